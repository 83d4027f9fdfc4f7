/**
 * Every number in the standards tables carries a provenance mark, matching
 * the marks of the project's trade-facts file:
 *
 * - CONFIRMED — read in a published secondary source (source ids such as "S4").
 * - DERIVED   — computed from confirmed inputs (arithmetic cross-checked).
 * - MEMORY    — from memory; not found in a readable source. Verify before relying on it.
 * - PRACTICE  — common field practice / rule of thumb; no authoritative source.
 */
export type SourceMark = 'CONFIRMED' | 'DERIVED' | 'MEMORY' | 'PRACTICE';

export interface Provenance {
  readonly mark: SourceMark;
  /** Source ids from the facts file, e.g. ["S3v", "S7"]. Empty for MEMORY / PRACTICE. */
  readonly sources: readonly string[];
  readonly note?: string;
}

export function confirmed(sources: readonly string[], note?: string): Provenance {
  return note === undefined ? { mark: 'CONFIRMED', sources } : { mark: 'CONFIRMED', sources, note };
}
export function derived(sources: readonly string[], note?: string): Provenance {
  return note === undefined ? { mark: 'DERIVED', sources } : { mark: 'DERIVED', sources, note };
}
export function fromMemory(note?: string): Provenance {
  return note === undefined ? { mark: 'MEMORY', sources: [] } : { mark: 'MEMORY', sources: [], note };
}
export function practice(note?: string): Provenance {
  return note === undefined ? { mark: 'PRACTICE', sources: [] } : { mark: 'PRACTICE', sources: [], note };
}

/** "[CONFIRMED] S3v, S7" — the tag printed beside a value in cautions and docs. */
export function provenanceTag(p: Provenance): string {
  return p.sources.length > 0 ? `[${p.mark}] ${p.sources.join(', ')}` : `[${p.mark}]`;
}
