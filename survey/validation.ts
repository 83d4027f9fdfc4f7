import * as v from "valibot";

export type FieldErrors = Record<string, string[]>;

/** Adds messages under `key` as an own property (a key such as "__proto__" must not reach the prototype). */
export function addFieldError(errors: FieldErrors, key: string, ...messages: string[]) {
  const list = Object.hasOwn(errors, key) ? errors[key] : [];
  for (const m of messages) if (!list.includes(m)) list.push(m);
  Object.defineProperty(errors, key, { value: list, enumerable: true, writable: true, configurable: true });
}

/**
 * Per-field messages from valibot issues, keyed by dotted path ("_" for the whole value). A missing
 * key comes out of valibot as "Invalid key: …"; it reads "This field is required." instead.
 */
/** The message for a value left out. */
export const REQUIRED_MESSAGE = "This field is required.";

export function fieldErrors(issues: readonly v.BaseIssue<unknown>[]): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of issues) {
    const key = v.getDotPath(issue) ?? "_";
    const message = issue.input === undefined && issue.message.startsWith("Invalid key") ? REQUIRED_MESSAGE : issue.message;
    addFieldError(out, key, message);
  }
  return out;
}

/** Parses with a shared schema: the value, or the per-field errors to mark in a form or a 400. */
export function check<S extends v.GenericSchema>(schema: S, input: unknown): { ok: true; value: v.InferOutput<S> } | { ok: false; errors: FieldErrors } {
  const result = v.safeParse(schema, input);
  return result.success ? { ok: true, value: result.output } : { ok: false, errors: fieldErrors(result.issues) };
}
