import Qty from 'js-quantities';
import { evaluate, unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  AWG_TABLE, celsiusToFahrenheit, fahrenheitToCelsius, feetToMetres, formatAmps, formatLength, formatMinutes,
  formatNumber, formatTemperature, formatWatts, lengthFromSI, lengthToSI, metresToFeet, roundTo, roundUpTo,
  runtimeMinutes, temperatureFromSI, temperatureToSI, wattHoursFromVoltAmpHours,
} from '../../survey/index';

describe('unit conversions, cross-checked with mathjs and js-quantities (facts §8)', () => {
  it('feet ↔ metres: 328 ft = 99.97 m; 100 m = 328.08 ft', () => {
    expect(feetToMetres(328)).toBeCloseTo(Qty('328 ft').to('m').scalar, 10);
    expect(feetToMetres(328)).toBeCloseTo(unit(328, 'ft').toNumber('m'), 10);
    expect(feetToMetres(328)).toBeCloseTo(99.97, 2);
    expect(metresToFeet(100)).toBeCloseTo(unit(100, 'm').toNumber('ft'), 10);
    expect(metresToFeet(100)).toBeCloseTo(Qty('100 m').to('ft').scalar, 10);
  });
  it('°C ↔ °F', () => {
    for (const c of [-40, 0, 20, 37.5, 60]) {
      expect(celsiusToFahrenheit(c)).toBeCloseTo(unit(c, 'degC').toNumber('degF'), 9);
      expect(celsiusToFahrenheit(c)).toBeCloseTo(Qty(`${c} tempC`).to('tempF').scalar, 9);
      expect(fahrenheitToCelsius(celsiusToFahrenheit(c))).toBeCloseTo(c, 10);
    }
  });
  it('site-unit helpers round-trip', () => {
    expect(lengthToSI(100, 'imperial')).toBeCloseTo(30.48, 10);
    expect(lengthToSI(100, 'metric')).toBe(100);
    expect(lengthFromSI(lengthToSI(57.3, 'imperial'), 'imperial')).toBeCloseTo(57.3, 10);
    expect(temperatureToSI(140, 'imperial')).toBeCloseTo(60, 10);
    expect(temperatureFromSI(20, 'imperial')).toBeCloseTo(68, 10);
  });
  it('UPS arithmetic: 12 V × 9 Ah = 108 Wh; 108 Wh / 40 W = 162 min (S32 formula; mathjs, js-quantities)', () => {
    expect(wattHoursFromVoltAmpHours(12, 9)).toBe(evaluate('12 V * 9 Ah').toNumber('Wh'));
    expect(wattHoursFromVoltAmpHours(12, 9)).toBeCloseTo(Qty('9 Ah').mul(Qty('12 V')).to('Wh').scalar, 10);
    expect(runtimeMinutes(108, 40)).toBeCloseTo(evaluate('108 Wh / 40 W').toNumber('minute'), 10);
    expect(runtimeMinutes(108, 40)).toBeCloseTo(Qty('108 Wh').div(Qty('40 W')).to('min').scalar, 10);
    expect(runtimeMinutes(108, 40)).toBe(162);
  });
  it('AWG per-metre resistance from Ω/1000 ft (mathjs, js-quantities: 25.67 Ω/kft × 100 m = 8.4219 Ω)', () => {
    const ours = AWG_TABLE[24].ohmPerM * 100;
    expect(ours).toBeCloseTo(evaluate('25.67 ohm/(1000 ft) * 100 m').toNumber('ohm'), 10);
    expect(ours).toBeCloseTo(Qty('25.67 ohm').div(Qty('1000 ft')).mul(Qty('100 m')).to('ohm').scalar, 10);
    // ρL/A with ρ = 1.724e-8 Ω·m (S18) and d = 0.51054 mm → 8.421 Ω.
    expect(evaluate('1.724e-8 ohm m * 100 m / (pi*(0.51054 mm/2)^2)').toNumber('ohm')).toBeCloseTo(ours, 2);
  });
});

describe('formatting', () => {
  it('numbers trim trailing zeros and round like Math.round', () => {
    expect(formatNumber(12.95)).toBe('12.95');
    expect(formatNumber(30)).toBe('30');
    expect(formatNumber(2.449999)).toBe('2.45');
    expect(formatNumber(0.001)).toBe('0');
    expect(formatNumber(-3.2)).toBe('-3.2');
    expect(formatNumber(1.05, 1)).toBe(String(roundTo(1.05, 1)));
    for (const x of [0.125, 7.5, 99.999, 1234.5678, 0.07, 42.1]) expect(formatNumber(x, 3)).toBe(String(roundTo(x, 3)));
  });
  it('lengths and temperatures follow the unit system', () => {
    expect(formatLength(30.48, 'imperial')).toBe('100 ft');
    expect(formatLength(30.48, 'metric')).toBe('30.5 m');
    expect(formatTemperature(60, 'imperial')).toBe('140 °F');
    expect(formatTemperature(20, 'metric')).toBe('20 °C');
  });
  it('watts, amps, minutes', () => {
    expect(formatWatts(25.5)).toBe('25.5 W');
    expect(formatAmps(0.35)).toBe('350 mA');
    expect(formatAmps(1.92)).toBe('1.92 A');
    expect(formatMinutes(162)).toBe('2 h 42 min');
    expect(formatMinutes(27.4)).toBe('27 min');
    expect(formatMinutes(120)).toBe('2 h');
  });
  it('roundUpTo never rounds a clean value up by float noise', () => {
    expect(roundUpTo(1.5, 2)).toBe(1.5);
    expect(roundUpTo(0.3 / 0.1 / 10, 2)).toBe(0.3);
    expect(roundUpTo(1.501, 2)).toBe(1.51);
  });
});
