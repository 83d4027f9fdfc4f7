import * as v from 'valibot';
import { PLANNING } from '../standards/planning-defaults';
import { IdSchema, fractionSchema, NameSchema, nonNegativeNumber, positiveNumber } from './common';

/** Capacity as watt-hours, or volts × amp-hours from the battery label. */
export const BatteryCapacitySchema = v.variant('by', [
  v.object({ by: v.literal('wh'), wh: positiveNumber('Battery capacity', 'Wh', 100000) }),
  v.object({
    by: v.literal('v_ah'),
    volts: positiveNumber('Battery voltage', 'V', 1000),
    ah: positiveNumber('Battery capacity', 'Ah', 10000),
  }),
], (i) => `Battery capacity must say "by": "wh" or "by": "v_ah" (got ${JSON.stringify(i.input)})`);

export const OtherLoadSchema = v.object({
  name: NameSchema,
  watts: nonNegativeNumber('Load', 'W', 10000),
});

export const BatteryBackupSchema = v.object({
  id: IdSchema,
  name: NameSchema,
  roomId: v.optional(IdSchema),
  capacity: BatteryCapacitySchema,
  inverterEfficiency: v.optional(fractionSchema('Inverter efficiency'), PLANNING.inverterEfficiency.value),
  depthOfDischarge: v.optional(fractionSchema('Usable depth of discharge'), PLANNING.depthOfDischarge.value),
  /** Age derate as a factor: 1 = new; 0.7–0.8 for batteries 3 years or older. */
  ageFactor: v.optional(fractionSchema('Age derate factor'), PLANNING.ageFactor.value),
  /** Power sources (switches, injectors, outlets) plugged into this battery. */
  feeds: v.optional(v.array(IdSchema, '"feeds" must be a list of power source ids'), []),
  /** Anything else on it, e.g. the modem and router. */
  otherLoads: v.optional(v.array(OtherLoadSchema, '"otherLoads" must be a list'), []),
});

export type BatteryCapacity = v.InferOutput<typeof BatteryCapacitySchema>;
export type BatteryBackup = v.InferOutput<typeof BatteryBackupSchema>;

export function capacityWh(c: BatteryCapacity): number {
  return c.by === 'wh' ? c.wh : c.volts * c.ah;
}
