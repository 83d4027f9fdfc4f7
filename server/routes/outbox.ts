import { desc } from "drizzle-orm";
import { Router } from "express";
import { capturedMail } from "../../db/schema";
import { requireTeam } from "../auth/actor";
import type { AppContext } from "../context";
import { HttpError } from "../errors";

/** Development only: the messages the local SMTP sink captured, for admins. */
export function outboxRouter({ db, config }: AppContext, router: Router = Router()) {
  router.get("/outbox", requireTeam("mail:read-outbox"), async (_req, res) => {
    if (!config.mailSink) throw new HttpError(404, "no_outbox", "There is no local outbox: mail goes to the configured SMTP provider.");
    const mail = await db
      .select({ id: capturedMail.id, to: capturedMail.to, subject: capturedMail.subject, text: capturedMail.text, links: capturedMail.links, receivedAt: capturedMail.receivedAt })
      .from(capturedMail)
      .orderBy(desc(capturedMail.receivedAt))
      .limit(100);
    res.json({ mail });
  });
  return router;
}
