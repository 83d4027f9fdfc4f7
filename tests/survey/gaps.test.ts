import { describe, expect, it } from 'vitest';
import { itemsOfSite } from '../../survey/capture';
import { demoSiteInput } from '../../survey/demo-site';
import { deviceGapList, deviceGaps, devicesProgressLabel, gapsLabel, roomGaps, siteGaps, walkProgress, type GapItem } from '../../survey/walk/gaps';
import { newDeviceFields } from '../../survey/walk/words';

const complete = {
  kind: 'camera',
  name: 'Porch camera',
  roomId: 'porch',
  mount: 'soffit',
  power: { by: 'watts', watts: 5 },
  input: { type: 'poe' },
  cableAccess: 'exterior',
  run: { lengthM: 21, category: 'cat6' },
};

const floor = (id: string, name = 'Ground floor'): GapItem => ({ id, kind: 'floor', data: { name, level: 0 } });
const room = (id: string, name: string, floorId = 'f0'): GapItem => ({ id, kind: 'room', data: { name, floorId } });
const device = (id: string, data: Record<string, unknown>): GapItem => ({ id, kind: 'device', data });

describe('deviceGaps', () => {
  it('a complete device has none', () => {
    expect(deviceGaps(complete)).toEqual([]);
  });

  it('a device just added from a kind lacks everything but its name, room and (typical) power', () => {
    const fresh = newDeviceFields('camera', { id: 'porch', name: 'Porch', outdoor: true }, []);
    expect(fresh).toMatchObject({ name: 'Porch camera', outdoor: true, power: { by: 'watts', typical: true } });
    expect(deviceGaps(fresh)).toEqual([
      'no mount point',
      'only a typical power figure: read the real one on its label',
      'no power input (how it takes power)',
      'no cable access',
      'no run length',
    ]);
  });

  it('an "other" device has no typical figure, so its power is a gap', () => {
    const fresh = newDeviceFields('other', { id: 'hall', name: 'Hall' }, []);
    expect(fresh.power).toBeUndefined();
    expect(deviceGaps(fresh)).toContain('no power figure');
  });

  it('reading the real figure closes the typical gap', () => {
    expect(deviceGaps({ ...complete, power: { by: 'watts', watts: 5, typical: true } })).toEqual(['only a typical power figure: read the real one on its label']);
    expect(deviceGaps({ ...complete, power: { by: 'adapter', volts: 12, amps: 1, typical: false } })).toEqual([]);
  });

  it('no run is a gap only where the cable could carry power', () => {
    const { run: _run, ...noRun } = complete;
    expect(deviceGaps(noRun)).toEqual(['no run length']);
    expect(deviceGaps({ ...noRun, input: { type: 'ac_plug' } })).toEqual([]);
    expect(deviceGaps({ ...noRun, input: { type: 'terminal_block', volts: 16, current: 'ac' } })).toEqual([]);
    expect(deviceGaps({ ...noRun, input: { type: 'terminal_block', volts: 12, current: 'dc' } })).toEqual(['no run length']);
    expect(deviceGaps({ ...noRun, input: { type: 'micro_usb' } })).toEqual(['no run length']);
  });

  it('a stored value that breaks its schema is a gap that says why', () => {
    expect(deviceGaps({ ...complete, power: { by: 'watts', watts: -5 } })).toEqual(['check the power need: Power need cannot be negative (got -5 W)']);
    expect(deviceGapList({ ...complete, run: { lengthM: 20, category: 'cat7' } })).toEqual([
      { code: 'invalid', field: 'run', text: 'check the cable run: Unknown cable category "cat7"; use cat5e, cat6 or cat6a' },
    ]);
    expect(deviceGaps({ ...complete, name: '   ' })).toEqual(['no name']);
  });

  it('a device whose room was deleted has a gap', () => {
    expect(deviceGaps(complete, new Set(['porch']))).toEqual([]);
    expect(deviceGaps(complete, new Set(['hall']))).toEqual(['its room was deleted: move it to a room']);
  });
});

describe('roomGaps', () => {
  it('groups the devices: by name for one, by count for several', () => {
    const lines = roomGaps({ name: 'Porch', floorId: 'f0' }, [
      { ...complete, power: undefined },
      { ...complete, name: 'Porch floodlight camera', power: undefined, run: undefined },
      complete,
    ]);
    expect(lines).toEqual(['2 devices have no power figure', 'no run length for Porch floodlight camera']);
  });

  it('names a nameless device by its kind', () => {
    expect(roomGaps({ name: 'Porch', floorId: 'f0' }, [{ ...complete, kind: 'doorbell', name: '', run: undefined }])).toEqual([
      'the doorbell has no name',
      'no run length for the doorbell',
    ]);
  });

  it("reports the room's own gaps first", () => {
    expect(roomGaps({ name: 'Attic', floorId: 'gone' }, [], new Set(['f0']))).toEqual(['Attic is on a floor that was deleted: move it to a floor']);
    expect(roomGaps({ name: 'Attic' }, [])).toEqual(['Attic is on no floor']);
  });
});

describe('a run longer than a network cable may be', () => {
  // TIA-568: 90 m permanent link, 100 m channel with its cords (../shared/reference/poe-facts.md).
  it('is a gap to settle before leaving the house, named once on the checklist', () => {
    expect(deviceGapList({ ...complete, run: { lengthM: 90, category: 'cat6' } })).toEqual([]);
    expect(deviceGapList({ ...complete, run: { lengthM: 150, category: 'cat6' } })).toEqual([{
      code: 'run_long', field: 'run',
      text: 'its run is over the 90 m (295 ft) a network cable may run to the closet: measure it again, find a shorter path, or note where a switch nearer could go',
    }]);
    const p = walkProgress({ closetRoomId: 'r1' }, [floor('f0'), room('r1', 'Closet'), room('porch', 'Porch'), device('far', { ...complete, name: 'Attic access point', run: { lengthM: 150, category: 'cat6' } })]);
    expect(p.lines).toEqual(['the run of Attic access point is over 90 m (295 ft): measure again or find a shorter path']);
    expect(p).toMatchObject({ devices: 1, devicesComplete: 0, devicesWithGaps: 1, devicesLeftOut: 0 });
  });
});

describe('siteGaps and walkProgress', () => {
  it('an empty site asks for floors first, then rooms, then the closet', () => {
    expect(siteGaps({ closetRoomId: null }, [])).toEqual(['no floors yet: add the floors of the house']);
    expect(siteGaps({ closetRoomId: null }, [floor('f0')])).toEqual(['no rooms yet: add the rooms you walk']);
    expect(siteGaps({ closetRoomId: null }, [floor('f0'), room('r1', 'Hall')])).toEqual(['no closet chosen: pick the room where the cables end']);
    expect(siteGaps({ closetRoomId: 'r1' }, [floor('f0'), room('r1', 'Hall')])).toEqual([]);
  });

  it('a deleted closet room is a gap; deleted items count for nothing', () => {
    const items: GapItem[] = [floor('f0'), { ...room('r1', 'Hall'), deleted: true }, room('r2', 'Kitchen'), { ...device('d1', { ...complete, power: undefined, roomId: 'r2' }), deleted: true }];
    expect(siteGaps({ closetRoomId: 'r1' }, items)).toEqual(['the closet room was deleted: choose the closet again']);
    expect(walkProgress({ closetRoomId: 'r2' }, items)).toMatchObject({ floors: 1, rooms: 1, devices: 0, gapCount: 0, lines: [] });
  });

  it('the demo house has two typical figures and a plug polarity left to read', () => {
    const items = itemsOfSite(demoSiteInput).map((i) => ({ ...i, deleted: false }));
    const progress = walkProgress({ closetRoomId: demoSiteInput.closetRoomId }, items);
    expect(progress).toMatchObject({ floors: 3, rooms: 10, devices: 16, devicesComplete: 13, devicesWithGaps: 3, devicesLeftOut: 0, gapCount: 3 });
    expect(progress.lines).toEqual(['2 devices have only a typical power figure', 'the plug polarity of Driveway camera is not read yet']);
    expect(devicesProgressLabel(progress)).toBe('13 of 16 devices complete');
  });

  it('counts every device once: complete, in the plan with gaps, or left out of the plan', () => {
    const base = [floor('f0'), room('r1', 'Closet'), room('r2', 'Porch')];
    const items = [
      ...base,
      device('done', { ...complete, roomId: 'r2' }),
      // In the plan (the rules take a device with no run yet) but the walk still owes its run length.
      device('no-run', { ...complete, roomId: 'r2', run: undefined }),
      // Left out: the rules cannot take a device with no power figure.
      device('no-power', { ...complete, roomId: 'r2', power: undefined }),
      // Left out: its room is on a floor that was deleted, so the plan has no room for it.
      room('r3', 'Loft', 'gone'),
      device('stray', { ...complete, roomId: 'r3' }),
    ];
    const p = walkProgress({ closetRoomId: 'r1' }, items);
    expect(p).toMatchObject({ devices: 4, devicesComplete: 1, devicesWithGaps: 1, devicesLeftOut: 2, leftOutDeviceIds: ['no-power', 'stray'] });
    expect(p.devicesComplete + p.devicesWithGaps + p.devicesLeftOut).toBe(p.devices);
    expect(devicesProgressLabel(p)).toBe('1 of 4 devices complete · 2 not in the plan yet');
    expect(devicesProgressLabel({ devices: 0, devicesComplete: 0, devicesLeftOut: 0 })).toBe('no devices yet');
    expect(devicesProgressLabel({ devices: 1, devicesComplete: 1, devicesLeftOut: 0 })).toBe('1 of 1 device complete');
  });

  it('the checklist changes as the surveyor fills a gap', () => {
    const base = [floor('f0'), room('r1', 'Closet'), room('r2', 'Porch')];
    const bell = { kind: 'doorbell', name: 'Front door bell', roomId: 'r2', mount: 'low_wall', power: { by: 'watts', watts: 5, typical: true }, input: { type: 'poe', class: 2 }, cableAccess: 'exterior' };
    const before = walkProgress({ closetRoomId: null }, [...base, device('d1', bell), device('d2', { ...complete, roomId: 'r2', power: undefined })]);
    expect(before.lines).toEqual([
      'no closet chosen: pick the room where the cables end',
      'no power figure for Porch camera',
      'only a typical power figure for Front door bell',
      'no run length for Front door bell',
    ]);
    expect(before.gapCount).toBe(4);
    expect(gapsLabel(before.gapCount)).toBe('4 gaps');
    const after = walkProgress({ closetRoomId: 'r1' }, [
      ...base,
      device('d1', { ...bell, power: { by: 'watts', watts: 4 }, run: { lengthM: 11, category: 'cat6' } }),
      device('d2', { ...complete, roomId: 'r2' }),
    ]);
    expect(after).toMatchObject({ devices: 2, devicesComplete: 2, gapCount: 0, lines: [] });
    expect(gapsLabel(after.gapCount)).toBe('no gaps');
    expect(gapsLabel(1)).toBe('1 gap');
  });
});
