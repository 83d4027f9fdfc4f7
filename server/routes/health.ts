import { sql } from "drizzle-orm";
import { Router } from "express";
import type { AppContext } from "../context";

export function healthRouter({ db, config }: AppContext, router: Router = Router()) {
  router.get("/health", async (_req, res) => {
    let dbOk = false;
    try {
      const result = await db.execute(sql`select 1 as ok`);
      dbOk = result.rows[0]?.ok === 1;
    } catch {
      dbOk = false;
    }
    res.status(dbOk ? 200 : 503).json({ ok: dbOk, db: dbOk ? "ok" : "unreachable", version: config.version });
  });
  return router;
}
