// The instant advice of a walk: the same rules the desk uses, run on the phone over what has been
// captured so far. Devices with gaps get no advice (their gaps say what is missing).
import { assembleSite, type SiteItem } from '../capture';
import { parseSite } from '../model/validate';
import type { Caution } from '../standards/cautions';
import type { UnitSystem } from '../units';
import { evaluateSite } from '../rules/evaluate-site';
import type { DeviceEvaluation } from '../rules/result-types';

export interface WalkSiteMeta {
  readonly id: string;
  readonly name: string;
  readonly address?: string;
  readonly closetRoomId: string | null;
  readonly units: UnitSystem;
}

export interface WalkAdvice {
  /** Advice per complete device. */
  readonly byDevice: ReadonlyMap<string, DeviceEvaluation>;
  /** Devices the rules could not take, with the reason (a pin to a port that does not exist…). */
  readonly refused: ReadonlyMap<string, string>;
  /** Site-wide cautions for the plan so far. */
  readonly cautions: readonly Caution[];
}

const EMPTY: WalkAdvice = { byDevice: new Map(), refused: new Map(), cautions: [] };

/**
 * Runs the rules over a site's items. A device whose captured fields break a site-wide check (two
 * devices pinned to the same port, say) is set aside with the reason, and the rest is evaluated.
 */
export function walkAdvice(meta: WalkSiteMeta, items: readonly SiteItem[]): WalkAdvice {
  const { site } = assembleSite({ id: meta.id, name: meta.name, address: meta.address, closetRoomId: meta.closetRoomId, settings: { units: meta.units } }, items);
  if (site.devices.length === 0) return EMPTY;
  const refused = new Map<string, string>();
  let input = site;
  for (let attempt = 0; attempt < 5; attempt++) {
    const parsed = parseSite(input);
    if (parsed.ok) {
      const evaluation = evaluateSite(parsed.value);
      return { byDevice: new Map(evaluation.devices.map((d) => [d.deviceId, d])), refused, cautions: evaluation.cautions };
    }
    const bad = new Set<number>();
    for (const e of parsed.errors) {
      const m = /^devices\.(\d+)\./.exec(e.path);
      if (!m) continue;
      const i = Number(m[1]);
      bad.add(i);
      const id = input.devices[i]?.id;
      if (id && !refused.has(id)) refused.set(id, e.message);
    }
    // Nothing to set aside: the site itself does not hold together (no closet room yet…).
    if (bad.size === 0) return { byDevice: new Map(), refused: new Map(input.devices.map((d) => [d.id, parsed.errors[0]?.message ?? 'The site is not complete yet.'])), cautions: [] };
    input = { ...input, devices: input.devices.filter((_, i) => !bad.has(i)) };
  }
  return { byDevice: new Map(), refused, cautions: [] };
}
