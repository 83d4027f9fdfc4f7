import type { RequestHandler } from "express";
import type { SiteLists } from "../services/site-lists";

const READ_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);
/** Posted, but reads: they change no site. */
const READ_POSTS = new Set(["/sync/pull", "/rules/evaluate"]);

/**
 * A member's write through this server holds at their next read here, before the database's notice
 * arrives: when its answer goes out (or the connection closes first), the writer's team's site list is
 * forgotten, along with any read of it still on its way. Other servers learn of the change from the
 * notice, as does this one for a write whose writer hung up before it committed. Runs after the actor
 * is known.
 */
export function writesRefreshSiteLists(siteLists: SiteLists | undefined): RequestHandler {
  return (req, res, next) => {
    const teamId = res.locals.actor?.teamId;
    if (siteLists === undefined || teamId === undefined || READ_METHODS.has(req.method) || READ_POSTS.has(req.path)) return next();
    const forget = () => siteLists.forget(teamId);
    res.once("finish", forget);
    res.once("close", forget);
    next();
  };
}
