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
import { drawForPdLoad, lossAtPsePower } from './poe-loss';
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

/**
 * The problem codes of the run being checked. Runs are checked one at a time, so the list is
 * reused and each evaluation keeps an exact-size copy (a fresh list would grow to room for 17).
 */
const foundProblems: string[] = [];

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
  const problems = foundProblems;
  problems.length = 0;
  const u = o.units;
  const deviceId = o.deviceId;
  const lengthM = run.lengthM;
  const category = run.category;
  const cca = run.cca;

  const gaugeAssumed = run.gauge === undefined;
  const gauge: AwgGauge = gaugeAssumed ? DEFAULT_GAUGE[category] : run.gauge!;
  const channelM = lengthM + o.cordAllowanceM;
  const ohmPerM = conductorOhmPerM(gauge, o.temperatureC, cca);
  const loopOhm = pairsetLoopOhm(ohmPerM, channelM);
  const withinPermanentLink = lengthM <= CHANNEL_LIMITS.permanentLinkMaxM + EPS;
  const withinChannel = channelM <= CHANNEL_LIMITS.channelMaxM + EPS;

  if (!withinChannel) {
    problems.push('channel_over_100m');
    warnings.push(cableWarning('channel_over_100m', 'error', deviceId, () =>
      `The cable run is ${formatLength(lengthM, u)} (${formatLength(channelM, u)} with cords), longer than the ${formatLength(CHANNEL_LIMITS.channelMaxM, u)} a network cable may be. Put a small switch closer or find a shorter route.`));
  } else if (!withinPermanentLink) {
    problems.push('link_over_90m');
    warnings.push(cableWarning('link_over_90m', 'warning', deviceId, () =>
      `The fixed cable is ${formatLength(lengthM, u)}, more than the ${formatLength(CHANNEL_LIMITS.permanentLinkMaxM, u)} the cabling standard allows for it; it works only with very short cords and should be tested after installation.`));
  }
  if (cca) {
    problems.push('cca');
    addCaution(cautions, CAUTIONS.no_cca);
    warnings.push({ code: 'cca_cable', severity: 'error', deviceId, message: CCA_MESSAGE });
  }
  if (gauge === 26) {
    problems.push('thin_gauge');
    warnings.push({ code: 'thin_gauge', severity: 'warning', deviceId, message: THIN_GAUGE_MESSAGE });
  }
  if (o.outdoor) addCaution(cautions, CAUTIONS.outdoor_runs);

  let poe: CablePoeCheck | null = null;
  let passive: CablePassiveCheck | null = null;
  let ok = withinChannel;

  const want = o.poe;
  if (want) {
    const poeClass = want.poeClass;
    const poeType = want.poeType;
    const spec = POE_TYPES[poeType];
    const cls = POE_CLASSES[poeClass];
    const pairs = cls.pairs;
    const v = spec.pseVoltageMinV;
    const pdVoltageMinV = spec.pdVoltageMinV;
    const atClassPower = atClassPowerCheck(cls.psePowerW, cls.pdMaxW, v, pdVoltageMinV, loopOhm, pairs);
    const atExpectedLoad = atExpectedLoadCheck(want.pdLoadW, v, pdVoltageMinV, loopOhm, pairs);
    const meetsClassPower = atClassPower.meetsClassPower;
    const meetsMinVoltage = atClassPower.meetsMinVoltage;
    const expMeetsV = atExpectedLoad.meetsMinVoltage;
    poe = { poeClass, poeType, pairs, pseVoltageMinV: v, pdVoltageMinV, atClassPower, atExpectedLoad };
    if (!meetsClassPower) problems.push('class_power_short');
    if (!meetsMinVoltage || !expMeetsV) problems.push('pd_voltage_low');
    ok = ok && meetsClassPower && meetsMinVoltage && expMeetsV;

    if (!(meetsClassPower && meetsMinVoltage && expMeetsV)) {
      warnings.push(cableWarning('cable_cannot_carry', 'error', deviceId, () => {
        const atClass = lossAtPsePower(cls.psePowerW, v, loopOhm, pairs);
        return `This cable cannot guarantee Class ${poeClass} power: at full load the device would get ${formatWatts(atClass.pdPowerW)} at ${formatVolts(atClass.pdVoltageV)} (it needs ${formatWatts(cls.pdMaxW)} and at least ${formatVolts(pdVoltageMinV)}). A shorter run or thicker solid-copper cable fixes this.`;
      }));
    }
    if (poeType >= 3) {
      addCaution(cautions, CAUTIONS.bundling);
      if (category !== TSB_184_A.newBuildCategory) {
        warnings.push({ code: 'cat6a_recommended', severity: 'info', deviceId, message: CAT6A_MESSAGE[category] });
      }
    }
    if (cls.psePowerW > NEC_725_144_THRESHOLD_W) {
      warnings.push({ code: 'nec_725_144', severity: 'info', deviceId, message: NEC_MESSAGE });
    }
  }

  const pass = o.passive;
  if (pass) {
    // Passive PoE is usually fed on the spare pairs only (one pairset). [MEMORY] pinout; I ≈ P / V.
    const volts = pass.volts;
    const currentA = pass.loadW / volts;
    const dropV = currentA * loopOhm;
    const deviceVolts = volts - dropV;
    const dropFraction = dropV / volts;
    passive = {
      volts,
      currentA: roundTo(currentA, 4),
      dropV: roundTo(dropV, 3),
      deviceVolts: roundTo(deviceVolts, 3),
      dropFraction: roundTo(dropFraction, 4),
    };
    if (dropFraction > PLANNING.passiveDropWarnFraction.value) {
      problems.push('passive_drop');
      warnings.push(cableWarning('passive_voltage_drop', 'warning', deviceId, () =>
        `The cable drops about ${formatVolts(dropV)} of the ${formatVolts(volts)} passive supply (${formatPercent(dropFraction)}); the device may reset under load. Check its allowed input range.`));
    }
  }

  return {
    deviceId,
    lengthM,
    cordAllowanceM: o.cordAllowanceM,
    channelM: roundTo(channelM, 2),
    category,
    gauge,
    gaugeAssumed,
    cca,
    temperatureC: o.temperatureC,
    conductorOhmPerM: roundTo(ohmPerM, 6),
    loopOhm: roundTo(loopOhm, 4),
    withinPermanentLink,
    withinChannel,
    poe,
    passive,
    ok,
    problems: problems.slice(),
  };
}

/** The run at full class power, with its checks (kept small so that the arithmetic's own objects are optimised away). */
function atClassPowerCheck(
  psePowerW: number, pdMaxW: number, pseVoltageV: number, pdVoltageMinV: number, loopOhm: number, pairs: 2 | 4,
): CableAtClassPower {
  const a = lossAtPsePower(psePowerW, pseVoltageV, loopOhm, pairs);
  return {
    psePowerW,
    currentA: roundTo(a.currentA, 4),
    currentPerPairsetA: roundTo(a.currentPerPairsetA, 4),
    currentPerConductorA: roundTo(a.currentPerPairsetA / 2, 4),
    lossW: roundTo(a.lossW, 3),
    pdPowerW: roundTo(a.pdPowerW, 3),
    pdVoltageV: roundTo(a.pdVoltageV, 3),
    meetsClassPower: a.pdPowerW >= pdMaxW - EPS,
    meetsMinVoltage: a.pdVoltageV >= pdVoltageMinV - EPS,
  };
}

/** The run at the expected load, with its voltage check. */
function atExpectedLoadCheck(pdLoadW: number, pseVoltageV: number, pdVoltageMinV: number, loopOhm: number, pairs: 2 | 4): CableAtExpectedLoad {
  const e = drawForPdLoad(pdLoadW, pseVoltageV, loopOhm, pairs);
  return {
    pdLoadW: roundTo(e.pdLoadW, 3),
    feasible: e.feasible,
    currentA: roundTo(e.currentA, 4),
    lossW: roundTo(e.lossW, 3),
    psePowerW: roundTo(e.psePowerW, 3),
    pdVoltageV: roundTo(e.pdVoltageV, 3),
    meetsMinVoltage: e.feasible && e.pdVoltageV >= pdVoltageMinV - EPS,
  };
}

/**
 * The run's reason when PoE gets through ("Over 55 m of Cat 6 … the device still gets …"),
 * else null. Worked out again from the run's own inputs, which the evaluation keeps unrounded.
 */
export function deliveredReason(c: CableRunEvaluation, u: UnitSystem): string | null {
  const poe = c.poe;
  if (poe === null || !(poe.atClassPower.meetsClassPower && poe.atClassPower.meetsMinVoltage && poe.atExpectedLoad.meetsMinVoltage)) {
    return null;
  }
  const channelM = c.lengthM + c.cordAllowanceM;
  const loopOhm = pairsetLoopOhm(conductorOhmPerM(c.gauge, c.temperatureC, c.cca), channelM);
  const cls = POE_CLASSES[poe.poeClass];
  const atClass = lossAtPsePower(cls.psePowerW, poe.pseVoltageMinV, loopOhm, cls.pairs);
  return `Over ${formatLength(channelM, u)} of ${CABLE_CATEGORY_NAMES[c.category]} (loop resistance ${formatOhms(loopOhm)}), the cable loses at most ${formatWatts(atClass.lossW)}; the device still gets ${formatWatts(atClass.pdPowerW)} at ${formatVolts(atClass.pdVoltageV)} (it needs at least ${formatVolts(poe.pdVoltageMinV)}).`;
}

/** Gauge used for a run (captured, or the category default). */
export function runGauge(run: CableRun): AwgGauge {
  return run.gauge ?? DEFAULT_GAUGE[run.category];
}

