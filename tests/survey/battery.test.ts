import { describe, expect, it } from 'vitest';
import { evaluateBattery, evaluateSite, runtimeMinutes, usableWattHours, buildPlanContext } from '../../survey/index';
import { dev, siteWith, switchInput } from './helpers';

describe('UPS runtime formula (facts §3)', () => {
  it('12 V × 9 Ah = 108 Wh; 108 Wh / 40 W = 162 min (S32; DERIVED)', () => {
    const usable = usableWattHours({ capacity: { by: 'v_ah', volts: 12, ah: 9 }, depthOfDischarge: 1, inverterEfficiency: 1, ageFactor: 1 });
    expect(usable).toBe(108);
    expect(runtimeMinutes(usable, 40)).toBe(162);
  });
  it('Wh × DoD × η × age (S34): 108 × 0.8 × 0.9 × 0.8 = 62.208 Wh', () => {
    expect(usableWattHours({ capacity: { by: 'wh', wh: 108 }, depthOfDischarge: 0.8, inverterEfficiency: 0.9, ageFactor: 0.8 })).toBeCloseTo(62.208, 9);
  });
  it('no load → no runtime (null, never Infinity or NaN)', () => {
    expect(runtimeMinutes(100, 0)).toBeNull();
  });
});

describe('evaluateBattery', () => {
  const site = () => siteWith({
    powerSources: [
      switchInput(),
      switchInput({ id: 'sw2', name: 'Garage switch' }),
      { kind: 'outlet', id: 'ups-out', name: 'Battery outlet' },
      switchInput({ id: 'flagged', name: 'Flagged switch', onBattery: true }),
    ],
    batteries: [{
      id: 'ups', name: 'Closet UPS', capacity: { by: 'v_ah', volts: 12, ah: 9 },
      inverterEfficiency: 0.9, depthOfDischarge: 0.8, ageFactor: 1,
      feeds: ['sw', 'ups-out'], otherLoads: [{ name: 'Router', watts: 10 }],
    }],
    devices: [
      dev({ id: 'cam', input: { type: 'poe', class: 3 }, power: { by: 'watts', watts: 6 }, mustStayUp: true, sourceId: 'sw' }),
      dev({ id: 'ap', kind: 'access_point', input: { type: 'poe', class: 4 }, power: { by: 'watts', watts: 13 }, sourceId: 'sw' }),
      dev({ id: 'garage', input: { type: 'poe', class: 2 }, power: { by: 'watts', watts: 4 }, mustStayUp: true, sourceId: 'sw2' }),
      dev({ id: 'flag', input: { type: 'poe', class: 2 }, power: { by: 'watts', watts: 4 }, sourceId: 'flagged' }),
      dev({ id: 'link', kind: 'other', input: { type: 'passive_poe', volts: 24 }, power: { by: 'watts', watts: 6 }, sourceId: 'ups-out' }),
      dev({ id: 'tv', kind: 'other', input: { type: 'ac_plug' }, power: { by: 'watts', watts: 60 }, outletDistanceM: 0.3, run: undefined }),
    ],
  });

  it('load = Σ PSE draw ÷ supply efficiency + own draw + outlet devices + other loads', () => {
    const s = site();
    const ctx = buildPlanContext(s);
    const r = evaluateBattery(s, ctx);
    const b = r.batteries[0];
    const pse = ctx.devices.filter((d) => d.deviceId === 'cam' || d.deviceId === 'ap').reduce((n, d) => n + d.poe!.expectedPseW, 0);
    expect(b.loads[0]).toMatchObject({ sourceId: 'sw', kind: 'poe_switch', efficiency: 0.9, ownDrawW: 10, deviceIds: ['cam', 'ap'] });
    expect(b.loads[0].wallW).toBeCloseTo(pse / 0.9 + 10, 3);
    expect(b.loads[1]).toMatchObject({ sourceId: 'ups-out', kind: 'outlet', wallW: 6, deviceIds: ['link'] });
    expect(b.otherLoadsW).toBe(10);
    expect(b.totalLoadW).toBeCloseTo(pse / 0.9 + 10 + 6 + 10, 3);
    expect(b.capacityWh).toBe(108);
    expect(b.usableWh).toBeCloseTo(77.76, 6);
    expect(b.runtimeMinutes).toBeCloseTo((77.76 / b.totalLoadW) * 60, 1);
    expect(b.cautions.map((c) => c.id)).toEqual(['battery']);
  });

  it('which devices stay up, and for how long', () => {
    const r = evaluateBattery(site());
    const by = Object.fromEntries(r.outage.devices.map((d) => [d.deviceId, d]));
    const minutes = r.batteries[0].runtimeMinutes;
    expect(by.cam).toMatchObject({ staysUp: true, batteryId: 'ups', minutes });
    expect(by.ap).toMatchObject({ staysUp: true, minutes });
    expect(by.link).toMatchObject({ staysUp: true, batteryId: 'ups' });
    expect(by.garage).toMatchObject({ staysUp: false, minutes: null });
    expect(by.flag).toMatchObject({ staysUp: true, batteryId: null, minutes: null });
    expect(by.flag.reason).toMatch(/runtime is unknown/);
    expect(by.tv).toMatchObject({ staysUp: false, reason: 'Its outlet is not on a battery backup.' });
    expect(r.outage.criticalDown).toEqual(['garage']);
    expect(r.outage.warnings[0]).toMatchObject({ code: 'critical_goes_down', deviceId: 'garage' });
    expect(r.outage.staysUpCount).toBe(4);
  });

  it('age derate scales the runtime', () => {
    const s = site();
    const young = evaluateBattery(s).batteries[0].runtimeMinutes!;
    const old = evaluateBattery({ ...s, batteries: [{ ...s.batteries[0], ageFactor: 0.8 }] }).batteries[0].runtimeMinutes!;
    expect(old / young).toBeCloseTo(0.8, 2);
  });

  it('an empty battery has no runtime and no NaN', () => {
    const s = siteWith({ batteries: [{ id: 'u', name: 'Spare UPS', capacity: { by: 'wh', wh: 500 } }], devices: [] });
    const b = evaluateBattery(s).batteries[0];
    expect(b).toMatchObject({ totalLoadW: 0, runtimeMinutes: null, runtimeText: 'no load' });
  });

  it('the site evaluation counts critical devices up and down', () => {
    expect(evaluateSite(site()).summary.mustStayUp).toEqual({ total: 2, staysUp: 1, goesDown: 1 });
  });
});
