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
 * The rules freeze any other site they are given the same way (`freezeSite`). To change a site,
 * make a changed copy (spreads, `structuredClone`) and evaluate that.
 */
export function parseSite(input: unknown): ParseResult<Site> {
  const r = v.safeParse(SiteSchema, input);
  if (!r.success) return { ok: false, errors: toErrors(r.issues) };
  return { ok: true, value: freezeSite({ ...r.output, devices: r.output.devices.map(uniformDevice) }), errors: [] };
}

/** Every key of every kind of power input. */
type InputKey = Device['input'] extends infer U ? (U extends unknown ? keyof U : never) : never;
type CableRun = NonNullable<Device['run']>;

/**
 * The same device with every field present (an absent optional one as `undefined`), in one order,
 * and the same for its power input and its run. Devices that differ only in which optional fields
 * they have then share one object layout, which the rules read much faster over thousands of
 * devices. JSON, deep equality and the types see no difference: the input's order keeps each
 * kind's own order (tested against the schema's output).
 *
 * Each record below is typed to need every field of its schema, so a field added to a schema does
 * not compile until it is copied here too.
 */
function uniformDevice(d: Device): Device {
  const i = d.input as { readonly [K in InputKey]?: unknown };
  const input: { [K in InputKey]-?: unknown } = {
    type: i.type, class: i.class, standard: i.standard,
    outerMm: i.outerMm, innerMm: i.innerMm, polarity: i.polarity, volts: i.volts, current: i.current,
  };
  const r = d.run;
  const run: { [K in keyof CableRun]-?: unknown } | undefined = r === undefined
    ? undefined
    : { lengthM: r.lengthM, category: r.category, cca: r.cca, gauge: r.gauge };
  const device: { [K in keyof Device]-?: unknown } = {
    id: d.id, kind: d.kind, name: d.name, roomId: d.roomId, mount: d.mount, power: d.power, input,
    mustStayUp: d.mustStayUp, outdoor: d.outdoor, outletDistanceM: d.outletDistanceM, cableAccess: d.cableAccess,
    run, sourceId: d.sourceId, port: d.port,
  };
  return device as Device;
}

/**
 * Freeze a site (or any parsed value) and everything in it, plain objects and arrays; returns it.
 * A part already frozen is taken as frozen all the way down, so a parsed site costs nothing.
 */
export function freezeSite<T>(value: T): T {
  if (typeof value === 'object' && value !== null && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const key of Object.keys(value)) freezeSite((value as Record<string, unknown>)[key]);
  }
  return value;
}

/** Validate a single device (no cross-references). */
export function parseDevice(input: unknown): ParseResult<Device> {
  const r = v.safeParse(DeviceSchema, input);
  return r.success ? { ok: true, value: r.output, errors: [] } : { ok: false, errors: toErrors(r.issues) };
}
