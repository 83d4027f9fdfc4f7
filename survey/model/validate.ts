import * as v from 'valibot';
import { DeviceSchema, type Device } from './device';
import { SiteSchema, type Site } from './site';

export interface FieldError {
  /** Dot path of the bad field, e.g. "devices.3.power.watts" ("" for the whole object). */
  readonly path: string;
  readonly message: string;
}

export type ParseResult<T> =
  | { readonly ok: true; readonly value: T; readonly errors: readonly [] }
  | { readonly ok: false; readonly errors: readonly FieldError[] };

function toErrors(issues: readonly v.BaseIssue<unknown>[]): FieldError[] {
  return issues.map((issue) => ({ path: v.getDotPath(issue) ?? '', message: issue.message }));
}

/**
 * Validate a whole site (structure, ranges and cross-references), all errors at once.
 *
 * The site handed out is frozen, all the way down: a site is a value. An evaluation reads its
 * site again when its records and words are first read (see rules/plan-context.ts), so an edit
 * made afterwards would change a result already handed out; frozen, the edit throws instead.
 * Edit a copy (`structuredClone`, or spreads) and evaluate that.
 */
export function parseSite(input: unknown): ParseResult<Site> {
  const r = v.safeParse(SiteSchema, input);
  if (!r.success) return { ok: false, errors: toErrors(r.issues) };
  return { ok: true, value: deepFreeze({ ...r.output, devices: r.output.devices.map(uniformDevice) }), errors: [] };
}

const DEVICE_KEYS = [
  'id', 'kind', 'name', 'roomId', 'mount', 'power', 'input', 'mustStayUp', 'outdoor', 'outletDistanceM', 'cableAccess', 'run', 'sourceId', 'port',
] as const;
/** Every kind's fields in one order that keeps each kind's own order (so JSON is unchanged). */
const INPUT_KEYS = ['type', 'class', 'standard', 'outerMm', 'innerMm', 'polarity', 'volts', 'current'] as const;
const RUN_KEYS = ['lengthM', 'category', 'cca', 'gauge'] as const;
type UniformKey<T extends readonly string[]> = T[number];
/** Every key of every kind of power input. */
type InputKey = Device['input'] extends infer U ? (U extends unknown ? keyof U : never) : never;

/**
 * The same device with every field present (an absent optional one as `undefined`), in one order,
 * and the same for its power input and its run. Devices that differ only in which optional fields
 * they have then share one object layout, which the rules read much faster over thousands of
 * devices. JSON, deep equality and the types see no difference.
 */
function uniformDevice(d: Device): Device {
  // If a field is added to the schemas, these checks fail to compile until it is added below.
  const deviceKeysCovered: [Exclude<keyof Device, UniformKey<typeof DEVICE_KEYS>>] extends [never] ? true : false = true;
  const inputKeysCovered: [Exclude<InputKey, UniformKey<typeof INPUT_KEYS>>] extends [never] ? true : false = true;
  const runKeysCovered: [Exclude<keyof NonNullable<Device['run']>, UniformKey<typeof RUN_KEYS>>] extends [never] ? true : false = true;
  void deviceKeysCovered, inputKeysCovered, runKeysCovered;
  const i = d.input as Partial<Record<'class' | 'standard' | 'volts' | 'outerMm' | 'innerMm' | 'polarity' | 'current', unknown>> & { type: string };
  const input = {
    type: i.type, class: i.class, standard: i.standard,
    outerMm: i.outerMm, innerMm: i.innerMm, polarity: i.polarity, volts: i.volts, current: i.current,
  } as unknown as Device['input'];
  const run = d.run === undefined ? undefined : { lengthM: d.run.lengthM, category: d.run.category, cca: d.run.cca, gauge: d.run.gauge };
  return {
    id: d.id, kind: d.kind, name: d.name, roomId: d.roomId, mount: d.mount, power: d.power, input,
    mustStayUp: d.mustStayUp, outdoor: d.outdoor, outletDistanceM: d.outletDistanceM, cableAccess: d.cableAccess,
    run, sourceId: d.sourceId, port: d.port,
  };
}

/** Freeze a parsed value and everything in it (plain objects and arrays only). */
function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const key of Object.keys(value)) deepFreeze((value as Record<string, unknown>)[key]);
  }
  return value;
}

/** Validate a single device (no cross-references). */
export function parseDevice(input: unknown): ParseResult<Device> {
  const r = v.safeParse(DeviceSchema, input);
  return r.success ? { ok: true, value: r.output, errors: [] } : { ok: false, errors: toErrors(r.issues) };
}
