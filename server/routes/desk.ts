import { asc, eq, inArray } from "drizzle-orm";
import { Router } from "express";
import { items, siteAssignments, sites, users } from "../../db/schema";
import { walkProgress } from "../../survey/walk/gaps";
import { actorOf, requireTeam } from "../auth/actor";
import type { AppContext } from "../context";

/** The desk's table of sites: every site of the team, with its people, status, checklist and last sync. */
export function deskRouter(ctx: AppContext, router: Router = Router()) {
  const { db } = ctx;

  router.get("/desk/sites", requireTeam("desk:read"), async (_req, res) => {
    const actor = actorOf(res);
    const rows = await db.select().from(sites).where(eq(sites.teamId, actor.teamId)).orderBy(asc(sites.name));
    const ids = rows.map((r) => r.id);
    const assigned = ids.length ? await db.select().from(siteAssignments).where(inArray(siteAssignments.siteId, ids)) : [];
    const peopleIds = [...new Set([...assigned.map((a) => a.userId), ...rows.flatMap((r) => (r.clientUserId ? [r.clientUserId] : []))])];
    const people = peopleIds.length ? await db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(inArray(users.id, peopleIds)) : [];
    const nameOf = new Map(people.map((p) => [p.id, p.name ?? p.email]));
    const itemRows = ids.length
      ? await db
          .select({ id: items.id, siteId: items.siteId, kind: items.kind, data: items.data, deleted: items.deleted, version: items.version, updatedAt: items.updatedAt })
          .from(items)
          .where(inArray(items.siteId, ids))
      : [];
    const bySite = new Map<string, typeof itemRows>(ids.map((id) => [id, []]));
    for (const i of itemRows) bySite.get(i.siteId)?.push(i);

    const out = rows.map((s) => {
      const siteItems = bySite.get(s.id) ?? [];
      // Counted exactly as the surveyor's walk counts them (walkProgress).
      const progress = walkProgress({ closetRoomId: s.closetRoomId }, siteItems);
      const last = siteItems.reduce<Date | null>((m, i) => (m === null || i.updatedAt > m ? i.updatedAt : m), null);
      const surveyors = assigned.filter((a) => a.siteId === s.id).map((a) => ({ id: a.userId, name: nameOf.get(a.userId) ?? a.userId }));
      return {
        id: s.id,
        name: s.name,
        address: s.address,
        status: s.status,
        clientName: s.clientUserId ? (nameOf.get(s.clientUserId) ?? null) : null,
        surveyors,
        devices: { total: progress.devices, complete: progress.devicesComplete, withGaps: progress.devicesWithGaps, leftOut: progress.devicesLeftOut },
        lastSyncAt: last ? last.toISOString() : null,
        updatedAt: s.updatedAt.toISOString(),
      };
    });
    res.json({ sites: out });
  });

  return router;
}
