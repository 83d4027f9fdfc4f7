import { eq, inArray } from "drizzle-orm";
import { siteAssignments, sites } from "../../db/schema";
import { decideSite, type Actor, type SiteAccess, type SiteAction } from "../../survey/policy";
import type { Db } from "../../db/client";
import { HttpError, notFound } from "../errors";

export type SiteRow = typeof sites.$inferSelect;
export type SiteWithAccess = SiteRow & SiteAccess;

export async function loadSite(db: Db, siteId: string): Promise<SiteWithAccess | undefined> {
  const [site] = await db.select().from(sites).where(eq(sites.id, siteId)).limit(1);
  if (!site) return undefined;
  const assigned = await db.select({ userId: siteAssignments.userId }).from(siteAssignments).where(eq(siteAssignments.siteId, siteId));
  return { ...site, surveyorIds: assigned.map((a) => a.userId) };
}

export async function surveyorsBySite(db: Db, siteIds: string[]): Promise<Map<string, string[]>> {
  const map = new Map<string, string[]>(siteIds.map((id) => [id, []]));
  if (siteIds.length === 0) return map;
  const rows = await db.select().from(siteAssignments).where(inArray(siteAssignments.siteId, siteIds));
  for (const r of rows) map.get(r.siteId)?.push(r.userId);
  return map;
}

const FORBIDDEN_MESSAGES: Record<SiteAction, string> = {
  "site:read": "You cannot open this site.",
  "site:plan": "The working plan is for the team; your scope appears when the installer publishes it.",
  "site:capture": "Only the team can change what was captured on this site.",
  "site:manage": "Only a designer or an admin can change this site's plan and people.",
  "site:sign": "Only the homeowner invited to this site can sign off its scope.",
};

/** Loads a site the actor may act on: another team's or an unassigned site is a 404, a role that may only look a 403. */
export async function siteFor(db: Db, actor: Actor, siteId: string, action: SiteAction): Promise<SiteWithAccess> {
  const site = await loadSite(db, siteId);
  if (!site) throw notFound("That site");
  const decision = decideSite(actor, action, site);
  if (decision === "hidden") throw notFound("That site");
  if (decision === "forbidden") throw new HttpError(403, "forbidden", FORBIDDEN_MESSAGES[action]);
  return site;
}
