// What the desk says about a plan that changed after its scope was published or signed:
// survey/report.ts compares the published scope with the one the plan would publish now.
import { describe, expect, it } from 'vitest';
import { demoSiteInput } from '../../survey/demo-site';
import { evaluateSite, parseSite, type SiteInput } from '../../survey/index';
import { buildReportContent, materialsTotalWords, scopeDrift, scopeDriftWords, type ReportContent } from '../../survey/report';

const money = (x: number) => x.toFixed(2);

function scopeOf(input: SiteInput, opts: { version?: number; total?: number; team?: string } = {}): ReportContent {
  const parsed = parseSite(input);
  if (!parsed.ok) throw new Error(parsed.errors[0].message);
  const total = opts.total ?? 0;
  return buildReportContent({
    site: input, team: opts.team ?? 'Crew', version: opts.version ?? 1, publishedAt: '2026-11-30T09:00:00.000Z',
    evaluation: evaluateSite(parsed.value), decisions: {},
    materials: { lines: [{ key: 'wall-plate:1-port', description: 'Wall plate', quantity: 4, unit: 'each', unitPrice: total / 4, total }], total, currency: 'USD', unpricedCount: 0 },
  });
}

describe('scopeDrift', () => {
  const published = scopeOf(demoSiteInput, { version: 3 });

  it('a plan that would publish the same scope has not changed, whatever its version, time or team name', () => {
    const again = { ...scopeOf(demoSiteInput, { version: 9, team: 'Renamed crew' }), publishedAt: '2026-12-01T10:00:00.000Z' };
    const drift = scopeDrift(published, again, true);
    expect(drift).toMatchObject({ sinceVersion: 3, signed: true, changed: false, otherParts: [] });
    expect(scopeDriftWords(drift, money)).toBeNull();
  });

  it('names a device added, one removed and one powered differently, and the new total', () => {
    const [first, second, ...rest] = demoSiteInput.devices;
    const added = { ...first, id: 'cam-shed', name: 'Shed camera' };
    // An AC plug far from any outlet: the rules move it to a new outlet whatever it was before.
    const moved = { ...second, input: { type: 'ac_plug' as const }, outletDistanceM: 20 };
    const now = scopeOf({ ...demoSiteInput, devices: [moved, ...rest, added] }, { total: 40 });
    const drift = scopeDrift(published, now, false);
    expect(drift.changed).toBe(true);
    expect(drift.changes.added).toEqual([{ id: 'cam-shed', name: 'Shed camera' }]);
    expect(drift.changes.removed).toEqual([{ id: first.id, name: first.name }]);
    expect(drift.changes.methodChanged.map((d) => d.id)).toEqual([second.id]);
    const words = scopeDriftWords(drift, money)!;
    expect(words).toContain('Added Shed camera');
    expect(words).toContain(`removed ${first.name}`);
    expect(words).toContain(`powered differently: ${second.name}`);
    expect(words).toContain('materials total 0.00 → 40.00');
  });

  it('a change with no device re-powered and no new total is named by the part it touches', () => {
    const longer = demoSiteInput.devices.map((d) => (d.run ? { ...d, run: { ...d.run, lengthM: d.run.lengthM + 1 } } : d));
    const drift = scopeDrift(published, scopeOf({ ...demoSiteInput, devices: longer }), true);
    expect(drift.changed).toBe(true);
    expect(drift.changes.methodChanged).toEqual([]);
    expect(drift.otherParts).toContain('the cable runs');
    expect(scopeDriftWords(drift, money)).toMatch(/^The .*cable runs/);
  });
});

describe('the scope lists every problem the plan has with a device', () => {
  it('a device left without a port says so under its own name, not only in the plan', () => {
    // Only the closet switch: take its ports away until a PoE device is left without one.
    const sources = (demoSiteInput.powerSources ?? []).map((s) => (s.kind === 'poe_switch' ? { ...s, poePorts: 2 } : s));
    const parsed = parseSite({ ...demoSiteInput, powerSources: sources });
    if (!parsed.ok) throw new Error(parsed.errors[0].message);
    const ev = evaluateSite(parsed.value);
    expect(ev.assignment.unassigned.length).toBeGreaterThan(0);
    const scope = buildReportContent({
      site: { ...demoSiteInput, powerSources: sources }, team: 'Crew', version: 1, publishedAt: '2026-11-30T09:00:00.000Z', evaluation: ev, decisions: {},
      materials: { lines: [], total: 0, currency: 'USD', unpricedCount: 0 },
    });
    const devices = scope.rooms.flatMap((r) => r.devices);
    for (const u of ev.assignment.unassigned) {
      const d = devices.find((x) => x.id === u.deviceId)!;
      expect(d.warnings.some((w) => w.includes(u.reason))).toBe(true);
    }
    // A device's own warnings are still there, each once.
    for (const e of ev.devices) {
      const d = devices.find((x) => x.id === e.deviceId)!;
      for (const w of e.warnings.filter((x) => x.severity !== 'info')) expect(d.warnings.filter((m) => m === w.message)).toHaveLength(1);
    }
  });
});

describe('a materials total', () => {
  it('reads "to be priced" while no line has a price, and the sum once one has', () => {
    const money = (x: number) => x.toFixed(2);
    expect(materialsTotalWords({ lines: [1, 2], total: 0, unpricedCount: 2 }, money)).toBe('to be priced');
    expect(materialsTotalWords({ lines: [1, 2], total: 6.5, unpricedCount: 1 }, money)).toBe('6.50');
    expect(materialsTotalWords({ lines: [], total: 0, unpricedCount: 0 }, money)).toBe('0.00');
  });
});
