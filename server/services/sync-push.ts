// Applies a batch of a phone's changes in one Postgres transaction, exactly once.
//
// - The client row is locked: ids at or below its last applied id are skipped; a gap is refused
//   before anything is written, so a retried push takes effect exactly once.
// - The team row is locked and its version bumped: every row this push touches carries the new
//   version, which is the cursor pulls read (never a timestamp or a sequence).
// - A change refused for a domain reason (no access, invalid field, item deleted) is recorded,
//   the queue moves on; anything else rolls the whole batch back.
// - Different fields merge; the same field goes to the later arrival and the lost value is kept;
//   a delete beats an update.
import { randomUUID } from "node:crypto";
import { and, eq, sql } from "drizzle-orm";
import type { Db } from "../../db/client";
import { itemConflicts, items, sites, syncClients, syncRejections, teams } from "../../db/schema";
import { checkItemDraft, mergeFields } from "../../survey/capture";
import { decideSite, type Actor } from "../../survey/policy";
import type { Mutation, PushRequest, PushResponse } from "../../sync/protocol";
import { HttpError } from "../errors";
import { lastWrites, recordWrite } from "./field-writes";
import { selectSitesWithSurveyors } from "./site-access";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
type ItemRow = typeof items.$inferSelect;
type SiteRow = typeof sites.$inferSelect & { surveyorIds: string[] };

class Rejected extends Error {
  constructor(
    readonly code: string,
    message: string,
  ) {
    super(message);
  }
}

function sameValue(a: unknown, b: unknown) {
  return JSON.stringify(a) === JSON.stringify(b);
}

export async function pushChanges(db: Db, actor: Actor, request: PushRequest): Promise<PushResponse> {
  return db.transaction(async (tx) => {
    // Lock order: the team row first (pushes of one team serialise on it), then the client row.
    // Taking the team lock later deadlocks against the key-share lock the client insert takes.
    const [team] = await tx.select({ version: teams.version }).from(teams).where(eq(teams.id, actor.teamId)).for("update");
    await tx.insert(syncClients).values({ clientId: request.clientId, userId: actor.userId, teamId: actor.teamId }).onConflictDoNothing();
    const [client] = await tx.select().from(syncClients).where(eq(syncClients.clientId, request.clientId)).for("update");
    if (client.userId !== actor.userId) {
      throw new HttpError(403, "client_of_another_user", "This device's store belongs to another user. Sign in as that user, or start a fresh store.");
    }
    const last = client.lastMutationId;
    const fresh = request.mutations.filter((m) => m.id > last);
    fresh.forEach((m, i) => {
      if (m.id !== last + 1 + i) {
        throw new HttpError(409, "mutation_gap", `Change ${m.id} came before change ${last + 1 + i}: the server applied up to ${last}. Send the changes in order, starting at ${last + 1}.`);
      }
    });
    if (fresh.length === 0) return { lastMutationId: last };

    const version = team.version + 1;
    const state = await loadState(tx, fresh);
    const rejections: { mutationId: number; code: string; message: string }[] = [];
    const conflicts: (typeof itemConflicts.$inferInsert)[] = [];

    for (const m of fresh) {
      try {
        applyOne(m, { actor, clientId: request.clientId, version, state, conflicts });
      } catch (err) {
        if (!(err instanceof Rejected)) throw err;
        rejections.push({ mutationId: m.id, code: err.code, message: err.message });
      }
    }

    await writeDirtyItems(tx, state, version);
    for (const site of state.sites.values()) {
      if (site.version === version) {
        await tx.update(sites).set({ closetRoomId: site.closetRoomId, settings: site.settings, version, updatedAt: new Date() }).where(eq(sites.id, site.id));
      }
    }
    if (conflicts.length) await tx.insert(itemConflicts).values(conflicts);
    if (rejections.length) await tx.insert(syncRejections).values(rejections.map((r) => ({ ...r, clientId: request.clientId, version })));
    const lastMutationId = fresh[fresh.length - 1].id;
    await tx.update(syncClients).set({ lastMutationId, lastSeenAt: new Date() }).where(eq(syncClients.clientId, request.clientId));
    await tx.update(teams).set({ version }).where(eq(teams.id, actor.teamId));
    return { lastMutationId };
  });
}

async function writeDirtyItems(tx: Tx, state: State, version: number) {
  const dirtyItems = [...state.items.values()].filter((i) => i.version === version);
  if (!dirtyItems.length) return;
  // One statement with one parameter (the rows as a JSON array): far cheaper to build and send than
  // a multi-row VALUES list with ten bind values per row.
  const rows = dirtyItems.map((i) => ({ id: i.id, team_id: i.teamId, site_id: i.siteId, kind: i.kind, data: i.data, field_versions: i.fieldVersions, deleted: i.deleted, version: i.version, updated_by: i.updatedBy }));
  await tx.execute(sql`
    insert into items (id, team_id, site_id, kind, data, field_versions, deleted, version, updated_by, updated_at)
    select r.id, r.team_id, r.site_id, r.kind::item_kind, r.data, r.field_versions, r.deleted, r.version, r.updated_by, now()
    from jsonb_to_recordset(${JSON.stringify(rows)}::jsonb)
      as r(id text, team_id text, site_id text, kind text, data jsonb, field_versions jsonb, deleted boolean, version bigint, updated_by text)
    on conflict (id) do update set data = excluded.data, field_versions = excluded.field_versions, deleted = excluded.deleted,
      version = excluded.version, updated_by = excluded.updated_by, updated_at = now()`);
}

interface State {
  items: Map<string, ItemRow>;
  sites: Map<string, SiteRow>;
}

async function loadState(tx: Tx, mutations: Mutation[]): Promise<State> {
  const itemIds = new Set<string>();
  const siteIds = new Set<string>();
  for (const m of mutations) {
    siteIds.add(m.args.siteId);
    if (m.name !== "site.update") itemIds.add(m.args.itemId);
    else if (m.args.fields.closetRoomId) itemIds.add(m.args.fields.closetRoomId);
  }
  // The ids go as one array parameter: a batch of 500 changes is one bind value, not 500.
  const itemRows = itemIds.size ? await tx.select().from(items).where(sql`${items.id} = any(${sql.param([...itemIds])}::text[])`) : [];
  const siteRows = await selectSitesWithSurveyors(tx).where(sql`${sites.id} = any(${sql.param([...siteIds])}::text[])`);
  return { items: new Map(itemRows.map((r) => [r.id, r])), sites: new Map(siteRows.map((s) => [s.id, s])) };
}

interface ApplyContext {
  actor: Actor;
  clientId: string;
  version: number;
  state: State;
  conflicts: (typeof itemConflicts.$inferInsert)[];
}

function siteForCapture(ctx: ApplyContext, siteId: string): SiteRow {
  const site = ctx.state.sites.get(siteId);
  const decision = site ? decideSite(ctx.actor, "site:capture", site) : "hidden";
  if (decision === "hidden") throw new Rejected("site_unavailable", "This site is not available to you any more, so the change was not saved on the server.");
  if (decision === "forbidden") throw new Rejected("forbidden", "Your role cannot change what was captured on this site.");
  return site!;
}

function applyOne(m: Mutation, ctx: ApplyContext) {
  const { state, version, actor, clientId } = ctx;
  switch (m.name) {
    case "item.put": {
      const { itemId, siteId, kind, fields, baseVersion } = m.args;
      siteForCapture(ctx, siteId);
      const existing = state.items.get(itemId);
      if (existing && (existing.siteId !== siteId || existing.kind !== kind)) {
        throw new Rejected("id_taken", "Another item already uses this id; the change was not saved.");
      }
      if (existing?.deleted) throw new Rejected("deleted", `This ${kind} was deleted by someone else, so your change to it was not kept.`);
      const data = mergeFields(existing?.data ?? {}, fields);
      const check = checkItemDraft(kind, data);
      if (!check.ok) {
        const [field, messages] = Object.entries(check.errors)[0];
        throw new Rejected("invalid", `${field}: ${messages[0]}`);
      }
      const previousWrites = existing ? lastWrites(existing.fieldVersions) : undefined;
      for (const [field, value] of Object.entries(fields)) {
        const previous = previousWrites?.get(field);
        const before = existing?.data[field];
        if (existing && previous && previous.v > baseVersion && previous.c !== clientId && !sameValue(before, value)) {
          ctx.conflicts.push({
            id: randomUUID(),
            teamId: actor.teamId,
            siteId,
            itemId,
            field,
            lostValue: before ?? null,
            keptValue: value,
            lostBy: existing.updatedBy,
            keptBy: actor.userId,
            version,
          });
        }
      }
      const fieldVersions = recordWrite(existing?.fieldVersions ?? {}, Object.keys(fields), version, clientId);
      state.items.set(itemId, {
        id: itemId,
        teamId: actor.teamId,
        siteId,
        kind,
        data,
        fieldVersions,
        deleted: false,
        version,
        updatedBy: actor.userId,
        updatedAt: new Date(),
      });
      return;
    }
    case "item.delete": {
      const { itemId, siteId } = m.args;
      siteForCapture(ctx, siteId);
      const existing = state.items.get(itemId);
      if (!existing || existing.deleted) return; // already gone: deleting twice is the same as once
      if (existing.siteId !== siteId) throw new Rejected("id_taken", "That item belongs to another site.");
      state.items.set(itemId, { ...existing, deleted: true, version, updatedBy: actor.userId });
      return;
    }
    case "site.update": {
      const site = siteForCapture(ctx, m.args.siteId);
      const { closetRoomId, units } = m.args.fields;
      if (closetRoomId) {
        const room = state.items.get(closetRoomId);
        if (!room || room.kind !== "room" || room.deleted || room.siteId !== site.id) {
          throw new Rejected("invalid", "The closet must be one of this site's rooms.");
        }
      }
      const settings = { ...(site.settings as Record<string, unknown>), ...(units ? { units } : {}) };
      state.sites.set(site.id, { ...site, closetRoomId: closetRoomId === undefined ? site.closetRoomId : closetRoomId, settings, version });
      return;
    }
  }
}

/** For REST writes to a site (rename, people): stamp it with a new team version so pulls see it. */
export async function bumpSiteVersion(tx: Tx | Db, teamId: string, siteId: string) {
  const [team] = await tx.update(teams).set({ version: sql`${teams.version} + 1` }).where(eq(teams.id, teamId)).returning({ version: teams.version });
  await tx.update(sites).set({ version: team.version }).where(and(eq(sites.id, siteId), eq(sites.teamId, teamId)));
}

/** One change to an item made away from a phone (the designer's desk): set fields, or delete. */
export type ItemChange =
  | { op: "put"; itemId: string; siteId: string; kind: ItemRow["kind"]; fields: Record<string, unknown> }
  | { op: "delete"; itemId: string; siteId: string };

/**
 * Applies item changes for a caller that is not a phone, inside the caller's transaction, with the
 * same merge and validation as a push: one team version bump, every touched row stamped with it
 * (and its fields with the caller's client id), so phones pull the changes. A refused change
 * throws a 409 and the caller's transaction rolls back. Returns the new team version (or the
 * current one when there was nothing to change).
 */
export async function applyItemChanges(tx: Tx, actor: Actor, changes: readonly ItemChange[], clientId = `desk:${actor.userId}`): Promise<number> {
  const [team] = await tx.select({ version: teams.version }).from(teams).where(eq(teams.id, actor.teamId)).for("update");
  if (changes.length === 0) return team.version;
  const version = team.version + 1;
  const mutations: Mutation[] = changes.map((c, i) =>
    c.op === "put"
      ? { id: i + 1, name: "item.put", args: { itemId: c.itemId, siteId: c.siteId, kind: c.kind, fields: c.fields, baseVersion: 0 } }
      : { id: i + 1, name: "item.delete", args: { itemId: c.itemId, siteId: c.siteId } },
  );
  const state = await loadState(tx, mutations);
  const conflicts: (typeof itemConflicts.$inferInsert)[] = [];
  for (const m of mutations) {
    // The desk read the rows it changes in this transaction: its base is the current version.
    if (m.name === "item.put") m.args.baseVersion = state.items.get(m.args.itemId)?.version ?? 0;
    try {
      applyOne(m, { actor, clientId, version, state, conflicts });
    } catch (err) {
      if (err instanceof Rejected) throw new HttpError(409, err.code, err.message);
      throw err;
    }
  }
  await writeDirtyItems(tx, state, version);
  if (conflicts.length) await tx.insert(itemConflicts).values(conflicts);
  await tx.update(teams).set({ version }).where(eq(teams.id, actor.teamId));
  return version;
}
