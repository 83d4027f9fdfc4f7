import type { RequestHandler } from "express";
import type { SiteLists } from "../services/site-lists";

const READS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * A member's write through this server holds at their next read here: the writer's team's site list is
 * forgotten when the write begins (so a list read while it runs is not kept) and again when its answer
 * goes out (so the next read is fresh), before the database's notice arrives. Other servers learn of the
 * change from that notice. Runs after the actor is known.
 */
export function writesRefreshSiteLists(siteLists: SiteLists | undefined): RequestHandler {
  return (req, res, next) => {
    const teamId = res.locals.actor?.teamId;
    if (siteLists === undefined || teamId === undefined || READS.has(req.method)) return next();
    siteLists.forget(teamId);
    res.once("finish", () => siteLists.forget(teamId));
    next();
  };
}
