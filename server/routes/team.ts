import { randomUUID } from "node:crypto";
import { and, asc, eq, gt, isNull, sql } from "drizzle-orm";
import { Router } from "express";
import { invites, memberships, teams, users } from "../../db/schema";
import { ChangeRoleSchema, InviteMemberSchema } from "../../survey/team";
import { actorOf, requireTeam } from "../auth/actor";
import type { AppContext } from "../context";
import { HttpError, notFound, param, parseInput } from "../errors";
import { mailFailed } from "../mail/mailer";
import { INVITE_DAYS, newInviteToken } from "../services/invite-tokens";

export function teamRouter(ctx: AppContext, router: Router = Router()) {
  const { db, config, mailer } = ctx;

  router.get("/team/members", requireTeam("team:read-members"), async (_req, res) => {
    const actor = actorOf(res);
    const members = await db
      .select({ id: users.id, name: users.name, email: users.email, role: memberships.role })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(eq(memberships.teamId, actor.teamId))
      .orderBy(asc(memberships.role), asc(users.name));
    const pending =
      actor.role === "admin"
        ? await db
            .select({ id: invites.id, email: invites.email, role: invites.role, expiresAt: invites.expiresAt })
            .from(invites)
            .where(and(eq(invites.teamId, actor.teamId), isNull(invites.acceptedAt), gt(invites.expiresAt, new Date())))
            .orderBy(asc(invites.createdAt))
        : [];
    res.json({ members, invites: pending });
  });

  router.post("/team/invites", requireTeam("team:manage"), async (req, res) => {
    const actor = actorOf(res);
    const input = parseInput(InviteMemberSchema, req.body);
    const [taken] = await db.select({ id: users.id }).from(users).innerJoin(memberships, eq(memberships.userId, users.id)).where(eq(users.email, input.email)).limit(1);
    if (taken) throw new HttpError(409, "already_member", "Someone with that e-mail address already has a Dropwise account.", { email: ["Already has an account."] });
    const { token, tokenHash } = newInviteToken();
    const expiresAt = new Date(Date.now() + INVITE_DAYS * 24 * 3600 * 1000);
    const [invite] = await db
      .insert(invites)
      .values({ id: randomUUID(), teamId: actor.teamId, email: input.email, role: input.role, tokenHash, invitedBy: actor.userId, expiresAt })
      .returning({ id: invites.id, email: invites.email, role: invites.role, expiresAt: invites.expiresAt });
    const [team] = await db.select({ name: teams.name }).from(teams).where(eq(teams.id, actor.teamId));
    const mail = mailer.send({
      to: input.email,
      subject: `Join ${team?.name ?? "your team"} on Dropwise`,
      text: [
        "Hello,",
        "",
        `${actor.name ?? actor.email} invited you to ${team?.name ?? "their team"} on Dropwise as a ${input.role}.`,
        "Open this link to choose your name and password:",
        `${config.publicOrigin}/invite/${token}`,
        "",
        `The invitation works once and expires in ${INVITE_DAYS} days.`,
      ].join("\n"),
    });
    try {
      await mail;
    } catch {
      await db.delete(invites).where(eq(invites.id, invite.id));
      throw mailFailed("Nothing was saved.");
    }
    res.status(201).json({ invite });
  });

  router.delete("/team/invites/:inviteId", requireTeam("team:manage"), async (req, res) => {
    const actor = actorOf(res);
    const removed = await db
      .delete(invites)
      .where(and(eq(invites.id, param(req, "inviteId")), eq(invites.teamId, actor.teamId), isNull(invites.acceptedAt)))
      .returning({ id: invites.id });
    if (!removed.length) throw notFound("That invitation");
    res.status(204).end();
  });

  /** Changing roles or removing members must leave the team at least one admin. */
  async function assertNotLastAdmin(teamId: string, userId: string) {
    const [row] = await db
      .select({ admins: sql<number>`count(*) filter (where ${memberships.role} = 'admin')::int`, isAdmin: sql<boolean>`bool_or(${memberships.userId} = ${userId} and ${memberships.role} = 'admin')` })
      .from(memberships)
      .where(eq(memberships.teamId, teamId));
    if (row?.isAdmin && row.admins <= 1) throw new HttpError(409, "last_admin", "A team needs at least one admin. Make someone else admin first.");
  }

  async function memberOfTeam(teamId: string, userId: string) {
    const [m] = await db.select().from(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
    if (!m || m.role === "client") throw notFound("That member");
    return m;
  }

  router.patch("/team/members/:userId", requireTeam("team:manage"), async (req, res) => {
    const actor = actorOf(res);
    const { role } = parseInput(ChangeRoleSchema, req.body);
    await memberOfTeam(actor.teamId, param(req, "userId"));
    if (role !== "admin") await assertNotLastAdmin(actor.teamId, param(req, "userId"));
    await db.update(memberships).set({ role }).where(and(eq(memberships.teamId, actor.teamId), eq(memberships.userId, param(req, "userId"))));
    ctx.members?.forget(param(req, "userId"));
    res.json({ member: { id: param(req, "userId"), role } });
  });

  router.delete("/team/members/:userId", requireTeam("team:manage"), async (req, res) => {
    const actor = actorOf(res);
    await memberOfTeam(actor.teamId, param(req, "userId"));
    await assertNotLastAdmin(actor.teamId, param(req, "userId"));
    // Their captured work stays with the sites; only the membership goes.
    await db.delete(memberships).where(and(eq(memberships.teamId, actor.teamId), eq(memberships.userId, param(req, "userId"))));
    ctx.members?.forget(param(req, "userId"));
    res.status(204).end();
  });

  return router;
}
