/**
 * Which write last set each field of an item: the team version it carried and the client that sent
 * it. Stored per write rather than per field ({"7:<client id>": ["name", "power"]}), so a client id
 * is kept once per write instead of once per field. Finds same-field conflicts in a push.
 */
export type FieldWrites = Record<string, string[]>;

export interface FieldWrite {
  v: number;
  c: string;
}

function writeKey(version: number, clientId: string) {
  return `${version}:${clientId}`;
}

/** Each field's last write. Client ids may contain ':' themselves (desk clients do): split at the first. */
export function lastWrites(writes: FieldWrites): Map<string, FieldWrite> {
  const byField = new Map<string, FieldWrite>();
  for (const [key, fields] of Object.entries(writes)) {
    const colon = key.indexOf(":");
    const write = { v: Number(key.slice(0, colon)), c: key.slice(colon + 1) };
    for (const field of fields) byField.set(field, write);
  }
  return byField;
}

/** The writes after `fields` were set by `clientId` at `version`; earlier writes keep only the fields they still hold. */
export function recordWrite(writes: FieldWrites, fields: readonly string[], version: number, clientId: string): FieldWrites {
  const written = new Set(fields);
  const next: FieldWrites = {};
  for (const [key, held] of Object.entries(writes)) {
    const still = held.filter((f) => !written.has(f));
    if (still.length) next[key] = still;
  }
  const key = writeKey(version, clientId);
  next[key] = [...(next[key] ?? []), ...fields.filter((f) => !(next[key] ?? []).includes(f))];
  return next;
}
