import { describe, expect, it } from 'vitest';
import { evaluateDevice, parseDevice, recommendationLabel, SiteSettingsSchema, type Device, type DeviceEvaluation } from '../../survey/index';
import * as v from 'valibot';
import { dev, type DeviceInput } from './helpers';

const settings = v.parse(SiteSettingsSchema, {});
const imperial = v.parse(SiteSettingsSchema, { units: 'imperial' });

function device(over: Partial<DeviceInput> & { id?: string }): Device {
  const r = parseDevice(dev({ id: 'd', ...over }));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.value;
}
function evalDev(over: Partial<DeviceInput>, s = settings): DeviceEvaluation {
  return evaluateDevice(device(over), { settings: s });
}
const codes = (e: DeviceEvaluation) => e.warnings.map((w) => w.code);
const cautionIds = (e: DeviceEvaluation) => e.cautions.map((c) => c.id);

const barrel = (innerMm = 2.1, polarity: 'centre_positive' | 'centre_negative' | 'unknown' = 'centre_positive', volts = 12, outerMm = 5.5) =>
  ({ type: 'dc_barrel', outerMm, innerMm, polarity, volts }) as const;

describe('native PoE devices', () => {
  it('a 13 W Class 4 access point gets an 802.3at port that reserves 30 W', () => {
    const e = evalDev({ kind: 'access_point', power: { by: 'watts', watts: 13 }, input: { type: 'poe', class: 4 } });
    expect(e.recommendation).toBe('poe');
    expect(e.label).toBe('PoE (Class 4, 802.3at port)');
    expect(e.poe).toMatchObject({ poeClass: 4, poeType: 2, standard: '802.3at', pairs: 2, reservedW: 30, pdLoadW: 13 });
    expect(e.poe!.expectedPseW).toBeCloseTo(13 + e.poe!.cableLossW, 2);
    expect(e.reasons.join(' ')).toMatch(/network cable \(PoE\)/);
  });
  it('without a stated class, the class comes from the need (5 W → Class 2, 802.3af)', () => {
    const e = evalDev({ input: { type: 'poe' }, power: { by: 'watts', watts: 5 } });
    expect(e.label).toBe('PoE (Class 2, 802.3af port)');
    expect(e.poe!.reservedW).toBe(7);
  });
  it('Class 8 is budgeted at 90 W on an 802.3bt Type 4 port, 4 pairs', () => {
    const e = evalDev({ input: { type: 'poe', class: 8 }, power: { by: 'watts', watts: 65 } });
    expect(e.poe).toMatchObject({ poeClass: 8, poeType: 4, pairs: 4, reservedW: 90 });
    expect(e.label).toBe('PoE (Class 8, 802.3bt port)');
    expect(codes(e)).toContain('nec_725_144');
    expect(cautionIds(e)).toContain('bundling');
  });
  it('above 71.3 W (802.3bt Type 4 at the device) it cannot be powered', () => {
    const e = evalDev({ input: { type: 'poe' }, power: { by: 'watts', watts: 80 } });
    expect(e.recommendation).toBe('cannot_power');
    expect(e.label).toBe("can't power here");
    expect(e.reasons[0]).toMatch(/71\.3 W, 802\.3bt Type 4/);
    expect(e.poe).toBeNull();
  });
  it('a run over the 100 m channel cannot carry it', () => {
    const e = evalDev({ input: { type: 'poe', class: 4 }, power: { by: 'watts', watts: 20 }, run: { lengthM: 97, category: 'cat6' } });
    expect(e.recommendation).toBe('cannot_power');
    expect(codes(e)).toContain('channel_over_100m');
    expect(e.cable!.withinChannel).toBe(false);
  });
  it('a hot, long CCA run cannot carry Class 8 (1.54 × copper)', () => {
    const e = evaluateDevice(device({ input: { type: 'poe', class: 8 }, power: { by: 'watts', watts: 70 }, run: { lengthM: 90, category: 'cat5e', cca: true } }),
      { settings: { ...settings, cableTemperatureC: 60 } });
    expect(e.recommendation).toBe('cannot_power');
    expect(codes(e)).toEqual(expect.arrayContaining(['cca_cable', 'cable_cannot_carry']));
    expect(cautionIds(e)).toContain('no_cca');
  });
  it('a stated class below the need is flagged', () => {
    const e = evalDev({ input: { type: 'poe', class: 3 }, power: { by: 'watts', watts: 18 } });
    expect(e.recommendation).toBe('poe');
    expect(codes(e)).toContain('need_above_class');
  });
  it('a missing run is a gap; the expected draw uses the standard\'s worst-case loop', () => {
    const e = evalDev({ input: { type: 'poe', class: 4 }, power: { by: 'watts', watts: 13 }, run: undefined });
    expect(codes(e)).toContain('run_missing');
    // I = 2P / (V + √(V² − 4RP)) at 50 V, 12.5 Ω: 0.2795 A, loss 0.977 W.
    expect(e.poe!.cableLossW).toBeCloseTo(0.977, 3);
    expect(e.poe!.expectedPseW).toBeCloseTo(13.977, 3);
  });
});

describe('adapter-powered devices: the decision table', () => {
  it('must stay up, outlet near → PoE + splitter (12 V · 2 A · 5.5×2.1 mm): P_in = 12 × 2 ÷ 0.85 = 28.24 W → Class 5', () => {
    const e = evalDev({ power: { by: 'adapter', volts: 12, amps: 2 }, input: barrel(), mustStayUp: true, outletDistanceM: 0.5 });
    expect(e.recommendation).toBe('poe_splitter');
    expect(e.splitter).toMatchObject({ outputVolts: 12, minAmps: 2, ratingAmps: 2, efficiency: 0.85, inputW: 28.235, poeClass: 5, poeType: 3 });
    expect(e.splitter!.plug).toMatchObject({ kind: 'barrel', outerMm: 5.5, innerMm: 2.1, polarity: 'centre_positive' });
    expect(e.label).toBe('PoE + splitter (12 V · 2 A · 5.5×2.1 mm, centre-positive)');
    expect(e.poe).toMatchObject({ poeClass: 5, reservedW: 45, pdLoadW: 28.235 });
  });
  it('not critical, outlet near, indoors → existing outlet', () => {
    const e = evalDev({ power: { by: 'adapter', volts: 12, amps: 1 }, input: barrel(), outletDistanceM: 1.5 });
    expect(e.recommendation).toBe('existing_outlet');
    expect(e.label).toBe('existing outlet');
    expect(e.outlet).toEqual({ via: 'adapter', location: 'device', distanceM: 1.5, electrician: false });
  });
  it('outlet near but outdoors → splitter (low voltage rather than an outdoor mains outlet)', () => {
    const e = evalDev({ power: { by: 'adapter', volts: 12, amps: 1 }, input: barrel(), outletDistanceM: 1, outdoor: true });
    expect(e.recommendation).toBe('poe_splitter');
    expect(cautionIds(e)).toContain('outdoor_runs');
  });
  it('no outlet near → splitter: 12 V × 1 A ÷ 0.85 = 14.12 W → Class 4 (802.3at)', () => {
    const e = evalDev({ power: { by: 'adapter', volts: 12, amps: 1 }, input: barrel(), outletDistanceM: 4 });
    expect(e.recommendation).toBe('poe_splitter');
    expect(e.splitter).toMatchObject({ inputW: 14.118, poeClass: 4, poeType: 2 });
  });
  it('no outlet near and too much for PoE (12 V × 6 A ÷ 0.85 = 84.7 W) → new outlet (electrician)', () => {
    const e = evalDev({ power: { by: 'adapter', volts: 12, amps: 6 }, input: barrel(2.5), outletDistanceM: 5 });
    expect(e.recommendation).toBe('new_outlet');
    expect(e.label).toBe('new outlet (electrician)');
    expect(e.outlet!.electrician).toBe(true);
    expect(cautionIds(e)).toContain('mains_electrician');
    expect(e.reasons.join(' ')).toMatch(/licensed electrician/);
  });
  it('must stay up, far from an outlet, run too long → new outlet on a battery-fed circuit', () => {
    const e = evalDev({ power: { by: 'adapter', volts: 12, amps: 1 }, input: barrel(), mustStayUp: true, run: { lengthM: 120, category: 'cat6' } });
    expect(e.recommendation).toBe('new_outlet');
    expect(e.reasons.join(' ')).toMatch(/battery backup/);
  });
  it('the 5 V / 4 A (20 W) single-board-computer add-on case needs Class 4 (S57v, S58, S59v)', () => {
    const e = evalDev({ kind: 'small_computer', power: { by: 'adapter', volts: 5, amps: 4 }, input: { type: 'terminal_block', volts: 5 } });
    expect(e.splitter).toMatchObject({ outputVolts: 5, minAmps: 4, inputW: 23.529, poeClass: 4 });
    expect(e.splitter!.plug.kind).toBe('terminal');
  });
  it('the adapter label and the input voltage disagree', () => {
    const e = evalDev({ power: { by: 'adapter', volts: 9, amps: 1 }, input: barrel(), outletDistanceM: 4 });
    expect(codes(e)).toContain('adapter_volts_mismatch');
  });
});

describe('barrel plugs', () => {
  it('5.5×2.1 looks like 5.5×2.5: flagged with the barrel caution', () => {
    const e = evalDev({ power: { by: 'adapter', volts: 12, amps: 1 }, input: barrel(2.1), outletDistanceM: 4 });
    expect(codes(e)).toContain('barrel_lookalike');
    expect(cautionIds(e)).toContain('barrel_plug');
  });
  it('unknown polarity is a warning before connecting a splitter', () => {
    const e = evalDev({ power: { by: 'adapter', volts: 12, amps: 1 }, input: barrel(2.5, 'unknown'), outletDistanceM: 4 });
    expect(e.warnings.find((w) => w.code === 'polarity_unknown')!.severity).toBe('warning');
    expect(e.splitter!.plug.label).toBe('5.5×2.5 mm, polarity unknown');
  });
  it('an EIAJ-keyed plug at the wrong voltage (5.5×3.3 is 10.5–13.5 V, S50)', () => {
    const e = evalDev({ power: { by: 'watts', watts: 5 }, input: barrel(3.3, 'centre_positive', 5), outletDistanceM: 4 });
    expect(codes(e)).toContain('barrel_voltage_key');
    expect(codes(e)).not.toContain('barrel_lookalike');
  });
});

describe('USB devices: 5 V splitters at USB levels (facts §4.2)', () => {
  it('micro-USB 5 W = 1 A → USB Battery Charging 1.2 level; 5 ÷ 0.85 = 5.88 W → Class 2', () => {
    const e = evalDev({ kind: 'hub', power: { by: 'watts', watts: 5 }, input: { type: 'micro_usb' }, mustStayUp: true });
    expect(e.splitter).toMatchObject({ outputVolts: 5, minAmps: 1, ratingAmps: 1, usbLevel: 'USB Battery Charging 1.2', poeClass: 2 });
    expect(e.label).toBe('PoE + splitter (5 V · 1 A · micro-USB)');
  });
  it('USB-C 20 W needs USB PD at 9 V (S56): 9 V × 2.23 A ÷ 0.85 = 23.61 W → Class 4', () => {
    const e = evalDev({ kind: 'small_computer', power: { by: 'watts', watts: 20 }, input: { type: 'usb_c' }, outletDistanceM: 3 });
    expect(e.splitter).toMatchObject({ outputVolts: 9, minAmps: 2.23, usbLevel: 'USB PD 9 V', poeClass: 4 });
    expect(e.splitter!.inputW).toBeCloseTo(9 * 2.23 / 0.85, 3);
  });
  it('micro-USB above 7.5 W is warned about', () => {
    const e = evalDev({ power: { by: 'watts', watts: 10 }, input: { type: 'micro_usb' }, outletDistanceM: 3 });
    expect(codes(e)).toContain('usb_above_levels');
    expect(e.splitter).toMatchObject({ outputVolts: 5, minAmps: 2 });
  });
});

describe('passive PoE — never a standard port, never into ordinary gear', () => {
  it('is powered by its own injector at the closet, with a strong caution', () => {
    const e = evalDev({ kind: 'other', power: { by: 'watts', watts: 6 }, input: { type: 'passive_poe', volts: 24 } });
    expect(e.recommendation).toBe('existing_outlet');
    expect(e.poe).toBeNull();
    expect(e.outlet).toEqual({ via: 'own_passive_injector', location: 'closet', distanceM: null, electrician: false });
    expect(cautionIds(e)).toContain('passive_poe');
    expect(e.warnings.find((w) => w.code === 'passive_poe_device')!.severity).toBe('warning');
    expect(e.reasons.join(' ')).toMatch(/never from a standard PoE switch port|A standard PoE switch cannot power it/);
  });
  it('warns about voltage drop over a long run (> 10 %, common practice)', () => {
    const e = evalDev({ power: { by: 'watts', watts: 24 }, input: { type: 'passive_poe', volts: 24 }, run: { lengthM: 60, category: 'cat5e' } });
    // I = 1 A, loop = 65 m × 0.08422 Ω/m = 5.47 Ω → 5.47 V drop (22.8 %).
    expect(e.cable!.passive!.dropV).toBeCloseTo(5.474, 2);
    expect(codes(e)).toContain('passive_voltage_drop');
  });
});

describe('mains-powered devices', () => {
  it('AC plug: near → existing outlet; far → new outlet (electrician)', () => {
    expect(evalDev({ input: { type: 'ac_plug' }, outletDistanceM: 1 }).recommendation).toBe('existing_outlet');
    const far = evalDev({ input: { type: 'ac_plug' }, outletDistanceM: 3 });
    expect(far.recommendation).toBe('new_outlet');
    expect(far.outlet!.via).toBe('plug');
  });
  it('AC doorbell on a transformer: keeps it when wired, else a new transformer (electrician), with the 16 V / 30 VA caution (S66, S67)', () => {
    const wired = evalDev({ kind: 'doorbell', input: { type: 'terminal_block', volts: 16, current: 'ac' }, outletDistanceM: 0 });
    expect(wired.recommendation).toBe('existing_outlet');
    expect(wired.outlet!.via).toBe('transformer');
    expect(cautionIds(wired)).toContain('doorbell_transformer');
    const none = evalDev({ kind: 'doorbell', input: { type: 'terminal_block', volts: 16, current: 'ac' } });
    expect(none.recommendation).toBe('new_outlet');
    expect(cautionIds(none)).toEqual(expect.arrayContaining(['doorbell_transformer', 'mains_electrician']));
  });
  it('a critical mains device says it needs a battery-backed supply', () => {
    const e = evalDev({ input: { type: 'ac_plug' }, outletDistanceM: 0.5, mustStayUp: true });
    expect(e.reasons[0]).toMatch(/only if its supply is on a battery backup/);
  });
});

describe('other results', () => {
  it('a typical figure is marked for checking', () => {
    const e = evalDev({ power: { by: 'watts', watts: 6, typical: true } });
    expect(e.typicalFigure).toBe(true);
    expect(codes(e)).toContain('typical_figure');
  });
  it('reasons use the site\'s units (imperial → ft)', () => {
    const e = evalDev({ input: { type: 'ac_plug' }, outletDistanceM: 3.048 }, imperial);
    expect(e.reasons.join(' ')).toMatch(/10 ft away/);
  });
  it('recommendationLabel words', () => {
    const base = { poe: null, splitter: null } as const;
    expect(recommendationLabel({ ...base, recommendation: 'existing_outlet' })).toBe('existing outlet');
    expect(recommendationLabel({ ...base, recommendation: 'new_outlet' })).toBe('new outlet (electrician)');
    expect(recommendationLabel({ ...base, recommendation: 'cannot_power' })).toBe("can't power here");
    expect(recommendationLabel({ recommendation: 'poe', poe: { poeClass: 6, poeType: 3 }, splitter: null })).toBe('PoE (Class 6, 802.3bt port)');
  });
});
