import type { AwgGauge } from './awg';
import { confirmed, fromMemory, practice, type Provenance } from './source-marks';

export type CableCategory = 'cat5e' | 'cat6' | 'cat6a';
export const CABLE_CATEGORY_VALUES = ['cat5e', 'cat6', 'cat6a'] as const;
export const CABLE_CATEGORY_NAMES: Readonly<Record<CableCategory, string>> = {
  cat5e: 'Cat 5e', cat6: 'Cat 6', cat6a: 'Cat 6A',
};

export interface ChannelLimits {
  /** Maximum channel (permanent link + all cords), TIA-568 / ISO/IEC 11801. */
  readonly channelMaxM: number;
  /** Maximum permanent link (fixed, solid-conductor horizontal cable). */
  readonly permanentLinkMaxM: number;
  /** Maximum total of patch, equipment and work-area cords. */
  readonly cordsMaxM: number;
  readonly provenance: Provenance;
}

export const CHANNEL_LIMITS: ChannelLimits = {
  channelMaxM: 100,
  permanentLinkMaxM: 90,
  cordsMaxM: 10,
  provenance: confirmed(['S15', 'S16', 'S17']),
};

/**
 * Default allowance for cords added to each captured run: 5 m (say a 2 m patch
 * cord in the closet and a 3 m cord at the device). [PRACTICE] — our planning
 * default, no source; the standard allows up to 10 m of cords in total.
 */
export const DEFAULT_CORD_ALLOWANCE_M = 5;
export const DEFAULT_CORD_ALLOWANCE_PROVENANCE = practice('our default: 2 m closet patch + 3 m device cord');

/** Usual conductor size when the gauge was not captured: Cat 5e 24 AWG, Cat 6/6A 23 AWG. */
export const DEFAULT_GAUGE: Readonly<Record<CableCategory, AwgGauge>> = { cat5e: 24, cat6: 23, cat6a: 23 };
export const DEFAULT_GAUGE_PROVENANCE = confirmed(['S17']);

/** TIA TSB-184-A bundling guidance for PoE (S21, S23v). */
export const TSB_184_A = {
  maxCablesPerBundle: 24,
  designCurrentPerPairA: 1.0,
  maxTemperatureRiseC: 15,
  newBuildCategory: 'cat6a' as CableCategory,
  provenance: confirmed(['S21', 'S23v']),
} as const;

/** NEC Table 725.144 applies only when power per cable exceeds 60 W (S26v, S27v). */
export const NEC_725_144_THRESHOLD_W = 60;
export const NEC_725_144_PROVENANCE = confirmed(['S26v', 'S27v']);
/** One confirmed cell: 22/23 AWG, 75 °C cable: ≥ 0.5 A per conductor in bundles up to 192 at 30 °C. */
export const NEC_725_144_ANCHOR = {
  gauges: [22, 23] as const,
  cableRatingC: 75,
  ampsPerConductor: 0.5,
  maxBundle: 192,
  ambientC: 30,
  provenance: confirmed(['S26v']),
} as const;

/** ISO/IEC naming: Class D = Cat 5e, E = Cat 6, EA = Cat 6A. [MEMORY] */
export const ISO_CHANNEL_CLASS: Readonly<Record<CableCategory, string>> = { cat5e: 'D', cat6: 'E', cat6a: 'EA' };
export const ISO_CHANNEL_CLASS_PROVENANCE = fromMemory();

/** Cable slack for ordering: 10 % of the run plus a 3 m service loop per drop. [PRACTICE] — no source. */
export const CABLE_SLACK = {
  fraction: 0.1,
  serviceLoopM: 3,
  provenance: practice('common practice, no source'),
} as const;
