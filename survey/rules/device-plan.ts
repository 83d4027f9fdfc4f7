import type { CableCategory } from '../standards/cabling';
import { POE_CLASSES, type PoeClass } from '../standards/poe-classes';
import { POE_TYPES } from '../standards/poe-types';
import type { Device } from '../model/device';
import type { SiteSettings } from '../model/site';
import { roundTo } from '../units';
import type { NoPoe, ReasonPath } from './device-reasons';
import type { OutletPlan, PlugSpec, PoePlan, Recommendation, SplitterPlan } from './result-types';

/** Which check a device's run gets in its result: data only, PoE at a class and load, or passive PoE. */
export type RunCheck = 'data' | 'poe' | 'passive';

/**
 * One device's decision and figures, as the device rules work them out (`planDevice`), with
 * no words and no result objects. The site rules keep thousands of these as columns
 * (site-plan.ts); a device's full result is written from its plan when it is read
 * (`deviceEvaluation`). A plan is a reusable record: copy out what you keep.
 */
export class DevicePlan {
  recommendation: Recommendation = 'cannot_power';
  path: ReasonPath = 'poe';
  /** The device's own need (W), unrounded. */
  needW = 0;

  /** The PoE port: its class (−1 for none), the load at the device (W, unrounded), and the expected draw and cable loss at the port (W, to the mW). */
  poeClass = -1;
  pdLoadW = 0;
  expectedPseW = 0;
  cableLossW = 0;

  /** The splitter: the class it needs (−1 for none), its output, the rating to buy, its draw (W, unrounded), plug and USB level. */
  splitterClass = -1;
  splitterVolts = 0;
  splitterMinAmps = 0;
  splitterRatingAmps = 0;
  splitterInputW = 0;
  plug: PlugSpec | null = null;
  usbLevel: string | null = null;

  /** The outlet: how the device is fed from it (null for none), at the closet or at the device, and whether it is new mains work. */
  outletVia: OutletPlan['via'] | null = null;
  outletAtCloset = false;
  electrician = false;

  /** The captured run (`hasRun`): figures as the cable schedule lists them. */
  hasRun = false;
  runCategory: CableCategory = 'cat6';
  runCca = false;
  runLengthM = 0;
  runChannelM = 0;
  runLoopOhm = 0;
  runGauge = 0;
  runWithinChannel = true;
  runOk = true;

  /** The check the run gets in the result, and for a PoE check its class and the load at the device (W, unrounded). */
  check: RunCheck = 'data';
  checkClass: PoeClass = 0;
  checkLoadW = 0;
  /** The run's PoE reason comes first in the reasons. */
  poeCable = false;
  /** The port class named in the reasons (native PoE), or −1. */
  reasonClass = -1;
  /** Why PoE does not work: 0 it does, 1 in `noPoeWords`, 2 no USB supply is big enough, 3 the splitter would draw `noPoeInputW`. */
  noPoeKind: 0 | 1 | 2 | 3 = 0;
  noPoeWords = '';
  noPoeInputW = 0;

  /** Bits of `W` and `C` (device-flags.ts). */
  warningBits = 0;
  cautionBits = 0;
}

/** The port plan of a device plan, or null. */
export function poePlanOf(p: DevicePlan): PoePlan | null {
  if (p.poeClass < 0) return null;
  const cls = POE_CLASSES[p.poeClass as PoeClass];
  const spec = POE_TYPES[cls.minType];
  return {
    poeClass: cls.poeClass,
    poeType: cls.minType,
    standard: spec.standardName,
    pairs: cls.pairs,
    reservedW: cls.psePowerW,
    pdLoadW: roundTo(p.pdLoadW, 3),
    expectedPseW: p.expectedPseW,
    cableLossW: p.cableLossW,
  };
}

/** The splitter of a device plan, or null. */
export function splitterPlanOf(p: DevicePlan, settings: SiteSettings): SplitterPlan | null {
  if (p.splitterClass < 0) return null;
  const cls = POE_CLASSES[p.splitterClass as PoeClass];
  return {
    outputVolts: p.splitterVolts,
    minAmps: p.splitterMinAmps,
    ratingAmps: p.splitterRatingAmps,
    plug: p.plug!,
    efficiency: settings.splitterEfficiency,
    inputW: roundTo(p.splitterInputW, 3),
    poeClass: cls.poeClass,
    poeType: cls.minType,
    usbLevel: p.usbLevel,
  };
}

/** The outlet of a device plan, or null. */
export function outletPlanOf(p: DevicePlan, device: Device): OutletPlan | null {
  if (p.outletVia === null) return null;
  if (p.outletAtCloset) return { via: p.outletVia, location: 'closet', distanceM: null, electrician: p.electrician };
  return { via: p.outletVia, location: 'device', distanceM: device.outletDistanceM ?? null, electrician: p.electrician };
}

/** Why PoE does not work for a device plan, for its reasons. */
export function noPoeOf(p: DevicePlan): NoPoe | null {
  switch (p.noPoeKind) {
    case 0: return null;
    case 1: return { kind: 'words', words: p.noPoeWords };
    case 2: return { kind: 'no_usb_supply' };
    case 3: return { kind: 'splitter_draw', inputW: p.noPoeInputW };
  }
}
