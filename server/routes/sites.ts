import { randomUUID } from "node:crypto";
import { and, eq, inArray } from "drizzle-orm";
import { Router } from "express";
import { memberships, siteAssignments, sites } from "../../db/schema";
import { canSeeSite } from "../../survey/policy";
import { AssignSurveyorsSchema, CreateSiteSchema, InviteClientSchema, UpdateSiteSchema } from "../../survey/team";
import { actorOf, requireTeam } from "../auth/actor";
import type { AppContext } from "../context";
import { HttpError, param, parseInput } from "../errors";
import { siteFor, type SiteWithAccess } from "../services/site-access";
import { uncachedSiteLists } from "../services/site-lists";
import { inviteClientToSite } from "../services/client-invite";

export function siteView(site: SiteWithAccess) {
  return {
    id: site.id,
    name: site.name,
    address: site.address,
    status: site.status,
    clientUserId: site.clientUserId,
    surveyorIds: site.surveyorIds,
    settings: site.settings,
    updatedAt: site.updatedAt,
  };
}

export function sitesRouter(ctx: AppContext, router: Router = Router()) {
  const { db } = ctx;
  const siteLists = ctx.siteLists ?? uncachedSiteLists(db);

  router.get("/sites", async (_req, res) => {
    const actor = actorOf(res);
    const visible = (await siteLists.find(actor.teamId))!.filter((s) => canSeeSite(actor, s)).map(siteView);
    res.json({ sites: visible });
  });

  router.post("/sites", requireTeam("site:create"), async (req, res) => {
    const actor = actorOf(res);
    const input = parseInput(CreateSiteSchema, req.body);
    const [site] = await db
      .insert(sites)
      .values({ id: randomUUID(), teamId: actor.teamId, name: input.name, address: input.address, settings: { units: input.units } })
      .returning();
    res.status(201).json({ site: siteView({ ...site, surveyorIds: [] }) });
  });

  router.get("/sites/:siteId", async (req, res) => {
    const site = await siteFor(db, actorOf(res), param(req, "siteId"), "site:read");
    res.json({ site: siteView(site) });
  });

  router.patch("/sites/:siteId", async (req, res) => {
    const site = await siteFor(db, actorOf(res), param(req, "siteId"), "site:manage");
    const input = parseInput(UpdateSiteSchema, req.body);
    const [updated] = await db.update(sites).set({ ...input, updatedAt: new Date() }).where(eq(sites.id, site.id)).returning();
    res.json({ site: siteView({ ...updated, surveyorIds: site.surveyorIds }) });
  });

  router.put("/sites/:siteId/surveyors", async (req, res) => {
    const actor = actorOf(res);
    const site = await siteFor(db, actor, param(req, "siteId"), "site:manage");
    const { surveyorIds } = parseInput(AssignSurveyorsSchema, req.body);
    const unique = [...new Set(surveyorIds)];
    if (unique.length) {
      const found = await db
        .select({ userId: memberships.userId })
        .from(memberships)
        .where(and(eq(memberships.teamId, actor.teamId), eq(memberships.role, "surveyor"), inArray(memberships.userId, unique)));
      const known = new Set(found.map((f) => f.userId));
      const unknown = unique.filter((id) => !known.has(id));
      if (unknown.length) {
        throw new HttpError(400, "invalid_input", "Only surveyors of your team can be assigned to a site.", { surveyorIds: [`Not a surveyor of this team: ${unknown.join(", ")}`] });
      }
    }
    await db.transaction(async (tx) => {
      await tx.delete(siteAssignments).where(eq(siteAssignments.siteId, site.id));
      if (unique.length) await tx.insert(siteAssignments).values(unique.map((userId) => ({ siteId: site.id, userId })));
    });
    res.json({ site: siteView({ ...site, surveyorIds: unique }) });
  });

  router.post("/sites/:siteId/client", async (req, res) => {
    const actor = actorOf(res);
    const site = await siteFor(db, actor, param(req, "siteId"), "site:manage");
    const input = parseInput(InviteClientSchema, req.body);
    const client = await inviteClientToSite(ctx, actor, site, input);
    res.status(201).json({ client, site: siteView({ ...site, clientUserId: client.id }) });
  });

  return router;
}
