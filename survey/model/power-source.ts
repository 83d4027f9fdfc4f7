import * as v from 'valibot';
import { PLANNING } from '../standards/planning-defaults';
import { POE_TYPE_VALUES } from '../standards/poe-types';
import { IdSchema, fractionSchema, integerInRange, NameSchema, nonNegativeNumber, positiveNumber } from './common';

export const PoeTypeSchema = v.picklist(POE_TYPE_VALUES, (i) =>
  `PoE type ${JSON.stringify(i.input)} does not exist: types are 1 (802.3af), 2 (802.3at), 3 and 4 (802.3bt)`);

/** A PoE switch in the closet (or anywhere). */
export const PoeSwitchSchema = v.object({
  kind: v.literal('poe_switch'),
  id: IdSchema,
  name: NameSchema,
  roomId: v.optional(IdSchema),
  /** Every PoE port supports up to this type. */
  poeType: PoeTypeSchema,
  /** Total PoE budget (W). */
  budgetW: positiveNumber('PoE budget', 'W', 10000),
  poePorts: integerInRange('PoE ports', 1, 512),
  /** The switch's own draw at the wall without PoE load (W). */
  ownDrawW: v.optional(nonNegativeNumber('Switch own draw', 'W', 2000), 0),
  /** Power-supply efficiency (PoE watts out ÷ watts in). */
  supplyEfficiency: v.optional(fractionSchema('Supply efficiency'), PLANNING.switchSupplyEfficiency.value),
  /** Designer says it is on a battery backup (runtime is known only if a battery in the plan feeds it). */
  onBattery: v.optional(v.boolean('"onBattery" must be true or false'), false),
});

/** A midspan injector: one or more ports of a PoE type, each with the type's full power. */
export const InjectorSchema = v.object({
  kind: v.literal('injector'),
  id: IdSchema,
  name: NameSchema,
  roomId: v.optional(IdSchema),
  poeType: PoeTypeSchema,
  ports: v.optional(integerInRange('Injector ports', 1, 64), 1),
  /** Total budget (W); when missing, ports × the type's PSE power. */
  budgetW: v.optional(positiveNumber('Injector budget', 'W', 10000)),
  efficiency: v.optional(fractionSchema('Injector efficiency'), PLANNING.injectorEfficiency.value),
  onBattery: v.optional(v.boolean('"onBattery" must be true or false'), false),
});

/** An outlet that the plan refers to by id, e.g. a battery-backed outlet in the closet. */
export const OutletSourceSchema = v.object({
  kind: v.literal('outlet'),
  id: IdSchema,
  name: NameSchema,
  roomId: v.optional(IdSchema),
  onBattery: v.optional(v.boolean('"onBattery" must be true or false'), false),
});

export const PowerSourceSchema = v.variant('kind', [PoeSwitchSchema, InjectorSchema, OutletSourceSchema],
  (i) => `Power source kind must be poe_switch, injector or outlet (got ${JSON.stringify(i.input)})`);

export type PoeSwitch = v.InferOutput<typeof PoeSwitchSchema>;
export type Injector = v.InferOutput<typeof InjectorSchema>;
export type OutletSource = v.InferOutput<typeof OutletSourceSchema>;
export type PowerSource = v.InferOutput<typeof PowerSourceSchema>;
export type PoeSource = PoeSwitch | Injector;

export function isPoeSource(s: PowerSource): s is PoeSource {
  return s.kind === 'poe_switch' || s.kind === 'injector';
}

/** Number of PoE ports of a source (0 for outlets). */
export function portCount(s: PowerSource): number {
  return s.kind === 'poe_switch' ? s.poePorts : s.kind === 'injector' ? s.ports : 0;
}
