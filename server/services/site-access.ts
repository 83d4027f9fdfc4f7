import { asc, eq, getTableColumns, sql } from "drizzle-orm";
import { siteAssignments, sites } from "../../db/schema";
import { decideSite, type Actor, type SiteAccess, type SiteAction } from "../../survey/policy";
import type { Db } from "../../db/client";
import { HttpError, notFound } from "../errors";

export type SiteRow = typeof sites.$inferSelect;
export type SiteWithAccess = SiteRow & SiteAccess;

export async function loadSite(db: Db, siteId: string): Promise<SiteWithAccess | undefined> {
  const [site] = await selectSitesWithSurveyors(db).where(eq(sites.id, siteId));
  return site;
}

type Reader = Pick<Db, "select">;

/** Sites with their assigned surveyors' ids, in one statement (add a where clause). */
export function selectSitesWithSurveyors(db: Reader) {
  return db
    .select({
      ...getTableColumns(sites),
      surveyorIds: sql<string[]>`coalesce(array_agg(${siteAssignments.userId} order by ${siteAssignments.userId}) filter (where ${siteAssignments.userId} is not null), '{}')`,
    })
    .from(sites)
    .leftJoin(siteAssignments, eq(siteAssignments.siteId, sites.id))
    .groupBy(sites.id)
    .$dynamic();
}

/**
 * Every site of a team with its assigned surveyors, as a prepared statement: the site list is the
 * first thing every screen asks for, so it is planned once per connection and built once here.
 */
export function teamSitesQuery(db: Db) {
  const query = selectSitesWithSurveyors(db).where(eq(sites.teamId, sql.placeholder("teamId"))).orderBy(asc(sites.name)).prepare("sites_of_team");
  return (teamId: string): Promise<SiteWithAccess[]> => query.execute({ teamId });
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
