import * as v from 'valibot';
import { PLANNING } from '../standards/planning-defaults';
import { UNIT_SYSTEM_VALUES } from '../units';
import { BatteryBackupSchema } from './battery';
import { fractionSchema, IdSchema, integerInRange, NameSchema, numberInRange } from './common';
import { DeviceSchema } from './device';
import { portCount, PowerSourceSchema, type PowerSource } from './power-source';

export const FloorSchema = v.object({
  id: IdSchema,
  name: NameSchema,
  /** 0 = ground floor, -1 = basement, 1 = first upper floor… */
  level: integerInRange('Floor level', -5, 200),
});

export const RoomSchema = v.object({
  id: IdSchema,
  name: NameSchema,
  floorId: IdSchema,
  outdoor: v.optional(v.boolean('"outdoor" must be true or false'), false),
});

export const BUDGET_BASIS_VALUES = ['class', 'expected'] as const;

export const SiteSettingsSchema = v.object({
  /** How lengths and temperatures are shown; data is always stored in SI. */
  units: v.optional(v.picklist(UNIT_SYSTEM_VALUES, 'Units must be "metric" or "imperial"'), 'metric'),
  /** Keep PoE load at or below this share of a switch budget. 0.8 — common practice, no standard. */
  planningCeiling: v.optional(fractionSchema('Planning ceiling'), PLANNING.planningCeiling.value),
  splitterEfficiency: v.optional(fractionSchema('Splitter efficiency'), PLANNING.splitterEfficiency.value),
  /** Cable temperature used for conductor resistance (°C). */
  cableTemperatureC: v.optional(
    numberInRange('Cable temperature', '°C', -40, PLANNING.cableTemperatureMaxC.value),
    PLANNING.cableTemperatureC.value,
  ),
  /** Cords added to every run to make the channel (m); the standard allows at most 10 m. */
  cordAllowanceM: v.optional(numberInRange('Cord allowance', 'm', 0, 10), 5),
  /** An outlet this close (m) counts as near the device. */
  nearOutletM: v.optional(numberInRange('Near-outlet distance', 'm', 0, 10), PLANNING.nearOutletM.value),
  /**
   * What a switch budget is checked against: "class" = the class power each
   * port reserves (static allocation, the safe default), "expected" = the
   * expected draw (device power plus cable loss, dynamic allocation).
   */
  budgetBasis: v.optional(v.picklist(BUDGET_BASIS_VALUES, 'Budget basis must be "class" or "expected"'), 'class'),
});

type PathKey = string | number;

/** Build a valibot issue path from the root object and a list of keys. */
function issuePath(root: unknown, keys: readonly PathKey[]): [v.IssuePathItem, ...v.IssuePathItem[]] {
  const items: v.IssuePathItem[] = [];
  let cur: unknown = root;
  for (const key of keys) {
    const value = (cur as Record<PathKey, unknown>)[key];
    if (typeof key === 'number') {
      items.push({ type: 'array', origin: 'value', input: cur as unknown[], key, value });
    } else {
      items.push({ type: 'object', origin: 'value', input: cur as Record<string, unknown>, key, value });
    }
    cur = value;
  }
  return items as [v.IssuePathItem, ...v.IssuePathItem[]];
}

const SiteObjectSchema = v.object({
  id: IdSchema,
  name: NameSchema,
  address: v.optional(v.pipe(v.string('Address must be text'), v.maxLength(500, 'Address is too long'))),
  floors: v.array(FloorSchema, '"floors" must be a list'),
  rooms: v.array(RoomSchema, '"rooms" must be a list'),
  /** The room holding the network closet: every cable run ends there. */
  closetRoomId: IdSchema,
  settings: v.optional(SiteSettingsSchema, {}),
  powerSources: v.optional(v.array(PowerSourceSchema, '"powerSources" must be a list'), []),
  batteries: v.optional(v.array(BatteryBackupSchema, '"batteries" must be a list'), []),
  devices: v.array(DeviceSchema, '"devices" must be a list'),
});

type SiteObject = v.InferOutput<typeof SiteObjectSchema>;

/** Cross-references: ids unique, every reference points at something that exists. */
function crossCheck(site: SiteObject, add: (message: string, keys: readonly PathKey[]) => void): void {
  const unique = (list: readonly { id: string }[], key: string, what: string): Set<string> => {
    const seen = new Set<string>();
    list.forEach((item, i) => {
      if (seen.has(item.id)) add(`Duplicate ${what} id "${item.id}"`, [key, i, 'id']);
      seen.add(item.id);
    });
    return seen;
  };
  const floors = unique(site.floors, 'floors', 'floor');
  const rooms = unique(site.rooms, 'rooms', 'room');
  unique(site.devices, 'devices', 'device');
  unique(site.powerSources, 'powerSources', 'power source');
  unique(site.batteries, 'batteries', 'battery');

  site.rooms.forEach((r, i) => {
    if (!floors.has(r.floorId)) add(`Room "${r.name}" is on floor "${r.floorId}", which is not in the site`, ['rooms', i, 'floorId']);
  });
  if (!rooms.has(site.closetRoomId)) add(`The closet room "${site.closetRoomId}" is not in the site`, ['closetRoomId']);

  const sources = new Map<string, PowerSource>();
  for (const s of site.powerSources) sources.set(s.id, s);
  site.powerSources.forEach((s, i) => {
    if (s.roomId !== undefined && !rooms.has(s.roomId)) add(`Power source "${s.name}" is in room "${s.roomId}", which is not in the site`, ['powerSources', i, 'roomId']);
  });

  const takenPorts = new Set<string>();
  site.devices.forEach((d, i) => {
    if (!rooms.has(d.roomId)) add(`Device "${d.name}" is in room "${d.roomId}", which is not in the site`, ['devices', i, 'roomId']);
    if (d.sourceId !== undefined && !sources.has(d.sourceId)) {
      add(`Device "${d.name}" is pinned to power source "${d.sourceId}", which is not in the site`, ['devices', i, 'sourceId']);
    }
    if (d.port !== undefined) {
      if (d.sourceId === undefined) {
        add(`Device "${d.name}" has a port but no power source; set "sourceId" too`, ['devices', i, 'port']);
      } else {
        const s = sources.get(d.sourceId);
        if (s !== undefined) {
          const n = portCount(s);
          if (s.kind === 'outlet') add(`Device "${d.name}" has a port on "${s.name}", but an outlet has no PoE ports`, ['devices', i, 'port']);
          else if (d.port > n) add(`Port ${d.port} does not exist on "${s.name}" (it has ${n} PoE port${n === 1 ? '' : 's'})`, ['devices', i, 'port']);
          const key = `${d.sourceId}\u0000${d.port}`;
          if (takenPorts.has(key)) add(`Port ${d.port} on "${s.name}" is pinned to more than one device`, ['devices', i, 'port']);
          takenPorts.add(key);
        }
      }
    }
  });

  const fedBy = new Map<string, string>();
  site.batteries.forEach((b, i) => {
    if (b.roomId !== undefined && !rooms.has(b.roomId)) add(`Battery "${b.name}" is in room "${b.roomId}", which is not in the site`, ['batteries', i, 'roomId']);
    b.feeds.forEach((id, j) => {
      if (!sources.has(id)) add(`Battery "${b.name}" feeds "${id}", which is not a power source in the site`, ['batteries', i, 'feeds', j]);
      const other = fedBy.get(id);
      if (other !== undefined) add(`Power source "${id}" is fed by two batteries ("${other}" and "${b.id}")`, ['batteries', i, 'feeds', j]);
      fedBy.set(id, b.id);
    });
  });
}

export const SiteSchema = v.pipe(
  SiteObjectSchema,
  v.rawCheck(({ dataset, addIssue }) => {
    if (!dataset.typed) return;
    const root = dataset.value;
    crossCheck(root, (message, keys) => addIssue({ message, path: issuePath(root, keys) }));
  }),
);

export type Floor = v.InferOutput<typeof FloorSchema>;
export type Room = v.InferOutput<typeof RoomSchema>;
export type SiteSettings = v.InferOutput<typeof SiteSettingsSchema>;
export type BudgetBasis = (typeof BUDGET_BASIS_VALUES)[number];
export type Site = v.InferOutput<typeof SiteSchema>;
export type SiteInput = v.InferInput<typeof SiteSchema>;
