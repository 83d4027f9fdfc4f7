import { conductorOhmPerM, pairsetLoopOhm, type AwgGauge } from '../standards/awg';
import {
  CABLE_CATEGORY_NAMES, CHANNEL_LIMITS, DEFAULT_GAUGE, NEC_725_144_THRESHOLD_W, TSB_184_A,
} from '../standards/cabling';
import { CAUTIONS, type Caution } from '../standards/cautions';
import { PLANNING } from '../standards/planning-defaults';
import { POE_CLASSES, type PoeClass } from '../standards/poe-classes';
import { POE_TYPES, type PoeType } from '../standards/poe-types';
import type { CableRun } from '../model/device';
import { formatLength, formatOhms, formatPercent, formatVolts, formatWatts, roundTo, type UnitSystem } from '../units';
import { drawForPdLoad, lossAtPsePower } from './poe-loss';
import type { CablePassiveCheck, CablePoeCheck, CableRunEvaluation, PlanWarning } from './result-types';

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

export function evaluateCableRun(run: CableRun, o: CableRunOptions): CableRunResult {
  const reasons: string[] = [];
  const warnings: PlanWarning[] = [];
  const cautions: Caution[] = [];
  const problems: string[] = [];
  const u = o.units;
  const deviceId = o.deviceId;

  const gauge: AwgGauge = run.gauge ?? DEFAULT_GAUGE[run.category];
  const gaugeAssumed = run.gauge === undefined;
  const channelM = run.lengthM + o.cordAllowanceM;
  const ohmPerM = conductorOhmPerM(gauge, o.temperatureC, run.cca);
  const loopOhm = pairsetLoopOhm(ohmPerM, channelM);
  const withinPermanentLink = run.lengthM <= CHANNEL_LIMITS.permanentLinkMaxM + EPS;
  const withinChannel = channelM <= CHANNEL_LIMITS.channelMaxM + EPS;
  const catName = CABLE_CATEGORY_NAMES[run.category];

  if (!withinChannel) {
    problems.push('channel_over_100m');
    warnings.push({
      code: 'channel_over_100m', severity: 'error', deviceId,
      message: `The cable run is ${formatLength(run.lengthM, u)} (${formatLength(channelM, u)} with cords), longer than the ${formatLength(CHANNEL_LIMITS.channelMaxM, u)} a network cable may be. Put a small switch closer or find a shorter route.`,
    });
  } else if (!withinPermanentLink) {
    problems.push('link_over_90m');
    warnings.push({
      code: 'link_over_90m', severity: 'warning', deviceId,
      message: `The fixed cable is ${formatLength(run.lengthM, u)}, more than the ${formatLength(CHANNEL_LIMITS.permanentLinkMaxM, u)} the cabling standard allows for it; it works only with very short cords and should be tested after installation.`,
    });
  }
  if (run.cca) {
    problems.push('cca');
    cautions.push(CAUTIONS.no_cca);
    warnings.push({
      code: 'cca_cable', severity: 'error', deviceId,
      message: 'This run is copper-clad aluminium (CCA): not compliant for network cable and about 1.5 times the resistance of copper. Replace it with solid copper cable.',
    });
  }
  if (gauge === 26) {
    problems.push('thin_gauge');
    warnings.push({
      code: 'thin_gauge', severity: 'warning', deviceId,
      message: '26 AWG is patch-cord wire; fixed runs should be 22–24 AWG solid copper.',
    });
  }
  if (o.outdoor) cautions.push(CAUTIONS.outdoor_runs);

  let poe: CablePoeCheck | null = null;
  let passive: CablePassiveCheck | null = null;
  let ok = withinChannel;

  if (o.poe) {
    const spec = POE_TYPES[o.poe.poeType];
    const cls = POE_CLASSES[o.poe.poeClass];
    const pairs = cls.pairs;
    const v = spec.pseVoltageMinV;
    const atClass = lossAtPsePower(cls.psePowerW, v, loopOhm, pairs);
    const exp = drawForPdLoad(o.poe.pdLoadW, v, loopOhm, pairs);
    const meetsClassPower = atClass.pdPowerW >= cls.pdMaxW - EPS;
    const meetsMinVoltage = atClass.pdVoltageV >= spec.pdVoltageMinV - EPS;
    const expMeetsV = exp.feasible && exp.pdVoltageV >= spec.pdVoltageMinV - EPS;
    poe = {
      poeClass: o.poe.poeClass,
      poeType: o.poe.poeType,
      pairs,
      pseVoltageMinV: v,
      pdVoltageMinV: spec.pdVoltageMinV,
      atClassPower: {
        psePowerW: cls.psePowerW,
        currentA: roundTo(atClass.currentA, 4),
        currentPerPairsetA: roundTo(atClass.currentPerPairsetA, 4),
        currentPerConductorA: roundTo(atClass.currentPerPairsetA / 2, 4),
        lossW: roundTo(atClass.lossW, 3),
        pdPowerW: roundTo(atClass.pdPowerW, 3),
        pdVoltageV: roundTo(atClass.pdVoltageV, 3),
        meetsClassPower,
        meetsMinVoltage,
      },
      atExpectedLoad: {
        pdLoadW: roundTo(exp.pdLoadW, 3),
        feasible: exp.feasible,
        currentA: roundTo(exp.currentA, 4),
        lossW: roundTo(exp.lossW, 3),
        psePowerW: roundTo(exp.psePowerW, 3),
        pdVoltageV: roundTo(exp.pdVoltageV, 3),
        meetsMinVoltage: expMeetsV,
      },
    };
    if (!meetsClassPower) problems.push('class_power_short');
    if (!meetsMinVoltage || !expMeetsV) problems.push('pd_voltage_low');
    ok = ok && meetsClassPower && meetsMinVoltage && expMeetsV;

    if (meetsClassPower && meetsMinVoltage && expMeetsV) {
      reasons.push(
        `Over ${formatLength(channelM, u)} of ${catName} (loop resistance ${formatOhms(loopOhm)}), the cable loses at most ${formatWatts(atClass.lossW)}; the device still gets ${formatWatts(atClass.pdPowerW)} at ${formatVolts(atClass.pdVoltageV)} (it needs at least ${formatVolts(spec.pdVoltageMinV)}).`,
      );
    } else {
      warnings.push({
        code: 'cable_cannot_carry', severity: 'error', deviceId,
        message: `This cable cannot guarantee Class ${o.poe.poeClass} power: at full load the device would get ${formatWatts(atClass.pdPowerW)} at ${formatVolts(atClass.pdVoltageV)} (it needs ${formatWatts(cls.pdMaxW)} and at least ${formatVolts(spec.pdVoltageMinV)}). A shorter run or thicker solid-copper cable fixes this.`,
      });
    }
    if (o.poe.poeType >= 3) {
      cautions.push(CAUTIONS.bundling);
      if (run.category !== TSB_184_A.newBuildCategory) {
        warnings.push({
          code: 'cat6a_recommended', severity: 'info', deviceId,
          message: `High-power PoE (802.3bt) on ${catName}: Cat 6A is recommended for new cable (TSB-184-A); keep this cable out of tight bundles.`,
        });
      }
    }
    if (cls.psePowerW > NEC_725_144_THRESHOLD_W) {
      warnings.push({
        code: 'nec_725_144', severity: 'info', deviceId,
        message: `This port puts out more than ${NEC_725_144_THRESHOLD_W} W: bundle sizes must be checked against NEC Table 725.144, or use LP-rated cable.`,
      });
    }
  }

  if (o.passive) {
    // Passive PoE is usually fed on the spare pairs only (one pairset). [MEMORY] pinout; I ≈ P / V.
    const currentA = o.passive.loadW / o.passive.volts;
    const dropV = currentA * loopOhm;
    const deviceVolts = o.passive.volts - dropV;
    const dropFraction = dropV / o.passive.volts;
    passive = {
      volts: o.passive.volts,
      currentA: roundTo(currentA, 4),
      dropV: roundTo(dropV, 3),
      deviceVolts: roundTo(deviceVolts, 3),
      dropFraction: roundTo(dropFraction, 4),
    };
    if (dropFraction > PLANNING.passiveDropWarnFraction.value) {
      problems.push('passive_drop');
      warnings.push({
        code: 'passive_voltage_drop', severity: 'warning', deviceId,
        message: `The cable drops about ${formatVolts(dropV)} of the ${formatVolts(o.passive.volts)} passive supply (${formatPercent(dropFraction)}); the device may reset under load. Check its allowed input range.`,
      });
    }
  }

  const evaluation: CableRunEvaluation = {
    deviceId,
    lengthM: run.lengthM,
    cordAllowanceM: o.cordAllowanceM,
    channelM: roundTo(channelM, 2),
    category: run.category,
    gauge,
    gaugeAssumed,
    cca: run.cca,
    temperatureC: o.temperatureC,
    conductorOhmPerM: roundTo(ohmPerM, 6),
    loopOhm: roundTo(loopOhm, 4),
    withinPermanentLink,
    withinChannel,
    poe,
    passive,
    ok,
    problems,
  };
  return { evaluation, reasons, warnings, cautions };
}

/** Gauge used for a run (captured, or the category default). */
export function runGauge(run: CableRun): AwgGauge {
  return run.gauge ?? DEFAULT_GAUGE[run.category];
}

