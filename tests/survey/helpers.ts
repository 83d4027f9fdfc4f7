import { parseSite, type Site, type SiteInput } from '../../survey/index';

export type DeviceInput = SiteInput['devices'][number];
export type SourceInput = NonNullable<SiteInput['powerSources']>[number];
export type SwitchInput = Extract<SourceInput, { kind: 'poe_switch' }>;

/** A minimal valid site around the given devices and sources. */
export function siteWith(parts: Partial<SiteInput> & { devices: DeviceInput[] }): Site {
  const input: SiteInput = {
    id: 'site-test',
    name: 'Test site',
    floors: [{ id: 'f0', name: 'Ground', level: 0 }],
    rooms: [
      { id: 'closet', name: 'Closet', floorId: 'f0' },
      { id: 'room', name: 'Room', floorId: 'f0' },
    ],
    closetRoomId: 'closet',
    ...parts,
  };
  const r = parseSite(input);
  if (!r.ok) throw new Error(r.errors.map((e) => `${e.path}: ${e.message}`).join('\n'));
  return r.value;
}

/** A valid device input with overrides. */
export function dev(over: Partial<DeviceInput> & { id: string }): DeviceInput {
  return {
    kind: 'camera',
    name: `Device ${over.id}`,
    roomId: 'room',
    mount: 'high_wall',
    power: { by: 'watts', watts: 5 },
    input: { type: 'poe' },
    cableAccess: 'open_attic',
    run: { lengthM: 20, category: 'cat6' },
    ...over,
  };
}

/** A Type 2, 8-port, 120 W switch. */
export function switchInput(over: Partial<SwitchInput> = {}): SwitchInput {
  return {
    kind: 'poe_switch', id: 'sw', name: 'Closet switch', poeType: 2, budgetW: 120, poePorts: 8,
    ownDrawW: 10, supplyEfficiency: 0.9, ...over,
  };
}
