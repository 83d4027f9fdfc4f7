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

/** Validate a whole site (structure, ranges and cross-references), all errors at once. */
export function parseSite(input: unknown): ParseResult<Site> {
  const r = v.safeParse(SiteSchema, input);
  return r.success ? { ok: true, value: r.output, errors: [] } : { ok: false, errors: toErrors(r.issues) };
}

/** Validate a single device (no cross-references). */
export function parseDevice(input: unknown): ParseResult<Device> {
  const r = v.safeParse(DeviceSchema, input);
  return r.success ? { ok: true, value: r.output, errors: [] } : { ok: false, errors: toErrors(r.issues) };
}
