import { describe, expect, it } from 'vitest';
import { demoSite, demoSiteInput, DEVICE_KIND_VALUES, evaluateSite, orderLengthM, parseSite, SITE_CAUTION_IDS } from '../../survey/index';
import { dev, siteWith, switchInput } from './helpers';

describe('the demo site (invented: the Okonkwo-Lindqvist house)', () => {
  const e = evaluateSite(demoSite);

  it('is valid and has every device kind', () => {
    expect(parseSite(demoSiteInput).ok).toBe(true);
    expect(new Set(demoSite.devices.map((d) => d.kind))).toEqual(new Set(DEVICE_KIND_VALUES));
    expect(demoSite.devices.length).toBeGreaterThanOrEqual(14);
  });

  it('follows the decision table for its devices', () => {
    const label = Object.fromEntries(e.devices.map((d) => [d.deviceId, d.label]));
    expect(label['ap-living']).toBe('PoE (Class 4, 802.3at port)');
    expect(label['ap-office']).toBe('PoE (Class 5, 802.3bt port)'); // 32 W, 802.3bt → Class 5 (≤ 40 W)
    expect(label['cam-porch']).toBe('PoE (Class 2, 802.3af port)'); // 5 W, no class stated
    expect(label['cam-garage']).toBe('existing outlet'); // outlet 1 m away, indoors, not critical
    expect(label['cam-drive']).toBe('PoE + splitter (12 V · 0.5 A · 5.5×2.5 mm, polarity unknown)');
    expect(label['hub-kitchen']).toBe('PoE + splitter (5 V · 1 A · USB-C)'); // must stay up
    expect(label['hub-hall']).toBe('existing outlet');
    expect(label['link-shed']).toBe('existing outlet'); // passive PoE: its own injector
    expect(label['display-hall']).toBe('new outlet (electrician)');
    expect(label['bell-front']).toBe('existing transformer'); // keeps its doorbell transformer
  });

  it('places the pinned access point on its injector and the rest on the closet switch', () => {
    expect(e.assignment.unassigned).toEqual([]);
    expect(e.assignment.placements.find((p) => p.deviceId === 'ap-office')).toMatchObject({ sourceId: 'inj-office', port: 1, pinned: true });
    const sw = e.switches.find((s) => s.sourceId === 'sw-closet')!;
    expect(sw.portsUsed).toBe(8);
    expect(sw.overCeiling).toBe(false);
    // Critical devices got the low ports.
    expect(sw.rows.filter((r) => r.critical).map((r) => r.port)).toEqual([1, 2, 3, 4]);
  });

  it('summary counts add up', () => {
    const s = e.summary;
    expect(Object.values(s.byRecommendation).reduce((a, b) => a + b, 0)).toBe(s.deviceCount);
    expect(s.deviceCount).toBe(demoSite.devices.length);
    const poe = e.devices.filter((d) => d.poe !== null);
    expect(s.poeWatts.reservedW).toBeCloseTo(poe.reduce((n, d) => n + d.poe!.reservedW, 0), 3);
    expect(s.poeWatts.expectedW).toBeCloseTo(poe.reduce((n, d) => n + d.poe!.expectedPseW, 0), 3);
    expect(s.newOutlets).toEqual([{ deviceId: 'display-hall', deviceName: 'Hall wall display', roomId: 'rm-hall', roomName: 'Hall', via: 'plug', mustStayUp: false }]);
    expect(s.mustStayUp).toEqual({ total: 4, staysUp: 4, goesDown: 0 });
    expect(s.warningCounts.error).toBe(e.warnings.filter((w) => w.severity === 'error').length);
  });

  it('cable totals: 10 % + 3 m service loop per drop (common practice, no source)', () => {
    const runs = demoSite.devices.filter((d) => d.run !== undefined);
    const total = runs.reduce((n, d) => n + d.run!.lengthM * 1.1 + 3, 0);
    expect(e.summary.cableTotalM).toBeCloseTo(total, 1);
    const cat6a = e.summary.cable.find((c) => c.category === 'cat6a')!;
    expect(cat6a).toEqual({ category: 'cat6a', cca: false, runs: 1, runM: 24, slackM: 5.4, totalM: 29.4 });
    // The CCA run is listed on its own so it can be replaced.
    expect(e.summary.cable.find((c) => c.cca)).toMatchObject({ category: 'cat5e', runs: 1 });
    expect(orderLengthM(10)).toBe(14);
  });

  it('battery: 12 V × 9 Ah × 0.8 × 0.9 = 77.76 Wh usable; runtime = usable ÷ load × 60', () => {
    const b = e.batteries[0];
    expect(b.capacityWh).toBe(108);
    expect(b.usableWh).toBeCloseTo(77.76, 6);
    expect(b.runtimeMinutes).toBeCloseTo((77.76 / b.totalLoadW) * 60, 1);
    expect(b.otherLoadsW).toBe(18);
  });

  it('carries the site-wide cautions with sources (facts §7) plus the battery caution', () => {
    expect(e.cautions.map((c) => c.id)).toEqual([...SITE_CAUTION_IDS, 'battery']);
    for (const c of e.cautions) expect(c.source.length).toBeGreaterThan(0);
  });

  it('flags the CCA run, the passive device and the unknown polarity', () => {
    const codes = e.warnings.map((w) => `${w.deviceId}:${w.code}`);
    expect(codes).toEqual(expect.arrayContaining(['cam-garage:cca_cable', 'link-shed:passive_poe_device', 'cam-drive:polarity_unknown']));
  });

  it('is deterministic and JSON-stable', () => {
    expect(evaluateSite(demoSite)).toEqual(e);
    expect(JSON.parse(JSON.stringify(e))).toEqual(e);
  });

  it('uses invented names only in its rooms and devices', () => {
    expect(demoSite.name).toBe('The Okonkwo-Lindqvist house');
    expect(demoSite.address).toBe('14 Larchmere Lane');
  });
});

describe('site summary rules', () => {
  it('with the class basis the demo switch is short: devices are unassigned and more switches are needed', () => {
    const e = evaluateSite({ ...demoSite, settings: { ...demoSite.settings, budgetBasis: 'class' } });
    expect(e.summary.unassignedCount).toBeGreaterThan(0);
    expect(e.summary.switches.additionalNeeded).toBeGreaterThanOrEqual(1);
    expect(e.summary.switches.additionalBasis).toMatch(/8-port switches with a 120 W budget \(like "Closet PoE switch"\)/);
    expect(e.warnings.some((w) => w.code === 'unassigned_over_ceiling' && w.severity === 'error')).toBe(true);
    // Unassigned devices go down in a power cut.
    const un = new Set(e.assignment.unassigned.map((u) => u.deviceId));
    for (const o of e.outage.devices) if (un.has(o.deviceId)) expect(o).toMatchObject({ staysUp: false, reason: 'It has no PoE port assigned yet.' });
  });

  it('groups splitters by output volts, rating and plug', () => {
    const cam = (id: string, amps: number) => dev({
      id, power: { by: 'adapter', volts: 12, amps }, outletDistanceM: 5,
      input: { type: 'dc_barrel', outerMm: 5.5, innerMm: 2.1, polarity: 'centre_positive', volts: 12 },
    });
    const e = evaluateSite(siteWith({ powerSources: [switchInput({ budgetW: 500 })], devices: [cam('a', 1), cam('b', 0.8), cam('c', 2.5)] }));
    expect(e.summary.splitters).toEqual([
      { outputVolts: 12, ratingAmps: 1, plug: '5.5×2.1 mm, centre-positive', count: 2, maxPoeClass: 4, deviceIds: ['a', 'b'] },
      // 12 V × 2.5 A ÷ 0.85 = 35.3 W → Class 5
      { outputVolts: 12, ratingAmps: 2.5, plug: '5.5×2.1 mm, centre-positive', count: 1, maxPoeClass: 5, deviceIds: ['c'] },
    ]);
  });

  it('warns when more than 24 high-power runs need bundling (TSB-184-A)', () => {
    const devices = Array.from({ length: 25 }, (_, i) => dev({ id: `ap${i}`, input: { type: 'poe', class: 6 }, power: { by: 'watts', watts: 45 } }));
    const e = evaluateSite(siteWith({ devices }));
    expect(e.warnings.find((w) => w.code === 'bundle_size')!.message).toMatch(/25 high-power \(802\.3bt\) runs/);
    // 60 W each under a 96 W ceiling (120 W placeholder × 80 %): one per switch.
    expect(e.summary.switches).toMatchObject({ inPlan: 0, additionalNeeded: 25 });
  });

  it('an empty site evaluates cleanly', () => {
    const e = evaluateSite(siteWith({ devices: [] }));
    expect(e.summary.deviceCount).toBe(0);
    expect(e.summary.cableTotalM).toBe(0);
    expect(e.cautions.map((c) => c.id)).toEqual([...SITE_CAUTION_IDS]);
  });
});
