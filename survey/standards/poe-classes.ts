import { POE_TYPES, type PoeType } from './poe-types';
import { confirmed, derived, type Provenance } from './source-marks';

export type PoeClass = 0 | 1 | 2 | 3 | 4 | 5 | 6 | 7 | 8;
export const POE_CLASS_VALUES = [0, 1, 2, 3, 4, 5, 6, 7, 8] as const;

export interface PoeClassSpec {
  readonly poeClass: PoeClass;
  /** PSE minimum output = the power a switch reserves for the port (W). */
  readonly psePowerW: number;
  /** Lowest PD power of the class range (W). */
  readonly pdMinW: number;
  /** Highest power the PD may draw (W). */
  readonly pdMaxW: number;
  /** Least PoE type whose port can serve this class. */
  readonly minType: PoeType;
  /** Energised pairs: classes 5–8 use all four pairs. */
  readonly pairs: 2 | 4;
  /** Classification current, as published. */
  readonly classificationCurrent: string;
  readonly provenance: {
    readonly power: Provenance;
    readonly minType: Provenance;
    readonly pairs: Provenance;
    readonly classificationCurrent: Provenance;
  };
}

const p03 = confirmed(['S3v', 'S6', 'S7', 'S11v']);
const p4 = confirmed(['S6', 'S7', 'S11v']);
const p58 = confirmed(['S3v', 'S6', 'S7', 'S9']);
const p8 = confirmed(['S7', 'S8', 'S9'], 'Class 8 = 90 W at the PSE; tables printing 99 W confuse it with the Type 4 P_Type ceiling of 99.9 W (S2)');
const currents = confirmed(['S6', 'S7']);
const types = confirmed(['S6']);
const pairs2 = confirmed(['S3v', 'S6']);
const pairs4 = confirmed(['S3v', 'S6'], '4-pair for Types 3–4; "classes 5–6 need 4 pairs" is from memory');

function row(
  poeClass: PoeClass, psePowerW: number, pdMinW: number, pdMaxW: number, minType: PoeType,
  classificationCurrent: string, power: Provenance,
): PoeClassSpec {
  const pairs = poeClass >= 5 ? 4 : 2;
  return {
    poeClass, psePowerW, pdMinW, pdMaxW, minType, pairs, classificationCurrent,
    provenance: { power, minType: types, pairs: pairs === 4 ? pairs4 : pairs2, classificationCurrent: currents },
  };
}

/** IEEE 802.3af/at/bt classes 0–8. */
export const POE_CLASSES: readonly PoeClassSpec[] = [
  row(0, 15.4, 0.44, 12.95, 1, '0–5 mA', p03),
  row(1, 4.0, 0.44, 3.84, 1, '8–13 mA', p03),
  row(2, 7.0, 3.84, 6.49, 1, '16–21 mA', p03),
  row(3, 15.4, 6.49, 12.95, 1, '25–31 mA', p03),
  row(4, 30, 12.95, 25.5, 2, '35–45 mA', p4),
  row(5, 45, 25.5, 40, 3, '36–44 mA then 1–4 mA', p58),
  row(6, 60, 40, 51, 3, '36–44 mA then 9–12 mA', p58),
  row(7, 75, 51, 62, 4, '36–44 mA then 17–20 mA', p58),
  row(8, 90, 62, 71.3, 4, '36–44 mA then 26–30 mA', p8),
];

export function poeClassSpec(c: PoeClass): PoeClassSpec {
  return POE_CLASSES[c];
}

/**
 * Smallest class (1–8) whose PD maximum covers `watts` at the device; null if
 * above 71.3 W (Class 8 / 802.3bt Type 4). Class 0 is never chosen: it covers
 * the same PD range as Class 3 and reserves the same 15.4 W. [DERIVED] from §1.3.
 */
export function classForPdPower(watts: number): PoeClass | null {
  for (let c = 1; c <= 8; c++) {
    if (watts <= POE_CLASSES[c].pdMaxW + 1e-9) return c as PoeClass;
  }
  return null;
}

export const CLASS_FOR_PD_POWER_PROVENANCE: Provenance = derived(['S3v', 'S6', 'S7'], 'smallest class whose PD maximum covers the load');

export function pairsForClass(c: PoeClass): 2 | 4 {
  return POE_CLASSES[c].pairs;
}

export function minimumTypeForClass(c: PoeClass): PoeType {
  return POE_CLASSES[c].minType;
}

/** Classes a port of `type` may serve (0..maxClass). */
export function classesForType(type: PoeType): PoeClass[] {
  const out: PoeClass[] = [];
  for (let c = 0; c <= POE_TYPES[type].maxClass; c++) out.push(c as PoeClass);
  return out;
}
