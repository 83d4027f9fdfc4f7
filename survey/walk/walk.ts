// A site's walk as the phone shows it: floors with their rooms, rooms with their devices, each
// with its gaps and, when complete, its instant advice.
import type { SiteItem } from '../capture';
import type { DeviceEvaluation } from '../rules/result-types';
import type { Caution } from '../standards/cautions';
import type { UnitSystem } from '../units';
import { walkAdvice, type WalkSiteMeta } from './advice';
import { deviceGapList, roomGaps, roomOwnGaps, walkProgress, type WalkProgress } from './gaps';

type Data = Record<string, unknown>;

export interface WalkDevice {
  readonly id: string;
  readonly data: Data;
  readonly name: string;
  readonly gaps: readonly string[];
  readonly advice: DeviceEvaluation | null;
  /** Why the rules could not take this complete device. */
  readonly refused: string | null;
}

export interface WalkRoom {
  readonly id: string;
  readonly data: Data;
  readonly name: string;
  readonly floorId: string | null;
  readonly isCloset: boolean;
  readonly devices: readonly WalkDevice[];
  /** The room's checklist (its own and its devices' gaps, grouped). */
  readonly gapLines: readonly string[];
  readonly gapCount: number;
}

export interface WalkFloor {
  readonly id: string;
  readonly data: Data;
  readonly name: string;
  readonly level: number | null;
  readonly rooms: readonly WalkRoom[];
}

export interface Walk {
  readonly units: UnitSystem;
  readonly floors: readonly WalkFloor[];
  /** Rooms whose floor is gone (another surveyor deleted it). */
  readonly strayRooms: readonly WalkRoom[];
  /** Devices whose room is gone. */
  readonly strayDevices: readonly WalkDevice[];
  readonly rooms: ReadonlyMap<string, WalkRoom>;
  readonly devices: ReadonlyMap<string, WalkDevice>;
  readonly progress: WalkProgress;
  readonly cautions: readonly Caution[];
}

const text = (x: unknown, fallback: string) => (typeof x === 'string' && x.trim() ? x.trim() : fallback);
const byName = <T extends { name: string }>(a: T, b: T) => a.name.localeCompare(b.name, undefined, { numeric: true });

export function buildWalk(meta: WalkSiteMeta, items: readonly SiteItem[]): Walk {
  const live = items.filter((i) => !i.deleted);
  const advice = walkAdvice(meta, live);
  const roomItems = live.filter((i) => i.kind === 'room');
  const roomIds = new Set(roomItems.map((r) => r.id));
  const floorItems = live.filter((i) => i.kind === 'floor');
  const floorIds = new Set(floorItems.map((f) => f.id));

  const devicesByRoom = new Map<string, WalkDevice[]>();
  const devices = new Map<string, WalkDevice>();
  const strayDevices: WalkDevice[] = [];
  for (const d of live) {
    if (d.kind !== 'device') continue;
    const entry: WalkDevice = {
      id: d.id,
      data: d.data,
      name: text(d.data.name, 'Unnamed device'),
      gaps: deviceGapList(d.data, roomIds).map((g) => g.text),
      advice: advice.byDevice.get(d.id) ?? null,
      refused: advice.refused.get(d.id) ?? null,
    };
    devices.set(d.id, entry);
    const roomId = d.data.roomId as string | undefined;
    if (roomId && roomIds.has(roomId)) {
      let list = devicesByRoom.get(roomId);
      if (!list) devicesByRoom.set(roomId, (list = []));
      list.push(entry);
    } else strayDevices.push(entry);
  }

  const rooms = new Map<string, WalkRoom>();
  const roomsByFloor = new Map<string, WalkRoom[]>();
  const strayRooms: WalkRoom[] = [];
  for (const r of roomItems) {
    const own = (devicesByRoom.get(r.id) ?? []).sort(byName);
    const floorId = typeof r.data.floorId === 'string' ? r.data.floorId : null;
    const lines = roomGaps(r.data, own.map((d) => d.data), floorIds);
    const ownLines = roomOwnGaps(r.data, floorIds).length;
    const room: WalkRoom = {
      id: r.id,
      data: r.data,
      name: text(r.data.name, 'Unnamed room'),
      floorId,
      isCloset: meta.closetRoomId === r.id,
      devices: own,
      gapLines: lines,
      gapCount: ownLines + own.reduce((n, d) => n + d.gaps.length, 0),
    };
    rooms.set(r.id, room);
    if (floorId && floorIds.has(floorId)) {
      let list = roomsByFloor.get(floorId);
      if (!list) roomsByFloor.set(floorId, (list = []));
      list.push(room);
    } else strayRooms.push(room);
  }

  const floors: WalkFloor[] = floorItems
    .map((f) => ({
      id: f.id,
      data: f.data,
      name: text(f.data.name, 'Unnamed floor'),
      level: typeof f.data.level === 'number' ? f.data.level : null,
      rooms: (roomsByFloor.get(f.id) ?? []).sort(byName),
    }))
    .sort((a, b) => (a.level ?? 0) - (b.level ?? 0) || byName(a, b));

  return {
    units: meta.units,
    floors,
    strayRooms: strayRooms.sort(byName),
    strayDevices: strayDevices.sort(byName),
    rooms,
    devices,
    progress: walkProgress({ closetRoomId: meta.closetRoomId }, live),
    cautions: advice.cautions,
  };
}
