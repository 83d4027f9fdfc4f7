// The words a walk uses for each choice, the room types offered for quick entry and the typical
// power figures a new device starts with. Pure data: the phone screens and the gaps read it.
import type { CableAccess, DeviceKind, Mount, Polarity } from '../model/device';
import { POWER_INPUT_TYPES } from '../model/device';
import type { CableCategory } from '../standards/cabling';

export type PowerInputType = (typeof POWER_INPUT_TYPES)[number];

export const KIND_WORDS: Readonly<Record<DeviceKind, string>> = {
  access_point: 'Access point',
  camera: 'Camera',
  doorbell: 'Doorbell',
  hub: 'Hub',
  small_computer: 'Small computer',
  compact_switch: 'Compact switch',
  other: 'Other device',
};

export const MOUNT_WORDS: Readonly<Record<Mount, string>> = {
  ceiling: 'Ceiling',
  high_wall: 'High on a wall',
  low_wall: 'Low on a wall',
  soffit: 'Soffit or eave',
  shelf: 'Shelf or desk',
  outdoor_wall: 'Outside wall',
};

export const CABLE_ACCESS_WORDS: Readonly<Record<CableAccess, string>> = {
  open_attic: 'Open attic above',
  drop_ceiling: 'Drop ceiling',
  unfinished_basement: 'Unfinished basement below',
  finished_no_access: 'Finished, no access',
  exterior: 'Along the outside',
};

export const INPUT_WORDS: Readonly<Record<PowerInputType, string>> = {
  poe: 'PoE (802.3af/at/bt)',
  passive_poe: 'Passive PoE',
  dc_barrel: 'DC barrel plug',
  micro_usb: 'Micro-USB',
  usb_c: 'USB-C',
  terminal_block: 'Terminal block',
  ac_plug: 'Mains plug',
};

export const POLARITY_WORDS: Readonly<Record<Polarity, string>> = {
  centre_positive: 'Centre positive (+)',
  centre_negative: 'Centre negative (−)',
  unknown: 'Not marked',
};

export const CATEGORY_WORDS: Readonly<Record<CableCategory, string>> = { cat5e: 'Cat 5e', cat6: 'Cat 6', cat6a: 'Cat 6A' };

/**
 * Typical power need (W) a new device of each kind starts with, marked `typical: true` until the
 * surveyor reads the real figure. Planning figures only, from the trade-facts file §6:
 * all are [MEMORY] / typical, no source — the device's label or datasheet always wins.
 * "Other" has no typical figure: the surveyor must read it.
 */
export const TYPICAL_WATTS: Readonly<Record<DeviceKind, number | null>> = {
  access_point: 13, // Wi-Fi 6, 2×2: 10–16 W (facts §6, [MEMORY], typical, no source)
  camera: 7, // fixed camera with IR at night: 5–10 W (facts §6, [MEMORY], typical, no source)
  doorbell: 5, // video doorbell draw ~3–6 W (facts §6, draw [MEMORY], typical, no source)
  hub: 3, // smart-home hub 1–4 W (facts §6, [MEMORY], typical, no source)
  small_computer: 8, // small board computer, > 7 W under load (facts §6; idle [MEMORY], typical)
  compact_switch: 5, // own consumption 2–6 W (facts §6, [PRACTICE]/[MEMORY], typical, no source)
  other: null,
};

export interface RoomType {
  readonly name: string;
  readonly outdoor?: boolean;
}

/** The short list offered by "Add room"; anything else is typed by name. */
export const ROOM_TYPES: readonly RoomType[] = [
  { name: 'Living room' },
  { name: 'Kitchen' },
  { name: 'Hall' },
  { name: 'Office' },
  { name: 'Bedroom' },
  { name: 'Bathroom' },
  { name: 'Dining room' },
  { name: 'Laundry' },
  { name: 'Garage' },
  { name: 'Basement' },
  { name: 'Attic' },
  { name: 'Closet' },
  { name: 'Porch', outdoor: true },
  { name: 'Yard', outdoor: true },
];

/** Quick floors for "Add floor" (0 = ground floor, −1 = basement). */
export const FLOOR_PRESETS: readonly { readonly name: string; readonly level: number }[] = [
  { name: 'Basement', level: -1 },
  { name: 'Ground floor', level: 0 },
  { name: 'Upper floor', level: 1 },
  { name: 'Attic', level: 2 },
];

/**
 * A name not used yet: "Bedroom" when free, else "Bedroom 2", "Bedroom 3"… Comparison ignores case
 * and surrounding spaces, so "bedroom " counts as taken by "Bedroom".
 */
export function nextFreeName(base: string, taken: readonly string[]): string {
  const clean = base.trim();
  const used = new Set(taken.map((t) => t.trim().toLowerCase()));
  if (!used.has(clean.toLowerCase())) return clean;
  for (let n = 2; ; n++) {
    const candidate = `${clean} ${n}`;
    if (!used.has(candidate.toLowerCase())) return candidate;
  }
}

/** The fields of a new device of a kind: its typical power pre-filled and marked as typical. */
export function newDeviceFields(kind: DeviceKind, room: { id: string; name: string; outdoor?: boolean }, takenNames: readonly string[]): Record<string, unknown> {
  const watts = TYPICAL_WATTS[kind];
  const base = kind === 'other' ? `${room.name} device` : `${room.name} ${KIND_WORDS[kind].toLowerCase()}`;
  return {
    kind,
    name: nextFreeName(base, takenNames),
    roomId: room.id,
    outdoor: room.outdoor === true,
    ...(watts === null ? {} : { power: { by: 'watts', watts, typical: true } }),
  };
}

/** What a walk photo shows. */
export const PHOTO_LABELS = ['mount_point', 'ceiling_access', 'device_label'] as const;
export type PhotoLabel = (typeof PHOTO_LABELS)[number];
export const PHOTO_LABEL_WORDS: Readonly<Record<PhotoLabel, string>> = {
  mount_point: 'Mount point',
  ceiling_access: 'Ceiling access',
  device_label: 'Device label',
};
