import express, { Router } from "express";
import { and, eq } from "drizzle-orm";
import type Stripe from "stripe";
import { deposits, paymentEvents } from "../../db/schema";
import type { AppContext } from "../context";
import { HttpError } from "../errors";

/**
 * The payments provider tells us a deposit was paid. The body must be the raw bytes for the
 * signature check, so this router is mounted before the JSON parser. A forged signature or an old
 * (replayed) timestamp is refused; the same event delivered twice has one effect.
 */
export function paymentsWebhookRouter({ db, payments }: AppContext) {
  const router = Router();
  router.post("/api/payments/webhook", express.raw({ type: "application/json", limit: "256kb" }), async (req, res) => {
    if (!payments) throw new HttpError(404, "no_payments", "Payments are not configured.");
    const signature = req.headers["stripe-signature"];
    let event: Stripe.Event;
    try {
      event = payments.client.webhooks.constructEvent(req.body as Buffer, typeof signature === "string" ? signature : "", payments.webhookSecret);
    } catch {
      throw new HttpError(400, "bad_signature", "The webhook signature does not verify (wrong secret, altered body or an old timestamp).");
    }
    const effect = await db.transaction(async (tx) => {
      const fresh = await tx.insert(paymentEvents).values({ id: event.id, type: event.type, createdAtProvider: event.created }).onConflictDoNothing().returning({ id: paymentEvents.id });
      if (!fresh.length) return "duplicate";
      if (event.type === "checkout.session.completed") {
        const session = event.data.object as Stripe.Checkout.Session;
        if (session.payment_status === "paid") {
          await tx.update(deposits).set({ status: "paid", paidAt: new Date() }).where(and(eq(deposits.checkoutSessionId, session.id), eq(deposits.status, "unpaid")));
        }
      }
      return "applied";
    });
    res.json({ received: true, duplicate: effect === "duplicate" });
  });
  return router;
}
