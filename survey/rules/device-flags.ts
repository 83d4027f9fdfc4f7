import { CAUTIONS, type Caution, type CautionId } from '../standards/cautions';
import type { Severity } from './result-types';

/**
 * The warnings and cautions a device (and its run) can raise, as bits of one number.
 *
 * The rules only set bits while they decide; the warning records and their words are made
 * when a result is read. The bit order is the order in which the rules raise them, so the
 * records come out in the order a reader expects: the device's own figures, then its
 * cable, then its plug, then what the walk still has to capture.
 */
export const WARNING_CODES = [
  'typical_figure',
  'need_above_class',
  'need_above_standard',
  'passive_poe_device',
  'adapter_volts_mismatch',
  'usb_above_levels',
  // The cable run's own warnings (cable-run.ts).
  'channel_over_100m',
  'link_over_90m',
  'cca_cable',
  'thin_gauge',
  'cable_cannot_carry',
  'cat6a_recommended',
  'nec_725_144',
  'passive_voltage_drop',
  // The splitter's plug.
  'barrel_lookalike',
  'polarity_unknown',
  'barrel_voltage_key',
  // Gaps and site conditions.
  'run_missing',
  'finished_surfaces',
] as const;

export type DeviceWarningCode = (typeof WARNING_CODES)[number];

/** The bit of each warning code. */
export const W = Object.fromEntries(WARNING_CODES.map((c, i) => [c, 1 << i])) as Readonly<Record<DeviceWarningCode, number>>;

export const WARNING_SEVERITY: Readonly<Record<DeviceWarningCode, Severity>> = {
  typical_figure: 'info',
  need_above_class: 'error',
  need_above_standard: 'warning',
  passive_poe_device: 'warning',
  adapter_volts_mismatch: 'warning',
  usb_above_levels: 'warning',
  channel_over_100m: 'error',
  link_over_90m: 'warning',
  cca_cable: 'error',
  thin_gauge: 'warning',
  cable_cannot_carry: 'error',
  cat6a_recommended: 'info',
  nec_725_144: 'info',
  passive_voltage_drop: 'warning',
  barrel_lookalike: 'info',
  polarity_unknown: 'warning',
  barrel_voltage_key: 'warning',
  run_missing: 'info',
  finished_surfaces: 'info',
};

/** The bits raised by the cable checks. */
export const CABLE_WARNINGS = W.channel_over_100m | W.link_over_90m | W.cca_cable | W.thin_gauge
  | W.cable_cannot_carry | W.cat6a_recommended | W.nec_725_144 | W.passive_voltage_drop;

function maskOf(severity: Severity): number {
  let m = 0;
  for (const c of WARNING_CODES) if (WARNING_SEVERITY[c] === severity) m |= W[c];
  return m;
}
const INFO_MASK = maskOf('info');
const WARNING_MASK = maskOf('warning');
const ERROR_MASK = maskOf('error');

function bitCount(n: number): number {
  let x = n - ((n >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

/** How many of the raised warnings are info, warning and error. */
export function countBySeverity(bits: number, into: Record<Severity, number>): void {
  into.info += bitCount(bits & INFO_MASK);
  into.warning += bitCount(bits & WARNING_MASK);
  into.error += bitCount(bits & ERROR_MASK);
}

/** The device cautions, in the order the rules add them. */
const CAUTION_ORDER: readonly CautionId[] = [
  'passive_poe', 'no_cca', 'outdoor_runs', 'bundling', 'doorbell_transformer', 'barrel_plug', 'mains_electrician',
];

/** The bit of each device caution. */
export const C = Object.fromEntries(CAUTION_ORDER.map((id, i) => [id, 1 << i])) as Readonly<Record<
  'passive_poe' | 'no_cca' | 'outdoor_runs' | 'bundling' | 'doorbell_transformer' | 'barrel_plug' | 'mains_electrician', number>>;

/** The cautions of a set of caution bits, in order (each once). */
export function cautionsOf(bits: number): Caution[] {
  const out: Caution[] = [];
  for (let i = 0; i < CAUTION_ORDER.length; i++) if ((bits & (1 << i)) !== 0) out.push(CAUTIONS[CAUTION_ORDER[i]]);
  return out;
}
