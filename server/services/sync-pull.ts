// Everything that changed for a phone since its cursor, read in one consistent snapshot.
import { and, eq, gt, inArray, notInArray, or, sql } from "drizzle-orm";
import type { Db } from "../../db/client";
import { itemConflicts, items, photos, sites, syncClients, syncRejections, teams } from "../../db/schema";
import { canSeeSite, type Actor } from "../../survey/policy";
import type { PullRequest, PullResponse, SiteRecord } from "../../sync/protocol";
import { HttpError } from "../errors";
import { selectSitesWithSurveyors } from "./site-access";

export async function pullChanges(db: Db, actor: Actor, request: PullRequest): Promise<PullResponse> {
  return db.transaction(
    async (tx) => {
      const [client] = await tx.select().from(syncClients).where(eq(syncClients.clientId, request.clientId));
      if (client && client.userId !== actor.userId) {
        throw new HttpError(403, "client_of_another_user", "This device's store belongs to another user. Sign in as that user, or start a fresh store.");
      }
      const [team] = await tx.select({ version: teams.version }).from(teams).where(eq(teams.id, actor.teamId));
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
      const itemRows = visibleIds.length
        ? await tx
            .select({ id: items.id, siteId: items.siteId, kind: items.kind, data: items.data, deleted: items.deleted, version: items.version })
            .from(items)
            .where(and(eq(items.teamId, actor.teamId), changed(items), fresh.length ? or(notInArray(items.siteId, fresh), eq(items.deleted, false)) : undefined))
        : [];
      const photoRows = visibleIds.length
        ? await tx
            .select({ id: photos.id, siteId: photos.siteId, itemId: photos.itemId, label: photos.label, mime: photos.mime, size: photos.size, version: photos.version })
            .from(photos)
            .where(and(eq(photos.teamId, actor.teamId), changed(photos)))
        : [];
      const conflicts = visibleIds.length
        ? await tx
            .select({
              id: itemConflicts.id,
              itemId: itemConflicts.itemId,
              siteId: itemConflicts.siteId,
              field: itemConflicts.field,
              lostValue: itemConflicts.lostValue,
              keptValue: itemConflicts.keptValue,
              lostBy: itemConflicts.lostBy,
              keptBy: itemConflicts.keptBy,
              version: itemConflicts.version,
            })
            .from(itemConflicts)
            .where(and(eq(itemConflicts.teamId, actor.teamId), inArray(itemConflicts.siteId, visibleIds), gt(itemConflicts.version, cursor)))
        : [];
      const rejections = client
        ? await tx
            .select({ mutationId: syncRejections.mutationId, code: syncRejections.code, message: syncRejections.message })
            .from(syncRejections)
            .where(and(eq(syncRejections.clientId, request.clientId), gt(syncRejections.version, cursor)))
        : [];
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
        cursor: team.version,
        lastMutationId: client?.lastMutationId ?? 0,
        sites: siteRecords,
        removedSiteIds,
        items: itemRows,
        photos: photoRows,
        rejections,
        conflicts,
      };
    },
    { isolationLevel: "repeatable read", accessMode: "read only" },
  );
}
