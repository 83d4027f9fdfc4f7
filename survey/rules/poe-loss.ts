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

/** The PSE puts out `psePowerW` at `pseVoltageV`: what reaches the PD? */
export function lossAtPsePower(psePowerW: number, pseVoltageV: number, loopOhmPerPairset: number, pairs: 2 | 4): LossAtPsePower {
  const rEff = effectiveResistance(loopOhmPerPairset, pairs);
  const currentA = psePowerW / pseVoltageV;
  const lossW = currentA * currentA * rEff;
  return {
    psePowerW,
    currentA,
    currentPerPairsetA: pairs === 4 ? currentA / 2 : currentA,
    lossW,
    pdPowerW: psePowerW - lossW,
    pdVoltageV: pseVoltageV - currentA * rEff,
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
  const maxDeliverableW = rEff > 0 ? (pseVoltageV * pseVoltageV) / (4 * rEff) : Infinity;
  const disc = pseVoltageV * pseVoltageV - 4 * rEff * pdLoadW;
  if (disc < 0) {
    // Beyond the maximum-power-transfer point: report the operating point at the
    // limit (I = V / 2R) so that nothing is NaN, and mark it infeasible.
    const currentA = pseVoltageV / (2 * rEff);
    const lossW = currentA * currentA * rEff;
    return {
      feasible: false, pdLoadW, currentA,
      currentPerPairsetA: pairs === 4 ? currentA / 2 : currentA,
      lossW, psePowerW: pseVoltageV * currentA, pdVoltageV: pseVoltageV / 2, maxDeliverableW,
    };
  }
  const currentA = (2 * pdLoadW) / (pseVoltageV + Math.sqrt(disc));
  const lossW = currentA * currentA * rEff;
  return {
    feasible: true, pdLoadW, currentA,
    currentPerPairsetA: pairs === 4 ? currentA / 2 : currentA,
    lossW, psePowerW: pdLoadW + lossW, pdVoltageV: pseVoltageV - currentA * rEff, maxDeliverableW,
  };
}
