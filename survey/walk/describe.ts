// Stored field values in words, for notices such as "your value 12 W for power need was replaced
// by 18 W from another surveyor".
import type { CableAccess, DeviceKind, Mount, Polarity } from '../model/device';
import type { CableCategory } from '../standards/cabling';
import { formatLength, formatNumber, type UnitSystem } from '../units';
import { DEVICE_FIELD_WORDS } from './gaps';
import { CABLE_ACCESS_WORDS, CATEGORY_WORDS, INPUT_WORDS, KIND_WORDS, MOUNT_WORDS, POLARITY_WORDS, type PowerInputType } from './words';

type Data = Record<string, unknown>;

const OTHER_FIELD_WORDS: Readonly<Record<string, string>> = {
  floorId: 'floor',
  level: 'level',
  closetRoomId: 'closet',
  units: 'units',
};

export function fieldWord(field: string): string {
  return DEVICE_FIELD_WORDS[field] ?? OTHER_FIELD_WORDS[field] ?? field;
}

/** Fields whose parts are saved together: one bad part holds the others back too. */
const SAVED_TOGETHER: Readonly<Record<string, string>> = {
  power: 'its figure and how it is printed',
  input: 'how it takes power and its details',
  run: 'its length, category, gauge and copper-clad aluminium',
};

/** A field that was held back, in words that say what else waits with it. */
export function heldFieldWords(field: string): string {
  const together = SAVED_TOGETHER[field];
  return together ? `${fieldWord(field)} (${together} are saved together)` : fieldWord(field);
}

const n = (x: unknown) => (typeof x === 'number' ? formatNumber(x, 2) : '?');

/** One stored value in words, lengths in the site's units. */
export function describeValue(field: string, value: unknown, units: UnitSystem): string {
  if (value === null || value === undefined) return 'nothing';
  switch (field) {
    case 'kind':
      return KIND_WORDS[value as DeviceKind] ?? String(value);
    case 'mount':
      return MOUNT_WORDS[value as Mount] ?? String(value);
    case 'cableAccess':
      return CABLE_ACCESS_WORDS[value as CableAccess] ?? String(value);
    case 'outletDistanceM':
      return typeof value === 'number' ? formatLength(value, units, 2) : String(value);
    case 'power': {
      const p = value as Data;
      const figure = p.by === 'adapter' ? `${n(p.volts)} V × ${n(p.amps)} A` : `${n(p.watts)} W`;
      return p.typical === true ? `${figure} (typical)` : figure;
    }
    case 'input': {
      const i = value as Data;
      const word = INPUT_WORDS[i.type as PowerInputType] ?? String(i.type);
      if (i.type === 'poe') return [word, typeof i.class === 'number' ? `Class ${i.class}` : null, typeof i.standard === 'string' ? `802.3${i.standard}` : null].filter(Boolean).join(', ');
      if (i.type === 'dc_barrel') return `${word} ${n(i.outerMm)}×${n(i.innerMm)} mm, ${POLARITY_WORDS[i.polarity as Polarity] ?? 'polarity ?'}, ${n(i.volts)} V`;
      if (i.type === 'passive_poe') return `${word} ${n(i.volts)} V`;
      if (i.type === 'terminal_block') return `${word} ${n(i.volts)} V ${i.current === 'ac' ? 'AC' : 'DC'}`;
      return word;
    }
    case 'run': {
      const r = value as Data;
      const length = typeof r.lengthM === 'number' ? formatLength(r.lengthM, units, 1) : '?';
      const parts = [`${length} of ${CATEGORY_WORDS[r.category as CableCategory] ?? String(r.category)}`];
      if (typeof r.gauge === 'number') parts.push(`${r.gauge} AWG`);
      if (r.cca === true) parts.push('CCA');
      return parts.join(', ');
    }
    case 'mustStayUp':
      return value === true ? 'must stay up' : 'may go down';
    case 'outdoor':
      return value === true ? 'outdoor' : 'indoor';
    default:
      if (typeof value === 'string') return `“${value}”`;
      if (typeof value === 'number' || typeof value === 'boolean') return String(value);
      return JSON.stringify(value);
  }
}

/**
 * The notice after a save that held fields back: the title counts the entries marked on screen
 * (one field such as the cable run has several), the text names them and what waits with them.
 */
export function heldNotice(held: readonly string[], marked: readonly string[], savedOthers: boolean): { title: string; text: string } {
  const count = marked.length > 0 ? marked.length : held.length;
  const title = count === 1 ? 'One entry needs fixing' : `${count} entries need fixing`;
  const fix = marked.length > 0 ? `Fix ${listWords(marked)} (marked in the form). ` : '';
  const waiting = `Until then the ${listWords(held.map(heldFieldWords))} ${held.length === 1 ? 'is' : 'are'} not saved; what you typed is still here.`;
  return { title, text: `${fix}${waiting}${savedOthers ? ' The other fields are saved on this phone.' : ''}` };
}

function listWords(xs: readonly string[]): string {
  return xs.length <= 1 ? (xs[0] ?? '') : `${xs.slice(0, -1).join(', ')} and ${xs[xs.length - 1]}`;
}
