/**
 * The one place where units are converted and formatted.
 *
 * Internally everything is SI: metres, watts, volts, amps, ohms, watt-hours,
 * minutes, degrees Celsius. The walk screens convert what the surveyor types
 * (metric or imperial) into SI with the `…ToSI` helpers, and every text shown
 * back goes through the `format…` helpers with the site's unit system.
 */

export type UnitSystem = 'metric' | 'imperial';
export const UNIT_SYSTEM_VALUES = ['metric', 'imperial'] as const;

/** International foot, exact by definition (1959). */
export const METRES_PER_FOOT = 0.3048;
export const FEET_PER_METRE = 1 / METRES_PER_FOOT;

export function feetToMetres(ft: number): number {
  return ft * METRES_PER_FOOT;
}
export function metresToFeet(m: number): number {
  return m / METRES_PER_FOOT;
}
export function celsiusToFahrenheit(c: number): number {
  return (c * 9) / 5 + 32;
}
export function fahrenheitToCelsius(f: number): number {
  return ((f - 32) * 5) / 9;
}

/** A length typed in the site's units → metres. */
export function lengthToSI(value: number, units: UnitSystem): number {
  return units === 'imperial' ? feetToMetres(value) : value;
}
/** Metres → the site's length unit (m or ft). */
export function lengthFromSI(metres: number, units: UnitSystem): number {
  return units === 'imperial' ? metresToFeet(metres) : metres;
}
/** A temperature typed in the site's units → °C. */
export function temperatureToSI(value: number, units: UnitSystem): number {
  return units === 'imperial' ? fahrenheitToCelsius(value) : value;
}
/** °C → the site's temperature unit. */
export function temperatureFromSI(celsius: number, units: UnitSystem): number {
  return units === 'imperial' ? celsiusToFahrenheit(celsius) : celsius;
}

/** Battery energy from its label: volts × amp-hours = watt-hours. */
export function wattHoursFromVoltAmpHours(volts: number, ampHours: number): number {
  return volts * ampHours;
}
export function hoursToMinutes(h: number): number {
  return h * 60;
}

/** Round to `dp` decimals; never returns -0. */
export function roundTo(x: number, dp: number): number {
  const f = POW10[dp] ?? Math.pow(10, dp);
  const r = Math.round(x * f) / f;
  return r === 0 ? 0 : r;
}
/** Round up to `dp` decimals (for "at least" figures such as a splitter's minimum amps). */
export function roundUpTo(x: number, dp: number): number {
  const f = POW10[dp] ?? Math.pow(10, dp);
  // The small epsilon keeps 1.5 from becoming 1.51 through float noise.
  const r = Math.ceil(x * f - 1e-9) / f;
  return r === 0 ? 0 : r;
}
const POW10: readonly number[] = [1, 10, 100, 1000, 10000, 100000, 1000000];

/**
 * Number with at most `maxDp` decimals, trailing zeros trimmed: 12.950 → "12.95", 30.0 → "30".
 * Same text as String(roundTo(x, maxDp)), built from integers (about twice as fast).
 */
export function formatNumber(x: number, maxDp = 2): string {
  const f = POW10[maxDp];
  if (f === undefined || !Number.isFinite(x) || Math.abs(x) * f > 1e15) return String(roundTo(x, maxDp));
  let n = Math.round(x * f);
  if (n === 0) return '0';
  const neg = n < 0;
  if (neg) n = -n;
  const ip = Math.floor(n / f);
  let fr = n - ip * f;
  let s = String(ip);
  if (fr !== 0) {
    let digits = maxDp;
    while (fr % 10 === 0) {
      fr /= 10;
      digits--;
    }
    const fs = String(fr);
    s += '.' + '000000'.slice(0, digits - fs.length) + fs;
  }
  return neg ? '-' + s : s;
}

export function unitLabel(units: UnitSystem): { length: string; temperature: string } {
  return units === 'imperial' ? { length: 'ft', temperature: '°F' } : { length: 'm', temperature: '°C' };
}

export function formatLength(metres: number, units: UnitSystem, maxDp = 1): string {
  return units === 'imperial'
    ? `${formatNumber(metresToFeet(metres), maxDp)} ft`
    : `${formatNumber(metres, maxDp)} m`;
}
export function formatTemperature(celsius: number, units: UnitSystem): string {
  return units === 'imperial'
    ? `${formatNumber(celsiusToFahrenheit(celsius), 0)} °F`
    : `${formatNumber(celsius, 0)} °C`;
}
export function formatWatts(w: number, maxDp = 2): string {
  return `${formatNumber(w, maxDp)} W`;
}
export function formatVolts(v: number, maxDp = 2): string {
  return `${formatNumber(v, maxDp)} V`;
}
/** Amps; below 1 A shown in mA ("350 mA"). */
export function formatAmps(a: number): string {
  return a < 1 ? `${formatNumber(a * 1000, 0)} mA` : `${formatNumber(a, 2)} A`;
}
export function formatOhms(ohm: number): string {
  return `${formatNumber(ohm, 2)} Ω`;
}
export function formatWattHours(wh: number): string {
  return `${formatNumber(wh, 1)} Wh`;
}
export function formatPercent(fraction: number): string {
  return `${formatNumber(fraction * 100, 1)} %`;
}
/** 27.3 → "27 min"; 162 → "2 h 42 min". */
export function formatMinutes(minutes: number): string {
  const total = Math.round(minutes);
  if (total < 60) return `${total} min`;
  const h = Math.floor(total / 60);
  const m = total % 60;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}
