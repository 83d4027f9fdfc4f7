// What a walk captures, item by item, and how the items of a site become a Site for the rules.
// During a walk an item is a draft: each field it has must be valid, but fields may still be missing
// (those are the walk's gaps). The rules run on the devices that are complete enough.
import * as v from "valibot";
import { BatteryBackupSchema } from "./model/battery";
import { DeviceSchema, deviceEntries } from "./model/device";
import { InjectorSchema, OutletSourceSchema, PoeSwitchSchema, PowerSourceSchema } from "./model/power-source";
import { FloorSchema, RoomSchema, type SiteInput } from "./model/site";
import { addFieldError, fieldErrors, type FieldErrors } from "./validation";

export const ITEM_KINDS = ["floor", "room", "device", "source", "battery"] as const;
export type ItemKind = (typeof ITEM_KINDS)[number];

/** Capture-only fields the rules do not read. */
const captureEntries = {
  notes: v.optional(v.pipe(v.string("Notes must be text."), v.maxLength(4000, "Keep notes under 4,000 characters."))),
};

const DeviceDraftEntries = { ...deviceEntries, ...captureEntries };
const SOURCE_OPTIONS = { poe_switch: PoeSwitchSchema, injector: InjectorSchema, outlet: OutletSourceSchema } as const;

type Entries = Record<string, v.GenericSchema>;

function entriesFor(kind: ItemKind, data: Record<string, unknown>): Entries | string {
  switch (kind) {
    case "floor":
      return FloorSchema.entries;
    case "room":
      return { ...RoomSchema.entries, ...captureEntries };
    case "device":
      return DeviceDraftEntries;
    case "battery":
      return BatteryBackupSchema.entries;
    case "source": {
      const option = SOURCE_OPTIONS[data.kind as keyof typeof SOURCE_OPTIONS];
      return option ? option.entries : 'A power source needs "kind": poe_switch, injector or outlet.';
    }
  }
}

/** Checks every field a draft item has (and refuses unknown ones); missing fields are allowed. */
export function checkItemDraft(kind: ItemKind, data: Record<string, unknown>): { ok: true } | { ok: false; errors: FieldErrors } {
  const entries = entriesFor(kind, data);
  if (typeof entries === "string") return { ok: false, errors: { kind: [entries] } };
  const errors: FieldErrors = {};
  for (const [field, value] of Object.entries(data)) {
    // Own keys only: "constructor" or "__proto__" must not find Object's members.
    const schema = Object.hasOwn(entries, field) ? entries[field] : undefined;
    if (!schema) {
      addFieldError(errors, field, `"${field}" is not a field of a ${kind}.`);
      continue;
    }
    if (value === null) continue; // a cleared field
    const result = v.safeParse(schema, value);
    if (!result.success) {
      for (const [path, messages] of Object.entries(fieldErrors(result.issues))) addFieldError(errors, path === "_" ? field : `${field}.${path}`, ...messages);
    }
  }
  return Object.keys(errors).length ? { ok: false, errors } : { ok: true };
}

/** Removes cleared (null) fields: a merge with `{field: null}` deletes the field. */
export function mergeFields(data: Record<string, unknown>, patch: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = { ...data };
  for (const [k, val] of Object.entries(patch)) {
    if (val === null) delete out[k];
    // defineProperty: a key named "__proto__" stays a plain (and then refused) field, never a prototype.
    else Object.defineProperty(out, k, { value: val, enumerable: true, writable: true, configurable: true });
  }
  return out;
}

export interface SiteItem {
  id: string;
  siteId: string;
  kind: ItemKind;
  data: Record<string, unknown>;
  deleted: boolean;
  version: number;
}

export interface AssembledSite {
  /** The site as the rules take it: complete items only. */
  site: SiteInput;
  /** Devices left out of the plan: not complete enough for the rules yet (their gaps say what is missing). */
  incompleteDeviceIds: string[];
}

/** What assembling a site reads of an item (a stored item, or a walk's item as the phone keeps it). */
export interface AssemblyItem {
  readonly id: string;
  readonly kind: string;
  readonly data: Record<string, unknown>;
  readonly deleted?: boolean;
}

/**
 * Builds the rules' Site from a site's captured items. Devices that fail the full device schema
 * are left out (they are gaps, not errors) so the rules can still advise on the rest.
 */
export function assembleSite(meta: { id: string; name: string; address?: string; closetRoomId: string | null; settings?: Record<string, unknown> }, siteItems: readonly AssemblyItem[]): AssembledSite {
  const live = siteItems.filter((i) => !i.deleted);
  const pick = (kind: ItemKind): (Record<string, unknown> & { id: string })[] => live.filter((i) => i.kind === kind).map((i) => ({ ...i.data, id: i.id }));
  const floors = pick("floor").filter((f) => v.is(FloorSchema, f));
  const floorIds = new Set(floors.map((f) => f.id));
  const rooms = pick("room")
    .filter((r) => v.is(RoomSchema, r) && floorIds.has((r as { floorId: string }).floorId))
    .map(({ notes: _notes, ...r }) => r);
  const roomIds = new Set(rooms.map((r) => r.id));
  const sources = pick("source").filter((s) => v.is(PowerSourceSchema, s));
  const sourceIds = new Set(sources.map((s) => s.id));
  const incompleteDeviceIds: string[] = [];
  const devices = pick("device").flatMap(({ notes: _notes, ...d }) => {
    const parsed = v.safeParse(DeviceSchema, d);
    if (!parsed.success || !roomIds.has(parsed.output.roomId)) {
      incompleteDeviceIds.push(d.id);
      return [];
    }
    // A hand-picked source that is gone (or not captured yet) is dropped rather than failing the site.
    if (parsed.output.sourceId && !sourceIds.has(parsed.output.sourceId)) return [{ ...d, sourceId: undefined, port: undefined }];
    return [d];
  });
  const closetRoomId = meta.closetRoomId && roomIds.has(meta.closetRoomId) ? meta.closetRoomId : (rooms[0]?.id ?? "");
  return {
    site: {
      id: meta.id,
      name: meta.name,
      address: meta.address,
      floors,
      rooms,
      closetRoomId,
      settings: meta.settings ?? {},
      powerSources: sources,
      batteries: pick("battery").filter((b) => v.is(BatteryBackupSchema, b)),
      devices,
    } as SiteInput,
    incompleteDeviceIds,
  };
}

/** The other way: a whole Site as items (the demo seed, imports). */
export function itemsOfSite(site: SiteInput): { kind: ItemKind; id: string; data: Record<string, unknown> }[] {
  const as = (kind: ItemKind, list: readonly { id: string }[] | undefined) => (list ?? []).map((x) => ({ kind, id: x.id, data: { ...x } as Record<string, unknown> }));
  return [
    ...as("floor", site.floors),
    ...as("room", site.rooms),
    ...as("source", site.powerSources),
    ...as("battery", site.batteries),
    ...as("device", site.devices),
  ];
}
