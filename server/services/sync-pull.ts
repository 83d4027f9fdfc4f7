// Everything that changed for a phone since its cursor, read in one consistent snapshot.
import { and, eq, gt, inArray, notInArray, or, sql } from "drizzle-orm";
import type { Db } from "../../db/client";
import { itemConflicts, items, photos, sites, syncClients, syncRejections, teams } from "../../db/schema";
import { canSeeSite, type Actor } from "../../survey/policy";
import type { ConflictNote, PhotoRecord, PullRequest, PullResponse, Rejection, SiteRecord } from "../../sync/protocol";
import { HttpError } from "../errors";
import { selectSitesWithSurveyors } from "./site-access";

export async function pullChanges(db: Db, actor: Actor, request: PullRequest): Promise<PullResponse> {
  return db.transaction(
    async (tx) => {
      // The team's version (the new cursor) and this phone's client row, in one statement.
      const [head] = await tx
        .select({ teamVersion: teams.version, clientUserId: syncClients.userId, lastMutationId: syncClients.lastMutationId })
        .from(teams)
        .leftJoin(syncClients, eq(syncClients.clientId, request.clientId))
        .where(eq(teams.id, actor.teamId));
      const client = head.clientUserId === null ? undefined : { userId: head.clientUserId, lastMutationId: head.lastMutationId ?? 0 };
      if (client && client.userId !== actor.userId) {
        throw new HttpError(403, "client_of_another_user", "This device's store belongs to another user. Sign in as that user, or start a fresh store.");
      }
      const teamSites = await selectSitesWithSurveyors(tx).where(eq(sites.teamId, actor.teamId));
      const visible = teamSites.filter((s) => canSeeSite(actor, s));
      const visibleIds = visible.map((s) => s.id);
      const known = new Set(request.knownSiteIds);
      const fresh = visibleIds.filter((id) => !known.has(id));
      const kept = visibleIds.filter((id) => known.has(id));
      const removedSiteIds = request.knownSiteIds.filter((id) => !visibleIds.includes(id));
      const cursor = request.cursor;

      // Known sites: what changed since the cursor (tombstones included). New sites: all of it.
      const changed = (table: typeof items | typeof photos) =>
        or(
          kept.length ? and(inArray(table.siteId, kept), gt(table.version, cursor)) : sql`false`,
          fresh.length ? inArray(table.siteId, fresh) : sql`false`,
        );
      // Thousands of rows on a first pull: read as the driver gives them (the columns named as the
      // protocol names them, jsonb already parsed, the bigint version as a float8 number, exact to
      // 2^53 like the schema's number mode), which skips a second mapping of every row.
      const itemRows = visibleIds.length
        ? (
            await tx.execute<PullResponse["items"][number] & Record<string, unknown>>(sql`select ${items.id} as "id", ${items.siteId} as "siteId", ${items.kind} as "kind",
                ${items.data} as "data", ${items.deleted} as "deleted", ${items.version}::float8 as "version"
              from ${items}
              where ${and(eq(items.teamId, actor.teamId), changed(items), fresh.length ? or(notInArray(items.siteId, fresh), eq(items.deleted, false)) : undefined)}`)
          ).rows
        : [];
      // Photos, lost values and refused changes since the cursor: small lists, fetched together in one
      // statement (each a JSON array) rather than three round trips.
      const notes = visibleIds.length
        ? (
            await tx.execute<{ photos: PhotoRecord[]; conflicts: ConflictNote[]; rejections: Rejection[] }>(sql`select
              (select coalesce(json_agg(json_build_object('id', ${photos.id}, 'siteId', ${photos.siteId}, 'itemId', ${photos.itemId},
                  'label', ${photos.label}, 'mime', ${photos.mime}, 'size', ${photos.size}, 'version', ${photos.version})), '[]'::json)
                from ${photos} where ${and(eq(photos.teamId, actor.teamId), changed(photos))}) as photos,
              (select coalesce(json_agg(json_build_object('id', ${itemConflicts.id}, 'itemId', ${itemConflicts.itemId}, 'siteId', ${itemConflicts.siteId},
                  'field', ${itemConflicts.field}, 'lostValue', ${itemConflicts.lostValue}, 'keptValue', ${itemConflicts.keptValue},
                  'lostBy', ${itemConflicts.lostBy}, 'keptBy', ${itemConflicts.keptBy}, 'version', ${itemConflicts.version})), '[]'::json)
                from ${itemConflicts}
                where ${and(eq(itemConflicts.teamId, actor.teamId), inArray(itemConflicts.siteId, visibleIds), gt(itemConflicts.version, cursor))}) as conflicts,
              (select coalesce(json_agg(json_build_object('mutationId', ${syncRejections.mutationId}, 'code', ${syncRejections.code},
                  'message', ${syncRejections.message})), '[]'::json)
                from ${syncRejections} where ${and(eq(syncRejections.clientId, request.clientId), gt(syncRejections.version, cursor))}) as rejections`)
          ).rows[0]
        : { photos: [], conflicts: [], rejections: [] };
      const siteRecords: SiteRecord[] = visible
        .filter((s) => fresh.includes(s.id) || s.version > cursor)
        .map((s) => ({
          id: s.id,
          name: s.name,
          address: s.address,
          status: s.status,
          units: ((s.settings as { units?: "metric" | "imperial" })?.units ?? "metric"),
          closetRoomId: s.closetRoomId,
          version: s.version,
        }));
      return {
        cursor: head.teamVersion,
        lastMutationId: client?.lastMutationId ?? 0,
        sites: siteRecords,
        removedSiteIds,
        items: itemRows,
        photos: notes.photos,
        rejections: client ? notes.rejections : [],
        conflicts: notes.conflicts,
      };
    },
    { isolationLevel: "repeatable read", accessMode: "read only" },
  );
}
