import { Router } from "express";
import { actorOf } from "../auth/actor";
import type { AppContext } from "../context";
import { param } from "../errors";
import { removeClosetItem, saveClosetItem, type ClosetKind } from "../services/closet";
import { buildPlanView, loadPlanData } from "../services/plan";
import { siteFor } from "../services/site-access";

/** The closet of a site: PoE switches, injectors, outlets and battery backups, edited at the desk. */
export function closetRouter(ctx: AppContext, router: Router = Router()) {
  const { db } = ctx;
  const collections: [string, ClosetKind, string][] = [
    ["sources", "source", "sourceId"],
    ["batteries", "battery", "batteryId"],
  ];
  for (const [path, kind, idParam] of collections) {
    router.post(`/sites/:siteId/closet/${path}`, async (req, res) => {
      const actor = actorOf(res);
      const site = await siteFor(db, actor, param(req, "siteId"), "site:manage");
      const id = await saveClosetItem(db, actor, site, kind, null, req.body);
      res.status(201).json({ id, plan: buildPlanView(await loadPlanData(db, site)) });
    });
    router.patch(`/sites/:siteId/closet/${path}/:${idParam}`, async (req, res) => {
      const actor = actorOf(res);
      const site = await siteFor(db, actor, param(req, "siteId"), "site:manage");
      const id = await saveClosetItem(db, actor, site, kind, param(req, idParam), req.body);
      res.json({ id, plan: buildPlanView(await loadPlanData(db, site)) });
    });
    router.delete(`/sites/:siteId/closet/${path}/:${idParam}`, async (req, res) => {
      const actor = actorOf(res);
      const site = await siteFor(db, actor, param(req, "siteId"), "site:manage");
      await removeClosetItem(db, actor, site, kind, param(req, idParam));
      res.json({ plan: buildPlanView(await loadPlanData(db, site)) });
    });
  }
  return router;
}
