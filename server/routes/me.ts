import { eq } from "drizzle-orm";
import { Router } from "express";
import { teams, users } from "../../db/schema";
import { teamPermissions } from "../../survey/policy";
import { UpdateMeSchema } from "../../survey/team";
import { actorOf, type SignedInActor } from "../auth/actor";
import type { AppContext } from "../context";
import { parseInput } from "../errors";

async function describe(db: AppContext["db"], actor: SignedInActor) {
  const [team] = await db.select({ id: teams.id, name: teams.name, units: teams.units }).from(teams).where(eq(teams.id, actor.teamId));
  return {
    user: { id: actor.userId, name: actor.name, email: actor.email },
    role: actor.role,
    team,
    permissions: teamPermissions(actor.role),
  };
}

/** Public: who is signed in, or null. The app asks this at start without provoking a 401. */
export function sessionRouter({ db }: AppContext, router: Router = Router()) {
  router.get("/session", async (_req, res) => {
    res.json({ session: res.locals.actor ? await describe(db, res.locals.actor) : null });
  });
  return router;
}

export function meRouter(ctx: AppContext, router: Router = Router()) {
  const { db } = ctx;

  router.get("/me", async (_req, res) => {
    res.json(await describe(db, actorOf(res)));
  });

  router.patch("/me", async (req, res) => {
    const actor = actorOf(res);
    const input = parseInput(UpdateMeSchema, req.body);
    await db.update(users).set({ name: input.name }).where(eq(users.id, actor.userId));
    ctx.members?.forget(actor.userId);
    res.json({ user: { id: actor.userId, name: input.name, email: actor.email } });
  });

  return router;
}
