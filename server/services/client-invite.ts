import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { memberships, sites, users } from "../../db/schema";
import type { Actor } from "../../survey/policy";
import type { InviteClientInput } from "../../survey/team";
import type { AppContext } from "../context";
import { HttpError } from "../errors";
import { mailFailed } from "../mail/mailer";
import type { SiteWithAccess } from "./site-access";

/** Makes the homeowner a client of the team (once) and the client of this site, and tells them by e-mail. */
export async function inviteClientToSite(ctx: AppContext, actor: Actor, site: SiteWithAccess, input: InviteClientInput) {
  const { db, config, mailer } = ctx;
  const client = await db.transaction(async (tx) => {
    const [existing] = await tx
      .select({ id: users.id, name: users.name, email: users.email, teamId: memberships.teamId, role: memberships.role })
      .from(users)
      .leftJoin(memberships, eq(memberships.userId, users.id))
      .where(eq(users.email, input.email))
      .limit(1);
    let id: string;
    if (existing) {
      if (existing.teamId && existing.teamId !== actor.teamId) {
        throw new HttpError(409, "email_taken", "That e-mail address already belongs to an account elsewhere. Use another address for this homeowner.", { email: ["Already in use by another account."] });
      }
      if (existing.role && existing.role !== "client") {
        throw new HttpError(409, "email_taken", "That e-mail address belongs to a member of your team, not a homeowner.", { email: ["A team member uses this address."] });
      }
      id = existing.id;
      if (!existing.teamId) await tx.insert(memberships).values({ teamId: actor.teamId, userId: id, role: "client" });
    } else {
      id = randomUUID();
      await tx.insert(users).values({ id, email: input.email, name: input.name });
      await tx.insert(memberships).values({ teamId: actor.teamId, userId: id, role: "client" });
    }
    await tx.update(sites).set({ clientUserId: id, updatedAt: new Date() }).where(eq(sites.id, site.id));
    return { id, email: input.email, name: existing?.name ?? input.name };
  });
  const link = `${config.publicOrigin}/sign-in?email=${encodeURIComponent(client.email)}`;
  const mail = mailer.send({
    to: client.email,
    subject: `Your installer invited you to review ${site.name}`,
    text: [
      `Hello ${client.name ?? ""},`.trim(),
      "",
      `Your installer is planning the network and power for ${site.name}${site.address ? `, ${site.address}` : ""}.`,
      "When the scope is ready you can read it, ask for changes and sign it off in Dropwise.",
      "",
      "Sign in with this e-mail address; we send you a one-time link each time:",
      link,
    ].join("\n"),
  });
  await mail.catch(() => {
    throw mailFailed(`${client.email} is now this site's client.`);
  });
  return client;
}
