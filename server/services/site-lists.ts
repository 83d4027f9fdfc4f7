import type { Db } from "../../db/client";
import { listenForChanges, NoticeCache, uncached, type NoticeCacheStart, type NoticeDirectory } from "./notice-cache";
import { teamSitesQuery, type SiteWithAccess } from "./site-access";

/**
 * Every site of a team with its assigned surveyors, by team id: the list every screen asks for first.
 * The lists are shared between requests, so they are frozen (all but their dates).
 */
export type SiteLists = NoticeDirectory<readonly Readonly<SiteWithAccess>[]>;

export const SITE_LIST_CHANNEL = "site_list_changed";

/** Freeze a row and the arrays and plain objects inside it (its settings, its surveyors). */
function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === "object" && !Object.isFrozen(value) && (Array.isArray(value) || Object.getPrototypeOf(value) === Object.prototype)) {
    for (const v of Object.values(value)) deepFreeze(v);
    Object.freeze(value);
  }
  return value;
}

function lookupOf(db: Db) {
  const sitesOfTeam = teamSitesQuery(db);
  return async (teamId: string) => deepFreeze(await sitesOfTeam(teamId));
}

/** Every request reads the database: for apps built without a running server (tests, scripts). */
export function uncachedSiteLists(db: Db): SiteLists {
  return uncached(lookupOf(db));
}

/** The site lists of a running server, remembered between requests (see `NoticeCache`). */
export class SiteListCache extends NoticeCache<readonly Readonly<SiteWithAccess>[]> {
  constructor(db: Db, options: { maxAgeMs?: number; maxEntries?: number } = {}) {
    super(lookupOf(db), { maxAgeMs: options.maxAgeMs ?? 60_000, maxEntries: options.maxEntries ?? 1_000 });
  }
}

export interface SiteListOptions extends NoticeCacheStart {
  db: Db;
}

/**
 * Site lists fed by a dedicated connection that LISTENs on `site_list_changed` (see `listenForChanges`).
 * Any change to a site or to who is assigned to it sends a notice naming the site's team when it
 * commits (migration 0008); a truncate names every team ("*").
 */
export function startSiteLists(options: SiteListOptions): Promise<SiteLists> {
  return listenForChanges(new SiteListCache(options.db, options), {
    ...options,
    channel: SITE_LIST_CHANNEL,
    applicationName: "dropwise-site-list-changes",
    what: "site list",
  });
}
