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
  return r.success ? { ok: true, value: deepFreeze(r.output), errors: [] } : { ok: false, errors: toErrors(r.issues) };
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
