import { confirmed, derived, fromMemory, type Provenance } from './source-marks';

export type AwgGauge = 22 | 23 | 24 | 26;
export const AWG_GAUGE_VALUES = [22, 23, 24, 26] as const;

const METRES_PER_KFT = 304.8; // 1000 ft = 304.8 m exactly

export interface AwgSpec {
  readonly gauge: AwgGauge;
  readonly diameterMm: number;
  /** Published DC resistance of one solid copper conductor at 20 °C (Ω per 1000 ft). */
  readonly ohmPerKft: number;
  /** Same, per metre (Ω/m) = ohmPerKft / 304.8. [DERIVED] */
  readonly ohmPerM: number;
  readonly provenance: Provenance;
}

function awg(gauge: AwgGauge, diameterMm: number, ohmPerKft: number, provenance: Provenance): AwgSpec {
  return { gauge, diameterMm, ohmPerKft, ohmPerM: ohmPerKft / METRES_PER_KFT, provenance };
}

/** Copper conductor resistance at 20 °C — HyperPhysics table (S18), Ω/km cross-check S19. */
export const AWG_TABLE: Readonly<Record<AwgGauge, AwgSpec>> = {
  22: awg(22, 0.6438, 16.14, confirmed(['S18', 'S19'])),
  23: awg(23, 0.5733, 20.36, confirmed(['S18', 'S19'])),
  24: awg(24, 0.5106, 25.67, confirmed(['S18', 'S19'])),
  26: awg(26, 0.4049, 40.81, confirmed(['S18'], 'thin patch-cord gauge')),
};

/** Annealed copper resistivity at 20 °C (Ω·m). */
export const COPPER_RESISTIVITY_OHM_M = 1.724e-8;
export const COPPER_RESISTIVITY_PROVENANCE = confirmed(['S18', 'S20']);

/**
 * Temperature coefficient of copper at 20 °C (1/°C). S20 gives 0.0039 [CONFIRMED];
 * the extra digit (0.00393 for annealed copper) is [MEMORY] (S20b context).
 */
export const COPPER_ALPHA_PER_C = 0.00393;
export const COPPER_ALPHA_PROVENANCE = fromMemory('0.0039 CONFIRMED S20; 0.00393 from memory (S20b context)');

/**
 * Copper-clad aluminium (10 % Cu / 90 % Al cross-section) has ≈ 1.54 × the
 * resistance of copper. [DERIVED] from ρ_Al = 2.82e-8, ρ_Cu = 1.72e-8 (S20);
 * "about 55 % higher" [CONFIRMED S30v].
 */
export const CCA_RESISTANCE_FACTOR = 1.54;
export const CCA_RESISTANCE_PROVENANCE = derived(['S20', 'S30v']);

/**
 * The TIA horizontal-cable maximum, 9.38 Ω per 100 m per conductor at 20 °C.
 * [MEMORY] — not found in a readable source; used only as an informational limit.
 */
export const TIA_MAX_CONDUCTOR_OHM_PER_100M = 9.38;
export const TIA_MAX_CONDUCTOR_PROVENANCE = fromMemory('ANSI/TIA-568-C.2 / -D.2; not found in a readable source');

/** ASTM B258 diameter formula d(n) = 0.127 mm × 92^((36 − n)/39). [MEMORY] */
export function awgDiameterMm(n: number): number {
  return 0.127 * Math.pow(92, (36 - n) / 39);
}

/** R = ρ·L/A for one round solid conductor of diameter d (mm), per metre. */
export function conductorOhmPerMFromDiameter(diameterMm: number, resistivityOhmM = COPPER_RESISTIVITY_OHM_M): number {
  const r = (diameterMm / 1000) / 2;
  return resistivityOhmM / (Math.PI * r * r);
}

/** R(T) = R20 · (1 + α·(T − 20)). */
export function resistanceAtTemperature(r20: number, temperatureC: number, alpha = COPPER_ALPHA_PER_C): number {
  return r20 * (1 + alpha * (temperatureC - 20));
}

/**
 * Resistance of one conductor per metre, for a gauge, temperature and material.
 */
export function conductorOhmPerM(gauge: AwgGauge, temperatureC: number, cca: boolean): number {
  const r20 = AWG_TABLE[gauge].ohmPerM * (cca ? CCA_RESISTANCE_FACTOR : 1);
  return resistanceAtTemperature(r20, temperatureC);
}

/**
 * Loop resistance of one pairset (Ω). Each leg of the loop is two conductors in
 * parallel (R/2) and the loop has two legs, so R_loop ≈ R_conductor per metre × length.
 * [DERIVED] facts §2.2 — e.g. 100 m of 24 AWG → 8.42 Ω.
 */
export function pairsetLoopOhm(conductorOhmPerMetre: number, lengthM: number): number {
  return conductorOhmPerMetre * lengthM;
}
