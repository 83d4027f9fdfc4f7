// Publishing a site's recommendation report as a frozen version, and what happens around it:
// the client's e-mail, views, comments, change requests, the sign-off and the deposit.
import { createHash, randomUUID } from "node:crypto";
import { and, desc, eq, inArray, max } from "drizzle-orm";
import type { Db } from "../../db/client";
import { depositSettings, deposits, memberships, reportComments, reportVersions, reportViews, signoffs, sites, teams, users } from "../../db/schema";
import type { Actor } from "../../survey/policy";
import { buildReportContent, canonicalJson, diffReports, type ReportContent } from "../../survey/report";
import { parseSite } from "../../survey";
import { planForReport, type ReportPlan } from "./plan";
import { createSignInLink } from "../auth/sign-in-link";
import type { AppContext } from "../context";
import { HttpError, notFound } from "../errors";
import { bumpSiteVersion } from "./sync-push";
import type { SiteWithAccess } from "./site-access";

export const hashContent = (content: ReportContent) => createHash("sha256").update(canonicalJson(content)).digest("hex");

/** The plan as it stands now: the site's items and the designer's decisions through the rules, priced. */
export async function currentPlan(db: Db, site: SiteWithAccess): Promise<ReportPlan> {
  const plan = await planForReport(db, site);
  const parsed = parseSite(plan.site);
  if (!parsed.ok) {
    throw new HttpError(409, "plan_incomplete", `The plan cannot be published yet: ${parsed.errors[0].path ? `${parsed.errors[0].path}: ` : ""}${parsed.errors[0].message}`);
  }
  return plan;
}

export async function publishReport(ctx: AppContext, actor: Actor, site: SiteWithAccess) {
  const { db, mailer } = ctx;
  if (!site.clientUserId) throw new HttpError(409, "no_client", "Invite the homeowner to this site before publishing its scope.");
  const plan = await currentPlan(db, site);
  const [team] = await db.select({ name: teams.name }).from(teams).where(eq(teams.id, site.teamId));
  const published = await db.transaction(async (tx) => {
    // One publisher at a time per site: the version number is the next one, never reused.
    await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, site.id)).for("update");
    const [{ latest }] = await tx.select({ latest: max(reportVersions.version) }).from(reportVersions).where(eq(reportVersions.siteId, site.id));
    const version = (latest ?? 0) + 1;
    const publishedAt = new Date();
    const content = buildReportContent({ ...plan, team: team?.name ?? "", version, publishedAt: publishedAt.toISOString() });
    const contentHash = hashContent(content);
    const id = randomUUID();
    await tx.insert(reportVersions).values({ id, teamId: site.teamId, siteId: site.id, version, content, contentHash, publishedBy: actor.userId, publishedAt });
    await tx.update(sites).set({ status: "out_for_sign_off", updatedAt: new Date() }).where(eq(sites.id, site.id));
    await bumpSiteVersion(tx, site.teamId, site.id);
    return { id, version, contentHash, content };
  });
  const [client] = await db.select({ email: users.email, name: users.name }).from(users).where(eq(users.id, site.clientUserId));
  const link = await createSignInLink(ctx, client.email, `/sites/${site.id}/report`);
  await mailer
    .send({
      to: client.email,
      subject: `Your scope for ${site.name} is ready (version ${published.version})`,
      text: [
        `Hello ${client.name ?? ""},`.trim(),
        "",
        `${team?.name ?? "Your installer"} published version ${published.version} of the plan for ${site.name}.`,
        `It covers ${published.content.summary.devices} devices: what gets PoE, what needs a splitter or an outlet, and what stays up on battery.`,
        "Read it, comment on anything, ask for changes or sign it off:",
        link,
        "",
        "The link signs you in once and works for 3 days; after that, ask for a new one on the sign-in page.",
      ].join("\n"),
    })
    .catch(() => {
      throw new HttpError(502, "mail_failed", `Version ${published.version} is published, but the e-mail to ${client.email} could not be sent. Check the mail settings and send the link again.`);
    });
  return { id: published.id, version: published.version, contentHash: published.contentHash };
}

export async function loadReport(db: Db, reportId: string) {
  const [report] = await db.select().from(reportVersions).where(eq(reportVersions.id, reportId));
  return report;
}

/** Everything the report screen shows, and what changed since the version this user last saw or signed. */
export async function reportView(db: Db, actor: Actor, reportId: string) {
  const report = await loadReport(db, reportId);
  if (!report) throw notFound("That report");
  const content = report.content as ReportContent;
  const [signoff] = await db.select().from(signoffs).where(eq(signoffs.reportId, report.id));
  const [deposit] = signoff ? await db.select().from(deposits).where(eq(deposits.signoffId, signoff.id)) : [];
  const comments = await db
    .select({ id: reportComments.id, itemRef: reportComments.itemRef, body: reportComments.body, changeRequest: reportComments.changeRequest, createdAt: reportComments.createdAt, author: users.name, authorId: reportComments.authorId })
    .from(reportComments)
    .leftJoin(users, eq(users.id, reportComments.authorId))
    .where(eq(reportComments.reportId, report.id))
    .orderBy(reportComments.createdAt);
  const versions = await db
    .select({ id: reportVersions.id, version: reportVersions.version, content: reportVersions.content })
    .from(reportVersions)
    .where(eq(reportVersions.siteId, report.siteId))
    .orderBy(desc(reportVersions.version));
  const latestVersion = versions[0]?.version ?? report.version;
  // The last earlier version this user signed, else the last one they opened.
  const earlierIds = versions.filter((v) => v.version < report.version).map((v) => v.id);
  let baseline: { version: number; content: unknown } | undefined;
  if (earlierIds.length) {
    const signed = await db.select({ reportId: signoffs.reportId }).from(signoffs).where(and(inArray(signoffs.reportId, earlierIds), eq(signoffs.clientUserId, actor.userId)));
    const seen = await db.select({ reportId: reportViews.reportId }).from(reportViews).where(and(inArray(reportViews.reportId, earlierIds), eq(reportViews.userId, actor.userId)));
    const pick = new Set((signed.length ? signed : seen).map((r) => r.reportId));
    baseline = versions.find((v) => pick.has(v.id)) ?? (actor.role === "client" ? undefined : versions.find((v) => v.version === report.version - 1));
  }
  if (actor.role === "client") await db.insert(reportViews).values({ reportId: report.id, userId: actor.userId });
  return {
    report: { id: report.id, siteId: report.siteId, version: report.version, contentHash: report.contentHash, publishedAt: report.publishedAt, latest: report.version === latestVersion },
    content,
    changes: baseline ? { sinceVersion: baseline.version, ...diffReports(baseline.content as ReportContent, content) } : null,
    comments,
    signoff: signoff ? { typedName: signoff.typedName, signedAt: signoff.signedAt, contentHash: signoff.contentHash } : null,
    deposit: deposit ? { status: deposit.status, amountCents: deposit.amountCents, currency: deposit.currency, checkoutUrl: deposit.status === "unpaid" ? deposit.checkoutUrl : null, paidAt: deposit.paidAt } : null,
  };
}

export async function addComment(ctx: AppContext, actor: Actor, site: SiteWithAccess, reportId: string, input: { itemRef: string; body: string; changeRequest: boolean }) {
  const { db, mailer, config } = ctx;
  const report = await loadReport(db, reportId);
  if (!report || report.siteId !== site.id) throw notFound("That report");
  const content = report.content as ReportContent;
  const known = input.itemRef === "general" || content.rooms.some((r) => r.devices.some((d) => d.id === input.itemRef));
  if (!known) throw new HttpError(400, "invalid_input", "Comment on a device of this report, or on the report in general.", { itemRef: ["Not a device of this report."] });
  if (input.changeRequest && actor.role !== "client") throw new HttpError(403, "forbidden", "Only the homeowner asks for changes; the team answers with a new version.");
  const id = randomUUID();
  await db.insert(reportComments).values({ id, reportId, siteId: site.id, authorId: actor.userId, itemRef: input.itemRef, body: input.body, changeRequest: input.changeRequest });
  if (input.changeRequest) {
    await db.transaction(async (tx) => {
      await tx.update(sites).set({ status: "changes_asked", updatedAt: new Date() }).where(eq(sites.id, site.id));
      await bumpSiteVersion(tx, site.teamId, site.id);
    });
    const designers = await db
      .select({ email: users.email })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.teamId, site.teamId), inArray(memberships.role, ["designer", "admin"])));
    const device = content.rooms.flatMap((r) => r.devices).find((d) => d.id === input.itemRef);
    await Promise.all(
      designers.map((d) =>
        mailer
          .send({
            to: d.email,
            subject: `Changes asked on ${site.name}`,
            text: [`The homeowner asked for changes to version ${report.version} of ${site.name}${device ? `, about ${device.name}` : ""}:`, "", input.body, "", `${config.publicOrigin}/sites/${site.id}/report`].join("\n"),
          })
          .catch(() => undefined), // the request is saved and shown on the desk even if a mail fails
      ),
    );
  }
  return { id };
}

export async function signOff(
  ctx: AppContext, actor: Actor, site: SiteWithAccess, reportId: string, input: { typedName: string; despiteChangeRequests?: boolean }, from: { ip: string; userAgent: string },
) {
  const { db } = ctx;
  const report = await loadReport(db, reportId);
  if (!report || report.siteId !== site.id) throw notFound("That report");
  const [{ latest }] = await db.select({ latest: max(reportVersions.version) }).from(reportVersions).where(eq(reportVersions.siteId, site.id));
  if (report.version !== latest) throw new HttpError(409, "not_latest", `Version ${report.version} was replaced by version ${latest}. Read and sign the latest one.`);
  const [me] = await db.select({ name: users.name }).from(users).where(eq(users.id, actor.userId));
  const normal = (s: string) => s.trim().replace(/\s+/g, " ").toLowerCase();
  if (me?.name && normal(me.name) !== normal(input.typedName)) {
    throw new HttpError(400, "invalid_input", `Type your full name as it is on your account (${me.name}) to sign.`, { typedName: [`Type ${me.name}.`] });
  }
  // Changes asked on this version are still open (a new version answers them): signing it as it
  // is must be said in so many words, so a signature never silently drops a request.
  const asked = await db
    .select({ itemRef: reportComments.itemRef })
    .from(reportComments)
    .where(and(eq(reportComments.reportId, report.id), eq(reportComments.changeRequest, true)));
  if (asked.length > 0 && !input.despiteChangeRequests) {
    const n = asked.length;
    throw new HttpError(409, "changes_asked", `You asked for ${n === 1 ? "a change" : `${n} changes`} on version ${report.version}, and your installer has not answered with a new version yet. Wait for it, or confirm that you sign this version as it is, without ${n === 1 ? "that change" : "those changes"}.`, {
      despiteChangeRequests: [`Tick to sign version ${report.version} as it is, without the ${n === 1 ? "change" : "changes"} you asked for.`],
    });
  }
  const id = randomUUID();
  const done = await db.transaction(async (tx) => {
    const inserted = await tx
      .insert(signoffs)
      .values({ id, reportId, siteId: site.id, clientUserId: actor.userId, typedName: input.typedName.trim(), contentHash: report.contentHash, ipAddress: from.ip, userAgent: from.userAgent.slice(0, 400) })
      .onConflictDoNothing()
      .returning({ id: signoffs.id, signedAt: signoffs.signedAt });
    if (!inserted.length) throw new HttpError(409, "already_signed", `Version ${report.version} is already signed. A sign-off cannot be changed.`);
    await tx.update(sites).set({ status: "signed", updatedAt: new Date() }).where(eq(sites.id, site.id));
    await bumpSiteVersion(tx, site.teamId, site.id);
    return inserted[0];
  });
  const deposit = await startDepositIfWanted(ctx, site, id, report.version);
  return { signoff: { id: done.id, signedAt: done.signedAt, contentHash: report.contentHash }, deposit };
}

/** When the team asks for a deposit, a checkout session with the payments provider. */
export async function startDepositIfWanted(ctx: AppContext, site: SiteWithAccess, signoffId: string, version: number) {
  const { db, payments, config } = ctx;
  const [policy] = await db.select().from(depositSettings).where(eq(depositSettings.teamId, site.teamId));
  if (!policy?.enabled || policy.amountCents <= 0) return null;
  if (!payments) throw new HttpError(503, "payments_unavailable", "Signed. The deposit cannot be taken right now: payments are not configured. Your installer will follow up.");
  const [existing] = await db.select().from(deposits).where(eq(deposits.signoffId, signoffId));
  if (existing) return { status: existing.status, checkoutUrl: existing.status === "unpaid" ? existing.checkoutUrl : null, amountCents: existing.amountCents, currency: existing.currency };
  const depositId = randomUUID();
  const session = await payments.client.checkout.sessions.create({
    mode: "payment",
    client_reference_id: depositId,
    metadata: { depositId, siteId: site.id },
    line_items: [{ quantity: 1, price_data: { currency: policy.currency, unit_amount: policy.amountCents, product_data: { name: `Deposit for ${site.name} (version ${version})` } } }],
    success_url: `${config.publicOrigin}/sites/${site.id}/report?paid=1`,
    cancel_url: `${config.publicOrigin}/sites/${site.id}/report`,
  });
  await db.insert(deposits).values({ id: depositId, signoffId, teamId: site.teamId, amountCents: policy.amountCents, currency: policy.currency, checkoutSessionId: session.id, checkoutUrl: session.url ?? "" });
  return { status: "unpaid" as const, checkoutUrl: session.url, amountCents: policy.amountCents, currency: policy.currency };
}
