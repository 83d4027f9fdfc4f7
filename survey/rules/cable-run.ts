import { conductorOhmPerM, pairsetLoopOhm, type AwgGauge } from '../standards/awg';
import {
  CABLE_CATEGORY_NAMES, CHANNEL_LIMITS, DEFAULT_GAUGE, NEC_725_144_THRESHOLD_W, TSB_184_A, type CableCategory,
} from '../standards/cabling';
import { CAUTIONS, type Caution } from '../standards/cautions';
import { PLANNING } from '../standards/planning-defaults';
import { POE_CLASSES, type PoeClass } from '../standards/poe-classes';
import { POE_TYPES, type PoeType } from '../standards/poe-types';
import type { CableRun } from '../model/device';
import { formatLength, formatOhms, formatPercent, formatVolts, formatWatts, roundTo, type UnitSystem } from '../units';
import { deferredField } from './deferred-text';
import { C, CABLE_WARNINGS, W } from './device-flags';
import { atPdLoad, atPsePower, lossAtPsePower, OperatingPoint } from './poe-loss';
import type {
  CableAtClassPower, CableAtExpectedLoad, CablePassiveCheck, CablePoeCheck, CableRunEvaluation, PlanWarning,
} from './result-types';

/**
 * Cable-run rules.
 *
 * - The captured length is the permanent link (fixed cable, ≤ 90 m); the site's
 *   cord allowance (5 m by default, [PRACTICE]) is added to make the channel,
 *   which must be ≤ 100 m (TIA-568 / ISO/IEC 11801; S15, S16, S17). Cords are
 *   counted at the run's own gauge (a simplification: stranded cords are a
 *   little worse).
 * - Conductor resistance: AWG table at 20 °C (S18), R(T) = R20·(1 + 0.00393·(T − 20)),
 *   × 1.54 for copper-clad aluminium [DERIVED]. Loop per pairset ≈ R_conductor/m × channel length.
 * - PoE is checked at the PSE's MINIMUM voltage for the port type (44 / 50 / 50 / 52 V),
 *   with 2 pairs for classes 0–4 and 4 pairs for classes 5–8, both at full class power
 *   (does the PD still get its class power and its type's minimum voltage?) and at the
 *   expected load (device need, or splitter input).
 * - A run is "ok" for PoE when the channel is ≤ 100 m and both operating points keep the
 *   PD at or above the type's minimum voltage with full class power.
 */

export interface CableRunOptions {
  readonly deviceId: string;
  readonly temperatureC: number;
  readonly cordAllowanceM: number;
  readonly units: UnitSystem;
  /** Check PoE delivery for this port class/type and PD load. */
  readonly poe?: { readonly poeClass: PoeClass; readonly poeType: PoeType; readonly pdLoadW: number } | null;
  /** Check passive PoE voltage drop (spare pairs, 2-pair). */
  readonly passive?: { readonly volts: number; readonly loadW: number } | null;
  readonly outdoor?: boolean;
}

export interface CableRunResult {
  readonly evaluation: CableRunEvaluation;
  readonly reasons: string[];
  readonly warnings: PlanWarning[];
  readonly cautions: Caution[];
}

const EPS = 1e-9;

const CCA_MESSAGE = 'This run is copper-clad aluminium (CCA): not compliant for network cable and about 1.5 times the resistance of copper. Replace it with solid copper cable.';
const THIN_GAUGE_MESSAGE = '26 AWG is patch-cord wire; fixed runs should be 22–24 AWG solid copper.';
const NEC_MESSAGE = `This port puts out more than ${NEC_725_144_THRESHOLD_W} W: bundle sizes must be checked against NEC Table 725.144, or use LP-rated cable.`;
const CAT6A_MESSAGE: Readonly<Record<CableCategory, string>> = {
  cat5e: cat6aMessage('cat5e'), cat6: cat6aMessage('cat6'), cat6a: cat6aMessage('cat6a'),
};
function cat6aMessage(c: CableCategory): string {
  return `High-power PoE (802.3bt) on ${CABLE_CATEGORY_NAMES[c]}: Cat 6A is recommended for new cable (TSB-184-A); keep this cable out of tight bundles.`;
}

/** A cable warning whose message is written when first read. */
function cableWarning(code: string, severity: PlanWarning['severity'], deviceId: string, write: () => string): PlanWarning {
  return deferredField<PlanWarning, 'message'>({ code, severity, deviceId, message: '' }, 'message', write);
}

function addCaution(cautions: Caution[], c: Caution): void {
  if (!cautions.includes(c)) cautions.push(c);
}

export function evaluateCableRun(run: CableRun, o: CableRunOptions): CableRunResult {
  const warnings: PlanWarning[] = [];
  const cautions: Caution[] = [];
  const evaluation = checkCableRun(run, o, warnings, cautions);
  const reason = deliveredReason(evaluation, o.units);
  return { evaluation, reasons: reason === null ? [] : [reason], warnings, cautions };
}

/**
 * The checks of `evaluateCableRun`, adding the run's warnings and cautions (each caution once)
 * to the caller's lists. Its reason, if any, is `deliveredReason(evaluation, units)`.
 */
export function checkCableRun(run: CableRun, o: CableRunOptions, warnings: PlanWarning[], cautions: Caution[]): CableRunEvaluation {
  const f = measureCableRun(run, o, new RunFigures());
  addCableWarnings(f.warnings, run, o, f, warnings);
  if ((f.cautions & C.no_cca) !== 0) addCaution(cautions, CAUTIONS.no_cca);
  if ((f.cautions & C.outdoor_runs) !== 0) addCaution(cautions, CAUTIONS.outdoor_runs);
  if ((f.cautions & C.bundling) !== 0) addCaution(cautions, CAUTIONS.bundling);
  return cableRunEvaluation(run, o, f);
}

/**
 * Every figure of one run's checks, unrounded, with the warnings (bits of `W`) and cautions
 * (bits of `C`) they raise. Working a run out into these figures makes no objects, so the site
 * rules can check thousands of runs and build the result records only when they are read.
 */
export class RunFigures {
  gauge: AwgGauge = 23;
  gaugeAssumed = false;
  channelM = 0;
  ohmPerM = 0;
  loopOhm = 0;
  withinPermanentLink = true;
  withinChannel = true;
  /** The PoE checks below were made (o.poe was given). */
  hasPoe = false;
  poeClass: PoeClass = 0;
  poeType: PoeType = 1;
  pairs: 2 | 4 = 2;
  pseVoltageMinV = 0;
  pdVoltageMinV = 0;
  /** The run at full class power, and whether the PD still gets its class power and minimum voltage. */
  readonly atClass = new OperatingPoint();
  meetsClassPower = true;
  meetsMinVoltage = true;
  /** The run at the expected load, and whether the PD still gets its minimum voltage. */
  readonly atLoad = new OperatingPoint();
  loadMeetsMinVoltage = true;
  /** The passive PoE check was made (o.passive was given). */
  hasPassive = false;
  passiveCurrentA = 0;
  passiveDropV = 0;
  passiveDropFraction = 0;
  /** Power can be delivered over this run within the standard. */
  ok = true;
  warnings = 0;
  cautions = 0;
}

/** Work out the checks of `run` into `f` (which is returned). */
export function measureCableRun(run: CableRun, o: CableRunOptions, f: RunFigures): RunFigures {
  const want = o.poe;
  const pass = o.passive;
  return measureRun(
    run, o.temperatureC, o.cordAllowanceM, o.outdoor === true,
    want ? want.poeClass : -1, want ? want.poeType : 1, want ? want.pdLoadW : 0, pass ? pass.volts : 0, pass ? pass.loadW : 0, f,
  );
}

/**
 * `measureCableRun` with the options spelled out, so that checking a run makes no objects:
 * a PoE check at `poeClass` (−1 for none) with `pdLoadW` at the device, a passive check at
 * `passiveVolts` (0 for none) with `passiveLoadW`.
 */
export function measureRun(
  run: CableRun, temperatureC: number, cordAllowanceM: number, outdoor: boolean,
  poeClass: number, poeType: PoeType, pdLoadW: number, passiveVolts: number, passiveLoadW: number, f: RunFigures,
): RunFigures {
  const lengthM = run.lengthM;
  const gaugeAssumed = run.gauge === undefined;
  const gauge: AwgGauge = gaugeAssumed ? DEFAULT_GAUGE[run.category] : run.gauge!;
  const channelM = lengthM + cordAllowanceM;
  const ohmPerM = conductorOhmPerM(gauge, temperatureC, run.cca);
  const loopOhm = pairsetLoopOhm(ohmPerM, channelM);
  const withinPermanentLink = lengthM <= CHANNEL_LIMITS.permanentLinkMaxM + EPS;
  const withinChannel = channelM <= CHANNEL_LIMITS.channelMaxM + EPS;
  let warnings = 0;
  let cautions = 0;
  if (!withinChannel) warnings |= W.channel_over_100m;
  else if (!withinPermanentLink) warnings |= W.link_over_90m;
  if (run.cca) {
    warnings |= W.cca_cable;
    cautions |= C.no_cca;
  }
  if (gauge === 26) warnings |= W.thin_gauge;
  if (outdoor) cautions |= C.outdoor_runs;
  f.gauge = gauge;
  f.gaugeAssumed = gaugeAssumed;
  f.channelM = channelM;
  f.ohmPerM = ohmPerM;
  f.loopOhm = loopOhm;
  f.withinPermanentLink = withinPermanentLink;
  f.withinChannel = withinChannel;
  let ok = withinChannel;

  f.hasPoe = poeClass >= 0;
  if (poeClass >= 0) {
    const cls = POE_CLASSES[poeClass as PoeClass];
    const spec = POE_TYPES[poeType];
    const pairs = cls.pairs;
    const v = spec.pseVoltageMinV;
    const pdVoltageMinV = spec.pdVoltageMinV;
    const atClass = atPsePower(f.atClass, cls.psePowerW, v, loopOhm, pairs);
    const atLoad = atPdLoad(f.atLoad, pdLoadW, v, loopOhm, pairs);
    const meetsClassPower = atClass.pdPowerW >= cls.pdMaxW - EPS;
    const meetsMinVoltage = atClass.pdVoltageV >= pdVoltageMinV - EPS;
    const loadMeetsMinVoltage = atLoad.feasible && atLoad.pdVoltageV >= pdVoltageMinV - EPS;
    f.poeClass = cls.poeClass;
    f.poeType = poeType;
    f.pairs = pairs;
    f.pseVoltageMinV = v;
    f.pdVoltageMinV = pdVoltageMinV;
    f.meetsClassPower = meetsClassPower;
    f.meetsMinVoltage = meetsMinVoltage;
    f.loadMeetsMinVoltage = loadMeetsMinVoltage;
    const delivers = meetsClassPower && meetsMinVoltage && loadMeetsMinVoltage;
    ok = ok && delivers;
    if (!delivers) warnings |= W.cable_cannot_carry;
    if (poeType >= 3) {
      cautions |= C.bundling;
      if (run.category !== TSB_184_A.newBuildCategory) warnings |= W.cat6a_recommended;
    }
    if (cls.psePowerW > NEC_725_144_THRESHOLD_W) warnings |= W.nec_725_144;
  }

  f.hasPassive = passiveVolts > 0;
  if (passiveVolts > 0) {
    // Passive PoE is usually fed on the spare pairs only (one pairset). [MEMORY] pinout; I ≈ P / V.
    const currentA = passiveLoadW / passiveVolts;
    const dropV = currentA * loopOhm;
    const dropFraction = dropV / passiveVolts;
    f.passiveCurrentA = currentA;
    f.passiveDropV = dropV;
    f.passiveDropFraction = dropFraction;
    if (dropFraction > PLANNING.passiveDropWarnFraction.value) warnings |= W.passive_voltage_drop;
  }
  f.ok = ok;
  f.warnings = warnings;
  f.cautions = cautions;
  return f;
}

/** The problem codes of a run, e.g. "channel_over_100m", "cca", "pd_voltage_low". */
function problemsOf(run: CableRun, f: RunFigures): string[] {
  const problems: string[] = [];
  if (!f.withinChannel) problems.push('channel_over_100m');
  else if (!f.withinPermanentLink) problems.push('link_over_90m');
  if (run.cca) problems.push('cca');
  if (f.gauge === 26) problems.push('thin_gauge');
  if (f.hasPoe) {
    if (!f.meetsClassPower) problems.push('class_power_short');
    if (!f.meetsMinVoltage || !f.loadMeetsMinVoltage) problems.push('pd_voltage_low');
  }
  if ((f.warnings & W.passive_voltage_drop) !== 0) problems.push('passive_drop');
  return problems;
}

/** The result record of a run measured into `f`, rounded for display. */
export function cableRunEvaluation(run: CableRun, o: CableRunOptions, f: RunFigures): CableRunEvaluation {
  let poe: CablePoeCheck | null = null;
  if (f.hasPoe) {
    const want = o.poe!;
    const cls = POE_CLASSES[f.poeClass];
    const atClassPower: CableAtClassPower = {
      psePowerW: cls.psePowerW,
      currentA: roundTo(f.atClass.currentA, 4),
      currentPerPairsetA: roundTo(f.pairs === 4 ? f.atClass.currentA / 2 : f.atClass.currentA, 4),
      currentPerConductorA: roundTo((f.pairs === 4 ? f.atClass.currentA / 2 : f.atClass.currentA) / 2, 4),
      lossW: roundTo(f.atClass.lossW, 3),
      pdPowerW: roundTo(f.atClass.pdPowerW, 3),
      pdVoltageV: roundTo(f.atClass.pdVoltageV, 3),
      meetsClassPower: f.meetsClassPower,
      meetsMinVoltage: f.meetsMinVoltage,
    };
    const atExpectedLoad: CableAtExpectedLoad = {
      pdLoadW: roundTo(want.pdLoadW, 3),
      feasible: f.atLoad.feasible,
      currentA: roundTo(f.atLoad.currentA, 4),
      lossW: roundTo(f.atLoad.lossW, 3),
      psePowerW: roundTo(f.atLoad.psePowerW, 3),
      pdVoltageV: roundTo(f.atLoad.pdVoltageV, 3),
      meetsMinVoltage: f.loadMeetsMinVoltage,
    };
    poe = {
      poeClass: f.poeClass, poeType: f.poeType, pairs: f.pairs, pseVoltageMinV: f.pseVoltageMinV, pdVoltageMinV: f.pdVoltageMinV,
      atClassPower, atExpectedLoad,
    };
  }
  let passive: CablePassiveCheck | null = null;
  if (f.hasPassive) {
    const volts = o.passive!.volts;
    passive = {
      volts,
      currentA: roundTo(f.passiveCurrentA, 4),
      dropV: roundTo(f.passiveDropV, 3),
      deviceVolts: roundTo(volts - f.passiveDropV, 3),
      dropFraction: roundTo(f.passiveDropFraction, 4),
    };
  }
  return {
    deviceId: o.deviceId,
    lengthM: run.lengthM,
    cordAllowanceM: o.cordAllowanceM,
    channelM: roundTo(f.channelM, 2),
    category: run.category,
    gauge: f.gauge,
    gaugeAssumed: f.gaugeAssumed,
    cca: run.cca,
    temperatureC: o.temperatureC,
    conductorOhmPerM: roundTo(f.ohmPerM, 6),
    loopOhm: roundTo(f.loopOhm, 4),
    withinPermanentLink: f.withinPermanentLink,
    withinChannel: f.withinChannel,
    poe,
    passive,
    ok: f.ok,
    problems: problemsOf(run, f),
  };
}

/** Add the warnings of the cable bits in `bits` for a run measured into `f`, in bit order. */
export function addCableWarnings(bits: number, run: CableRun, o: CableRunOptions, f: RunFigures, into: PlanWarning[]): void {
  if ((bits & CABLE_WARNINGS) === 0) return;
  const u = o.units;
  const deviceId = o.deviceId;
  const lengthM = run.lengthM;
  const channelM = f.channelM;
  if ((bits & W.channel_over_100m) !== 0) {
    into.push(cableWarning('channel_over_100m', 'error', deviceId, () =>
      `The cable run is ${formatLength(lengthM, u)}; with its patch cords the channel is ${formatLength(channelM, u)}, longer than the ${formatLength(CHANNEL_LIMITS.channelMaxM, u)} a network channel may be (at most ${formatLength(CHANNEL_LIMITS.permanentLinkMaxM, u)} of fixed cable plus cords). Put a small switch closer or find a shorter route.`));
  }
  if ((bits & W.link_over_90m) !== 0) {
    into.push(cableWarning('link_over_90m', 'warning', deviceId, () =>
      `The fixed cable is ${formatLength(lengthM, u)}, more than the ${formatLength(CHANNEL_LIMITS.permanentLinkMaxM, u)} the cabling standard allows for it; it works only with very short cords and should be tested after installation.`));
  }
  if ((bits & W.cca_cable) !== 0) into.push({ code: 'cca_cable', severity: 'error', deviceId, message: CCA_MESSAGE });
  if ((bits & W.thin_gauge) !== 0) into.push({ code: 'thin_gauge', severity: 'warning', deviceId, message: THIN_GAUGE_MESSAGE });
  if ((bits & W.cable_cannot_carry) !== 0) {
    const poeClass = f.poeClass;
    const cls = POE_CLASSES[poeClass];
    const pdPowerW = f.atClass.pdPowerW;
    const pdVoltageV = f.atClass.pdVoltageV;
    const pdVoltageMinV = f.pdVoltageMinV;
    into.push(cableWarning('cable_cannot_carry', 'error', deviceId, () =>
      `This cable cannot guarantee Class ${poeClass} power: at full load the device would get ${formatWatts(pdPowerW)} at ${formatVolts(pdVoltageV)} (it needs ${formatWatts(cls.pdMaxW)} and at least ${formatVolts(pdVoltageMinV)}). A shorter run or thicker solid-copper cable fixes this.`));
  }
  if ((bits & W.cat6a_recommended) !== 0) {
    into.push({ code: 'cat6a_recommended', severity: 'info', deviceId, message: CAT6A_MESSAGE[run.category] });
  }
  if ((bits & W.nec_725_144) !== 0) into.push({ code: 'nec_725_144', severity: 'info', deviceId, message: NEC_MESSAGE });
  if ((bits & W.passive_voltage_drop) !== 0) {
    const volts = o.passive!.volts;
    const dropV = f.passiveDropV;
    const dropFraction = f.passiveDropFraction;
    into.push(cableWarning('passive_voltage_drop', 'warning', deviceId, () =>
      `The cable drops about ${formatVolts(dropV)} of the ${formatVolts(volts)} passive supply (${formatPercent(dropFraction)}); the device may reset under load. Check its allowed input range.`));
  }
}

/**
 * The run's reason when PoE gets through ("Over 55 m of Cat 6 … the device can draw the full …"),
 * else null. Worked out again from the run's own inputs, which the evaluation keeps unrounded.
 */
export function deliveredReason(c: CableRunEvaluation, u: UnitSystem): string | null {
  const poe = c.poe;
  // A run too long for a network cable delivers nothing worth promising, whatever the arithmetic says.
  if (!c.withinChannel || poe === null || !(poe.atClassPower.meetsClassPower && poe.atClassPower.meetsMinVoltage && poe.atExpectedLoad.meetsMinVoltage)) {
    return null;
  }
  const channelM = c.lengthM + c.cordAllowanceM;
  const loopOhm = pairsetLoopOhm(conductorOhmPerM(c.gauge, c.temperatureC, c.cca), channelM);
  const cls = POE_CLASSES[poe.poeClass];
  const atClass = lossAtPsePower(cls.psePowerW, poe.pseVoltageMinV, loopOhm, cls.pairs);
  const category = CABLE_CATEGORY_NAMES[c.category];
  // The length said is the one typed, with the cords the rules add to it named as such.
  const over = c.cordAllowanceM > 0
    ? `its ${formatLength(c.lengthM, u)} run and ${formatLength(c.cordAllowanceM, u)} of patch cords (${formatLength(channelM, u)} of ${category}, loop resistance ${formatOhms(loopOhm)})`
    : `its ${formatLength(c.lengthM, u)} run of ${category} (loop resistance ${formatOhms(loopOhm)})`;
  return `Over ${over}, the cable loses at most ${formatWatts(atClass.lossW)} of the port's ${formatWatts(cls.psePowerW)}, so the device can draw the full ${formatWatts(cls.pdMaxW)} of Class ${cls.poeClass}, at ${formatVolts(atClass.pdVoltageV)} or more (it needs at least ${formatVolts(poe.pdVoltageMinV)}).`;
}

/** Gauge used for a run (captured, or the category default). */
export function runGauge(run: CableRun): AwgGauge {
  return run.gauge ?? DEFAULT_GAUGE[run.category];
}

