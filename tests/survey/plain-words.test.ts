// The scope's everyday words for each device (survey/plain-words.ts): what the homeowner reads
// first, with the rules' technical reasons kept behind them. Checked against the plan's own
// figures (the switch it is placed on, the outage runtime) rather than against fixed sentences.
import { describe, expect, it } from 'vitest';
import { demoSiteInput } from '../../survey/demo-site';
import { evaluateSite, formatMinutes, parseSite, type SiteInput } from '../../survey/index';
import { buildReportContent, scopeDrift, type ReportContent, type ReportDevice } from '../../survey/report';
import { dev, switchInput, type DeviceInput } from './helpers';

function scopeOf(input: SiteInput): ReportContent {
  const parsed = parseSite(input);
  if (!parsed.ok) throw new Error(parsed.errors.map((e) => `${e.path}: ${e.message}`).join('; '));
  return buildReportContent({
    site: input, team: 'Crew', version: 1, publishedAt: '2026-11-30T09:00:00.000Z',
    evaluation: evaluateSite(parsed.value), decisions: {},
    materials: { lines: [], total: 0, currency: 'USD', unpricedCount: 0 },
  });
}

const devicesOf = (scope: ReportContent): ReportDevice[] => scope.rooms.flatMap((r) => r.devices);

/** A small site: one Type 2 switch on a battery, and the given devices. */
function small(devices: DeviceInput[], over: Partial<SiteInput> = {}): SiteInput {
  return {
    id: 'site-words', name: 'Words test house',
    floors: [{ id: 'f0', name: 'Ground', level: 0 }],
    rooms: [{ id: 'closet', name: 'Closet', floorId: 'f0' }, { id: 'room', name: 'Room', floorId: 'f0' }],
    closetRoomId: 'closet',
    powerSources: [switchInput(), { kind: 'outlet', id: 'wall', name: 'Closet outlet' }],
    batteries: [{ id: 'ups', name: 'Closet battery', capacity: { by: 'wh', wh: 300 }, feeds: ['sw'] }],
    devices,
    ...over,
  };
}

const words = (d: ReportDevice) => d.plain!.join(' ');

describe('the scope in everyday words', () => {
  const demo = scopeOf(demoSiteInput);

  it('gives every demo device its words, with none of the engineering figures the technical detail keeps', () => {
    for (const d of devicesOf(demo)) {
      expect(d.plain!.length, d.name).toBeGreaterThanOrEqual(2);
      // Loop resistance, port classes, the standards' names and watts stay in the technical reasons.
      expect(words(d), d.name).not.toMatch(/Ω|loop resistance|Class \d|802\.3|\d W\b|patch cord/);
      expect(d.reasons.length, d.name).toBeGreaterThan(0);
    }
  });

  it('names the switch or injector the plan put a PoE device on', () => {
    const ev = evaluateSite(parseSiteOrThrow(demoSiteInput));
    const sourceName = new Map((demoSiteInput.powerSources ?? []).map((s) => [s.id, s.name]));
    for (const p of ev.assignment.placements) {
      const d = devicesOf(demo).find((x) => x.id === p.deviceId)!;
      expect(words(d)).toContain(`"${sourceName.get(p.sourceId)}"`);
    }
  });

  it('says how long a device keeps working in a power cut, from the outage check', () => {
    const ev = evaluateSite(parseSiteOrThrow(demoSiteInput));
    for (const o of ev.outage.devices) {
      const text = words(devicesOf(demo).find((x) => x.id === o.deviceId)!);
      if (o.staysUp && o.minutes !== null) expect(text).toContain(`for about ${formatMinutes(o.minutes)}`);
      if (!o.staysUp) expect(text).toMatch(/goes off/);
    }
  });

  it('a device that must stay up but goes down says so, and points to the note', () => {
    const scope = scopeOf(small([dev({ id: 'hub', kind: 'hub', input: { type: 'ac_plug' }, outletDistanceM: 0.5, mustStayUp: true })]));
    const d = devicesOf(scope)[0];
    expect(words(d)).toContain('It should keep working in a power cut, but as planned it goes off');
    expect(d.warnings.length).toBeGreaterThan(0);
  });

  it('a new outlet is work for a licensed electrician, with the distance in the site\'s units', () => {
    const device = dev({ id: 'tv', kind: 'other', input: { type: 'ac_plug' }, outletDistanceM: 3.5, run: undefined, cableAccess: 'finished_no_access' });
    const metric = devicesOf(scopeOf(small([device])))[0];
    expect(words(metric)).toContain('A licensed electrician puts in a new outlet beside it: the nearest outlet now is 3.5 m away.');
    // Finished walls: the homeowner is told what the work leaves behind, though no cable is run.
    expect(words(metric)).toMatch(/surface cable cover, or some patching/);
    const imperial = devicesOf(scopeOf(small([device], { settings: { units: 'imperial' } })))[0];
    // 3.5 m = 11.48 ft (1 ft = 0.3048 m exactly, NIST SP 811 / the 1959 international yard and pound).
    expect(words(imperial)).toContain('11.5 ft away');
  });

  it('passive PoE gear keeps its own injector, with the warning never to connect it to other equipment', () => {
    const scope = scopeOf(small([dev({ id: 'link', kind: 'other', input: { type: 'passive_poe', volts: 24 }, power: { by: 'watts', watts: 6 } })]));
    const text = words(devicesOf(scope)[0]);
    expect(text).toContain('It keeps its own power injector, plugged into an outlet in the network closet.');
    expect(text).toContain('never connect it, or the device\'s cable, to any other equipment');
  });

  it('a splitter is described by the socket it feeds, and the adapter it replaces', () => {
    const scope = scopeOf(small([dev({
      id: 'cam', power: { by: 'adapter', volts: 12, amps: 1 }, mustStayUp: true,
      input: { type: 'dc_barrel', outerMm: 5.5, innerMm: 2.1, polarity: 'centre_positive', volts: 12 },
    })]));
    const d = devicesOf(scope)[0];
    expect(d.recommendation).toBe('poe_splitter');
    expect(words(d)).toContain('a small PoE splitter beside it, which feeds its 12 V round power plug');
    expect(words(d)).toContain('Its own adapter is no longer needed.');
  });

  it('a PoE device with no free port is told so, not that it is powered', () => {
    const devices = [1, 2, 3].map((i) => dev({ id: `ap${i}`, kind: 'access_point', power: { by: 'watts', watts: 10 } }));
    const scope = scopeOf(small(devices, { powerSources: [switchInput({ poePorts: 2 })] }));
    const texts = devicesOf(scope).map(words);
    expect(texts.filter((t) => t.includes('no PoE port is free for it yet'))).toHaveLength(1);
    expect(texts.filter((t) => t.includes('from "Closet switch"'))).toHaveLength(2);
  });

  it('tells how the cable reaches the device, from the access the walk recorded', () => {
    const scope = scopeOf(small([
      dev({ id: 'a', cableAccess: 'unfinished_basement' }),
      dev({ id: 'b', cableAccess: 'exterior', outdoor: true }),
    ]));
    const [a, b] = devicesOf(scope);
    expect(words(a)).toContain('comes up from the basement below');
    expect(words(b)).toContain('runs along the outside of the house');
    // In the closet itself the cable is a short one, whatever the access above the closet.
    const inCloset = devicesOf(scopeOf(small([dev({ id: 'nas', kind: 'small_computer', roomId: 'closet', cableAccess: 'unfinished_basement' })])))[0];
    expect(words(inCloset)).toContain('It sits in the network closet, so its cable is a short one there.');
    expect(words(inCloset)).not.toContain('basement');
  });
});

describe('a scope published before the everyday words were kept', () => {
  it('is not reported as changed only because the words are new', () => {
    const now = scopeOf(demoSiteInput);
    const before: ReportContent = {
      ...now,
      rooms: now.rooms.map((r) => ({ ...r, devices: r.devices.map(({ plain: _plain, ...d }) => d) })),
    };
    expect(scopeDrift(before, now, true).changed).toBe(false);
    // A real change to the words still counts once a version has them.
    const edited = { ...now, rooms: now.rooms.map((r, i) => (i === 0 ? { ...r, devices: r.devices.map((d) => ({ ...d, plain: ['Different words.'] })) } : r)) };
    expect(scopeDrift(now, edited, true).otherParts).toContain("the devices' reasons or warnings");
  });
});

function parseSiteOrThrow(input: SiteInput) {
  const parsed = parseSite(input);
  if (!parsed.ok) throw new Error(parsed.errors[0].message);
  return parsed.value;
}
