import { describe, expect, it } from 'vitest';
import { assignPorts, buildPlanContext, evaluateSite, evaluateSwitch } from '../../survey/index';
import { dev, siteWith, switchInput } from './helpers';

const c4 = (id: string, over = {}) => dev({ id, input: { type: 'poe', class: 4 }, power: { by: 'watts', watts: 13 }, ...over });

describe('assignPorts', () => {
  it('never goes over the 80 % planning ceiling (class basis): 3 × 30 W fit in 96 W, the 4th is unassigned', () => {
    const site = siteWith({ powerSources: [switchInput()], devices: [c4('a'), c4('b'), c4('c'), c4('d')] });
    const a = assignPorts(site);
    expect(a.placements.map((p) => [p.deviceId, p.port])).toEqual([['a', 1], ['b', 2], ['c', 3]]);
    expect(a.unassigned).toHaveLength(1);
    expect(a.unassigned[0]).toMatchObject({ deviceId: 'd', code: 'over_ceiling' });
    expect(a.unassigned[0].reason).toMatch(/sets aside 30 W, but the roomiest suitable source, "Closet switch", has only 6 W left under its 80 % planning ceiling \(common practice, no standard\)/);
  });
  it('on the expected basis the same four fit (about 13.3 W each)', () => {
    const site = siteWith({ settings: { budgetBasis: 'expected' }, powerSources: [switchInput()], devices: [c4('a'), c4('b'), c4('c'), c4('d')] });
    expect(assignPorts(site).unassigned).toHaveLength(0);
  });
  it('places critical devices first, on the lowest ports', () => {
    const site = siteWith({ powerSources: [switchInput()], devices: [c4('a'), c4('b'), c4('c'), c4('crit', { mustStayUp: true })] });
    const a = assignPorts(site);
    expect(a.placements[0]).toMatchObject({ deviceId: 'crit', port: 1, critical: true });
    expect(a.unassigned.map((u) => u.deviceId)).toEqual(['c']);
  });
  it('prefers battery-backed switches for critical devices', () => {
    const site = siteWith({
      powerSources: [switchInput({ id: 'plain', name: 'Plain' }), switchInput({ id: 'backed', name: 'Backed' })],
      batteries: [{ id: 'b', name: 'UPS', capacity: { by: 'wh', wh: 200 }, feeds: ['backed'] }],
      devices: [c4('n'), c4('crit', { mustStayUp: true })],
    });
    const a = assignPorts(site);
    expect(a.placements.find((p) => p.deviceId === 'crit')!.sourceId).toBe('backed');
    expect(a.placements.find((p) => p.deviceId === 'n')!.sourceId).toBe('plain');
  });
  it('never uses more ports than the switch has', () => {
    const devices = Array.from({ length: 9 }, (_, i) => dev({ id: `d${i}`, input: { type: 'poe', class: 1 }, power: { by: 'watts', watts: 2 } }));
    const a = assignPorts(siteWith({ powerSources: [switchInput()], devices }));
    expect(a.placements).toHaveLength(8);
    expect(new Set(a.placements.map((p) => p.port)).size).toBe(8);
    expect(a.unassigned[0]).toMatchObject({ code: 'ports_full' });
    expect(a.unassigned[0].reason).toBe('All 8 suitable PoE ports (802.3af or better) are taken. Add a switch or an injector.');
  });
  it('says when the one suitable port is taken and the free ports left are of too low a type', () => {
    // Two Class 4 devices need 802.3at; the one at injector is taken, the af switch cannot serve them.
    const site = siteWith({
      powerSources: [switchInput({ poeType: 1, budgetW: 120 }), { kind: 'injector', id: 'inj', name: 'Injector', poeType: 2 }],
      devices: [c4('a'), c4('b')],
    });
    const a = assignPorts(site);
    expect(a.placements.map((p) => p.deviceId)).toEqual(['a']);
    expect(a.unassigned[0].reason).toBe('The only suitable PoE port (802.3at or better) is taken; the 8 free ports left are of a lower PoE type than it needs. Add a switch or an injector.');
  });
  it('a device needing 802.3bt goes to a bt injector, not the at switch', () => {
    const big = dev({ id: 'big', input: { type: 'poe', class: 6 }, power: { by: 'watts', watts: 45 } });
    const noInj = assignPorts(siteWith({ powerSources: [switchInput()], devices: [big] }));
    expect(noInj.unassigned[0]).toMatchObject({ code: 'no_port_of_type' });
    expect(noInj.unassigned[0].reason).toMatch(/needs an 802\.3bt Type 3 port/);
    const withInj = assignPorts(siteWith({ powerSources: [switchInput(), { kind: 'injector', id: 'inj', name: 'Injector', poeType: 3 }], devices: [big] }));
    expect(withInj.placements).toEqual([expect.objectContaining({ deviceId: 'big', sourceId: 'inj', port: 1, reservedW: 60 })]);
  });
  it('respects pins: a fixed port, a source without a port, even over budget', () => {
    const site = siteWith({
      powerSources: [switchInput()],
      devices: [c4('p5', { sourceId: 'sw', port: 5 }), c4('pAny', { sourceId: 'sw' }), c4('p1', { sourceId: 'sw', port: 1 }), c4('p2', { sourceId: 'sw', port: 2 })],
    });
    const a = assignPorts(site);
    expect(Object.fromEntries(a.placements.map((p) => [p.deviceId, p.port]))).toEqual({ p5: 5, p1: 1, p2: 2, pAny: 3 });
    expect(a.placements.every((p) => p.pinned)).toBe(true);
    expect(a.unassigned).toHaveLength(0);
  });
  it('a pin to a port of too low a type is refused with a reason', () => {
    const site = siteWith({ powerSources: [switchInput()], devices: [dev({ id: 'x', input: { type: 'poe', class: 5 }, power: { by: 'watts', watts: 35 }, sourceId: 'sw' })] });
    expect(assignPorts(site).unassigned[0]).toMatchObject({ code: 'pinned_type_too_low' });
  });
  it('a passive PoE device pinned to a switch is an error, and never placed', () => {
    const site = siteWith({ powerSources: [switchInput()], devices: [dev({ id: 'pp', input: { type: 'passive_poe', volts: 24 }, sourceId: 'sw' })] });
    const a = assignPorts(site);
    expect(a.placements).toHaveLength(0);
    expect(a.warnings[0]).toMatchObject({ code: 'passive_on_standard_port', severity: 'error', deviceId: 'pp' });
  });
});

describe('evaluateSwitch', () => {
  const fivePinned = () => siteWith({
    powerSources: [switchInput()],
    devices: [
      c4('crit', { sourceId: 'sw', port: 1, mustStayUp: true }),
      c4('b', { sourceId: 'sw', port: 2 }), c4('c', { sourceId: 'sw', port: 3 }),
      c4('d', { sourceId: 'sw', port: 4 }), c4('e', { sourceId: 'sw', port: 5 }),
    ],
  });

  it('reports class reservation and expected draw against budget and ceiling', () => {
    const site = siteWith({ powerSources: [switchInput()], devices: [c4('a'), c4('b')] });
    const s = evaluateSwitch(site, 'sw');
    expect(s).toMatchObject({ ports: 8, portsUsed: 2, portsFree: 6, budgetW: 120, planningCeiling: 0.8, ceilingW: 96, reservedW: 60, basis: 'class', basisW: 60, overBudget: false, overCeiling: false });
    expect(s.headroomReservedW).toBe(36);
    const ctx = buildPlanContext(site);
    const expected = ctx.devices.reduce((n, d) => n + (d.poe?.expectedPseW ?? 0), 0);
    expect(s.expectedW).toBeCloseTo(expected, 3);
    expect(s.headroomExpectedW).toBeCloseTo(96 - expected, 3);
    // Wall draw = expected ÷ supply efficiency + own draw.
    expect(s.wallDrawW).toBeCloseTo(expected / 0.9 + 10, 3);
    expect(s.reasons.join(' ')).toMatch(/80 % of its budget \(96 W\) — common practice, not a standard/);
  });
  it('over budget: sheds the lowest priority first, higher port first on a tie (S43v)', () => {
    const s = evaluateSwitch(fivePinned(), 'sw');
    expect(s.reservedW).toBe(150);
    expect(s.overBudget).toBe(true);
    expect(s.shedOrder).toEqual([5, 4, 3, 2, 1]);
    expect(s.wouldShed).toEqual([5]);
    expect(s.warnings.find((w) => w.code === 'over_budget')!.message).toMatch(/port 5 \(Device e\)/);
    expect(s.suggestions).toHaveLength(3);
    expect(s.suggestions[1]).toBe('Or use a switch with a PoE budget of at least 188 W.');
    expect(s.suggestions[2]).toMatch(/injector/);
  });
  it('critical devices are shed last even on high ports', () => {
    const site = siteWith({ powerSources: [switchInput()], devices: [c4('a', { sourceId: 'sw', port: 1 }), c4('z', { sourceId: 'sw', port: 8, mustStayUp: true })] });
    expect(evaluateSwitch(site, 'sw').shedOrder).toEqual([1, 8]);
  });
  it('over the ceiling but within budget is a warning with suggestions', () => {
    const site = siteWith({ powerSources: [switchInput()], devices: [c4('a', { sourceId: 'sw' }), c4('b', { sourceId: 'sw' }), c4('c', { sourceId: 'sw' }), c4('d', { sourceId: 'sw' })] });
    const s = evaluateSwitch(site, 'sw');
    expect(s).toMatchObject({ overBudget: false, overCeiling: true, wouldShed: [] });
    expect(s.warnings[0]).toMatchObject({ code: 'over_ceiling', severity: 'warning' });
    expect(s.suggestions[0]).toMatch(/Move about 24 W/);
  });
  it('throws for something that is not a PoE source', () => {
    const site = siteWith({ powerSources: [{ kind: 'outlet', id: 'o', name: 'Outlet' }], devices: [] });
    expect(() => evaluateSwitch(site, 'o')).toThrow(/not a PoE switch or injector/);
  });
  it('site evaluation gives the same switch result as evaluateSwitch', () => {
    const site = fivePinned();
    expect(evaluateSite(site).switches[0]).toEqual(evaluateSwitch(site, 'sw'));
  });
});
