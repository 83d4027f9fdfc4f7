import * as v from 'valibot';

/** Ids are short non-empty strings chosen by the client (uuid, slug…). */
export const IdSchema = v.pipe(
  v.string('An id must be text'),
  v.minLength(1, 'An id cannot be empty'),
  v.maxLength(100, 'An id can be at most 100 characters'),
);

export const NameSchema = v.pipe(
  v.string('A name must be text'),
  v.minLength(1, 'Give it a name'),
  v.maxLength(200, 'A name can be at most 200 characters'),
);

function fmt(x: unknown): string {
  return typeof x === 'number' ? String(x) : JSON.stringify(x);
}

function numberOf(label: string) {
  return v.pipe(
    v.number(`${label} must be a number`),
    v.finite(`${label} must be a finite number`),
    // -0 + 0 === +0: results must survive a JSON round trip.
    v.transform((x: number) => x + 0),
  );
}

/** A number > 0 and ≤ max, with messages that say what is wrong and in which unit. */
export function positiveNumber(label: string, unit: string, max: number, maxHint = '') {
  return v.pipe(
    numberOf(label),
    v.gtValue(0, (i) =>
      (i.input as number) < 0
        ? `${label} cannot be negative (got ${fmt(i.input)} ${unit})`
        : `${label} must be more than 0 ${unit}`),
    v.maxValue(max, (i) => `${label} of ${fmt(i.input)} ${unit} is too large (at most ${max} ${unit}${maxHint})`),
  );
}

/** A number ≥ 0 and ≤ max. */
export function nonNegativeNumber(label: string, unit: string, max: number, maxHint = '') {
  return v.pipe(
    numberOf(label),
    v.minValue(0, (i) => `${label} cannot be negative (got ${fmt(i.input)} ${unit})`),
    v.maxValue(max, (i) => `${label} of ${fmt(i.input)} ${unit} is too large (at most ${max} ${unit}${maxHint})`),
  );
}

/** A number in [min, max]. */
export function numberInRange(label: string, unit: string, min: number, max: number) {
  return v.pipe(
    numberOf(label),
    v.minValue(min, (i) => `${label} must be at least ${min} ${unit} (got ${fmt(i.input)} ${unit})`),
    v.maxValue(max, (i) => `${label} must be at most ${max} ${unit} (got ${fmt(i.input)} ${unit})`),
  );
}

/** An efficiency or fraction in (0, 1]. */
export function fractionSchema(label: string) {
  return v.pipe(
    numberOf(label),
    v.gtValue(0, (i) => `${label} must be more than 0 (got ${fmt(i.input)}); write 85 % as 0.85`),
    v.maxValue(1, (i) => `${label} must be at most 1 (got ${fmt(i.input)}); write 85 % as 0.85`),
  );
}

/** An integer in [min, max]. */
export function integerInRange(label: string, min: number, max: number, maxMessage?: (input: number) => string) {
  return v.pipe(
    numberOf(label),
    v.integer((i) => `${label} must be a whole number (got ${fmt(i.input)})`),
    v.minValue(min, (i) => `${label} must be at least ${min} (got ${fmt(i.input)})`),
    v.maxValue(max, (i) => (maxMessage ? maxMessage(i.input as number) : `${label} must be at most ${max} (got ${fmt(i.input)})`)),
  );
}
