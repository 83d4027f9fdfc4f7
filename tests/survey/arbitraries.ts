import fc from 'fast-check';
import {
  BARREL_SIZES, CABLE_ACCESS_VALUES, CABLE_CATEGORY_VALUES, DEVICE_KIND_VALUES, MOUNT_VALUES, parseSite, type Site, type SiteInput,
} from '../../survey/index';

type DeviceInput = SiteInput['devices'][number];

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

export const powerArb = fc.oneof(
  fc.record({ by: fc.constant('watts' as const), watts: num(0.05, 120), typical: fc.boolean() }),
  fc.record({ by: fc.constant('adapter' as const), volts: num(3, 48), amps: num(0.05, 6), typical: fc.boolean() }),
);

export const inputArb: fc.Arbitrary<DeviceInput['input']> = fc.oneof(
  fc.record({ type: fc.constant('poe' as const), class: fc.option(fc.constantFrom(0, 1, 2, 3, 4, 5, 6, 7, 8), { nil: undefined }) }),
  fc.record({ type: fc.constant('poe' as const), standard: fc.constantFrom('af', 'at', 'bt') }),
  fc.record({ type: fc.constant('passive_poe' as const), volts: num(5, 57) }),
  fc.record({
    type: fc.constant('dc_barrel' as const),
    size: fc.constantFrom(...BARREL_SIZES),
    polarity: fc.constantFrom('centre_positive', 'centre_negative', 'unknown'),
    volts: num(3, 48),
  }).map(({ size, ...rest }) => ({ ...rest, outerMm: size.outerMm, innerMm: size.innerMm })),
  fc.constant({ type: 'micro_usb' as const }),
  fc.constant({ type: 'usb_c' as const }),
  fc.record({ type: fc.constant('terminal_block' as const), volts: num(5, 48), current: fc.constantFrom('dc', 'ac') }),
  fc.constant({ type: 'ac_plug' as const }),
);

export const runArb = fc.record({
  lengthM: num(0.01, 1000),
  category: fc.constantFrom(...CABLE_CATEGORY_VALUES),
  cca: fc.boolean(),
  gauge: fc.option(fc.constantFrom(22, 23, 24, 26), { nil: undefined }),
});

export const deviceArb = (id: string, roomIds: readonly string[], sourceIds: readonly string[]): fc.Arbitrary<DeviceInput> =>
  fc.record({
    kind: fc.constantFrom(...DEVICE_KIND_VALUES),
    roomId: fc.constantFrom(...roomIds),
    mount: fc.constantFrom(...MOUNT_VALUES),
    power: powerArb,
    input: inputArb,
    mustStayUp: fc.boolean(),
    outdoor: fc.boolean(),
    outletDistanceM: fc.option(num(0, 50), { nil: undefined }),
    cableAccess: fc.constantFrom(...CABLE_ACCESS_VALUES),
    run: fc.option(runArb, { nil: undefined }),
    sourceId: sourceIds.length > 0 ? fc.option(fc.constantFrom(...sourceIds), { nil: undefined, freq: 4 }) : fc.constant(undefined),
  }).map((d) => ({ id, name: `Device ${id}`, ...d }));

const switchArb = (id: string) => fc.record({
  kind: fc.constant('poe_switch' as const), id: fc.constant(id), name: fc.constant(`Switch ${id}`),
  poeType: fc.constantFrom(1, 2, 3, 4), budgetW: num(10, 800), poePorts: fc.integer({ min: 1, max: 24 }),
  ownDrawW: num(0, 50), supplyEfficiency: num(0.5, 1),
});
const injectorArb = (id: string) => fc.record({
  kind: fc.constant('injector' as const), id: fc.constant(id), name: fc.constant(`Injector ${id}`),
  poeType: fc.constantFrom(1, 2, 3, 4), ports: fc.integer({ min: 1, max: 4 }),
});

/** Random valid sites (pins to sources without ports; batteries feeding disjoint sources). */
export const siteArb = (opts: { pins?: boolean; basis?: 'class' | 'expected' } = {}): fc.Arbitrary<Site> =>
  fc.record({
    nSwitches: fc.integer({ min: 0, max: 3 }),
    nInjectors: fc.integer({ min: 0, max: 2 }),
    nDevices: fc.integer({ min: 0, max: 30 }),
    ceiling: num(0.3, 1),
    basis: opts.basis ? fc.constant(opts.basis) : fc.constantFrom('class' as const, 'expected' as const),
    temp: num(-40, 60),
    units: fc.constantFrom('metric' as const, 'imperial' as const),
  }).chain((k) => {
    const sw = Array.from({ length: k.nSwitches }, (_, i) => `sw${i}`);
    const inj = Array.from({ length: k.nInjectors }, (_, i) => `inj${i}`);
    const sources = [...sw, ...inj, 'out0'];
    const rooms = ['closet', 'r1', 'r2'];
    return fc.record({
      switches: fc.tuple(...sw.map(switchArb)),
      injectors: fc.tuple(...inj.map(injectorArb)),
      devices: fc.tuple(...Array.from({ length: k.nDevices }, (_, i) => deviceArb(`d${i}`, rooms, opts.pins === false ? [] : sources))),
      feeds: fc.subarray(sources),
      batteryWh: num(1, 5000),
    }).map((p): Site => {
      const input: SiteInput = {
        id: 'prop', name: 'Property site',
        floors: [{ id: 'f', name: 'Floor', level: 0 }],
        rooms: rooms.map((id) => ({ id, name: id, floorId: 'f' })),
        closetRoomId: 'closet',
        settings: { planningCeiling: k.ceiling, budgetBasis: k.basis, cableTemperatureC: k.temp, units: k.units },
        powerSources: [...p.switches, ...p.injectors, { kind: 'outlet', id: 'out0', name: 'Outlet' }],
        batteries: [{ id: 'ups', name: 'UPS', capacity: { by: 'wh', wh: p.batteryWh }, feeds: p.feeds, otherLoads: [{ name: 'Router', watts: 5 }] }],
        devices: p.devices,
      };
      const r = parseSite(input);
      if (!r.ok) throw new Error(`generated an invalid site: ${JSON.stringify(r.errors.slice(0, 3))}`);
      return r.value;
    });
  });

/** Every number anywhere in the value is finite. */
export function allFinite(x: unknown, path = '$'): string | null {
  if (typeof x === 'number') return Number.isFinite(x) ? null : `${path} = ${x}`;
  if (Array.isArray(x)) {
    for (let i = 0; i < x.length; i++) {
      const r = allFinite(x[i], `${path}[${i}]`);
      if (r) return r;
    }
    return null;
  }
  if (x !== null && typeof x === 'object') {
    for (const [k, v] of Object.entries(x)) {
      const r = allFinite(v, `${path}.${k}`);
      if (r) return r;
    }
  }
  return null;
}
