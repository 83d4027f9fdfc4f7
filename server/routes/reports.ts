import { desc, eq } from "drizzle-orm";
import { Router } from "express";
import * as v from "valibot";
import { depositSettings, reportVersions, signoffs } from "../../db/schema";
import { actorOf, requireTeam } from "../auth/actor";
import type { AppContext } from "../context";
import { notFound, param, parseInput } from "../errors";
import { renderReportPdf } from "../report/report-pdf";
import { addComment, loadReport, publishReport, reportView, signOff } from "../services/reports";
import { siteFor } from "../services/site-access";
import type { ReportContent } from "../../survey/report";

const CommentSchema = v.object({
  itemRef: v.pipe(v.string("Say what the comment is about."), v.nonEmpty("Say what the comment is about."), v.maxLength(80)),
  body: v.pipe(v.string("Write the comment."), v.trim(), v.nonEmpty("Write the comment."), v.maxLength(4000, "Keep the comment under 4,000 characters.")),
  changeRequest: v.optional(v.boolean(), false),
});

const SignOffSchema = v.pipe(
  v.object({
    typedName: v.pipe(v.string("Type your full name."), v.trim(), v.minLength(2, "Type your full name."), v.maxLength(120)),
    confirm: v.optional(v.boolean("Confirm with true or false."), false),
    /** The homeowner asked for changes on this version and signs it as it is all the same. */
    despiteChangeRequests: v.optional(v.boolean("Say with true or false whether you sign without the changes you asked for."), false),
  }),
  v.forward(v.check((i) => i.confirm === true, "Tick the box to confirm you agree to this scope."), ["confirm"]),
);

const DepositSettingsSchema = v.object({
  enabled: v.boolean("Say whether a deposit is asked."),
  amountCents: v.pipe(v.number("The deposit is a number of cents."), v.integer("The deposit is a whole number of cents."), v.minValue(0, "The deposit cannot be negative."), v.maxValue(10_000_000, "The deposit is at most 100,000.00.")),
  currency: v.optional(v.pipe(v.string(), v.regex(/^[a-z]{3}$/, "Use a three-letter currency code such as usd.")), "usd"),
});

export function reportsRouter(ctx: AppContext, router: Router = Router()) {
  const { db } = ctx;

  router.post("/sites/:siteId/reports", async (req, res) => {
    const actor = actorOf(res);
    const site = await siteFor(db, actor, param(req, "siteId"), "site:manage");
    res.status(201).json({ report: await publishReport(ctx, actor, site) });
  });

  router.get("/sites/:siteId/reports", async (req, res) => {
    const site = await siteFor(db, actorOf(res), param(req, "siteId"), "site:read");
    const rows = await db
      .select({ id: reportVersions.id, version: reportVersions.version, contentHash: reportVersions.contentHash, publishedAt: reportVersions.publishedAt, signedAt: signoffs.signedAt })
      .from(reportVersions)
      .leftJoin(signoffs, eq(signoffs.reportId, reportVersions.id))
      .where(eq(reportVersions.siteId, site.id))
      .orderBy(desc(reportVersions.version));
    res.json({ reports: rows });
  });

  async function reportFor(res: Parameters<typeof actorOf>[0], reportId: string, action: "site:read" | "site:sign") {
    const actor = actorOf(res);
    const report = await loadReport(db, reportId);
    if (!report || report.teamId !== actor.teamId) throw notFound("That report");
    const site = await siteFor(db, actor, report.siteId, action);
    return { actor, report, site };
  }

  router.get("/reports/:reportId", async (req, res) => {
    const { actor, report } = await reportFor(res, param(req, "reportId"), "site:read");
    res.json(await reportView(db, actor, report.id));
  });

  router.get("/reports/:reportId/pdf", async (req, res) => {
    const { report } = await reportFor(res, param(req, "reportId"), "site:read");
    const pdf = await renderReportPdf(report.content as ReportContent, report.contentHash);
    res.setHeader("Content-Type", "application/pdf");
    res.setHeader("Content-Disposition", `inline; filename="scope-v${report.version}.pdf"`);
    res.send(pdf);
  });

  router.post("/reports/:reportId/comments", async (req, res) => {
    const { actor, report, site } = await reportFor(res, param(req, "reportId"), "site:read");
    const input = parseInput(CommentSchema, req.body, "comment");
    res.status(201).json({ comment: await addComment(ctx, actor, site, report.id, input) });
  });

  router.post("/reports/:reportId/signoff", async (req, res) => {
    const { actor, report, site } = await reportFor(res, param(req, "reportId"), "site:sign");
    const input = parseInput(SignOffSchema, req.body, "sign-off");
    res.status(201).json(await signOff(ctx, actor, site, report.id, input, { ip: req.ip ?? "", userAgent: req.headers["user-agent"] ?? "" }));
  });

  router.put("/team/deposit", requireTeam("team:manage"), async (req, res) => {
    const actor = actorOf(res);
    const input = parseInput(DepositSettingsSchema, req.body, "deposit settings");
    await db.insert(depositSettings).values({ teamId: actor.teamId, ...input }).onConflictDoUpdate({ target: depositSettings.teamId, set: input });
    res.json({ deposit: input });
  });

  return router;
}
