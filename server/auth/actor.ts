import type { ExpressAuthConfig } from "@auth/express";
import type { RequestHandler } from "express";
import type { Actor, Role, TeamAction } from "../../survey/policy";
import { decideTeam } from "../../survey/policy";
import type { AppContext } from "../context";
import { HttpError } from "../errors";
import { membershipLookup } from "./auth-config";
import { uncachedMembers } from "./member-directory";
import { sessionReader } from "./session-cache";

export interface SignedInActor extends Actor {
  name: string | null;
  email: string;
  role: Role;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      actor?: SignedInActor;
    }
  }
}

/**
 * Reads the Auth.js session (when there is a session cookie) and the member's current team role.
 * The session is Auth.js's encrypted JWT; reading it with Auth.js's own `getToken` checks it the
 * same way its session endpoint does, without running the whole Auth.js request pipeline per call;
 * a Cookie header already opened by this process is not opened again until its token expires.
 */
export function loadActor(ctx: AppContext, authConfig: ExpressAuthConfig): RequestHandler {
  const readSession = sessionReader({ secret: ctx.config.authSecret, secureCookie: Boolean(authConfig.useSecureCookies) });
  const members = ctx.members ?? uncachedMembers(membershipLookup(ctx.db));
  return async (req, res, next) => {
    const cookie = req.headers.cookie;
    if (cookie === undefined) return next();
    const token = await readSession(cookie);
    const userId = typeof token?.uid === "string" ? token.uid : token?.sub;
    if (!userId) return next();
    // A changed role or a removal takes effect at once: the member directory forgets a member as
    // soon as the database says their membership changed (or reads every request fresh).
    const member = await members.find(userId);
    if (member) res.locals.actor = { userId: member.userId, teamId: member.teamId, role: member.role, name: member.name, email: member.email };
    else res.locals.actor = undefined;
    next();
  };
}

export const signedOut = () => new HttpError(401, "signed_out", "Sign in to continue.");

export function actorOf(res: { locals: { actor?: SignedInActor } }): SignedInActor {
  const actor = res.locals.actor;
  if (!actor) throw signedOut();
  return actor;
}

/** Route guard for team-level actions (see survey/policy.ts). */
export function requireTeam(action: TeamAction): RequestHandler {
  return (_req, res, next) => {
    const actor = actorOf(res);
    if (decideTeam(actor, action) !== "allow") {
      throw new HttpError(403, "forbidden", `A ${actor.role} cannot do that. Ask your team's admin if you need it.`);
    }
    next();
  };
}

export const requireSignedIn: RequestHandler = (_req, res, next) => {
  actorOf(res);
  next();
};
