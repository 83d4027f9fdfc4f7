import { confirmed, fromMemory, practice, type Provenance } from './source-marks';

export interface PlanningValue<T> {
  readonly value: T;
  readonly provenance: Provenance;
}

function pv<T>(value: T, provenance: Provenance): PlanningValue<T> {
  return { value, provenance };
}

/**
 * Planning defaults. None of these is a standard limit; each says where it comes from.
 */
export const PLANNING = {
  /** Keep PoE load ≤ 80 % of a switch budget. [PRACTICE] — common practice, no standard (not NEC 210.20). */
  planningCeiling: pv(0.8, practice('common practice, no standard')),
  /** PoE splitter conversion efficiency used for sizing. [PRACTICE] anchored by module datasheets (up to 87 %, S13v). */
  splitterEfficiency: pv(0.85, practice('80–90 % typical; anchored by S13v (up to 87 %)')),
  /** An outlet within 1.5 m of the device counts as "near" (reachable by its own adapter cord). [PRACTICE] — our policy. */
  nearOutletM: pv(1.5, practice('our policy: a typical adapter cord reaches 1.5 m')),
  /** PoE switch power-supply efficiency if not given. [MEMORY] 0.85–0.90. */
  switchSupplyEfficiency: pv(0.88, fromMemory('PSU efficiency 0.85–0.90')),
  /** Midspan injector efficiency if not given. [MEMORY] same range as switch supplies. */
  injectorEfficiency: pv(0.88, fromMemory('PSU efficiency 0.85–0.90')),
  /** UPS / inverter efficiency if not given: 0.9. [CONFIRMED] S33, S35 (85–95 %, 0.9 a common default). */
  inverterEfficiency: pv(0.9, confirmed(['S33', 'S35'])),
  /** Usable depth of discharge if not given: 0.8. [MEMORY] lead-acid 50–80 %, LiFePO₄ 80–90 %. */
  depthOfDischarge: pv(0.8, fromMemory('lead-acid 50–80 %, LiFePO4 80–90 %')),
  /** Age derate factor if not given: 1 (new battery). Use 0.7–0.8 for batteries ≥ 3 years old. [CONFIRMED] S33, S35. */
  ageFactor: pv(1, confirmed(['S33', 'S35'], '0.7–0.8 for batteries 3 years or older')),
  /** Cable temperature for resistance if not given (°C). */
  cableTemperatureC: pv(20, practice('reference temperature of the AWG table')),
  /** Highest cable temperature we accept (°C). */
  cableTemperatureMaxC: pv(60, practice('hot attic upper bound')),
  /** Passive PoE: warn when the cable drops more than 10 % of the injector voltage. [PRACTICE] — no source. */
  passiveDropWarnFraction: pv(0.1, practice('common practice, no source')),
  /** Splitter ratings are grouped in 0.5 A steps for the shopping list. [PRACTICE] — our convention. */
  splitterRatingStepA: pv(0.5, practice('our grouping convention')),
  /** Placeholder switch for "how many more switches": 8 ports, 120 W. [PRACTICE] — our placeholder. */
  placeholderSwitch: pv({ ports: 8, budgetW: 120 }, practice('our placeholder for estimates')),
  /** Doorbell transformer: at least 16 V / 30 VA; legacy ones are often ~10 VA. [CONFIRMED] S66, S67. */
  doorbellTransformer: pv({ minVolts: 16, maxVolts: 24, minVA: 30, legacyVA: 10 }, confirmed(['S66', 'S67'])),
} as const;

type Kind =
  | 'access_point' | 'camera' | 'doorbell' | 'hub' | 'small_computer' | 'compact_switch' | 'other';

/**
 * Typical power at the device, used to pre-fill a walk (the figure is then
 * flagged "typical"). Facts §6 — the datasheet always wins.
 */
export const TYPICAL_DEVICE_WATTS: Readonly<Record<Kind, PlanningValue<number>>> = {
  access_point: pv(13, fromMemory('Wi-Fi 5/6 2×2: 7–16 W')),
  camera: pv(6, fromMemory('fixed camera with IR: 5–10 W; classes 1–3 confirmed S64v')),
  doorbell: pv(5, fromMemory('video doorbell 3–8 W')),
  hub: pv(3, fromMemory('hub / bridge 1–4 W')),
  small_computer: pv(8, confirmed(['S58'], '> 7 W under load (S58); idle ≈ 3 W from memory')),
  compact_switch: pv(5, fromMemory('own use 2–6 W, plus whatever it passes through')),
  other: pv(5, practice('our placeholder')),
};
