/**
 * Cable loss arithmetic for PoE (facts §1.4, Ohm's law; the method is published in S4).
 *
 * 2-pair:  I = P_PSE / V_PSE;  V_PD = V_PSE − I·R_loop;  P_loss = I²·R_loop.
 * 4-pair:  two pairsets in parallel carry I/2 each:
 *          P_loss = 2·(I/2)²·R_loop = I²·(R_loop/2);  V_PD = V_PSE − (I/2)·R_loop.
 * Both are the 2-pair formulas with an effective resistance R_eff = R_loop (2-pair)
 * or R_loop/2 (4-pair), and V_PD = V_PSE − I·R_eff, P_PD = V_PD·I = P_PSE − P_loss.
 *
 * Inverse (PD load known): I = (V − √(V² − 4·R_eff·P_PD)) / (2·R_eff), computed in the
 * equivalent, numerically stable form I = 2·P_PD / (V + √(V² − 4·R_eff·P_PD)).
 * [DERIVED]
 */

export function effectiveResistance(loopOhmPerPairset: number, pairs: 2 | 4): number {
  return pairs === 4 ? loopOhmPerPairset / 2 : loopOhmPerPairset;
}

export interface LossAtPsePower {
  readonly psePowerW: number;
  /** Total current out of the port (A). */
  readonly currentA: number;
  readonly currentPerPairsetA: number;
  readonly lossW: number;
  readonly pdPowerW: number;
  readonly pdVoltageV: number;
}

/**
 * One operating point of a run, filled in place by `atPsePower` and `atPdLoad`, so that a loop
 * over thousands of runs makes no objects. `lossAtPsePower` and `drawForPdLoad` return the same
 * figures as records.
 */
export class OperatingPoint {
  /** False when the cable cannot carry the load at this voltage at all (V² < 4·R_eff·P). */
  feasible = true;
  psePowerW = 0;
  /** The load at the PD (W), when it was given (`atPdLoad`). */
  pdLoadW = 0;
  /** Total current out of the port (A). */
  currentA = 0;
  lossW = 0;
  /** Power at the PD (W): P_PSE − P_loss. */
  pdPowerW = 0;
  pdVoltageV = 0;
}

/** The PSE puts out `psePowerW` at `pseVoltageV`: what reaches the PD? (into `out`) */
export function atPsePower(out: OperatingPoint, psePowerW: number, pseVoltageV: number, loopOhmPerPairset: number, pairs: 2 | 4): OperatingPoint {
  const rEff = effectiveResistance(loopOhmPerPairset, pairs);
  const currentA = psePowerW / pseVoltageV;
  const lossW = currentA * currentA * rEff;
  out.feasible = true;
  out.psePowerW = psePowerW;
  out.currentA = currentA;
  out.lossW = lossW;
  out.pdPowerW = psePowerW - lossW;
  out.pdVoltageV = pseVoltageV - currentA * rEff;
  return out;
}

/** The PD draws `pdLoadW`: how much must the PSE put out, and what voltage does the PD see? (into `out`) */
export function atPdLoad(out: OperatingPoint, pdLoadW: number, pseVoltageV: number, loopOhmPerPairset: number, pairs: 2 | 4): OperatingPoint {
  const rEff = effectiveResistance(loopOhmPerPairset, pairs);
  const disc = pseVoltageV * pseVoltageV - 4 * rEff * pdLoadW;
  out.pdLoadW = pdLoadW;
  out.pdPowerW = pdLoadW;
  if (disc < 0) {
    // Beyond the maximum-power-transfer point: report the operating point at the
    // limit (I = V / 2R) so that nothing is NaN, and mark it infeasible.
    const currentA = pseVoltageV / (2 * rEff);
    out.feasible = false;
    out.currentA = currentA;
    out.lossW = currentA * currentA * rEff;
    out.psePowerW = pseVoltageV * currentA;
    out.pdVoltageV = pseVoltageV / 2;
    return out;
  }
  const currentA = (2 * pdLoadW) / (pseVoltageV + Math.sqrt(disc));
  const lossW = currentA * currentA * rEff;
  out.feasible = true;
  out.currentA = currentA;
  out.lossW = lossW;
  out.psePowerW = pdLoadW + lossW;
  out.pdVoltageV = pseVoltageV - currentA * rEff;
  return out;
}

/** The PSE puts out `psePowerW` at `pseVoltageV`: what reaches the PD? */
export function lossAtPsePower(psePowerW: number, pseVoltageV: number, loopOhmPerPairset: number, pairs: 2 | 4): LossAtPsePower {
  const a = atPsePower(new OperatingPoint(), psePowerW, pseVoltageV, loopOhmPerPairset, pairs);
  return {
    psePowerW,
    currentA: a.currentA,
    currentPerPairsetA: pairs === 4 ? a.currentA / 2 : a.currentA,
    lossW: a.lossW,
    pdPowerW: a.pdPowerW,
    pdVoltageV: a.pdVoltageV,
  };
}

export interface DrawForPdLoad {
  /** False when the cable cannot carry this load at this voltage at all (V² < 4·R_eff·P). */
  readonly feasible: boolean;
  readonly pdLoadW: number;
  readonly currentA: number;
  readonly currentPerPairsetA: number;
  readonly lossW: number;
  /** P_PSE = P_PD + P_loss. */
  readonly psePowerW: number;
  readonly pdVoltageV: number;
  /** The most this cable could ever deliver at this voltage, V²/(4·R_eff) (W); Infinity for a 0 Ω loop. */
  readonly maxDeliverableW: number;
}

/** The PD draws `pdLoadW`: how much must the PSE put out, and what voltage does the PD see? */
export function drawForPdLoad(pdLoadW: number, pseVoltageV: number, loopOhmPerPairset: number, pairs: 2 | 4): DrawForPdLoad {
  const rEff = effectiveResistance(loopOhmPerPairset, pairs);
  const e = atPdLoad(new OperatingPoint(), pdLoadW, pseVoltageV, loopOhmPerPairset, pairs);
  return {
    feasible: e.feasible, pdLoadW, currentA: e.currentA,
    currentPerPairsetA: pairs === 4 ? e.currentA / 2 : e.currentA,
    lossW: e.lossW, psePowerW: e.psePowerW, pdVoltageV: e.pdVoltageV,
    maxDeliverableW: rEff > 0 ? (pseVoltageV * pseVoltageV) / (4 * rEff) : Infinity,
  };
}
