import { BARREL_SIZES, findBarrelSize, type BarrelSize } from '../standards/barrel-sizes';
import { CAUTIONS, type Caution } from '../standards/cautions';
import { PLANNING } from '../standards/planning-defaults';
import { classForPdPower, POE_CLASSES, type PoeClass } from '../standards/poe-classes';
import { MAX_PD_POWER_W, POE_TYPES, type PoeType } from '../standards/poe-types';
import { usbLevelFor } from '../standards/usb-power';
import { powerNeedWatts, type Device, type DcBarrelInput } from '../model/device';
import type { SiteSettings } from '../model/site';
import { formatLength, formatNumber, formatWatts, roundTo, type UnitSystem } from '../units';
import { checkCableRun, deliveredReason, type CableRunOptions, type CableRunResult } from './cable-run';
import { deferredField, deferredListOf } from './deferred-text';
import { DeviceReasons, type DeviceFacts, type NoPoe, type ReasonPath } from './device-reasons';
import { recommendationLabel } from './labels';
import { drawForPdLoad } from './poe-loss';
import type {
  CableRunEvaluation, DeviceEvaluation, OutletPlan, PlanWarning, PlugSpec, PoePlan, Recommendation, SplitterPlan,
} from './result-types';
import {
  MICRO_USB_PLUG, minimumAmps, plugForBarrel, sizeSplitter, splitterRatingAmps, TERMINAL_PLUG, USB_C_PLUG,
} from './splitter';
/*
 * Decision policy — how each device is powered.
 *
 *  input                | must stay up | outlet near¹ | outdoor | PoE path works² | recommendation
 *  ---------------------|--------------|--------------|---------|-----------------|------------------------------
 *  native PoE           |      –       |      –       |    –    |      yes        | poe
 *  native PoE           |      –       |      –       |    –    |      no         | cannot_power
 *  barrel / USB /       |     yes      |      –       |    –    |      yes        | poe_splitter
 *  DC terminal block    |     yes      |     yes      |    –    |      no         | existing_outlet (+ it stays up only on a battery-backed outlet)
 *                       |     yes      |     no       |    –    |      no         | new_outlet (+ same)
 *                       |     no       |     yes      |   no    |      –          | existing_outlet
 *                       |     no       |     yes      |   yes   |      yes        | poe_splitter (low voltage beats relying on an outdoor mains outlet)
 *                       |     no       |     yes      |   yes   |      no         | existing_outlet
 *                       |     no       |     no       |    –    |      yes        | poe_splitter (no mains work)
 *                       |     no       |     no       |    –    |      no         | new_outlet
 *  passive PoE          |      –       |      –       |    –    |      –          | existing_outlet, via its own documented injector plugged in at the
 *                       |              |              |         |                 | closet — never a standard PoE port, never a standard port's cable
 *                       |              |              |         |                 | straight into it (strong caution)
 *  AC plug              |      –       |     yes      |    –    |      –          | existing_outlet
 *                       |      –       |     no       |    –    |      –          | new_outlet
 *  AC terminal block    |      –       |     yes³     |    –    |      –          | existing_outlet (keeps its transformer)
 *  (doorbell)           |      –       |     no       |    –    |      –          | new_outlet (new transformer, electrician)
 *
 *  ¹ nearest outlet ≤ settings.nearOutletM (1.5 m by default — [PRACTICE], our policy: a
 *    typical adapter cord reaches that far). An unknown distance counts as "not near".
 *  ² the load at the PD (device need, or splitter input P_in = V × A ÷ η) is ≤ 71.3 W
 *    (802.3bt Type 4 / Class 8) and the captured run passes the cable checks (channel ≤ 100 m,
 *    PD voltage and class power at the PSE's minimum voltage). A run not captured yet is a gap:
 *    PoE is assumed to work over a standard-compliant run and the expected draw is computed
 *    with the standard's worst-case loop (20 Ω Type 1, 12.5 Ω Types 2–4).
 *  ³ for AC terminal-block devices "near" means low-voltage AC wires already at the device.
 *
 *  A native PoE device's port class is its stated class, else the smallest class covering its
 *  need; the port type is the least type serving that class. A splitter's class is the smallest
 *  class covering P_in.
 */


// Fixed texts are written once; the reasons are written when first read (device-reasons.ts),
// and so are the warnings that quote the device's own figures.
const RUN_MISSING = 'The cable run to the closet has not been captured yet (a gap for the next walk); PoE was checked against the standard\'s worst-case cable.';
const FINISHED_SURFACES = 'Walls and ceilings here are finished with no access above or below: expect surface raceway or patching for new cable or a new outlet.';
const POLARITY_UNKNOWN = 'The plug polarity was not recorded: read the polarity symbol on the device or its adapter before connecting a splitter (centre-positive is common, not universal).';
const CANNOT_CARRY = 'its cable cannot carry enough power at the voltage PoE guarantees';
const TOO_LONG: Readonly<Record<UnitSystem, string>> = {
  metric: `its cable run is longer than the ${formatLength(100, 'metric')} a network cable may be`,
  imperial: `its cable run is longer than the ${formatLength(100, 'imperial')} a network cable may be`,
};
/** The label of a native PoE device, by class (its port type is the least type serving the class). */
const POE_LABEL: readonly string[] = POE_CLASSES.map((c) =>
  recommendationLabel({ recommendation: 'poe', poe: { poeClass: c.poeClass, poeType: c.minType }, splitter: null }));
/** "Its 5.5×2.1 mm plug looks just like 5.5×2.5 mm…", for each barrel size that has look-alikes. */
const LOOKALIKE_WARNING = new Map<BarrelSize, string>();
for (const size of BARREL_SIZES) {
  if (size.lookAlikes.length === 0) continue;
  LOOKALIKE_WARNING.set(size,
    `Its ${size.outerMm}×${size.innerMm} mm plug looks just like ${size.lookAlikes.map((s) => s.replace('x', '×')).join(', ')} mm, and the two do not connect reliably: check the splitter's plug (a round toothpick is snug in 2.1 mm, loose in 2.5 mm).`);
}

export interface DeviceContext {
  readonly settings: SiteSettings;
}

/**
 * The warnings and cautions of the device being worked out. One device is worked out at a
 * time, so the lists are reused and the result gets exact-size copies of them (a fresh list
 * per device would grow to room for 17 items at its first push).
 */
const gathered: { readonly warnings: PlanWarning[]; readonly cautions: Caution[] } = { warnings: [], cautions: [] };

function addCaution(cautions: Caution[], c: Caution): void {
  if (!cautions.includes(c)) cautions.push(c);
}

/** A warning whose message is fixed text. */
function warn(warnings: PlanWarning[], deviceId: string, code: string, severity: PlanWarning['severity'], message: string): void {
  warnings.push({ code, severity, message, deviceId });
}

/** A warning whose message is written when first read. */
function warnLater(warnings: PlanWarning[], deviceId: string, code: string, severity: PlanWarning['severity'], write: () => string): void {
  warnings.push(deferredField<PlanWarning, 'message'>({ code, severity, message: '', deviceId }, 'message', write));
}

export interface PoeAttempt {
  readonly works: boolean;
  readonly plan: PoePlan | null;
  readonly cable: CableRunResult | null;
  /** Why PoE does not work, in plain words. */
  readonly whyNot: string | null;
}

/** `PoeAttempt` as the device rules use it: the run's warnings and cautions went to the caller's lists. */
interface PoeTry {
  readonly works: boolean;
  readonly plan: PoePlan;
  readonly cable: CableRunEvaluation | null;
  readonly whyNot: string | null;
}

/** Try to power `pdLoadW` over the device's run with a port of `poeClass` (also used for designer decisions). */
export function attemptPoe(device: Device, poeClass: PoeClass, pdLoadW: number, settings: SiteSettings): PoeAttempt {
  const warnings: PlanWarning[] = [];
  const cautions: Caution[] = [];
  const t = tryPoe(device, poeClass, pdLoadW, settings, warnings, cautions);
  const c = t.cable;
  let cable: CableRunResult | null = null;
  if (c !== null) {
    const reason = deliveredReason(c, settings.units);
    cable = { evaluation: c, reasons: reason === null ? [] : [reason], warnings, cautions };
  }
  return { works: t.works, plan: t.plan, cable, whyNot: t.whyNot };
}

/** The cable check options for a device's run (one object shape for every check). */
function cableOptions(device: Device, settings: SiteSettings, poe: CableRunOptions['poe'], passive: CableRunOptions['passive']): CableRunOptions {
  return {
    deviceId: device.id,
    temperatureC: settings.cableTemperatureC,
    cordAllowanceM: settings.cordAllowanceM,
    units: settings.units,
    poe,
    passive,
    outdoor: device.outdoor || device.cableAccess === 'exterior',
  };
}

function tryPoe(
  device: Device, poeClass: PoeClass, pdLoadW: number, settings: SiteSettings, warnings: PlanWarning[], cautions: Caution[],
): PoeTry {
  const cls = POE_CLASSES[poeClass];
  const poeType: PoeType = cls.minType;
  const spec = POE_TYPES[poeType];
  const run = device.run;
  let cable: CableRunEvaluation | null = null;
  let expectedPseW: number;
  let lossW: number;
  if (run !== undefined) {
    cable = checkCableRun(run, cableOptions(device, settings, { poeClass, poeType, pdLoadW }, null), warnings, cautions);
    const exp = cable.poe!.atExpectedLoad;
    expectedPseW = exp.psePowerW;
    lossW = exp.lossW;
  } else {
    const worst = drawForPdLoad(pdLoadW, spec.pseVoltageMinV, spec.loopResistanceOhm, cls.pairs);
    expectedPseW = roundTo(worst.psePowerW, 3);
    lossW = roundTo(worst.lossW, 3);
  }
  const plan: PoePlan = {
    poeClass,
    poeType,
    standard: spec.standardName,
    pairs: cls.pairs,
    reservedW: cls.psePowerW,
    pdLoadW: roundTo(pdLoadW, 3),
    expectedPseW,
    cableLossW: lossW,
  };
  if (cable !== null && !cable.ok) {
    return { works: false, plan, cable, whyNot: !cable.withinChannel ? TOO_LONG[settings.units] : CANNOT_CARRY };
  }
  return { works: true, plan, cable, whyNot: null };
}

/** Cable checks for a device whose run carries data only (outlet-powered devices). */
function dataOnlyCable(device: Device, settings: SiteSettings): CableRunEvaluation | null {
  const run = device.run;
  if (run === undefined) return null;
  return checkCableRun(run, cableOptions(device, settings, null, null), gathered.warnings, gathered.cautions);
}

interface SplitterSpec {
  readonly volts: number;
  readonly plug: PlugSpec;
  readonly usbLevel: string | null;
}

/** What a splitter must put out for an adapter-powered device. */
function splitterSpecFor(device: Device, needW: number): SplitterSpec | null {
  const input = device.input;
  switch (input.type) {
    case 'dc_barrel':
      return { volts: input.volts, plug: plugForBarrel(input.outerMm, input.innerMm, input.polarity), usbLevel: null };
    case 'terminal_block':
      return { volts: input.volts, plug: TERMINAL_PLUG, usbLevel: null };
    case 'micro_usb':
    case 'usb_c': {
      const level = usbLevelFor(input.type, needW);
      if (level === null) {
        if (input.type === 'micro_usb') {
          warnLater(gathered.warnings, device.id, 'usb_above_levels', 'warning', () =>
            `It draws ${formatWatts(needW)}, more than micro-USB normally supplies (7.5 W at 1.5 A); it needs a 5 V supply rated for that current and a short, thick cable.`);
          return { volts: 5, plug: MICRO_USB_PLUG, usbLevel: null };
        }
        return null; // above USB PD 100 W: no splitter
      }
      return { volts: level.volts, plug: input.type === 'usb_c' ? USB_C_PLUG : MICRO_USB_PLUG, usbLevel: level.name };
    }
    default:
      return null;
  }
}

function barrelChecks(device: Device, input: DcBarrelInput): void {
  const warnings = gathered.warnings;
  const size = findBarrelSize(input.outerMm, input.innerMm);
  addCaution(gathered.cautions, CAUTIONS.barrel_plug);
  if (size !== undefined) {
    const lookalike = LOOKALIKE_WARNING.get(size);
    if (lookalike !== undefined) warn(warnings, device.id, 'barrel_lookalike', 'info', lookalike);
  }
  if (input.polarity === 'unknown') warn(warnings, device.id, 'polarity_unknown', 'warning', POLARITY_UNKNOWN);
  const eiaj = size?.eiaj;
  const volts = input.volts;
  if (size !== undefined && eiaj !== undefined && (volts < eiaj.minV || volts > eiaj.maxV)) {
    warnLater(warnings, device.id, 'barrel_voltage_key', 'warning', () =>
      `A ${size.outerMm}×${size.innerMm} mm plug is the ${eiaj.code} size, keyed for ${eiaj.minV}–${eiaj.maxV} V, but the device says ${formatNumber(volts)} V: check the label.`);
  }
}

function buildResult(
  device: Device, needW: number, recommendation: Recommendation,
  poe: PoePlan | null, splitter: SplitterPlan | null, outlet: OutletPlan | null, cable: CableRunEvaluation | null,
  path: ReasonPath, settings: SiteSettings, poeCable: boolean, poeClass: PoeClass | null, noPoe: NoPoe | null,
): DeviceEvaluation {
  const warnings = gathered.warnings;
  const needsRun = recommendation === 'poe' || recommendation === 'poe_splitter' || device.input.type === 'passive_poe';
  if (needsRun && device.run === undefined) warn(warnings, device.id, 'run_missing', 'info', RUN_MISSING);
  if (device.cableAccess === 'finished_no_access' && (needsRun || recommendation === 'new_outlet')) {
    warn(warnings, device.id, 'finished_surfaces', 'info', FINISHED_SURFACES);
  }
  const label = recommendation === 'poe' && poe !== null && poe.poeType === POE_CLASSES[poe.poeClass].minType
    ? POE_LABEL[poe.poeClass]
    : recommendationLabel({ recommendation, poe, splitter });
  return {
    deviceId: device.id,
    name: device.name,
    kind: device.kind,
    roomId: device.roomId,
    mustStayUp: device.mustStayUp,
    recommendation,
    label,
    needW: roundTo(needW, 3),
    typicalFigure: device.power.typical,
    poe,
    splitter,
    outlet,
    cable,
    reasons: deferredListOf(new DeviceReasons(path, deviceFacts(device, needW, settings), poeCable ? cable : null, poeClass, poe, splitter, noPoe)),
    cautions: gathered.cautions.slice(),
    warnings: warnings.slice(),
  };
}

function deviceFacts(device: Device, needW: number, settings: SiteSettings): DeviceFacts {
  const input = device.input;
  const distanceM = device.outletDistanceM;
  return {
    units: settings.units,
    needW,
    mustStayUp: device.mustStayUp,
    outdoor: device.outdoor,
    outletDistanceM: distanceM,
    near: distanceM !== undefined && distanceM <= settings.nearOutletM,
    inputVolts: input.type === 'passive_poe' || input.type === 'terminal_block' ? input.volts : 0,
    transformer: input.type === 'terminal_block' && input.current === 'ac',
  };
}

function outletPlan(distanceM: number | undefined, near: boolean, via: OutletPlan['via']): OutletPlan {
  return { via, location: 'device', distanceM: distanceM ?? null, electrician: !near };
}

const NO_USB_SUPPLY: NoPoe = { kind: 'no_usb_supply' };

/** Recommend how to power one device. Pure; uses only the site settings. */
export function evaluateDevice(device: Device, site: DeviceContext): DeviceEvaluation {
  const settings = site.settings;
  const power = device.power;
  const needW = powerNeedWatts(power);
  const warnings = gathered.warnings;
  const cautions = gathered.cautions;
  warnings.length = 0;
  cautions.length = 0;
  const distanceM = device.outletDistanceM;
  const near = distanceM !== undefined && distanceM <= settings.nearOutletM;
  const mustStayUp = device.mustStayUp;
  const input = device.input;

  if (power.typical) {
    warnLater(warnings, device.id, 'typical_figure', 'info', () =>
      `The power figure (${formatWatts(needW)}) is a typical value, not read from the device: check its label or datasheet.`);
  }

  // ── Native PoE ────────────────────────────────────────────────────────────
  if (input.type === 'poe') {
    if (needW > MAX_PD_POWER_W + 1e-9) {
      const cable = dataOnlyCable(device, settings);
      return buildResult(device, needW, 'cannot_power', null, null, null, cable, 'poe_too_much', settings, false, null, null);
    }
    const fromNeed = classForPdPower(needW)!;
    const poeClass: PoeClass = input.class ?? fromNeed;
    const cls = POE_CLASSES[poeClass];
    if (input.class !== undefined && needW > cls.pdMaxW + 1e-9) {
      warnLater(warnings, device.id, 'need_above_class', 'warning', () =>
        `It is listed as Class ${poeClass}, but its figure of ${formatWatts(needW)} is above the ${formatWatts(cls.pdMaxW)} that Class ${poeClass} guarantees: the port may cut it off. Check the datasheet.`);
    }
    const standard = input.standard;
    if (standard !== undefined && input.class === undefined) {
      const maxPd = standard === 'af' ? POE_TYPES[1].pdPowerW : standard === 'at' ? POE_TYPES[2].pdPowerW : POE_TYPES[4].pdPowerW;
      if (needW > maxPd + 1e-9) {
        warnLater(warnings, device.id, 'need_above_standard', 'warning', () =>
          `It says 802.3${standard}, which delivers at most ${formatWatts(maxPd)} to a device, but its figure is ${formatWatts(needW)}: check the datasheet.`);
      }
    }
    const attempt = tryPoe(device, poeClass, needW, settings, warnings, cautions);
    if (!attempt.works) {
      return buildResult(device, needW, 'cannot_power', null, null, null, attempt.cable, 'poe_failed', settings, true, poeClass,
        { kind: 'words', words: attempt.whyNot! });
    }
    return buildResult(device, needW, 'poe', attempt.plan, null, null, attempt.cable, 'poe', settings, true, poeClass, null);
  }

  // ── Passive PoE ───────────────────────────────────────────────────────────
  if (input.type === 'passive_poe') {
    const volts = input.volts;
    addCaution(cautions, CAUTIONS.passive_poe);
    warnLater(warnings, device.id, 'passive_poe_device', 'warning', () =>
      `It uses passive PoE at ${formatNumber(volts)} V: never plug it into a standard PoE switch port, and never plug its injector into other gear.`);
    const run = device.run;
    const cable = run === undefined
      ? null
      : checkCableRun(run, cableOptions(device, settings, null, { volts, loadW: needW }), warnings, cautions);
    const outlet: OutletPlan = { via: 'own_passive_injector', location: 'closet', distanceM: null, electrician: false };
    return buildResult(device, needW, 'existing_outlet', null, null, outlet, cable, 'passive', settings, false, null, null);
  }

  // ── Mains-powered: AC plug, AC terminal block ─────────────────────────────
  if (input.type === 'ac_plug' || (input.type === 'terminal_block' && input.current === 'ac')) {
    const isTransformer = input.type === 'terminal_block';
    const via: OutletPlan['via'] = isTransformer ? 'transformer' : 'plug';
    const cable = dataOnlyCable(device, settings);
    if (isTransformer) addCaution(cautions, CAUTIONS.doorbell_transformer);
    if (near) {
      return buildResult(device, needW, 'existing_outlet', null, null, outletPlan(distanceM, true, via), cable, 'mains_near', settings, false, null, null);
    }
    addCaution(cautions, CAUTIONS.mains_electrician);
    return buildResult(device, needW, 'new_outlet', null, null, outletPlan(distanceM, false, via), cable, 'mains_new', settings, false, null, null);
  }

  // ── Adapter-powered: barrel, USB, DC terminal block ───────────────────────
  const eff = settings.splitterEfficiency;
  if (input.type === 'dc_barrel' && power.by === 'adapter' && Math.abs(power.volts - input.volts) > 0.05) {
    const adapterVolts = power.volts;
    const inputVolts = input.volts;
    warnLater(warnings, device.id, 'adapter_volts_mismatch', 'warning', () =>
      `Its adapter label says ${formatNumber(adapterVolts)} V but its input was recorded as ${formatNumber(inputVolts)} V: check which is right before buying a splitter.`);
  }
  // Near an outlet, indoors and not critical: the table says existing outlet, whatever PoE could do.
  if (near && !mustStayUp && !device.outdoor) {
    const dataCable = dataOnlyCable(device, settings);
    return buildResult(device, needW, 'existing_outlet', null, null, outletPlan(distanceM, true, 'adapter'), dataCable, 'adapter_near', settings, false, null, null);
  }
  const spec = splitterSpecFor(device, needW);
  // The PoE attempt's warnings and cautions count only if the splitter is chosen.
  const warningsBefore = warnings.length;
  const cautionsBefore = cautions.length;
  let splitter: SplitterPlan | null = null;
  let attempt: PoeTry | null = null;
  let noPoe: NoPoe;
  if (spec === null) {
    noPoe = NO_USB_SUPPLY;
  } else {
    const minAmps = minimumAmps(needW, spec.volts);
    const sizing = sizeSplitter(spec.volts, minAmps, eff);
    if (sizing.poeClass === null) {
      noPoe = { kind: 'splitter_draw', inputW: sizing.inputW };
    } else {
      attempt = tryPoe(device, sizing.poeClass, sizing.inputW, settings, warnings, cautions);
      splitter = {
        outputVolts: spec.volts,
        minAmps,
        ratingAmps: splitterRatingAmps(minAmps),
        plug: spec.plug,
        efficiency: eff,
        inputW: roundTo(sizing.inputW, 3),
        poeClass: sizing.poeClass,
        poeType: sizing.poeType!,
        usbLevel: spec.usbLevel,
      };
      noPoe = { kind: 'words', words: attempt.works ? '' : attempt.whyNot! };
    }
  }
  const poeWorks = attempt !== null && attempt.works;

  let choice: Recommendation;
  if (mustStayUp) {
    choice = poeWorks ? 'poe_splitter' : near ? 'existing_outlet' : 'new_outlet';
  } else if (near) {
    choice = device.outdoor && poeWorks ? 'poe_splitter' : 'existing_outlet';
  } else {
    choice = poeWorks ? 'poe_splitter' : 'new_outlet';
  }

  if (choice === 'poe_splitter') {
    if (input.type === 'dc_barrel') barrelChecks(device, input);
    return buildResult(device, needW, 'poe_splitter', attempt!.plan, splitter, null, attempt!.cable, 'splitter', settings, true, null, null);
  }

  // Outlet choices: the cable (if any) carries data only; report its own
  // problems (length, CCA…) without the PoE-specific notes.
  warnings.length = warningsBefore;
  cautions.length = cautionsBefore;
  const dataCable = dataOnlyCable(device, settings);
  if (choice === 'existing_outlet') {
    return buildResult(device, needW, 'existing_outlet', null, null, outletPlan(distanceM, true, 'adapter'), dataCable, 'adapter_outlet', settings, false, null, noPoe);
  }
  addCaution(cautions, CAUTIONS.mains_electrician);
  return buildResult(device, needW, 'new_outlet', null, null, outletPlan(distanceM, false, 'adapter'), dataCable, 'adapter_new', settings, false, null, noPoe);
}

export const NEAR_OUTLET_PROVENANCE = PLANNING.nearOutletM.provenance;
