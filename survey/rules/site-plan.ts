import { CABLE_CATEGORY_VALUES, type CableCategory } from '../standards/cabling';
import { POE_CLASSES, type PoeClass } from '../standards/poe-classes';
import type { Device } from '../model/device';
import type { SiteSettings } from '../model/site';
import { roundTo } from '../units';
import { DevicePlan } from './device-plan';
import { planDevice } from './recommend-device';
import { RECOMMENDATION_VALUES, type DeviceEvaluation, type OutletPlan, type PlugSpec, type Recommendation } from './result-types';

/** How an outlet-fed device is fed, by code (0: not from an outlet). */
const VIAS: readonly (OutletPlan['via'] | null)[] = [null, 'adapter', 'plug', 'own_passive_injector', 'transformer', 'poe_injector'];

/** The code of each value: its place in `values` (a plain object reads faster than a Map here). */
function codeOf<T extends string>(values: readonly (T | null)[]): Readonly<Record<T, number>> {
  const codes = {} as Record<T, number>;
  values.forEach((v, i) => {
    if (v !== null) codes[v] = i;
  });
  return codes;
}
/** The code of each recommendation in `SitePlan.recommendationCode` (its place in RECOMMENDATION_VALUES). */
export const REC_CODE = codeOf<Recommendation>(RECOMMENDATION_VALUES);
const VIA_CODE = codeOf(VIAS);
const CATEGORY_CODE = codeOf<CableCategory>(CABLE_CATEGORY_VALUES);

/** Bits of `flags`. */
const MUST_STAY_UP = 1;
const HAS_RUN = 2;
const RUN_WITHIN_CHANNEL = 4;
const RUN_OK = 8;
const PINNED = 16;

/**
 * The figures of every device's plan that the site rules read (port assignment, budgets,
 * battery, summary), kept as columns: one typed array per figure, indexed by the device's
 * place in the site. Evaluating a site of thousands of devices so makes a handful of arrays
 * instead of thousands of objects. A device's full result is not kept here: it is worked out
 * again from the device (`evaluateDevice`) when it is read.
 */
export class SitePlan {
  readonly size: number;
  /** The plans were copied from results worked out elsewhere (their warnings are known only as records). */
  readonly fromResults: boolean;
  /** The recommendation, as its `REC_CODE`. */
  readonly recommendationCode: Uint8Array;
  private readonly flags: Uint8Array;
  /** The device's need (W), rounded as in its result. */
  readonly needW: Float64Array;
  /** The PoE port: class (−1 for none), type, class power set aside and expected draw (W). */
  readonly poeClass: Int8Array;
  readonly poeType: Uint8Array;
  readonly reservedW: Float64Array;
  readonly expectedPseW: Float64Array;
  /** The splitter: class (−1 for none), output volts, rating to buy (A) and plug. */
  readonly splitterClass: Int8Array;
  readonly splitterVolts: Float64Array;
  readonly splitterRatingAmps: Float64Array;
  readonly plug: (PlugSpec | null)[];
  private readonly viaCode: Uint8Array;
  /** The run as the cable schedule lists it; `runKind` is its category's place in `CABLE_CATEGORY_VALUES` × 2, + 1 for copper-clad aluminium. */
  readonly runKind: Uint8Array;
  readonly runLengthM: Float64Array;
  readonly runGauge: Uint8Array;
  readonly runChannelM: Float64Array;
  readonly runLoopOhm: Float64Array;
  /** Bits of `W` (device-flags.ts); not kept when copied from results. */
  readonly warningBits: Uint32Array;

  constructor(size: number, fromResults: boolean) {
    this.size = size;
    this.fromResults = fromResults;
    this.recommendationCode = new Uint8Array(size);
    this.flags = new Uint8Array(size);
    this.needW = new Float64Array(size);
    this.poeClass = new Int8Array(size);
    this.poeType = new Uint8Array(size);
    this.reservedW = new Float64Array(size);
    this.expectedPseW = new Float64Array(size);
    this.splitterClass = new Int8Array(size);
    this.splitterVolts = new Float64Array(size);
    this.splitterRatingAmps = new Float64Array(size);
    this.plug = new Array<PlugSpec | null>(size).fill(null);
    this.viaCode = new Uint8Array(size);
    this.runKind = new Uint8Array(size);
    this.runLengthM = new Float64Array(size);
    this.runGauge = new Uint8Array(size);
    this.runChannelM = new Float64Array(size);
    this.runLoopOhm = new Float64Array(size);
    this.warningBits = new Uint32Array(size);
  }

  recommendation(i: number): Recommendation {
    return RECOMMENDATION_VALUES[this.recommendationCode[i]];
  }
  mustStayUp(i: number): boolean {
    return (this.flags[i] & MUST_STAY_UP) !== 0;
  }
  /** The device names a source (and maybe a port) to be powered from. */
  pinned(i: number): boolean {
    return (this.flags[i] & PINNED) !== 0;
  }
  hasPoe(i: number): boolean {
    return this.poeClass[i] >= 0;
  }
  /** How the device is fed from an outlet, or null when it is not. */
  outletVia(i: number): OutletPlan['via'] | null {
    return VIAS[this.viaCode[i]];
  }
  hasRun(i: number): boolean {
    return (this.flags[i] & HAS_RUN) !== 0;
  }
  runCategory(i: number): CableCategory {
    return CABLE_CATEGORY_VALUES[this.runKind[i] >> 1];
  }
  runCca(i: number): boolean {
    return (this.runKind[i] & 1) === 1;
  }
  runWithinChannel(i: number): boolean {
    return (this.flags[i] & RUN_WITHIN_CHANNEL) !== 0;
  }
  runOk(i: number): boolean {
    return (this.flags[i] & RUN_OK) !== 0;
  }

  /** Keep the figures of device `i`'s plan. */
  store(i: number, p: DevicePlan, device: Device): void {
    this.recommendationCode[i] = REC_CODE[p.recommendation];
    let flags = device.mustStayUp ? MUST_STAY_UP : 0;
    if (device.sourceId !== undefined) flags |= PINNED;
    if (p.hasRun) {
      flags |= HAS_RUN;
      if (p.runWithinChannel) flags |= RUN_WITHIN_CHANNEL;
      if (p.runOk) flags |= RUN_OK;
      this.runKind[i] = CATEGORY_CODE[p.runCategory] * 2 + (p.runCca ? 1 : 0);
      this.runLengthM[i] = p.runLengthM;
      this.runGauge[i] = p.runGauge;
      this.runChannelM[i] = p.runChannelM;
      this.runLoopOhm[i] = p.runLoopOhm;
    }
    this.flags[i] = flags;
    this.needW[i] = roundTo(p.needW, 3);
    const c = p.poeClass;
    this.poeClass[i] = c;
    if (c >= 0) {
      const cls = POE_CLASSES[c as PoeClass];
      this.poeType[i] = cls.minType;
      this.reservedW[i] = cls.psePowerW;
      this.expectedPseW[i] = p.expectedPseW;
    }
    this.splitterClass[i] = p.splitterClass;
    if (p.splitterClass >= 0) {
      this.splitterVolts[i] = p.splitterVolts;
      this.splitterRatingAmps[i] = p.splitterRatingAmps;
      this.plug[i] = p.plug;
    }
    if (p.outletVia !== null) this.viaCode[i] = VIA_CODE[p.outletVia];
    this.warningBits[i] = p.warningBits;
  }

  /** Keep the figures of a result worked out elsewhere (e.g. with a designer decision applied). */
  storeResult(i: number, e: DeviceEvaluation, device: Device): void {
    this.recommendationCode[i] = REC_CODE[e.recommendation];
    let flags = e.mustStayUp ? MUST_STAY_UP : 0;
    if (device.sourceId !== undefined) flags |= PINNED;
    const c = e.cable;
    if (c !== null) {
      flags |= HAS_RUN;
      if (c.withinChannel) flags |= RUN_WITHIN_CHANNEL;
      if (c.ok) flags |= RUN_OK;
      this.runKind[i] = CATEGORY_CODE[c.category] * 2 + (c.cca ? 1 : 0);
      this.runLengthM[i] = c.lengthM;
      this.runGauge[i] = c.gauge;
      this.runChannelM[i] = c.channelM;
      this.runLoopOhm[i] = c.loopOhm;
    }
    this.flags[i] = flags;
    this.needW[i] = e.needW;
    const poe = e.poe;
    this.poeClass[i] = poe === null ? -1 : poe.poeClass;
    if (poe !== null) {
      this.poeType[i] = poe.poeType;
      this.reservedW[i] = poe.reservedW;
      this.expectedPseW[i] = poe.expectedPseW;
    }
    const s = e.splitter;
    this.splitterClass[i] = s === null ? -1 : s.poeClass;
    if (s !== null) {
      this.splitterVolts[i] = s.outputVolts;
      this.splitterRatingAmps[i] = s.ratingAmps;
      this.plug[i] = s.plug;
    }
    if (e.outlet !== null) this.viaCode[i] = VIA_CODE[e.outlet.via];
  }
}

/** Plan every device of a site into columns. */
export function planSite(devices: readonly Device[], settings: SiteSettings): SitePlan {
  const plan = new SitePlan(devices.length, false);
  const p = new DevicePlan();
  for (let i = 0; i < devices.length; i++) {
    const d = devices[i];
    plan.store(i, planDevice(d, settings, p), d);
  }
  return plan;
}

/** The columns of device results worked out elsewhere, one per site device in site order. */
export function planOfResults(devices: readonly Device[], results: readonly DeviceEvaluation[]): SitePlan {
  const plan = new SitePlan(results.length, true);
  for (let i = 0; i < results.length; i++) plan.storeResult(i, results[i], devices[i]);
  return plan;
}

