// What a walk captures, item by item, and how the items of a site become a Site for the rules.
// During a walk an item is a draft: each field it has must be valid, but fields may still be missing
// (those are the walk's gaps). The rules run on the devices that are complete enough.
import * as v from "valibot";
import { BatteryBackupSchema } from "./model/battery";
import { deviceEntries } from "./model/device";
import { PoeSwitchSchema, InjectorSchema, OutletSourceSchema } from "./model/power-source";
import { FloorSchema, RoomSchema } from "./model/site";
import { fieldErrors, type FieldErrors } from "./validation";

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
    const schema = entries[field];
    if (!schema) {
      errors[field] = [`"${field}" is not a field of a ${kind}.`];
      continue;
    }
    if (value === null) continue; // a cleared field
    const result = v.safeParse(schema, value);
    if (!result.success) {
      for (const [path, messages] of Object.entries(fieldErrors(result.issues))) errors[path === "_" ? field : `${field}.${path}`] = messages;
    }
  }
  return Object.keys(errors).length ? { ok: false, errors } : { ok: true };
}

/** Removes cleared (null) fields: a merge with `{field: null}` deletes the field. */
export function mergeFields(data: Record<string, unknown>, patch: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = { ...data };
  for (const [k, val] of Object.entries(patch)) {
    if (val === null) delete out[k];
    else out[k] = val;
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
