import { addFieldError, type FieldErrors } from './validation';

/**
 * Numbers as people type them into a form: "12.5", "12,5", "1,299.50", "1.299,50", " 88 ".
 * With both separators the last one is the decimal mark and the other groups thousands; a lone comma
 * is a decimal comma. Returns undefined for a blank field and NaN for anything that is not a number.
 */
export function parseTypedNumber(text: string): number | undefined {
  const t = text.trim().replace(/[\s\u00a0\u202f]/g, '');
  if (t === '') return undefined;
  const comma = t.lastIndexOf(',');
  const dot = t.lastIndexOf('.');
  let normal = t;
  if (comma >= 0 && dot >= 0) normal = comma > dot ? t.replace(/\./g, '').replace(',', '.') : t.replace(/,/g, '');
  else if (comma >= 0) normal = t.replace(',', '.');
  if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(normal)) return NaN;
  return Number(normal);
}

/**
 * Reads a form's typed numbers and percentages, marking each field that cannot be read with a
 * message in the form's own terms, before anything is sent. Percentages are typed as percent
 * (88) and come back as fractions (0.88), the way the schemas keep them.
 */
export class TypedFields {
  readonly errors: FieldErrors = {};

  get ok(): boolean {
    return Object.keys(this.errors).length === 0;
  }

  /** A number, undefined when blank; a field that is not a number is marked. */
  number(key: string, text: string, label: string, example = '12.5'): number | undefined {
    const n = parseTypedNumber(text);
    if (n !== undefined && !Number.isFinite(n)) {
      addFieldError(this.errors, key, `${label} must be a number, e.g. ${example}.`);
      return undefined;
    }
    return n;
  }

  /** A percentage typed as percent (above 0, at most 100), as a fraction; undefined when blank. */
  percent(key: string, text: string, label: string): number | undefined {
    const n = this.number(key, text, label, '88');
    if (n === undefined) return undefined;
    if (!(n > 0 && n <= 100)) {
      addFieldError(this.errors, key, `${label} is a percentage above 0 and at most 100 (got ${text.trim()}); type 88 for 88 %.`);
      return undefined;
    }
    return n / 100;
  }
}
