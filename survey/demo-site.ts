import { parseSite } from './model/validate';
import type { Site, SiteInput } from './model/site';

/**
 * An invented demo site: the Okonkwo-Lindqvist house, 14 Larchmere Lane — a
 * fictional family in a fictional two-storey house with a basement closet.
 * Every name here is made up. The server seed loads this.
 *
 * The closet switch allocates PoE by actual draw, so the demo uses the
 * "expected" budget basis; with the (default) class basis the same eight
 * devices would reserve more than the 120 W switch can give.
 */
export const demoSiteInput: SiteInput = {
  id: 'demo-larchmere-14',
  name: 'The Okonkwo-Lindqvist house',
  address: '14 Larchmere Lane',
  floors: [
    { id: 'fl-basement', name: 'Basement', level: -1 },
    { id: 'fl-ground', name: 'Ground floor', level: 0 },
    { id: 'fl-upper', name: 'Upper floor', level: 1 },
  ],
  rooms: [
    { id: 'rm-closet', name: 'Basement closet', floorId: 'fl-basement' },
    { id: 'rm-living', name: 'Living room', floorId: 'fl-ground' },
    { id: 'rm-kitchen', name: 'Kitchen', floorId: 'fl-ground' },
    { id: 'rm-hall', name: 'Hall', floorId: 'fl-ground' },
    { id: 'rm-garage', name: 'Garage', floorId: 'fl-ground' },
    { id: 'rm-porch', name: 'Porch', floorId: 'fl-ground', outdoor: true },
    { id: 'rm-yard', name: 'Back yard', floorId: 'fl-ground', outdoor: true },
    { id: 'rm-office', name: 'Office', floorId: 'fl-upper' },
    { id: 'rm-bed1', name: 'Bedroom 1', floorId: 'fl-upper' },
    { id: 'rm-bed2', name: 'Bedroom 2', floorId: 'fl-upper' },
  ],
  closetRoomId: 'rm-closet',
  settings: { units: 'metric', budgetBasis: 'expected' },
  powerSources: [
    {
      kind: 'poe_switch', id: 'sw-closet', name: 'Closet PoE switch', roomId: 'rm-closet',
      poeType: 2, budgetW: 120, poePorts: 8, ownDrawW: 9, supplyEfficiency: 0.88,
    },
    { kind: 'injector', id: 'inj-office', name: 'Office access point injector', roomId: 'rm-closet', poeType: 3, ports: 1, efficiency: 0.88 },
    { kind: 'outlet', id: 'out-closet-battery', name: 'Closet battery outlet', roomId: 'rm-closet' },
  ],
  batteries: [
    {
      id: 'ups-closet', name: 'Closet battery backup', roomId: 'rm-closet',
      capacity: { by: 'v_ah', volts: 12, ah: 9 },
      inverterEfficiency: 0.9, depthOfDischarge: 0.8, ageFactor: 1,
      feeds: ['sw-closet', 'inj-office', 'out-closet-battery'],
      otherLoads: [{ name: 'Internet modem', watts: 8 }, { name: 'Router', watts: 10 }],
    },
  ],
  devices: [
    {
      id: 'ap-living', kind: 'access_point', name: 'Living room access point', roomId: 'rm-living', mount: 'ceiling',
      power: { by: 'watts', watts: 13 }, input: { type: 'poe', class: 4 }, mustStayUp: true,
      cableAccess: 'unfinished_basement', run: { lengthM: 16, category: 'cat6' },
    },
    {
      id: 'ap-office', kind: 'access_point', name: 'Office access point', roomId: 'rm-office', mount: 'ceiling',
      power: { by: 'watts', watts: 32 }, input: { type: 'poe', standard: 'bt' },
      cableAccess: 'open_attic', run: { lengthM: 24, category: 'cat6a' }, sourceId: 'inj-office', port: 1,
    },
    {
      id: 'ap-garage', kind: 'access_point', name: 'Garage access point', roomId: 'rm-garage', mount: 'high_wall',
      power: { by: 'watts', watts: 8, typical: true }, input: { type: 'poe', class: 3 }, outletDistanceM: 2,
      cableAccess: 'unfinished_basement', run: { lengthM: 14, category: 'cat6' },
    },
    {
      id: 'cam-porch', kind: 'camera', name: 'Porch camera', roomId: 'rm-porch', mount: 'soffit',
      power: { by: 'watts', watts: 5 }, input: { type: 'poe' }, mustStayUp: true, outdoor: true,
      cableAccess: 'exterior', run: { lengthM: 21, category: 'cat6' },
    },
    {
      id: 'cam-yard', kind: 'camera', name: 'Back yard camera', roomId: 'rm-yard', mount: 'outdoor_wall',
      power: { by: 'watts', watts: 18 }, input: { type: 'poe', class: 4 }, mustStayUp: true, outdoor: true,
      cableAccess: 'exterior', run: { lengthM: 29, category: 'cat6' },
    },
    {
      id: 'cam-garage', kind: 'camera', name: 'Garage inside camera', roomId: 'rm-garage', mount: 'high_wall',
      power: { by: 'adapter', volts: 12, amps: 1 },
      input: { type: 'dc_barrel', outerMm: 5.5, innerMm: 2.1, polarity: 'centre_positive', volts: 12 },
      outletDistanceM: 1, cableAccess: 'unfinished_basement', run: { lengthM: 12, category: 'cat5e', cca: true },
    },
    {
      id: 'cam-drive', kind: 'camera', name: 'Driveway camera', roomId: 'rm-garage', mount: 'outdoor_wall',
      power: { by: 'adapter', volts: 12, amps: 0.5 },
      input: { type: 'dc_barrel', outerMm: 5.5, innerMm: 2.5, polarity: 'unknown', volts: 12 },
      outdoor: true, cableAccess: 'exterior', run: { lengthM: 19, category: 'cat6' },
    },
    {
      id: 'bell-front', kind: 'doorbell', name: 'Front door bell', roomId: 'rm-porch', mount: 'low_wall',
      power: { by: 'watts', watts: 5, typical: true }, input: { type: 'terminal_block', volts: 16, current: 'ac' },
      outdoor: true, outletDistanceM: 0, cableAccess: 'exterior',
    },
    {
      id: 'bell-back', kind: 'doorbell', name: 'Back door bell', roomId: 'rm-kitchen', mount: 'low_wall',
      power: { by: 'watts', watts: 4 }, input: { type: 'poe', class: 2 }, outdoor: true,
      cableAccess: 'unfinished_basement', run: { lengthM: 11, category: 'cat6' },
    },
    {
      id: 'hub-hall', kind: 'hub', name: 'Hall smart-home hub', roomId: 'rm-hall', mount: 'shelf',
      power: { by: 'adapter', volts: 5, amps: 1 }, input: { type: 'micro_usb' }, outletDistanceM: 0.5,
      cableAccess: 'unfinished_basement', run: { lengthM: 9, category: 'cat6' },
    },
    {
      id: 'hub-kitchen', kind: 'hub', name: 'Kitchen security hub', roomId: 'rm-kitchen', mount: 'shelf',
      power: { by: 'watts', watts: 4 }, input: { type: 'usb_c' }, mustStayUp: true, outletDistanceM: 0.8,
      cableAccess: 'unfinished_basement', run: { lengthM: 10, category: 'cat6' },
    },
    {
      id: 'pc-office', kind: 'small_computer', name: 'Office mini computer', roomId: 'rm-office', mount: 'shelf',
      power: { by: 'adapter', volts: 5, amps: 3 }, input: { type: 'usb_c' }, outletDistanceM: 1,
      cableAccess: 'open_attic', run: { lengthM: 23, category: 'cat6' },
    },
    {
      id: 'pc-closet', kind: 'small_computer', name: 'Closet home server', roomId: 'rm-closet', mount: 'shelf',
      power: { by: 'watts', watts: 25 }, input: { type: 'ac_plug' }, outletDistanceM: 0.5,
      cableAccess: 'unfinished_basement', run: { lengthM: 2, category: 'cat6' },
    },
    {
      id: 'sw-bed2', kind: 'compact_switch', name: 'Bedroom 2 desk switch', roomId: 'rm-bed2', mount: 'low_wall',
      power: { by: 'watts', watts: 20 }, input: { type: 'poe', class: 4 },
      cableAccess: 'open_attic', run: { lengthM: 26, category: 'cat6' },
    },
    {
      id: 'link-shed', kind: 'other', name: 'Garden shed radio link', roomId: 'rm-yard', mount: 'outdoor_wall',
      power: { by: 'watts', watts: 6 }, input: { type: 'passive_poe', volts: 24 }, outdoor: true,
      cableAccess: 'exterior', run: { lengthM: 31, category: 'cat6' }, sourceId: 'out-closet-battery',
    },
    {
      id: 'display-hall', kind: 'other', name: 'Hall wall display', roomId: 'rm-hall', mount: 'high_wall',
      power: { by: 'watts', watts: 12 }, input: { type: 'ac_plug' }, outletDistanceM: 3.5,
      cableAccess: 'finished_no_access',
    },
  ],
};

function load(): Site {
  const r = parseSite(demoSiteInput);
  if (!r.ok) throw new Error(`demo site is invalid: ${r.errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`);
  return r.value;
}

/** The demo site, validated (defaults filled in). */
export const demoSite: Site = load();
