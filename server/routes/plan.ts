import { Router } from "express";
import { stringify } from "csv-stringify/sync";
import * as v from "valibot";
import { eq, sql } from "drizzle-orm";
import { sitePlans } from "../../db/schema";
import { ClearDecisionSchema, DecisionInputSchema } from "../../survey/decisions";
import { materialsCsvRows, PricesInputSchema } from "../../survey/materials";
import { actorOf } from "../auth/actor";
import type { AppContext } from "../context";
import { param, parseInput } from "../errors";
import { assignPortsAutomatically, clearDecision, decideDevice } from "../services/plan-decisions";
import { buildPlanView, loadPlanData, lockTeam } from "../services/plan";
import { siteFor } from "../services/site-access";

const AssignPortsSchema = v.object({
  reason: v.optional(v.pipe(v.string("The reason must be text."), v.trim(), v.maxLength(1000, "Keep the reason under 1,000 characters."))),
});

function fileName(name: string) {
  const base = name.normalize("NFKD").replace(/[^\w\s-]/g, "").trim().replace(/\s+/g, "-").toLowerCase().slice(0, 60) || "site";
  return `${base}-materials.csv`;
}

/** A site's plan for the designer's desk: the evaluation, decisions, port assignment, prices and materials. */
export function planRouter(ctx: AppContext, router: Router = Router()) {
  const { db } = ctx;
  const planOf = async (siteId: string, actor: ReturnType<typeof actorOf>) => {
    const site = await siteFor(db, actor, siteId, "site:plan");
    return buildPlanView(await loadPlanData(db, site));
  };

  router.get("/sites/:siteId/plan", async (req, res) => {
    res.json({ plan: await planOf(param(req, "siteId"), actorOf(res)) });
  });

  router.put("/sites/:siteId/devices/:deviceId/decision", async (req, res) => {
    const actor = actorOf(res);
    const site = await siteFor(db, actor, param(req, "siteId"), "site:manage");
    const input = parseInput(DecisionInputSchema, req.body ?? {}, "decision");
    await decideDevice(db, actor, site, param(req, "deviceId"), input);
    res.json({ plan: await planOf(site.id, actor) });
  });

  router.delete("/sites/:siteId/devices/:deviceId/decision", async (req, res) => {
    const actor = actorOf(res);
    const site = await siteFor(db, actor, param(req, "siteId"), "site:manage");
    const { reason } = parseInput(ClearDecisionSchema, req.body ?? {}, "request");
    await clearDecision(db, actor, site, param(req, "deviceId"), reason);
    res.json({ plan: await planOf(site.id, actor) });
  });

  router.post("/sites/:siteId/assign-ports", async (req, res) => {
    const actor = actorOf(res);
    const site = await siteFor(db, actor, param(req, "siteId"), "site:manage");
    const { reason } = parseInput(AssignPortsSchema, req.body ?? {}, "request");
    const result = await assignPortsAutomatically(db, actor, site, reason);
    res.json({ ...result, plan: await planOf(site.id, actor) });
  });

  router.put("/sites/:siteId/prices", async (req, res) => {
    const actor = actorOf(res);
    const site = await siteFor(db, actor, param(req, "siteId"), "site:manage");
    const input = parseInput(PricesInputSchema, req.body, "prices");
    await db.transaction(async (tx) => {
      await lockTeam(tx, actor.teamId);
      const [row] = await tx.select().from(sitePlans).where(eq(sitePlans.siteId, site.id)).for("update");
      const prices = { ...(row?.prices ?? {}) };
      for (const [key, price] of Object.entries(input)) {
        if (price === null) delete prices[key];
        else prices[key] = Math.round(price * 100);
      }
      if (row) await tx.update(sitePlans).set({ prices, updatedBy: actor.userId, updatedAt: sql`now()` }).where(eq(sitePlans.siteId, site.id));
      else await tx.insert(sitePlans).values({ siteId: site.id, teamId: actor.teamId, prices, updatedBy: actor.userId });
    });
    const plan = await planOf(site.id, actor);
    res.json({ prices: plan.prices, materials: plan.materials, plan });
  });

  router.get("/sites/:siteId/materials.csv", async (req, res) => {
    const plan = await planOf(param(req, "siteId"), actorOf(res));
    const csv = stringify(materialsCsvRows(plan.materials, plan.site), { bom: true, escape_formulas: true, record_delimiter: "windows" });
    res.setHeader("Content-Type", "text/csv; charset=utf-8");
    res.setHeader("Content-Disposition", `attachment; filename="${fileName(plan.site.name)}"`);
    res.setHeader("Cache-Control", "no-store");
    res.send(csv);
  });

  return router;
}
