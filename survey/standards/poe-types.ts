import { confirmed, derived, fromMemory, type Provenance } from './source-marks';

/** IEEE 802.3 PoE Types. Type 1 = 802.3af, Type 2 = 802.3at, Types 3 and 4 = 802.3bt. */
export type PoeType = 1 | 2 | 3 | 4;
export type PoeStandard = 'af' | 'at' | 'bt';
export const POE_TYPE_VALUES = [1, 2, 3, 4] as const;
export const POE_STANDARD_VALUES = ['af', 'at', 'bt'] as const;

export interface PoeTypeSpec {
  readonly type: PoeType;
  readonly standard: PoeStandard;
  /** "802.3af" etc. — the name printed on a switch port. */
  readonly standardName: string;
  /** Minimum output power per port at the PSE (W). */
  readonly psePowerW: number;
  /** Maximum power available at the PD (W). */
  readonly pdPowerW: number;
  readonly pseVoltageMinV: number;
  readonly pseVoltageMaxV: number;
  /** Minimum voltage the PD must still see (V). */
  readonly pdVoltageMinV: number;
  /** Maximum current per pairset (A). */
  readonly maxCurrentPerPairsetA: number;
  /** Worst-case channel DC loop resistance per pairset assumed by the standard (Ω, 100 m). */
  readonly loopResistanceOhm: number;
  /** Highest class a port of this Type may serve. */
  readonly maxClass: number;
  /** Least cable category the standard's loop budget assumes. */
  readonly minimumCabling: string;
  readonly provenance: {
    readonly power: Provenance;
    readonly voltage: Provenance;
    readonly current: Provenance;
    readonly loopResistance: Provenance;
    readonly classes: Provenance;
    readonly cabling: Provenance;
  };
}

const powerSrc = confirmed(['S3v', 'S7', 'S8', 'S9']);
const classesSrc = confirmed(['S6']);

export const POE_TYPES: Readonly<Record<PoeType, PoeTypeSpec>> = {
  1: {
    type: 1, standard: 'af', standardName: '802.3af',
    psePowerW: 15.4, pdPowerW: 12.95,
    pseVoltageMinV: 44, pseVoltageMaxV: 57, pdVoltageMinV: 37,
    maxCurrentPerPairsetA: 0.35, loopResistanceOhm: 20, maxClass: 3, minimumCabling: 'Cat 3',
    provenance: {
      power: powerSrc, voltage: confirmed(['S3v', 'S4']), current: confirmed(['S3v', 'S4']),
      loopResistance: confirmed(['S4'], '20 Ω per pairset (Category 3 channel)'),
      classes: classesSrc, cabling: confirmed(['S4', 'S6']),
    },
  },
  2: {
    type: 2, standard: 'at', standardName: '802.3at',
    psePowerW: 30, pdPowerW: 25.5,
    pseVoltageMinV: 50, pseVoltageMaxV: 57, pdVoltageMinV: 42.5,
    maxCurrentPerPairsetA: 0.6, loopResistanceOhm: 12.5, maxClass: 4, minimumCabling: 'Cat 5e',
    provenance: {
      power: powerSrc, voltage: confirmed(['S3v', 'S4']), current: confirmed(['S3v', 'S4']),
      loopResistance: confirmed(['S4'], '12.5 Ω per pairset (Category 5/5e channel)'),
      classes: classesSrc, cabling: confirmed(['S4', 'S6']),
    },
  },
  3: {
    type: 3, standard: 'bt', standardName: '802.3bt',
    psePowerW: 60, pdPowerW: 51,
    pseVoltageMinV: 50, pseVoltageMaxV: 57, pdVoltageMinV: 42.5,
    maxCurrentPerPairsetA: 0.6, loopResistanceOhm: 12.5, maxClass: 6, minimumCabling: 'Cat 5e',
    provenance: {
      power: powerSrc, voltage: confirmed(['S3v', 'S9']), current: confirmed(['S3v', 'S10v']),
      loopResistance: fromMemory('12.5 Ω per pairset; the DERIVED check of the class table reproduces 51 W exactly'),
      classes: classesSrc, cabling: confirmed(['S6', 'S21']),
    },
  },
  4: {
    type: 4, standard: 'bt', standardName: '802.3bt',
    psePowerW: 90, pdPowerW: 71.3,
    pseVoltageMinV: 52, pseVoltageMaxV: 57, pdVoltageMinV: 41.1,
    maxCurrentPerPairsetA: 0.96, loopResistanceOhm: 12.5, maxClass: 8, minimumCabling: 'Cat 5e (Cat 6A recommended for new builds)',
    provenance: {
      power: powerSrc, voltage: confirmed(['S3v', 'S9']), current: confirmed(['S3v', 'S10v']),
      loopResistance: fromMemory('12.5 Ω per pairset; the DERIVED check of the class table reproduces 71.3 W exactly'),
      classes: classesSrc, cabling: confirmed(['S6', 'S21']),
    },
  },
};

/** Whole-cable (4-pair) current limit for Type 4 (1.92 A) — IEEE 802.3-2022 Table 145-1 as quoted by S2. */
export const TYPE4_MAX_PI_CURRENT_A = 1.92;
export const TYPE4_MAX_PI_CURRENT_PROVENANCE = confirmed(['S2']);
/**
 * Type 4 P_Type ceiling, 99.9 W (Table 145-16 as quoted by S2). This is NOT a
 * class value: a Class 8 port is budgeted at 90 W. Never show 99 W or 100 W as a class.
 */
export const TYPE4_PTYPE_CEILING_W = 99.9;
export const TYPE4_PTYPE_CEILING_PROVENANCE = confirmed(['S2']);
/** 34.2 W "max power delivered" seen for Type 2 = 57 V × 0.6 A; not the Class 4 budget (30 W). */
export const TYPE2_MAX_DELIVERED_W = 34.2;
export const TYPE2_MAX_DELIVERED_PROVENANCE = derived(['S4', 'S12v'], '57 V × 0.6 A');

/** The most power PoE can deliver at a device: 802.3bt Type 4, 71.3 W. */
export const MAX_PD_POWER_W = POE_TYPES[4].pdPowerW;

export function poeTypeForStandard(standard: PoeStandard): PoeType {
  return standard === 'af' ? 1 : standard === 'at' ? 2 : 4;
}

/** Lowest PoE type of a standard (802.3bt covers Types 3 and 4). */
export function lowestTypeOfStandard(standard: PoeStandard): PoeType {
  return standard === 'af' ? 1 : standard === 'at' ? 2 : 3;
}

/** A PoE type as installers name it: "802.3af", "802.3at", "802.3bt Type 3", "802.3bt Type 4". */
export function poeTypeName(t: PoeType): string {
  return t >= 3 ? `${POE_TYPES[t].standardName} Type ${t}` : POE_TYPES[t].standardName;
}
