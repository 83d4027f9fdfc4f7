import { Router } from "express";
import { evaluateSite, parseSite } from "../../survey";
import { requireTeam } from "../auth/actor";
import type { AppContext } from "../context";
import { HttpError } from "../errors";

/** The same rules the phone runs, for any site in the documented JSON (see DEVELOPERS.md). */
export function rulesRouter(_ctx: AppContext, router: Router = Router()) {
  router.post("/rules/evaluate", requireTeam("rules:evaluate"), (req, res) => {
    const parsed = parseSite(req.body);
    if (!parsed.ok) {
      const fields: Record<string, string[]> = {};
      for (const e of parsed.errors) (fields[e.path || "_"] ??= []).push(e.message);
      const first = parsed.errors[0];
      throw new HttpError(400, "invalid_input", `The site is not valid. ${first.path ? `${first.path}: ` : ""}${first.message}`, fields);
    }
    res.json(evaluateSite(parsed.value));
  });
  return router;
}
