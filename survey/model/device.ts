import * as v from 'valibot';
import { AWG_GAUGE_VALUES } from '../standards/awg';
import { findBarrelSize, KNOWN_BARREL_SIZES_TEXT } from '../standards/barrel-sizes';
import { CABLE_CATEGORY_VALUES } from '../standards/cabling';
import { POE_CLASS_VALUES, POE_CLASSES } from '../standards/poe-classes';
import { POE_STANDARD_VALUES, POE_TYPES } from '../standards/poe-types';
import { IdSchema, integerInRange, NameSchema, nonNegativeNumber, positiveNumber } from './common';

export const DEVICE_KIND_VALUES = [
  'access_point', 'camera', 'doorbell', 'hub', 'small_computer', 'compact_switch', 'other',
] as const;
export const DeviceKindSchema = v.picklist(DEVICE_KIND_VALUES, (i) =>
  `Unknown device kind ${JSON.stringify(i.input)}; use one of ${DEVICE_KIND_VALUES.join(', ')}`);

export const MOUNT_VALUES = ['ceiling', 'high_wall', 'low_wall', 'soffit', 'shelf', 'outdoor_wall'] as const;
export const MountSchema = v.picklist(MOUNT_VALUES, (i) =>
  `Unknown mount ${JSON.stringify(i.input)}; use one of ${MOUNT_VALUES.join(', ')}`);

export const CABLE_ACCESS_VALUES = [
  'open_attic', 'drop_ceiling', 'unfinished_basement', 'finished_no_access', 'exterior',
] as const;
export const CableAccessSchema = v.picklist(CABLE_ACCESS_VALUES, (i) =>
  `Unknown cable access ${JSON.stringify(i.input)}; use one of ${CABLE_ACCESS_VALUES.join(', ')}`);

/** Largest device load we accept on a walk (W); anything above is a typo in a house. */
export const MAX_DEVICE_WATTS = 3000;

const typicalFlag = v.optional(v.boolean('"typical" must be true or false'), false);

/**
 * What the device needs: either watts, or volts × amps as printed on its
 * adapter. `typical: true` marks a pre-filled default rather than a figure
 * read from the device.
 */
export const PowerNeedSchema = v.variant('by', [
  v.object({
    by: v.literal('watts'),
    watts: positiveNumber('Power need', 'W', MAX_DEVICE_WATTS),
    typical: typicalFlag,
  }),
  v.object({
    by: v.literal('adapter'),
    volts: positiveNumber('Adapter voltage', 'V', 240),
    amps: positiveNumber('Adapter current', 'A', 20),
    typical: typicalFlag,
  }),
], (i) => `Power need must say "by": "watts" or "by": "adapter" (got ${JSON.stringify(i.input)})`);

export const PoeClassSchema = v.picklist(POE_CLASS_VALUES, (i) =>
  `PoE class ${JSON.stringify(i.input)} does not exist: classes are whole numbers from 0 to 8 (802.3bt)`);

export const PoeStandardSchema = v.picklist(POE_STANDARD_VALUES, (i) =>
  `Unknown PoE standard ${JSON.stringify(i.input)}; use af (802.3af), at (802.3at) or bt (802.3bt)`);

export const POLARITY_VALUES = ['centre_positive', 'centre_negative', 'unknown'] as const;
export const PolaritySchema = v.picklist(POLARITY_VALUES, (i) =>
  `Unknown polarity ${JSON.stringify(i.input)}; use centre_positive, centre_negative or unknown`);

export const NativePoeInputSchema = v.pipe(
  v.object({
    type: v.literal('poe'),
    class: v.optional(PoeClassSchema),
    standard: v.optional(PoeStandardSchema),
  }),
  v.forward(
    v.check((i) => {
      if (i.class === undefined || i.standard === undefined) return true;
      const maxType = i.standard === 'af' ? 1 : i.standard === 'at' ? 2 : 4;
      return POE_CLASSES[i.class].minType <= maxType;
    }, (issue) => {
      const i = issue.input as { class: number; standard: 'af' | 'at' | 'bt' };
      const need = POE_TYPES[POE_CLASSES[i.class].minType].standardName;
      return `Class ${i.class} needs ${need}; a device that says 802.3${i.standard} cannot be Class ${i.class}`;
    }),
    ['class'],
  ),
);

export const PassivePoeInputSchema = v.object({
  type: v.literal('passive_poe'),
  volts: positiveNumber('Passive PoE voltage', 'V', 57, '; PoE never exceeds 57 V'),
});

export const DcBarrelInputSchema = v.pipe(
  v.object({
    type: v.literal('dc_barrel'),
    outerMm: positiveNumber('Barrel outer diameter', 'mm', 10),
    innerMm: positiveNumber('Barrel inner diameter', 'mm', 10),
    polarity: PolaritySchema,
    volts: positiveNumber('Barrel input voltage', 'V', 60),
  }),
  v.forward(
    v.check((i) => findBarrelSize(i.outerMm, i.innerMm) !== undefined, (issue) => {
      const i = issue.input as { outerMm: number; innerMm: number };
      return `${i.outerMm}×${i.innerMm} mm is not a barrel size we know; known sizes: ${KNOWN_BARREL_SIZES_TEXT} (mm)`;
    }),
    ['innerMm'],
  ),
);

export const MicroUsbInputSchema = v.object({ type: v.literal('micro_usb') });
export const UsbCInputSchema = v.object({ type: v.literal('usb_c') });
export const TerminalBlockInputSchema = v.object({
  type: v.literal('terminal_block'),
  volts: positiveNumber('Terminal voltage', 'V', 60),
  /** Doorbells usually take 16–24 V AC from a transformer; most other gear takes DC. */
  current: v.optional(v.picklist(['dc', 'ac'], 'Terminal current must be "dc" or "ac"'), 'dc'),
});
export const AcPlugInputSchema = v.object({ type: v.literal('ac_plug') });

export const POWER_INPUT_TYPES = [
  'poe', 'passive_poe', 'dc_barrel', 'micro_usb', 'usb_c', 'terminal_block', 'ac_plug',
] as const;

/** How the device takes power. */
export const PowerInputSchema = v.variant('type', [
  NativePoeInputSchema,
  PassivePoeInputSchema,
  DcBarrelInputSchema,
  MicroUsbInputSchema,
  UsbCInputSchema,
  TerminalBlockInputSchema,
  AcPlugInputSchema,
], (i) => `Power input type must be one of ${POWER_INPUT_TYPES.join(', ')} (got ${JSON.stringify(i.input)})`);

/** Longest run we accept on a walk; the PoE channel limit itself is 100 m and is a rule, not a validation. */
export const MAX_RUN_M = 1000;

/** The cable from the device to the closet: its length is taken as the permanent link. */
export const CableRunSchema = v.object({
  lengthM: positiveNumber('Cable run', 'm', MAX_RUN_M, '; the PoE channel limit is 100 m'),
  category: v.picklist(CABLE_CATEGORY_VALUES, (i) =>
    `Unknown cable category ${JSON.stringify(i.input)}; use cat5e, cat6 or cat6a`),
  /** Copper-clad aluminium: non-compliant, flagged by the rules. */
  cca: v.optional(v.boolean('"cca" must be true or false'), false),
  /** Conductor gauge; when missing, Cat 5e is taken as 24 AWG and Cat 6/6A as 23 AWG. */
  gauge: v.optional(v.picklist(AWG_GAUGE_VALUES, (i) =>
    `Unknown conductor gauge ${JSON.stringify(i.input)}; use 22, 23, 24 or 26 (AWG)`)),
});

/**
 * The device's fields. Exported as plain entries so that other modules can
 * extend the device (for example with designer overrides):
 *
 *     const MyDevice = v.object({ ...deviceEntries, override: … });
 */
export const deviceEntries = {
  id: IdSchema,
  kind: DeviceKindSchema,
  name: NameSchema,
  roomId: IdSchema,
  mount: MountSchema,
  power: PowerNeedSchema,
  input: PowerInputSchema,
  /** Must keep working on battery in a power cut. */
  mustStayUp: v.optional(v.boolean('"mustStayUp" must be true or false'), false),
  outdoor: v.optional(v.boolean('"outdoor" must be true or false'), false),
  /** Distance to the nearest usable outlet (m). Missing = no outlet known nearby. */
  outletDistanceM: v.optional(nonNegativeNumber('Outlet distance', 'm', 1000)),
  cableAccess: CableAccessSchema,
  /** Missing = the cable run has not been captured yet (a gap). */
  run: v.optional(CableRunSchema),
  /** Pinned by hand to a power source (switch, injector or outlet). */
  sourceId: v.optional(IdSchema),
  /** Pinned by hand to a port of that source (1-based). */
  port: v.optional(integerInRange('Port', 1, 512)),
};

export const DeviceSchema = v.object(deviceEntries);

export type DeviceKind = (typeof DEVICE_KIND_VALUES)[number];
export type Mount = (typeof MOUNT_VALUES)[number];
export type CableAccess = (typeof CABLE_ACCESS_VALUES)[number];
export type Polarity = (typeof POLARITY_VALUES)[number];
export type PowerNeed = v.InferOutput<typeof PowerNeedSchema>;
export type PowerInput = v.InferOutput<typeof PowerInputSchema>;
export type NativePoeInput = v.InferOutput<typeof NativePoeInputSchema>;
export type DcBarrelInput = v.InferOutput<typeof DcBarrelInputSchema>;
export type TerminalBlockInput = v.InferOutput<typeof TerminalBlockInputSchema>;
export type CableRun = v.InferOutput<typeof CableRunSchema>;
export type Device = v.InferOutput<typeof DeviceSchema>;
export type DeviceInput = v.InferInput<typeof DeviceSchema>;

/** The device's power need in watts (V × A when given as an adapter rating). */
export function powerNeedWatts(p: PowerNeed): number {
  return p.by === 'watts' ? p.watts : p.volts * p.amps;
}

