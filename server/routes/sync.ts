import { Router } from "express";
import { PullRequestSchema, PushRequestSchema } from "../../sync/protocol";
import { actorOf } from "../auth/actor";
import type { AppContext } from "../context";
import { parseInput } from "../errors";
import { pullChanges } from "../services/sync-pull";
import { pushChanges } from "../services/sync-push";

export function syncRouter({ db }: AppContext, router: Router = Router()) {

  router.post("/sync/push", async (req, res) => {
    const actor = actorOf(res);
    const input = parseInput(PushRequestSchema, req.body, "push");
    res.json(await pushChanges(db, actor, input));
  });

  router.post("/sync/pull", async (req, res) => {
    const actor = actorOf(res);
    const input = parseInput(PullRequestSchema, req.body, "pull");
    res.json(await pullChanges(db, actor, input));
  });

  return router;
}
