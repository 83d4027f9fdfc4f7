import { confirmed, fromMemory, type Provenance } from './source-marks';

export interface BarrelSize {
  readonly id: string;
  readonly outerMm: number;
  readonly innerMm: number;
  /** Centre-pin diameter where the standard defines one (EIAJ). */
  readonly pinMm?: number;
  /** EIAJ RC-5320A voltage key, if this is an EIAJ size. */
  readonly eiaj?: { readonly code: string; readonly minV: number; readonly maxV: number; readonly maxA: number };
  /** Sizes that look alike and do not mate reliably with this one. */
  readonly lookAlikes: readonly string[];
  readonly provenance: Provenance;
}

/** Barrel (coaxial) DC plug sizes we accept. Facts §4.1. */
export const BARREL_SIZES: readonly BarrelSize[] = [
  { id: '5.5x2.1', outerMm: 5.5, innerMm: 2.1, lookAlikes: ['5.5x2.5'], provenance: confirmed(['S45v', 'S46v', 'S47', 'S49']) },
  { id: '5.5x2.5', outerMm: 5.5, innerMm: 2.5, lookAlikes: ['5.5x2.1'], provenance: confirmed(['S45v', 'S46v', 'S47', 'S49']) },
  { id: '3.5x1.35', outerMm: 3.5, innerMm: 1.35, lookAlikes: [], provenance: fromMemory('common small size; not in the facts file') },
  { id: '2.35x0.7', outerMm: 2.35, innerMm: 0.7, eiaj: { code: 'EIAJ-01', minV: 0, maxV: 3.15, maxA: 2 }, lookAlikes: [], provenance: confirmed(['S50']) },
  { id: '4.0x1.7', outerMm: 4.0, innerMm: 1.7, eiaj: { code: 'EIAJ-02', minV: 3.15, maxV: 6.3, maxA: 2 }, lookAlikes: [], provenance: confirmed(['S50']) },
  { id: '4.75x1.7', outerMm: 4.75, innerMm: 1.7, eiaj: { code: 'EIAJ-03', minV: 6.3, maxV: 10.5, maxA: 2 }, lookAlikes: [], provenance: confirmed(['S50']) },
  { id: '5.5x3.3', outerMm: 5.5, innerMm: 3.3, pinMm: 1.0, eiaj: { code: 'EIAJ-04', minV: 10.5, maxV: 13.5, maxA: 2 }, lookAlikes: [], provenance: confirmed(['S50']) },
  { id: '6.5x4.4', outerMm: 6.5, innerMm: 4.4, pinMm: 1.4, eiaj: { code: 'EIAJ-05', minV: 13.5, maxV: 18, maxA: 2 }, lookAlikes: [], provenance: confirmed(['S50']) },
];

const BY_ID = new Map(BARREL_SIZES.map((b) => [b.id, b]));

export function findBarrelSize(outerMm: number, innerMm: number): BarrelSize | undefined {
  for (const b of BARREL_SIZES) {
    if (Math.abs(b.outerMm - outerMm) < 0.005 && Math.abs(b.innerMm - innerMm) < 0.005) return b;
  }
  return undefined;
}

export function barrelSizeById(id: string): BarrelSize | undefined {
  return BY_ID.get(id);
}

export function barrelSizeLabel(b: { outerMm: number; innerMm: number }): string {
  return `${b.outerMm}×${b.innerMm} mm`;
}

export const KNOWN_BARREL_SIZES_TEXT = BARREL_SIZES.map((b) => `${b.outerMm}×${b.innerMm}`).join(', ');

/** Centre (tip) positive is the de facto majority convention; always read the symbol. [CONFIRMED S51, S47, S48v] */
export const BARREL_POLARITY_PROVENANCE = confirmed(['S51', 'S47', 'S48v']);
/** 5.5×2.1 vs 5.5×2.5 look alike and do not mate reliably. [CONFIRMED S46v, S48v] */
export const BARREL_LOOKALIKE_PROVENANCE = confirmed(['S45v', 'S46v', 'S48v']);
