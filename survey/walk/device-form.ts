// The device form as the surveyor types it (text in the site's units) and the stored fields (SI),
// both ways. Every field is checked with the shared device schemas; a bad field keeps what was
// typed and says what is wrong, and never stops the other fields from being saved.
import { checkItemDraft } from '../capture';
import { REQUIRED_MESSAGE } from '../validation';
import type { CableAccess, DeviceKind, Mount, Polarity } from '../model/device';
import type { AwgGauge } from '../standards/awg';
import type { CableCategory } from '../standards/cabling';
import { formatLength, formatNumber, lengthFromSI, lengthToSI, roundTo, type UnitSystem } from '../units';
import { fieldWord } from './describe';
import type { PowerInputType } from './words';

type Data = Record<string, unknown>;

export interface DeviceForm {
  name: string;
  kind: DeviceKind | undefined;
  roomId: string | undefined;
  mount: Mount | undefined;
  powerBy: 'watts' | 'adapter';
  watts: string;
  volts: string;
  amps: string;
  /** The figure is the kind's typical one, not read from the device. */
  powerTypical: boolean;
  inputType: PowerInputType | undefined;
  /** "" = not stated. */
  poeClass: '' | '0' | '1' | '2' | '3' | '4' | '5' | '6' | '7' | '8';
  poeStandard: '' | 'af' | 'at' | 'bt';
  passiveVolts: string;
  barrelOuter: string;
  barrelInner: string;
  polarity: Polarity | undefined;
  barrelVolts: string;
  terminalVolts: string;
  terminalCurrent: 'dc' | 'ac';
  mustStayUp: boolean;
  outdoor: boolean;
  outletDistance: string;
  cableAccess: CableAccess | undefined;
  runLength: string;
  runCategory: CableCategory | undefined;
  /** "" = not known (the rules assume the category's usual gauge). */
  runGauge: '' | '22' | '23' | '24' | '26';
  runCca: boolean;
  notes: string;
}

export type FormKey = keyof DeviceForm;
export type FormErrors = Partial<Record<FormKey, string[]>>;

/** Which form keys make up each stored field. */
export const FIELD_KEYS: Readonly<Record<string, readonly FormKey[]>> = {
  name: ['name'],
  kind: ['kind'],
  roomId: ['roomId'],
  mount: ['mount'],
  power: ['powerBy', 'watts', 'volts', 'amps', 'powerTypical'],
  input: ['inputType', 'poeClass', 'poeStandard', 'passiveVolts', 'barrelOuter', 'barrelInner', 'polarity', 'barrelVolts', 'terminalVolts', 'terminalCurrent'],
  mustStayUp: ['mustStayUp'],
  outdoor: ['outdoor'],
  outletDistanceM: ['outletDistance'],
  cableAccess: ['cableAccess'],
  run: ['runLength', 'runCategory', 'runGauge', 'runCca'],
  notes: ['notes'],
};

const num = (x: unknown) => (typeof x === 'number' && Number.isFinite(x) ? formatNumber(x, 3) : '');
const len = (x: unknown, units: UnitSystem) => (typeof x === 'number' && Number.isFinite(x) ? formatNumber(lengthFromSI(x, units), 2) : '');
const str = (x: unknown) => (typeof x === 'string' ? x : '');

/** Drops keys left undefined, so the schema reports a missing value as "This field is required.". */
function compact(o: Data): Data {
  const out: Data = {};
  for (const [k, x] of Object.entries(o)) if (x !== undefined) out[k] = x;
  return out;
}

/** The stored device as the form shows it, lengths in the site's units. */
export function deviceToForm(data: Data, units: UnitSystem): DeviceForm {
  const power = (data.power ?? {}) as Data;
  const input = (data.input ?? {}) as Data;
  const run = (data.run ?? {}) as Data;
  const type = input.type as PowerInputType | undefined;
  return {
    name: str(data.name),
    kind: data.kind as DeviceKind | undefined,
    roomId: typeof data.roomId === 'string' ? data.roomId : undefined,
    mount: data.mount as Mount | undefined,
    powerBy: power.by === 'adapter' ? 'adapter' : 'watts',
    watts: power.by === 'watts' ? num(power.watts) : '',
    volts: power.by === 'adapter' ? num(power.volts) : '',
    amps: power.by === 'adapter' ? num(power.amps) : '',
    powerTypical: power.typical === true,
    inputType: type,
    poeClass: type === 'poe' && typeof input.class === 'number' ? (String(input.class) as DeviceForm['poeClass']) : '',
    poeStandard: type === 'poe' && typeof input.standard === 'string' ? (input.standard as DeviceForm['poeStandard']) : '',
    passiveVolts: type === 'passive_poe' ? num(input.volts) : '',
    barrelOuter: type === 'dc_barrel' ? num(input.outerMm) : '',
    barrelInner: type === 'dc_barrel' ? num(input.innerMm) : '',
    polarity: type === 'dc_barrel' ? (input.polarity as Polarity | undefined) : undefined,
    barrelVolts: type === 'dc_barrel' ? num(input.volts) : '',
    terminalVolts: type === 'terminal_block' ? num(input.volts) : '',
    terminalCurrent: type === 'terminal_block' && input.current === 'ac' ? 'ac' : 'dc',
    mustStayUp: data.mustStayUp === true,
    outdoor: data.outdoor === true,
    outletDistance: len(data.outletDistanceM, units),
    cableAccess: data.cableAccess as CableAccess | undefined,
    runLength: len(run.lengthM, units),
    runCategory: run.category as CableCategory | undefined,
    runGauge: typeof run.gauge === 'number' ? (String(run.gauge) as DeviceForm['runGauge']) : '',
    runCca: run.cca === true,
    notes: str(data.notes),
  };
}

/** Typed text → number: "" is nothing, a decimal comma is accepted, anything else not a number is NaN (the schema says so). */
export function parseNumber(text: string): number | undefined {
  const t = text.trim().replace(',', '.');
  if (t === '') return undefined;
  return /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(t) ? Number(t) : Number.NaN;
}

function lengthSI(text: string, units: UnitSystem): number | undefined {
  const n = parseNumber(text);
  if (n === undefined || Number.isNaN(n)) return n;
  return roundTo(lengthToSI(n, units), 3);
}

/** Each stored field from the form; `null` clears the field. */
export function formToFields(form: DeviceForm, units: UnitSystem): Record<string, unknown> {
  const f: Record<string, unknown> = {};
  f.name = form.name.trim();
  f.kind = form.kind ?? null;
  f.roomId = form.roomId ?? null;
  f.mount = form.mount ?? null;
  if (form.powerBy === 'watts') {
    const watts = parseNumber(form.watts);
    f.power = watts === undefined ? null : { by: 'watts', watts, typical: form.powerTypical };
  } else {
    const volts = parseNumber(form.volts);
    const amps = parseNumber(form.amps);
    f.power = volts === undefined && amps === undefined ? null : compact({ by: 'adapter', volts, amps, typical: form.powerTypical });
  }
  f.input = inputFromForm(form);
  f.mustStayUp = form.mustStayUp;
  f.outdoor = form.outdoor;
  f.outletDistanceM = lengthSI(form.outletDistance, units) ?? null;
  f.cableAccess = form.cableAccess ?? null;
  const lengthM = lengthSI(form.runLength, units);
  if (lengthM === undefined && form.runCategory === undefined) f.run = null;
  else {
    f.run = compact({
      lengthM,
      category: form.runCategory,
      cca: form.runCca,
      ...(form.runGauge ? { gauge: Number(form.runGauge) as AwgGauge } : {}),
    });
  }
  f.notes = form.notes.trim() === '' ? null : form.notes;
  return f;
}

function inputFromForm(form: DeviceForm): Data | null {
  switch (form.inputType) {
    case undefined:
      return null;
    case 'poe':
      return {
        type: 'poe',
        ...(form.poeClass !== '' ? { class: Number(form.poeClass) } : {}),
        ...(form.poeStandard !== '' ? { standard: form.poeStandard } : {}),
      };
    case 'passive_poe':
      return compact({ type: 'passive_poe', volts: parseNumber(form.passiveVolts) });
    case 'dc_barrel':
      return compact({ type: 'dc_barrel', outerMm: parseNumber(form.barrelOuter), innerMm: parseNumber(form.barrelInner), polarity: form.polarity, volts: parseNumber(form.barrelVolts) });
    case 'terminal_block':
      return compact({ type: 'terminal_block', volts: parseNumber(form.terminalVolts), current: form.terminalCurrent });
    default:
      return { type: form.inputType };
  }
}

/** Where a schema error of a stored field is shown in the form. */
function errorKey(path: string, form: DeviceForm): FormKey {
  const [field, sub] = path.split('.');
  switch (field) {
    case 'power':
      if (sub === 'watts' || sub === 'volts' || sub === 'amps') return sub;
      return form.powerBy === 'watts' ? 'watts' : 'volts';
    case 'input':
      if (sub === 'class') return 'poeClass';
      if (sub === 'standard') return 'poeStandard';
      if (sub === 'outerMm') return 'barrelOuter';
      if (sub === 'innerMm') return 'barrelInner';
      if (sub === 'polarity') return 'polarity';
      if (sub === 'current') return 'terminalCurrent';
      if (sub === 'volts') return form.inputType === 'passive_poe' ? 'passiveVolts' : form.inputType === 'dc_barrel' ? 'barrelVolts' : 'terminalVolts';
      return 'inputType';
    case 'run':
      if (sub === 'category') return 'runCategory';
      if (sub === 'gauge') return 'runGauge';
      if (sub === 'cca') return 'runCca';
      return 'runLength';
    case 'outletDistanceM':
      return 'outletDistance';
    default:
      return (FIELD_KEYS[field]?.[0] ?? 'name') as FormKey;
  }
}

export interface FormCheck {
  /** Every stored field with its value (`null` = cleared). */
  readonly fields: Record<string, unknown>;
  /** Stored fields that failed their schema. */
  readonly badFields: ReadonlySet<string>;
  readonly errors: FormErrors;
}

/** Checks the whole form with the shared schemas; errors are keyed by form field. */
export function checkDeviceForm(form: DeviceForm, units: UnitSystem): FormCheck {
  const fields = formToFields(form, units);
  const errors: FormErrors = {};
  const badFields = new Set<string>();
  // A name cannot be cleared: an empty one is checked (and refused) rather than removed.
  const result = checkItemDraft('device', fields);
  if (!result.ok) {
    for (const [path, messages] of Object.entries(result.errors)) {
      badFields.add(path.split('.')[0]);
      const key = errorKey(path, form);
      const worded = messages.map((m) => (m === REQUIRED_MESSAGE && MISSING_WORDS[key] ? MISSING_WORDS[key]! : m));
      const shown = units === 'imperial' && (key === 'runLength' || key === 'outletDistance') ? worded.map((m) => withFeet(m, form[key] as string, units)) : worded;
      errors[key] = [...(errors[key] ?? []), ...shown];
    }
  }
  return { fields, badFields, errors };
}

/** What the form asks for when a part of a field is left out, in the words of its input. */
const MISSING_WORDS: Partial<Record<FormKey, string>> = {
  runCategory: 'Choose its cable category (Cat 5e, Cat 6 or Cat 6A): a run is saved with its length and category together.',
  runLength: 'Type the length of the run too, or clear the cable run.',
  polarity: 'Choose the plug\'s polarity, or "Not marked" when nothing says.',
  barrelOuter: 'Type the plug\'s outer diameter, or pick its size.',
  barrelInner: 'Type the plug\'s inner diameter, or pick its size.',
  barrelVolts: 'Type the voltage printed on the device or its adapter.',
  terminalVolts: 'Type the voltage at the terminals.',
  terminalCurrent: 'Choose DC or AC at the terminals.',
  passiveVolts: 'Type the passive PoE voltage printed on the device.',
  watts: 'Type its power need in watts, or switch to the adapter\'s volts and amps.',
  volts: 'Type the volts printed on its adapter.',
  amps: 'Type the amps printed on its adapter.',
  inputType: 'Choose how it takes power.',
};

/** Schema messages speak metres; an imperial surveyor also sees what they typed. */
function withFeet(message: string, typed: string, units: UnitSystem): string {
  const n = parseNumber(typed);
  if (n === undefined || Number.isNaN(n)) return message;
  return `${message} — you typed ${formatNumber(n, 2)} ft = ${formatLength(lengthToSI(n, units), 'metric', 2)}.`;
}

/** The stored fields whose form keys changed since the form was loaded. */
export function changedFields(initial: DeviceForm, current: DeviceForm): string[] {
  return Object.entries(FIELD_KEYS)
    .filter(([, keys]) => keys.some((k) => initial[k] !== current[k]))
    .map(([field]) => field);
}

/**
 * What to send on save: only the changed fields that pass their schema. Bad fields stay in the
 * form with their messages, and what is already stored for them is left as it was.
 */
export function devicePatch(
  initial: DeviceForm, current: DeviceForm, units: UnitSystem,
): { patch: Record<string, unknown>; check: FormCheck; held: string[]; marked: string[] } {
  const check = checkDeviceForm(current, units);
  const patch: Record<string, unknown> = {};
  const held: string[] = [];
  for (const field of changedFields(initial, current)) {
    if (check.badFields.has(field)) held.push(field);
    else patch[field] = check.fields[field];
  }
  return { patch, check, held, marked: markedInputs(held, check.errors) };
}

/**
 * The inputs marked with a message on screen for the held fields, by their labels, in form
 * order: what the surveyor has to fix (one stored field such as the run has several inputs).
 */
export function markedInputs(held: readonly string[], errors: FormErrors): string[] {
  const labels: string[] = [];
  for (const field of held) {
    for (const k of FIELD_KEYS[field] ?? []) {
      if ((errors[k]?.length ?? 0) === 0) continue;
      const label = FORM_KEY_LABELS[k] ?? fieldWord(field);
      if (!labels.includes(label)) labels.push(label);
    }
  }
  return labels;
}

/**
 * The device as the form has it now, for live advice: stored data with every valid field of the
 * form on top (bad or unfinished fields keep their stored value).
 */
/**
 * What the live advice waits for: the messages of the fields changed on screen that do not pass yet.
 * Until they do, advice worked out from the stored values would describe another device (say, the
 * PoE input it had before passive PoE was picked), so none is given.
 */
export function adviceWaitsFor(initial: DeviceForm, current: DeviceForm, units: UnitSystem): string[] {
  return waitsForOf(initial, current, checkDeviceForm(current, units));
}

/** The live advice's input, checking the form once: the draft (`draftData`) and what it waits for (`adviceWaitsFor`). */
export function liveDraft(stored: Data, initial: DeviceForm, current: DeviceForm, units: UnitSystem): { data: Data; waitsFor: string[] } {
  const check = checkDeviceForm(current, units);
  return { data: draftOf(stored, check), waitsFor: waitsForOf(initial, current, check) };
}

function waitsForOf(initial: DeviceForm, current: DeviceForm, check: FormCheck): string[] {
  const messages: string[] = [];
  for (const field of changedFields(initial, current)) {
    if (!check.badFields.has(field)) continue;
    for (const k of FIELD_KEYS[field] ?? []) {
      for (const m of check.errors[k] ?? []) {
        const line = FORM_KEY_LABELS[k] ? `${FORM_KEY_LABELS[k]}: ${m}` : m;
        if (!messages.includes(line)) messages.push(line);
      }
    }
  }
  return messages;
}

/** The form's fields as the device screen labels them. */
const FORM_KEY_LABELS: Partial<Record<FormKey, string>> = {
  name: 'Name', kind: 'Kind', roomId: 'Room', mount: 'Mount point', watts: 'Power need', volts: 'Adapter volts', amps: 'Adapter amps',
  inputType: 'How it takes power', poeClass: 'PoE class', poeStandard: 'PoE standard', passiveVolts: 'Passive PoE volts',
  barrelOuter: 'Outer diameter', barrelInner: 'Inner diameter', polarity: 'Polarity', barrelVolts: 'Barrel volts', terminalVolts: 'Terminal volts',
  outletDistance: 'Nearest outlet distance', cableAccess: 'Cable access', runLength: 'Cable run to the closet', runCategory: 'Cable category',
  terminalCurrent: 'Current at the terminals', runGauge: 'Conductor gauge', runCca: 'Conductor', notes: 'Notes',
};

export function draftData(stored: Data, current: DeviceForm, units: UnitSystem): Data {
  return draftOf(stored, checkDeviceForm(current, units));
}

function draftOf(stored: Data, check: FormCheck): Data {
  const out: Data = { ...stored };
  for (const [field, value] of Object.entries(check.fields)) {
    if (check.badFields.has(field)) continue;
    if (value === null) delete out[field];
    else out[field] = value;
  }
  return out;
}
