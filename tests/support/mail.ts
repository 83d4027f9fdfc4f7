import { and, desc, eq, gt } from "drizzle-orm";
import type { Db } from "../../db/client";
import { capturedMail } from "../../db/schema";

/** Waits for the local SMTP sink to capture a message to `to` (received after `since`). */
export async function waitForMail(db: Db, to: string, since = new Date(0), timeoutMs = 5000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const [mail] = await db
      .select()
      .from(capturedMail)
      .where(and(eq(capturedMail.to, to), gt(capturedMail.receivedAt, since)))
      .orderBy(desc(capturedMail.receivedAt))
      .limit(1);
    if (mail) return mail;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no mail to ${to} within ${timeoutMs} ms`);
}

export async function mailCount(db: Db, to: string) {
  return (await db.select({ id: capturedMail.id }).from(capturedMail).where(eq(capturedMail.to, to))).length;
}
