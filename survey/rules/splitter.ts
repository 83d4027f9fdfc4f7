import { BARREL_SIZES, barrelSizeLabel } from '../standards/barrel-sizes';
import { classForPdPower, POE_CLASSES, type PoeClass } from '../standards/poe-classes';
import { PLANNING } from '../standards/planning-defaults';
import type { PoeType } from '../standards/poe-types';
import type { Polarity } from '../model/device';
import { roundUpTo } from '../units';
import type { PlugSpec } from './result-types';

/**
 * Splitter sizing (facts §5, [DERIVED] from §1.3):
 * P_in = V_out × I_out ÷ η, then the smallest class whose PD maximum ≥ P_in
 * (≤ 3.84 W Class 1 … ≤ 71.3 W Class 8). Null class above 71.3 W.
 */
export interface SplitterSizing {
  readonly inputW: number;
  readonly poeClass: PoeClass | null;
  readonly poeType: PoeType | null;
}

/** P_in = V_out × I_out ÷ η: what the splitter draws as a PD (W). */
export function splitterInputW(outputVolts: number, outputAmps: number, efficiency: number): number {
  return (outputVolts * outputAmps) / efficiency;
}

export function sizeSplitter(outputVolts: number, outputAmps: number, efficiency: number): SplitterSizing {
  const inputW = splitterInputW(outputVolts, outputAmps, efficiency);
  const poeClass = classForPdPower(inputW);
  return { inputW, poeClass, poeType: poeClass === null ? null : POE_CLASSES[poeClass].minType };
}

/** Rating to buy: the minimum current rounded up to the next 0.5 A step ([PRACTICE] our convention). */
export function splitterRatingAmps(minAmps: number): number {
  const step = PLANNING.splitterRatingStepA.value;
  return Math.max(step, Math.ceil(minAmps / step - 1e-9) * step);
}

export function minimumAmps(watts: number, volts: number): number {
  return roundUpTo(watts / volts, 2);
}

const POLARITY_TEXT: Readonly<Record<Polarity, string>> = {
  centre_positive: 'centre-positive',
  centre_negative: 'centre-negative',
  unknown: 'polarity unknown',
};

export function polarityText(p: Polarity): string {
  return POLARITY_TEXT[p];
}

export function barrelPlug(outerMm: number, innerMm: number, polarity: Polarity): PlugSpec {
  return { kind: 'barrel', outerMm, innerMm, polarity, label: `${barrelSizeLabel({ outerMm, innerMm })}, ${POLARITY_TEXT[polarity]}` };
}

/** The plug of every known barrel size and polarity, written once (they are shared and frozen). */
const KNOWN_BARREL_PLUGS: readonly { readonly outerMm: number; readonly innerMm: number; readonly byPolarity: Readonly<Record<Polarity, PlugSpec>> }[] =
  BARREL_SIZES.map((b) => ({
    outerMm: b.outerMm,
    innerMm: b.innerMm,
    byPolarity: {
      centre_positive: Object.freeze(barrelPlug(b.outerMm, b.innerMm, 'centre_positive')),
      centre_negative: Object.freeze(barrelPlug(b.outerMm, b.innerMm, 'centre_negative')),
      unknown: Object.freeze(barrelPlug(b.outerMm, b.innerMm, 'unknown')),
    },
  }));

/** Same as `barrelPlug`, but a known size gives its shared plug instead of a new one. */
export function plugForBarrel(outerMm: number, innerMm: number, polarity: Polarity): PlugSpec {
  for (const k of KNOWN_BARREL_PLUGS) {
    if (k.outerMm === outerMm && k.innerMm === innerMm) return k.byPolarity[polarity];
  }
  return barrelPlug(outerMm, innerMm, polarity);
}

export const MICRO_USB_PLUG: PlugSpec = Object.freeze({ kind: 'micro_usb', label: 'micro-USB' });
export const USB_C_PLUG: PlugSpec = Object.freeze({ kind: 'usb_c', label: 'USB-C' });
export const TERMINAL_PLUG: PlugSpec = Object.freeze({ kind: 'terminal', label: 'screw terminals' });
