// A walk's gaps: what is still missing before the surveyor leaves the house, in plain words.
// Pure: reads item data as the store keeps it (schema fields, possibly incomplete).
import * as v from 'valibot';
import { assembleSite } from '../capture';
import { deviceEntries, type DeviceKind } from '../model/device';
import { FloorSchema, RoomSchema } from '../model/site';
import { CHANNEL_LIMITS } from '../standards/cabling';
import { lengthFromSI } from '../units';
import { fieldErrors } from '../validation';
import { KIND_WORDS } from './words';

type Data = Record<string, unknown>;

export type DeviceGapCode = 'name' | 'kind' | 'room' | 'mount' | 'power' | 'power_typical' | 'input' | 'cable_access' | 'run' | 'run_long' | 'polarity' | 'invalid';

export interface DeviceGap {
  readonly code: DeviceGapCode;
  /** The device field the gap is about. */
  readonly field: string;
  /** Said of the device itself: "no power figure". */
  readonly text: string;
}

/** In the order the form asks for them. */
const REQUIRED: readonly { field: keyof typeof deviceEntries; code: DeviceGapCode; text: string }[] = [
  { field: 'name', code: 'name', text: 'no name' },
  { field: 'kind', code: 'kind', text: 'no device kind' },
  { field: 'roomId', code: 'room', text: 'not in a room' },
  { field: 'mount', code: 'mount', text: 'no mount point' },
  { field: 'power', code: 'power', text: 'no power figure' },
  { field: 'input', code: 'input', text: 'no power input (how it takes power)' },
  { field: 'cableAccess', code: 'cable_access', text: 'no cable access' },
];

const OPTIONAL_CHECKED = ['mustStayUp', 'outdoor', 'outletDistanceM', 'run', 'sourceId', 'port'] as const;

/** Field names as a surveyor reads them. */
export const DEVICE_FIELD_WORDS: Readonly<Record<string, string>> = {
  name: 'name',
  kind: 'kind',
  roomId: 'room',
  mount: 'mount point',
  power: 'power need',
  input: 'power input',
  mustStayUp: 'must stay up',
  outdoor: 'indoor or outdoor',
  outletDistanceM: 'nearest outlet distance',
  cableAccess: 'cable access',
  run: 'cable run',
  sourceId: 'power source',
  port: 'port',
  notes: 'notes',
};

const present = (x: unknown) => x !== undefined && x !== null;

/**
 * A run longer than TIA-568's 90 m permanent link (100 m channel with its cords) is something to
 * settle at the house: measure it again, find a shorter path, or note a place for a switch nearer.
 */
const LINK_LIMIT = `${CHANNEL_LIMITS.permanentLinkMaxM} m (${Math.round(lengthFromSI(CHANNEL_LIMITS.permanentLinkMaxM, 'imperial'))} ft)`;
const RUN_LONG: DeviceGap = {
  code: 'run_long',
  field: 'run',
  text: `its run is over the ${LINK_LIMIT} a network cable may run to the closet: measure it again, find a shorter path, or note where a switch nearer could go`,
};

/**
 * A cable run matters for power unless the device takes mains or low-voltage AC from where it is
 * (a mains plug, or an AC terminal block fed by a transformer): those never get PoE.
 */
export function runMatters(data: Data): boolean {
  const input = data.input as { type?: unknown; current?: unknown } | undefined;
  if (!input || typeof input !== 'object') return true;
  if (input.type === 'ac_plug') return false;
  if (input.type === 'terminal_block' && input.current === 'ac') return false;
  return true;
}

/**
 * The gaps of one device, each with its code and field. `roomIds`, when given, are the rooms that
 * still exist: a device in a deleted room has a gap.
 */
export function deviceGapList(data: Data, roomIds?: ReadonlySet<string>): DeviceGap[] {
  const gaps: DeviceGap[] = [];
  for (const r of REQUIRED) {
    const value = data[r.field];
    if (!present(value) || (r.field === 'name' && typeof value === 'string' && value.trim() === '')) {
      gaps.push({ code: r.code, field: r.field, text: r.text });
      continue;
    }
    const problem = invalid(r.field, value);
    if (problem) {
      gaps.push(problem);
      continue;
    }
    if (r.field === 'roomId' && roomIds && !roomIds.has(value as string)) gaps.push({ code: 'room', field: 'roomId', text: 'its room was deleted: move it to a room' });
    if (r.field === 'power' && (value as { typical?: unknown }).typical === true) {
      gaps.push({ code: 'power_typical', field: 'power', text: 'only a typical power figure: read the real one on its label' });
    }
    // Only someone at the device can read the polarity symbol; a splitter wired the wrong way round can harm it.
    if (r.field === 'input' && (value as { type?: unknown; polarity?: unknown }).type === 'dc_barrel' && (value as { polarity?: unknown }).polarity === 'unknown') {
      gaps.push({ code: 'polarity', field: 'input', text: 'its plug polarity is not read yet: look for the polarity symbol on its label or adapter' });
    }
  }
  for (const field of OPTIONAL_CHECKED) {
    const value = data[field];
    if (!present(value)) {
      if (field === 'run' && runMatters(data)) gaps.push({ code: 'run', field: 'run', text: 'no run length' });
      continue;
    }
    const problem = invalid(field, value);
    if (problem) gaps.push(problem);
    else if (field === 'run' && (value as { lengthM: number }).lengthM > CHANNEL_LIMITS.permanentLinkMaxM) gaps.push(RUN_LONG);
  }
  return gaps;
}

function invalid(field: keyof typeof deviceEntries, value: unknown): DeviceGap | null {
  const result = v.safeParse(deviceEntries[field], value);
  if (result.success) return null;
  const messages = Object.values(fieldErrors(result.issues)).flat();
  return { code: 'invalid', field, text: `check the ${DEVICE_FIELD_WORDS[field] ?? field}: ${messages[0] ?? 'it is not valid'}` };
}

/** What one device still lacks, in words said of the device ("no power figure"). */
export function deviceGaps(data: Data, roomIds?: ReadonlySet<string>): string[] {
  return deviceGapList(data, roomIds).map((g) => g.text);
}

/** How each gap reads for one device ("no power figure for Porch camera") or several. */
const GROUP_WORDS: Readonly<Record<DeviceGapCode, { one: (who: string) => string; many: (n: number) => string }>> = {
  name: { one: (who) => `${who} has no name`, many: (n) => `${n} devices have no name` },
  kind: { one: (who) => `no device kind for ${who}`, many: (n) => `${n} devices have no kind` },
  room: { one: (who) => `${who} is not in a room`, many: (n) => `${n} devices are not in a room` },
  mount: { one: (who) => `no mount point for ${who}`, many: (n) => `${n} devices have no mount point` },
  power: { one: (who) => `no power figure for ${who}`, many: (n) => `${n} devices have no power figure` },
  power_typical: { one: (who) => `only a typical power figure for ${who}`, many: (n) => `${n} devices have only a typical power figure` },
  input: { one: (who) => `no power input for ${who}`, many: (n) => `${n} devices don't say how they take power` },
  cable_access: { one: (who) => `no cable access for ${who}`, many: (n) => `${n} devices have no cable access` },
  run: { one: (who) => `no run length for ${who}`, many: (n) => `${n} devices have no run length` },
  polarity: { one: (who) => `the plug polarity of ${who} is not read yet`, many: (n) => `${n} devices have a plug polarity not read yet` },
  run_long: { one: (who) => `the run of ${who} is over ${LINK_LIMIT}: measure again or find a shorter path`, many: (n) => `${n} devices have runs over ${LINK_LIMIT}: measure again or find shorter paths` },
  invalid: { one: (who) => `a field of ${who} needs fixing`, many: (n) => `${n} devices have a field that needs fixing` },
};

const CODE_ORDER: readonly DeviceGapCode[] = ['name', 'kind', 'room', 'mount', 'power', 'power_typical', 'input', 'cable_access', 'run', 'run_long', 'polarity', 'invalid'];

/** "Porch camera", or "the doorbell" when it has no name yet. */
function deviceWho(data: Data): string {
  const name = typeof data.name === 'string' ? data.name.trim() : '';
  if (name) return name;
  const kind = KIND_WORDS[data.kind as DeviceKind];
  return kind ? `the ${kind.toLowerCase()}` : 'a device';
}

/** Groups device gaps by what is missing: one line per kind of gap. */
function groupDeviceGaps(devices: readonly Data[], roomIds?: ReadonlySet<string>): string[] {
  const byCode = new Map<DeviceGapCode, Data[]>();
  for (const d of devices) {
    const codes = new Set(deviceGapList(d, roomIds).map((g) => g.code));
    for (const code of codes) {
      let list = byCode.get(code);
      if (!list) byCode.set(code, (list = []));
      list.push(d);
    }
  }
  const lines: string[] = [];
  for (const code of CODE_ORDER) {
    const list = byCode.get(code);
    if (!list) continue;
    const words = GROUP_WORDS[code];
    lines.push(list.length === 1 ? words.one(deviceWho(list[0])) : words.many(list.length));
  }
  return lines;
}

/** A room's own gaps (its name, its floor), without its devices'. */
export function roomOwnGaps(room: Data, floorIds?: ReadonlySet<string>): string[] {
  const name = typeof room.name === 'string' && room.name.trim() ? room.name.trim() : 'a room';
  const out: string[] = [];
  if (!v.is(RoomSchema.entries.name, room.name) || !String(room.name).trim()) out.push('a room has no name');
  if (!present(room.floorId)) out.push(`${name} is on no floor`);
  else if (floorIds && !floorIds.has(room.floorId as string)) out.push(`${name} is on a floor that was deleted: move it to a floor`);
  return out;
}

/** What one room still lacks: its own fields, then its devices' gaps grouped. */
export function roomGaps(room: Data, devices: readonly Data[], floorIds?: ReadonlySet<string>): string[] {
  return [...roomOwnGaps(room, floorIds), ...groupDeviceGaps(devices)];
}

export interface GapItem {
  readonly id: string;
  readonly kind: string;
  readonly data: Data;
  readonly deleted?: boolean;
}

export interface WalkProgress {
  readonly floors: number;
  readonly rooms: number;
  readonly devices: number;
  /**
   * Every device counts in exactly one of these three, the same way on the phone and at the desk:
   * complete (no gaps at all, and in the plan), in the plan with gaps still to fill (a run length,
   * a typical figure to read), or left out of the plan until the walk captures what the rules need.
   */
  readonly devicesComplete: number;
  readonly devicesWithGaps: number;
  readonly devicesLeftOut: number;
  /** The ids of the devices left out of the plan, in capture order. */
  readonly leftOutDeviceIds: readonly string[];
  /** Every single missing thing counted once (a device missing two fields counts two). */
  readonly gapCount: number;
  /** The site's checklist, one line per kind of gap. */
  readonly lines: readonly string[];
}

function live(items: readonly GapItem[]) {
  const floors: GapItem[] = [];
  const rooms: GapItem[] = [];
  const devices: GapItem[] = [];
  for (const i of items) {
    if (i.deleted) continue;
    if (i.kind === 'floor') floors.push(i);
    else if (i.kind === 'room') rooms.push(i);
    else if (i.kind === 'device') devices.push(i);
  }
  return { floors, rooms, devices };
}

function siteOwnGaps(meta: { closetRoomId: string | null }, floors: readonly GapItem[], rooms: readonly GapItem[]): string[] {
  const out: string[] = [];
  if (floors.length === 0) out.push('no floors yet: add the floors of the house');
  else if (rooms.length === 0) out.push('no rooms yet: add the rooms you walk');
  for (const f of floors) if (!v.is(FloorSchema.entries.name, f.data.name)) out.push('a floor has no name');
  if (rooms.length > 0) {
    if (!meta.closetRoomId) out.push('no closet chosen: pick the room where the cables end');
    else if (!rooms.some((r) => r.id === meta.closetRoomId)) out.push('the closet room was deleted: choose the closet again');
  }
  return out;
}

/** The site's checklist: site-wide gaps (floors, closet), then every room's and device's, grouped. */
export function siteGaps(meta: { closetRoomId: string | null }, items: readonly GapItem[]): string[] {
  return [...walkProgress(meta, items).lines];
}

/**
 * Walk progress for the sites list and the walk view: counts, gap count and the checklist.
 * `leftOutDeviceIds`, when the caller has just assembled the site itself, saves assembling it again.
 */
export function walkProgress(meta: { closetRoomId: string | null }, items: readonly GapItem[], leftOutDeviceIds?: readonly string[]): WalkProgress {
  const { floors, rooms, devices } = live(items);
  const floorIds = new Set(floors.map((f) => f.id));
  const roomIds = new Set(rooms.map((r) => r.id));
  const own = siteOwnGaps(meta, floors, rooms);
  const roomLines = rooms.flatMap((r) => roomOwnGaps(r.data, floorIds));
  const deviceData = devices.map((d) => d.data);
  // Left out of the plan: exactly the devices the plan leaves out when it assembles the site.
  const leftOutIds = leftOutDeviceIds ?? assembleSite({ id: '', name: '', closetRoomId: meta.closetRoomId }, items).incompleteDeviceIds;
  const leftOut = new Set(leftOutIds);
  let deviceGapCount = 0;
  let devicesComplete = 0;
  devices.forEach((d, k) => {
    const n = deviceGapList(deviceData[k], roomIds).length;
    deviceGapCount += n;
    if (n === 0 && !leftOut.has(d.id)) devicesComplete++;
  });
  return {
    floors: floors.length,
    rooms: rooms.length,
    devices: devices.length,
    devicesComplete,
    devicesWithGaps: devices.length - devicesComplete - leftOut.size,
    devicesLeftOut: leftOut.size,
    leftOutDeviceIds: leftOutIds,
    gapCount: own.length + roomLines.length + deviceGapCount,
    lines: [...own, ...roomLines, ...groupDeviceGaps(deviceData, roomIds)],
  };
}

/** "14 of 16 devices complete · 1 not in the plan yet": the walk's and the desk's one line on devices. */
export function devicesProgressLabel(p: Pick<WalkProgress, 'devices' | 'devicesComplete' | 'devicesLeftOut'>): string {
  if (p.devices === 0) return 'no devices yet';
  const head = `${p.devicesComplete} of ${p.devices === 1 ? '1 device' : `${p.devices} devices`} complete`;
  return p.devicesLeftOut === 0 ? head : `${head} · ${p.devicesLeftOut} not in the plan yet`;
}

/** "no gaps", "1 gap", "3 gaps". */
export function gapsLabel(n: number): string {
  return n === 0 ? 'no gaps' : n === 1 ? '1 gap' : `${n} gaps`;
}
