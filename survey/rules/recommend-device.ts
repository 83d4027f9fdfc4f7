import { BARREL_SIZES, findBarrelSize, type BarrelSize } from '../standards/barrel-sizes';
import type { Caution } from '../standards/cautions';
import { CHANNEL_LIMITS } from '../standards/cabling';
import { PLANNING } from '../standards/planning-defaults';
import { classForPdPower, POE_CLASSES, type PoeClass } from '../standards/poe-classes';
import { MAX_PD_POWER_W, POE_TYPES } from '../standards/poe-types';
import { usbLevelFor } from '../standards/usb-power';
import { powerNeedWatts, type CableRun, type DcBarrelInput, type Device } from '../model/device';
import type { SiteSettings } from '../model/site';
import { formatLength, formatNumber, formatWatts, roundTo, type UnitSystem } from '../units';
import {
  addCableWarnings, cableRunEvaluation, checkCableRun, deliveredReason, measureCableRun, measureRun, RunFigures,
  type CableRunOptions, type CableRunResult,
} from './cable-run';
import { deferredField, deferredListOf } from './deferred-text';
import { C, cautionsOf, W, WARNING_SEVERITY, type DeviceWarningCode } from './device-flags';
import { DevicePlan, noPoeOf, outletPlanOf, poePlanOf, splitterPlanOf } from './device-plan';
import { DeviceReasons, type DeviceFacts, type ReasonPath } from './device-reasons';
import { recommendationLabel } from './labels';
import { atPdLoad, OperatingPoint } from './poe-loss';
import type { CableRunEvaluation, DeviceEvaluation, OutletPlan, PlanWarning, PlugSpec, PoePlan, Recommendation } from './result-types';
import { MICRO_USB_PLUG, minimumAmps, plugForBarrel, splitterInputW, splitterRatingAmps, TERMINAL_PLUG, USB_C_PLUG } from './splitter';
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


// Fixed texts are written once; the reasons and the warnings that quote the device's own
// figures are written when first read.
const RUN_MISSING = 'The cable run to the closet has not been captured yet (a gap for the next walk); PoE was checked against the standard\'s worst-case cable.';
const FINISHED_SURFACES = 'Walls and ceilings here are finished with no access above or below: expect surface raceway or patching for new cable or a new outlet.';
const POLARITY_UNKNOWN = 'The plug polarity was not recorded: read the polarity symbol on the device or its adapter before connecting a splitter (centre-positive is common, not universal).';
const CANNOT_CARRY = 'its cable cannot carry enough power at the voltage PoE guarantees';
const TOO_LONG: Readonly<Record<UnitSystem, string>> = {
  metric: `its cable run with patch cords is longer than the ${formatLength(CHANNEL_LIMITS.channelMaxM, 'metric')} a network channel may be`,
  imperial: `its cable run with patch cords is longer than the ${formatLength(CHANNEL_LIMITS.channelMaxM, 'imperial')} a network channel may be`,
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

export interface PoeAttempt {
  readonly works: boolean;
  readonly plan: PoePlan | null;
  readonly cable: CableRunResult | null;
  /** Why PoE does not work, in plain words. */
  readonly whyNot: string | null;
}

/**
 * The run being measured, and the outcome of the last PoE attempt. Devices are planned one at
 * a time, so these records are reused and planning a device makes no objects.
 */
const measuring = new RunFigures();
const worstCase = new OperatingPoint();
const attempt = {
  /** PoE gets through (or no run was captured: the standard's worst-case run is assumed). */
  works: true,
  whyNot: null as string | null,
  expectedPseW: 0,
  cableLossW: 0,
};

/** Try to power `pdLoadW` over the device's run with a port of `poeClass` (also used for designer decisions). */
export function attemptPoe(device: Device, poeClass: PoeClass, pdLoadW: number, settings: SiteSettings): PoeAttempt {
  tryPoe(device, poeClass, pdLoadW, settings);
  const cls = POE_CLASSES[poeClass];
  const plan: PoePlan = {
    poeClass,
    poeType: cls.minType,
    standard: POE_TYPES[cls.minType].standardName,
    pairs: cls.pairs,
    reservedW: cls.psePowerW,
    pdLoadW: roundTo(pdLoadW, 3),
    expectedPseW: attempt.expectedPseW,
    cableLossW: attempt.cableLossW,
  };
  const works = attempt.works;
  const whyNot = attempt.whyNot;
  const run = device.run;
  let cable: CableRunResult | null = null;
  if (run !== undefined) {
    const warnings: PlanWarning[] = [];
    const cautions: Caution[] = [];
    const evaluation = checkCableRun(run, poeOptions(device, settings, poeClass, pdLoadW), warnings, cautions);
    const reason = deliveredReason(evaluation, settings.units);
    cable = { evaluation, reasons: reason === null ? [] : [reason], warnings, cautions };
  }
  return { works, plan, cable, whyNot };
}

function isOutdoorRun(device: Device): boolean {
  return device.outdoor || device.cableAccess === 'exterior';
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
    outdoor: isOutdoorRun(device),
  };
}

function poeOptions(device: Device, settings: SiteSettings, poeClass: PoeClass, pdLoadW: number): CableRunOptions {
  return cableOptions(device, settings, { poeClass, poeType: POE_CLASSES[poeClass].minType, pdLoadW }, null);
}

/** Check the device's run into `measuring`: for PoE at `poeClass` (−1 for none) or passive PoE at `passiveVolts` (0 for none). */
function measure(device: Device, run: CableRun, settings: SiteSettings, poeClass: number, pdLoadW: number, passiveVolts: number, passiveLoadW: number): RunFigures {
  const poeType = poeClass >= 0 ? POE_CLASSES[poeClass as PoeClass].minType : 1;
  return measureRun(run, settings.cableTemperatureC, settings.cordAllowanceM, isOutdoorRun(device),
    poeClass, poeType, pdLoadW, passiveVolts, passiveLoadW, measuring);
}

/** Keep the run's figures (as measured) in the plan. */
function keepRun(p: DevicePlan, run: CableRun | undefined, f: RunFigures | null): void {
  if (run === undefined || f === null) {
    p.hasRun = false;
    return;
  }
  p.hasRun = true;
  p.runCategory = run.category;
  p.runCca = run.cca;
  p.runLengthM = run.lengthM;
  p.runChannelM = roundTo(f.channelM, 2);
  p.runLoopOhm = roundTo(f.loopOhm, 4);
  p.runGauge = f.gauge;
  p.runWithinChannel = f.withinChannel;
  p.runOk = f.ok;
  p.warningBits |= f.warnings;
  p.cautionBits |= f.cautions;
}

/** Try PoE at `poeClass` for `pdLoadW` over the device's run; the outcome is in `attempt`, the run's figures in `measuring`. */
function tryPoe(device: Device, poeClass: PoeClass, pdLoadW: number, settings: SiteSettings): RunFigures | null {
  const run = device.run;
  attempt.works = true;
  attempt.whyNot = null;
  if (run === undefined) {
    const cls = POE_CLASSES[poeClass];
    const spec = POE_TYPES[cls.minType];
    const worst = atPdLoad(worstCase, pdLoadW, spec.pseVoltageMinV, spec.loopResistanceOhm, cls.pairs);
    attempt.expectedPseW = roundTo(worst.psePowerW, 3);
    attempt.cableLossW = roundTo(worst.lossW, 3);
    return null;
  }
  const f = measure(device, run, settings, poeClass, pdLoadW, 0, 0);
  attempt.expectedPseW = roundTo(f.atLoad.psePowerW, 3);
  attempt.cableLossW = roundTo(f.atLoad.lossW, 3);
  if (!f.ok) {
    attempt.works = false;
    attempt.whyNot = !f.withinChannel ? TOO_LONG[settings.units] : CANNOT_CARRY;
  }
  return f;
}

/** The device's run carries data only (outlet-powered devices): check it into the plan. */
function dataOnly(p: DevicePlan, device: Device, settings: SiteSettings): void {
  const run = device.run;
  p.check = 'data';
  keepRun(p, run, run === undefined ? null : measure(device, run, settings, -1, 0, 0, 0));
}

/** The device is fed from an outlet at the device. */
function onOutlet(p: DevicePlan, recommendation: Recommendation, path: ReasonPath, via: OutletPlan['via'], electrician: boolean): void {
  p.recommendation = recommendation;
  p.path = path;
  p.outletVia = via;
  p.outletAtCloset = false;
  p.electrician = electrician;
  if (electrician) p.cautionBits |= C.mains_electrician;
}

/** Put the outcome of the last PoE attempt into the plan as its port. */
function keepPort(p: DevicePlan, run: CableRun | undefined, poeClass: PoeClass, pdLoadW: number, f: RunFigures | null): void {
  p.poeClass = poeClass;
  p.pdLoadW = pdLoadW;
  p.expectedPseW = attempt.expectedPseW;
  p.cableLossW = attempt.cableLossW;
  p.check = 'poe';
  p.checkClass = poeClass;
  p.checkLoadW = pdLoadW;
  p.poeCable = true;
  keepRun(p, run, f);
}

/** What a splitter must put out for the device being planned (filled by `splitterSpecFor`). */
const spec = {
  volts: 0,
  plug: TERMINAL_PLUG as PlugSpec,
  usbLevel: null as string | null,
  /** Micro-USB above the USB levels: a 5 V supply all the same, with a warning. */
  overLevels: false,
};

/** What a splitter must put out for an adapter-powered device, into `spec`; false when no splitter can. */
function splitterSpecFor(device: Device, needW: number): boolean {
  const input = device.input;
  spec.usbLevel = null;
  spec.overLevels = false;
  switch (input.type) {
    case 'dc_barrel':
      spec.volts = input.volts;
      spec.plug = plugForBarrel(input.outerMm, input.innerMm, input.polarity);
      return true;
    case 'terminal_block':
      spec.volts = input.volts;
      spec.plug = TERMINAL_PLUG;
      return true;
    case 'micro_usb':
    case 'usb_c': {
      const level = usbLevelFor(input.type, needW);
      if (level === null) {
        // Above the USB levels: micro-USB still gets a 5 V supply (with a warning); USB-C above USB PD 100 W gets none.
        if (input.type !== 'micro_usb') return false;
        spec.volts = 5;
        spec.plug = MICRO_USB_PLUG;
        spec.overLevels = true;
        return true;
      }
      spec.volts = level.volts;
      spec.plug = input.type === 'usb_c' ? USB_C_PLUG : MICRO_USB_PLUG;
      spec.usbLevel = level.name;
      return true;
    }
    default:
      return false;
  }
}

/** The warnings of a barrel plug on a splitter. */
function barrelWarnings(input: DcBarrelInput): number {
  const size = findBarrelSize(input.outerMm, input.innerMm);
  let bits = 0;
  if (size !== undefined && LOOKALIKE_WARNING.has(size)) bits |= W.barrel_lookalike;
  if (input.polarity === 'unknown') bits |= W.polarity_unknown;
  const eiaj = size?.eiaj;
  if (eiaj !== undefined && (input.volts < eiaj.minV || input.volts > eiaj.maxV)) bits |= W.barrel_voltage_key;
  return bits;
}

function maxPdForStandard(standard: 'af' | 'at' | 'bt'): number {
  return standard === 'af' ? POE_TYPES[1].pdPowerW : standard === 'at' ? POE_TYPES[2].pdPowerW : POE_TYPES[4].pdPowerW;
}

/**
 * Decide how to power one device, into `p`: the recommendation with every figure the site
 * rules need, and no words. Pure; uses only the site settings. `deviceEvaluation` writes the
 * full result from the plan.
 */
export function planDevice(device: Device, settings: SiteSettings, p: DevicePlan): DevicePlan {
  const power = device.power;
  const needW = powerNeedWatts(power);
  p.needW = needW;
  p.poeClass = -1;
  p.splitterClass = -1;
  p.outletVia = null;
  p.hasRun = false;
  p.poeCable = false;
  p.reasonClass = -1;
  p.noPoeKind = 0;
  p.warningBits = power.typical ? W.typical_figure : 0;
  p.cautionBits = 0;
  decide(device, settings, p, needW);
  const rec = p.recommendation;
  const needsRun = rec === 'poe' || rec === 'poe_splitter' || device.input.type === 'passive_poe';
  if (needsRun && device.run === undefined) p.warningBits |= W.run_missing;
  if (device.cableAccess === 'finished_no_access' && (needsRun || rec === 'new_outlet')) p.warningBits |= W.finished_surfaces;
  return p;
}

function decide(device: Device, settings: SiteSettings, p: DevicePlan, needW: number): void {
  const power = device.power;
  const distanceM = device.outletDistanceM;
  const near = distanceM !== undefined && distanceM <= settings.nearOutletM;
  const mustStayUp = device.mustStayUp;
  const input = device.input;

  // ── Native PoE ────────────────────────────────────────────────────────────
  if (input.type === 'poe') {
    if (needW > MAX_PD_POWER_W + 1e-9) {
      p.recommendation = 'cannot_power';
      p.path = 'poe_too_much';
      dataOnly(p, device, settings);
      return;
    }
    const poeClass: PoeClass = input.class ?? classForPdPower(needW)!;
    if (input.class !== undefined && needW > POE_CLASSES[poeClass].pdMaxW + 1e-9) p.warningBits |= W.need_above_class;
    const standard = input.standard;
    if (standard !== undefined && input.class === undefined && needW > maxPdForStandard(standard) + 1e-9) {
      p.warningBits |= W.need_above_standard;
    }
    const f = tryPoe(device, poeClass, needW, settings);
    keepPort(p, device.run, poeClass, needW, f);
    p.reasonClass = poeClass;
    if (attempt.works) {
      p.recommendation = 'poe';
      p.path = 'poe';
    } else {
      p.recommendation = 'cannot_power';
      p.path = 'poe_failed';
      p.poeClass = -1;
      p.noPoeKind = 1;
      p.noPoeWords = attempt.whyNot!;
    }
    return;
  }

  // ── Passive PoE ───────────────────────────────────────────────────────────
  if (input.type === 'passive_poe') {
    p.warningBits |= W.passive_poe_device;
    p.cautionBits |= C.passive_poe;
    p.recommendation = 'existing_outlet';
    p.path = 'passive';
    p.outletVia = 'own_passive_injector';
    p.outletAtCloset = true;
    p.electrician = false;
    p.check = 'passive';
    const run = device.run;
    keepRun(p, run, run === undefined ? null : measure(device, run, settings, -1, 0, input.volts, needW));
    return;
  }

  // ── Mains-powered: AC plug, AC terminal block ─────────────────────────────
  if (input.type === 'ac_plug' || (input.type === 'terminal_block' && input.current === 'ac')) {
    const isTransformer = input.type === 'terminal_block';
    dataOnly(p, device, settings);
    if (isTransformer) p.cautionBits |= C.doorbell_transformer;
    const via: OutletPlan['via'] = isTransformer ? 'transformer' : 'plug';
    if (near) onOutlet(p, 'existing_outlet', 'mains_near', via, false);
    else onOutlet(p, 'new_outlet', 'mains_new', via, true);
    return;
  }

  // ── Adapter-powered: barrel, USB, DC terminal block ───────────────────────
  if (input.type === 'dc_barrel' && power.by === 'adapter' && Math.abs(power.volts - input.volts) > 0.05) {
    p.warningBits |= W.adapter_volts_mismatch;
  }
  // Near an outlet, indoors and not critical: the table says existing outlet, whatever PoE could do.
  if (near && !mustStayUp && !device.outdoor) {
    dataOnly(p, device, settings);
    onOutlet(p, 'existing_outlet', 'adapter_near', 'adapter', false);
    return;
  }
  const hasSpec = splitterSpecFor(device, needW);
  if (hasSpec && spec.overLevels) p.warningBits |= W.usb_above_levels;
  let poeWorks = false;
  let f: RunFigures | null = null;
  let minAmps = 0;
  let inputW = 0;
  let splitterClass: PoeClass | null = null;
  if (!hasSpec) {
    p.noPoeKind = 2;
  } else {
    minAmps = minimumAmps(needW, spec.volts);
    inputW = splitterInputW(spec.volts, minAmps, settings.splitterEfficiency);
    splitterClass = classForPdPower(inputW);
    if (splitterClass === null) {
      p.noPoeKind = 3;
      p.noPoeInputW = inputW;
    } else {
      f = tryPoe(device, splitterClass, inputW, settings);
      poeWorks = attempt.works;
      p.noPoeKind = 1;
      p.noPoeWords = poeWorks ? '' : attempt.whyNot!;
    }
  }

  let choice: Recommendation;
  if (mustStayUp) {
    choice = poeWorks ? 'poe_splitter' : near ? 'existing_outlet' : 'new_outlet';
  } else if (near) {
    choice = device.outdoor && poeWorks ? 'poe_splitter' : 'existing_outlet';
  } else {
    choice = poeWorks ? 'poe_splitter' : 'new_outlet';
  }

  if (choice === 'poe_splitter') {
    p.recommendation = 'poe_splitter';
    p.path = 'splitter';
    p.noPoeKind = 0;
    keepPort(p, device.run, splitterClass!, inputW, f);
    p.splitterClass = splitterClass!;
    p.splitterVolts = spec.volts;
    p.splitterMinAmps = minAmps;
    p.splitterRatingAmps = splitterRatingAmps(minAmps);
    p.splitterInputW = inputW;
    p.plug = spec.plug;
    p.usbLevel = spec.usbLevel;
    if (input.type === 'dc_barrel') {
      p.warningBits |= barrelWarnings(input);
      p.cautionBits |= C.barrel_plug;
    }
    return;
  }

  // Outlet choices: the cable (if any) carries data only; it reports its own
  // problems (length, CCA…) without the PoE attempt's notes.
  dataOnly(p, device, settings);
  if (choice === 'existing_outlet') onOutlet(p, 'existing_outlet', 'adapter_outlet', 'adapter', false);
  else onOutlet(p, 'new_outlet', 'adapter_new', 'adapter', true);
}

/** The plan being turned into a result by `evaluateDevice`. */
const planning = new DevicePlan();

/** Recommend how to power one device, with its reasons, cautions and warnings. Pure; uses only the site settings. */
export function evaluateDevice(device: Device, site: DeviceContext): DeviceEvaluation {
  return deviceEvaluation(device, site.settings, planDevice(device, site.settings, planning));
}

/** A warning whose message is written when first read. */
function warnLater(warnings: PlanWarning[], deviceId: string, code: DeviceWarningCode, write: () => string): void {
  warnings.push(deferredField<PlanWarning, 'message'>({ code, severity: WARNING_SEVERITY[code], message: '', deviceId }, 'message', write));
}

function warn(warnings: PlanWarning[], deviceId: string, code: DeviceWarningCode, message: string): void {
  warnings.push({ code, severity: WARNING_SEVERITY[code], message, deviceId });
}

/** The full result of a device planned by `planDevice`: its run's checks, reasons, cautions and warnings. */
export function deviceEvaluation(device: Device, settings: SiteSettings, p: DevicePlan): DeviceEvaluation {
  const needW = p.needW;
  const run = device.run;
  let cable: CableRunEvaluation | null = null;
  let figures: RunFigures | null = null;
  let options: CableRunOptions | null = null;
  if (run !== undefined) {
    const input = device.input;
    options = p.check === 'poe'
      ? poeOptions(device, settings, p.checkClass, p.checkLoadW)
      : p.check === 'passive' && input.type === 'passive_poe'
        ? cableOptions(device, settings, null, { volts: input.volts, loadW: needW })
        : cableOptions(device, settings, null, null);
    figures = measureCableRun(run, options, new RunFigures());
    cable = cableRunEvaluation(run, options, figures);
  }
  const poe = poePlanOf(p);
  const splitter = splitterPlanOf(p, settings);
  const outlet = outletPlanOf(p, device);
  const label = p.recommendation === 'poe' && poe !== null
    ? POE_LABEL[poe.poeClass]
    : recommendationLabel({ recommendation: p.recommendation, poe, splitter, outlet });
  return {
    deviceId: device.id,
    name: device.name,
    kind: device.kind,
    roomId: device.roomId,
    mustStayUp: device.mustStayUp,
    recommendation: p.recommendation,
    label,
    needW: roundTo(needW, 3),
    typicalFigure: device.power.typical,
    poe,
    splitter,
    outlet,
    cable,
    reasons: deferredListOf(new DeviceReasons(
      p.path, deviceFacts(device, needW, settings), p.poeCable ? cable : null,
      p.reasonClass < 0 ? null : (p.reasonClass as PoeClass), poe, splitter, noPoeOf(p))),
    cautions: cautionsOf(p.cautionBits),
    warnings: deviceWarnings(device, needW, p.warningBits, run, options, figures),
  };
}

/** The warning records of a device's warning bits, in bit order. */
function deviceWarnings(
  device: Device, needW: number, bits: number, run: CableRun | undefined, options: CableRunOptions | null, figures: RunFigures | null,
): PlanWarning[] {
  const warnings: PlanWarning[] = [];
  const id = device.id;
  const input = device.input;
  const power = device.power;
  if ((bits & W.typical_figure) !== 0) {
    warnLater(warnings, id, 'typical_figure', () =>
      `The power figure (${formatWatts(needW)}) is a typical value, not read from the device: check its label or datasheet.`);
  }
  if ((bits & W.need_above_class) !== 0 && input.type === 'poe') {
    const poeClass = input.class!;
    const pdMaxW = POE_CLASSES[poeClass].pdMaxW;
    warnLater(warnings, id, 'need_above_class', () =>
      `It is listed as Class ${poeClass}, but its figure of ${formatWatts(needW)} is above the ${formatWatts(pdMaxW)} that Class ${poeClass} guarantees: the port may cut it off. Check the datasheet.`);
  }
  if ((bits & W.need_above_standard) !== 0 && input.type === 'poe') {
    const standard = input.standard!;
    const maxPd = maxPdForStandard(standard);
    warnLater(warnings, id, 'need_above_standard', () =>
      `It says 802.3${standard}, which delivers at most ${formatWatts(maxPd)} to a device, but its figure is ${formatWatts(needW)}: check the datasheet.`);
  }
  if ((bits & W.passive_poe_device) !== 0 && input.type === 'passive_poe') {
    const volts = input.volts;
    warnLater(warnings, id, 'passive_poe_device', () =>
      `It uses passive PoE at ${formatNumber(volts)} V: never plug it into a standard PoE switch port, and never plug its injector into other gear.`);
  }
  if ((bits & W.adapter_volts_mismatch) !== 0 && input.type === 'dc_barrel' && power.by === 'adapter') {
    const adapterVolts = power.volts;
    const inputVolts = input.volts;
    warnLater(warnings, id, 'adapter_volts_mismatch', () =>
      `Its adapter label says ${formatNumber(adapterVolts)} V but its input was recorded as ${formatNumber(inputVolts)} V: check which is right before buying a splitter.`);
  }
  if ((bits & W.usb_above_levels) !== 0) {
    warnLater(warnings, id, 'usb_above_levels', () =>
      `It draws ${formatWatts(needW)}, more than micro-USB normally supplies (7.5 W at 1.5 A); it needs a 5 V supply rated for that current and a short, thick cable.`);
  }
  if (run !== undefined && options !== null && figures !== null) addCableWarnings(bits, run, options, figures, warnings);
  if (input.type === 'dc_barrel') {
    const size = findBarrelSize(input.outerMm, input.innerMm);
    if ((bits & W.barrel_lookalike) !== 0 && size !== undefined) warn(warnings, id, 'barrel_lookalike', LOOKALIKE_WARNING.get(size)!);
    if ((bits & W.polarity_unknown) !== 0) warn(warnings, id, 'polarity_unknown', POLARITY_UNKNOWN);
    const eiaj = size?.eiaj;
    if ((bits & W.barrel_voltage_key) !== 0 && size !== undefined && eiaj !== undefined) {
      const volts = input.volts;
      warnLater(warnings, id, 'barrel_voltage_key', () =>
        `A ${size.outerMm}×${size.innerMm} mm plug is the ${eiaj.code} size, keyed for ${eiaj.minV}–${eiaj.maxV} V, but the device says ${formatNumber(volts)} V: check the label.`);
    }
  }
  if ((bits & W.run_missing) !== 0) warn(warnings, id, 'run_missing', RUN_MISSING);
  if ((bits & W.finished_surfaces) !== 0) warn(warnings, id, 'finished_surfaces', FINISHED_SURFACES);
  return warnings;
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

export const NEAR_OUTLET_PROVENANCE = PLANNING.nearOutletM.provenance;
