import { randomUUID } from "node:crypto";
import { and, eq, isNull } from "drizzle-orm";
import { Router } from "express";
import { invites, memberships, teams, users } from "../../db/schema";
import { AcceptInviteSchema } from "../../survey/team";
import { hashPassword } from "../auth/passwords";
import type { AppContext } from "../context";
import { HttpError, param, parseInput } from "../errors";
import { hashInviteToken } from "../services/invite-tokens";

/** Public: someone holding an invitation link reads it and accepts it. */
export function invitesRouter({ db }: AppContext, router: Router = Router()) {

  async function usableInvite(token: string) {
    const [invite] = await db
      .select({ id: invites.id, email: invites.email, role: invites.role, expiresAt: invites.expiresAt, acceptedAt: invites.acceptedAt, teamId: invites.teamId, teamName: teams.name })
      .from(invites)
      .innerJoin(teams, eq(teams.id, invites.teamId))
      .where(eq(invites.tokenHash, hashInviteToken(token)))
      .limit(1);
    if (!invite) throw new HttpError(404, "invite_unknown", "This invitation link is not valid. Check that you opened the whole link from the e-mail.");
    if (invite.acceptedAt) throw new HttpError(410, "invite_used", "This invitation was already used. Sign in with the e-mail and password chosen then, or ask your admin for a new invitation.");
    if (invite.expiresAt.getTime() < Date.now()) throw new HttpError(410, "invite_expired", "This invitation has expired. Ask your admin to send a new one.");
    return invite;
  }

  router.get("/invites/:token", async (req, res) => {
    const invite = await usableInvite(param(req, "token"));
    res.json({ invite: { email: invite.email, role: invite.role, teamName: invite.teamName, expiresAt: invite.expiresAt } });
  });

  router.post("/invites/:token/accept", async (req, res) => {
    const input = parseInput(AcceptInviteSchema, req.body);
    const invite = await usableInvite(param(req, "token"));
    const passwordHash = await hashPassword(input.password);
    const userId = await db.transaction(async (tx) => {
      // Claim the invitation first: of two concurrent accepts only one updates the row.
      const claimed = await tx
        .update(invites)
        .set({ acceptedAt: new Date() })
        .where(and(eq(invites.id, invite.id), isNull(invites.acceptedAt)))
        .returning({ id: invites.id });
      if (claimed.length === 0) throw new HttpError(410, "invite_used", "This invitation was already used.");
      const [existing] = await tx.select({ id: users.id }).from(users).where(eq(users.email, invite.email)).limit(1);
      if (existing) throw new HttpError(409, "already_member", "Someone with that e-mail address already has a Dropwise account.");
      const id = randomUUID();
      await tx.insert(users).values({ id, email: invite.email, name: input.name, passwordHash, emailVerified: new Date() });
      await tx.insert(memberships).values({ teamId: invite.teamId, userId: id, role: invite.role });
      await tx.update(invites).set({ acceptedBy: id }).where(eq(invites.id, invite.id));
      return id;
    });
    res.status(201).json({ user: { id: userId, email: invite.email, name: input.name }, role: invite.role });
  });

  return router;
}
