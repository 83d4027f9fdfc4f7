import { describe, expect, it } from 'vitest';
import { demoSiteInput, parseDevice, parseSite, SiteSchema, type FieldError } from '../../survey/index';
import { generateBenchSite } from '../bench/rules-bench';
import * as v from 'valibot';
import { dev, switchInput, type DeviceInput } from './helpers';

function siteInput(devices: unknown[], extra: Record<string, unknown> = {}) {
  return {
    id: 's', name: 'Site',
    floors: [{ id: 'f0', name: 'Ground', level: 0 }],
    rooms: [{ id: 'closet', name: 'Closet', floorId: 'f0' }, { id: 'room', name: 'Room', floorId: 'f0' }],
    closetRoomId: 'closet',
    devices,
    ...extra,
  };
}

function errorsOf(input: unknown): FieldError[] {
  const r = parseSite(input);
  expect(r.ok).toBe(false);
  return r.errors as FieldError[];
}

function deviceErrors(over: Partial<DeviceInput> | Record<string, unknown>): FieldError[] {
  return errorsOf(siteInput([{ ...dev({ id: 'd1' }), ...over }]));
}

describe('bad input gives clear per-field errors', () => {
  it('negative watts', () => {
    const e = deviceErrors({ power: { by: 'watts', watts: -5 } });
    expect(e).toEqual([{ path: 'devices.0.power.watts', message: 'Power need cannot be negative (got -5 W)' }]);
  });
  it('zero watts', () => {
    expect(deviceErrors({ power: { by: 'watts', watts: 0 } })[0]).toEqual({ path: 'devices.0.power.watts', message: 'Power need must be more than 0 W' });
  });
  it('negative adapter amps', () => {
    expect(deviceErrors({ power: { by: 'adapter', volts: 12, amps: -1 } })[0].path).toBe('devices.0.power.amps');
  });
  it('NaN and Infinity are rejected, never passed on', () => {
    expect(deviceErrors({ power: { by: 'watts', watts: Number.NaN } })[0]).toEqual({ path: 'devices.0.power.watts', message: 'Power need must be a number' });
    expect(deviceErrors({ power: { by: 'watts', watts: Infinity } })[0]).toEqual({ path: 'devices.0.power.watts', message: 'Power need must be a finite number' });
  });
  it('a PoE class that does not exist (class 9)', () => {
    const e = deviceErrors({ input: { type: 'poe', class: 9 } });
    expect(e).toHaveLength(1);
    expect(e[0].path).toBe('devices.0.input.class');
    expect(e[0].message).toBe('PoE class 9 does not exist: classes are whole numbers from 0 to 8 (802.3bt)');
  });
  it('a fractional or negative class', () => {
    expect(deviceErrors({ input: { type: 'poe', class: 2.5 } })[0].message).toMatch(/PoE class 2.5 does not exist/);
    expect(deviceErrors({ input: { type: 'poe', class: -1 } })[0].message).toMatch(/PoE class -1 does not exist/);
  });
  it('a class the stated standard cannot have (Class 4 on 802.3af)', () => {
    const e = deviceErrors({ input: { type: 'poe', class: 4, standard: 'af' } });
    expect(e).toEqual([{ path: 'devices.0.input.class', message: 'Class 4 needs 802.3at; a device that says 802.3af cannot be Class 4' }]);
  });
  it('a run of 0 m', () => {
    const e = deviceErrors({ run: { lengthM: 0, category: 'cat6' } });
    expect(e).toEqual([{ path: 'devices.0.run.lengthM', message: 'Cable run must be more than 0 m' }]);
  });
  it('a run of 10 km', () => {
    const e = deviceErrors({ run: { lengthM: 10000, category: 'cat6' } });
    expect(e).toEqual([{
      path: 'devices.0.run.lengthM',
      message: 'Cable run of 10000 m is too large (at most 1000 m; the PoE channel limit is 100 m)',
    }]);
  });
  it('a barrel size that does not exist (5.5 × 3.0)', () => {
    const e = deviceErrors({ input: { type: 'dc_barrel', outerMm: 5.5, innerMm: 3.0, polarity: 'centre_positive', volts: 12 } });
    expect(e).toHaveLength(1);
    expect(e[0].path).toBe('devices.0.input.innerMm');
    expect(e[0].message).toMatch(/^5\.5×3 mm is not a barrel size we know; known sizes: 5\.5×2\.1, 5\.5×2\.5, /);
  });
  it('an unknown cable category, gauge, input type', () => {
    expect(deviceErrors({ run: { lengthM: 10, category: 'cat7' } })[0]).toMatchObject({ path: 'devices.0.run.category' });
    expect(deviceErrors({ run: { lengthM: 10, category: 'cat6', gauge: 28 } })[0].message).toMatch(/Unknown conductor gauge 28/);
    expect(deviceErrors({ input: { type: 'solar' } })[0]).toMatchObject({ path: 'devices.0.input.type' });
  });
  it('passive PoE above 57 V', () => {
    expect(deviceErrors({ input: { type: 'passive_poe', volts: 90 } })[0].message).toMatch(/PoE never exceeds 57 V/);
  });
  it('efficiencies outside (0, 1]', () => {
    const e1 = errorsOf(siteInput([], { settings: { splitterEfficiency: 0 } }));
    expect(e1[0]).toEqual({ path: 'settings.splitterEfficiency', message: 'Splitter efficiency must be more than 0 (got 0); write 85 % as 0.85' });
    const e2 = errorsOf(siteInput([], { powerSources: [switchInput({ supplyEfficiency: 88 })] }));
    expect(e2[0]).toEqual({ path: 'powerSources.0.supplyEfficiency', message: 'Supply efficiency must be at most 1 (got 88); write 85 % as 0.85' });
    const e3 = errorsOf(siteInput([], { settings: { planningCeiling: 1.2 } }));
    expect(e3[0].path).toBe('settings.planningCeiling');
  });
  it('a PoE type that does not exist, a cable temperature over 60 °C', () => {
    expect(errorsOf(siteInput([], { powerSources: [switchInput({ poeType: 5 as never })] }))[0]).toMatchObject({ path: 'powerSources.0.poeType' });
    expect(errorsOf(siteInput([], { settings: { cableTemperatureC: 75 } }))[0]).toEqual({
      path: 'settings.cableTemperatureC', message: 'Cable temperature must be at most 60 °C (got 75 °C)',
    });
  });
  it('reports every bad field at once', () => {
    const e = errorsOf(siteInput([
      { ...dev({ id: 'a' }), power: { by: 'watts', watts: -1 } },
      { ...dev({ id: 'b' }), input: { type: 'poe', class: 9 } },
      { ...dev({ id: 'c' }), run: { lengthM: 0, category: 'cat6' } },
    ]));
    expect(e.map((x) => x.path)).toEqual(['devices.0.power.watts', 'devices.1.input.class', 'devices.2.run.lengthM']);
  });
});

describe('cross-references', () => {
  it('unknown room, duplicate ids, unknown closet', () => {
    const e = errorsOf({ ...siteInput([dev({ id: 'a', roomId: 'attic' }), dev({ id: 'a' })]), closetRoomId: 'nowhere' });
    expect(e).toContainEqual({ path: 'devices.1.id', message: 'Duplicate device id "a"' });
    expect(e).toContainEqual({ path: 'closetRoomId', message: 'The closet room "nowhere" is not in the site' });
    expect(e).toContainEqual({ path: 'devices.0.roomId', message: 'Device "Device a" is in room "attic", which is not in the site' });
  });
  it('pins: unknown source, port without source, port beyond the count, the same port twice, a port on an outlet', () => {
    const e = errorsOf(siteInput([
      dev({ id: 'a', sourceId: 'ghost' }),
      dev({ id: 'b', port: 2 }),
      dev({ id: 'c', sourceId: 'sw', port: 9 }),
      dev({ id: 'd', sourceId: 'sw', port: 3 }),
      dev({ id: 'e', sourceId: 'sw', port: 3 }),
      dev({ id: 'f', sourceId: 'out', port: 1 }),
    ], { powerSources: [switchInput(), { kind: 'outlet', id: 'out', name: 'Outlet' }] }));
    expect(e).toEqual([
      { path: 'devices.0.sourceId', message: 'Device "Device a" is pinned to power source "ghost", which is not in the site' },
      { path: 'devices.1.port', message: 'Device "Device b" has a port but no power source; set "sourceId" too' },
      { path: 'devices.2.port', message: 'Port 9 does not exist on "Closet switch" (it has 8 PoE ports)' },
      { path: 'devices.4.port', message: 'Port 3 on "Closet switch" is pinned to more than one device' },
      { path: 'devices.5.port', message: 'Device "Device f" has a port on "Outlet", but an outlet has no PoE ports' },
    ]);
  });
  it('batteries: unknown feed, a source fed twice', () => {
    const bat = (id: string, feeds: string[]) => ({ id, name: id, capacity: { by: 'wh', wh: 100 }, feeds });
    const e = errorsOf(siteInput([], { powerSources: [switchInput()], batteries: [bat('b1', ['sw', 'nope']), bat('b2', ['sw'])] }));
    expect(e).toEqual([
      { path: 'batteries.0.feeds.1', message: 'Battery "b1" feeds "nope", which is not a power source in the site' },
      { path: 'batteries.1.feeds.0', message: 'Power source "sw" is fed by two batteries ("b1" and "b2")' },
    ]);
  });
});

describe('valid input', () => {
  it('fills defaults (SI values, planning defaults)', () => {
    const r = parseSite(siteInput([dev({ id: 'a' })]));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.settings).toEqual({
      units: 'metric', planningCeiling: 0.8, splitterEfficiency: 0.85, cableTemperatureC: 20, cordAllowanceM: 5, nearOutletM: 1.5, budgetBasis: 'class',
    });
    expect(r.value.devices[0]).toMatchObject({ mustStayUp: false, outdoor: false, run: { cca: false } });
  });
  it('the schema is usable directly with valibot (shared by client and server)', () => {
    expect(v.safeParse(SiteSchema, siteInput([dev({ id: 'a' })])).success).toBe(true);
  });
  it('hands out a frozen site whose devices share one layout, with the same JSON as the schema gives', () => {
    const input = siteInput([
      dev({ id: 'a' }),
      dev({ id: 'b', input: { type: 'dc_barrel', outerMm: 5.5, innerMm: 2.1, polarity: 'centre_positive', volts: 12 }, power: { by: 'adapter', volts: 12, amps: 1 } }),
      { ...dev({ id: 'c', input: { type: 'ac_plug' } }), run: undefined, outletDistanceM: 0.5 },
    ]);
    const r = parseSite(input);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const [a, b, c] = r.value.devices;
    expect(Object.keys(b)).toEqual(Object.keys(a));
    expect(Object.keys(c)).toEqual(Object.keys(a));
    expect(Object.keys(b.input)).toEqual(Object.keys(a.input));
    expect(JSON.stringify(r.value)).toBe(JSON.stringify(v.parse(SiteSchema, input)));
    expect(Object.isFrozen(r.value)).toBe(true);
    expect(Object.isFrozen(b.input)).toBe(true);
    expect(Object.isFrozen(r.value.devices)).toBe(true);
    // Every kind of input and power, with and without each optional field.
    for (const site of [demoSiteInput, generateBenchSite(600, 4)]) {
      expect(JSON.stringify(parseSite(site).ok && (parseSite(site) as { value: unknown }).value)).toBe(JSON.stringify(v.parse(SiteSchema, site)));
    }
  });
  it('parseDevice checks a single device', () => {
    expect(parseDevice(dev({ id: 'a' })).ok).toBe(true);
    const r = parseDevice({ ...dev({ id: 'a' }), input: { type: 'poe', class: 9 } });
    expect(r.errors[0]).toMatchObject({ path: 'input.class' });
  });
});
