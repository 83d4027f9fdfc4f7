// The local stand-in for a hosted payments provider: the few calls Dropwise uses (create and read a
// checkout session), a hosted checkout page, and a signed webhook back, all on loopback. The
// provider's official SDK talks to it exactly as it would to the real service.
import { randomBytes } from "node:crypto";
import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import express from "express";
import Stripe from "stripe";

interface Session {
  id: string;
  object: "checkout.session";
  status: "open" | "complete";
  payment_status: "unpaid" | "paid";
  amount_total: number;
  currency: string;
  success_url: string;
  cancel_url: string | null;
  client_reference_id: string | null;
  metadata: Record<string, string>;
  url: string;
  description: string;
}

export interface FakePaymentProvider {
  origin: string;
  secretKey: string;
  webhookSecret: string;
  close(): Promise<void>;
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

export async function startFakePaymentProvider(options: { webhookUrl: () => string; port?: number }): Promise<FakePaymentProvider> {
  const secretKey = `sk_test_local_${randomBytes(12).toString("hex")}`;
  const webhookSecret = `whsec_local_${randomBytes(16).toString("hex")}`;
  const sessions = new Map<string, Session>();
  const app = express();
  let origin = "";

  app.use("/v1", (req, res, next) => {
    if (req.headers.authorization !== `Bearer ${secretKey}`) {
      res.status(401).json({ error: { type: "invalid_request_error", message: "Invalid API key provided." } });
      return;
    }
    next();
  });
  app.post("/v1/checkout/sessions", express.urlencoded({ extended: true }), (req, res) => {
    const body = req.body as { success_url?: string; cancel_url?: string; client_reference_id?: string; metadata?: Record<string, string>; line_items?: { price_data?: { currency?: string; unit_amount?: string; product_data?: { name?: string } }; quantity?: string }[] };
    const item = body.line_items?.[0];
    const amount = Number(item?.price_data?.unit_amount ?? 0) * Number(item?.quantity ?? 1);
    if (!body.success_url || !item?.price_data?.currency || !(amount > 0)) {
      res.status(400).json({ error: { type: "invalid_request_error", message: "success_url and one line item with a positive amount are required." } });
      return;
    }
    const id = `cs_test_${randomBytes(10).toString("hex")}`;
    const session: Session = {
      id,
      object: "checkout.session",
      status: "open",
      payment_status: "unpaid",
      amount_total: amount,
      currency: item.price_data.currency,
      success_url: body.success_url,
      cancel_url: body.cancel_url ?? null,
      client_reference_id: body.client_reference_id ?? null,
      metadata: body.metadata ?? {},
      url: `${origin}/pay/${id}`,
      description: item.price_data.product_data?.name ?? "Deposit",
    };
    sessions.set(id, session);
    res.json(session);
  });
  app.get("/v1/checkout/sessions/:id", (req, res) => {
    const s = sessions.get(req.params.id);
    if (!s) res.status(404).json({ error: { type: "invalid_request_error", message: "No such checkout session." } });
    else res.json(s);
  });

  app.get("/pay/:id", (req, res) => {
    const s = sessions.get(req.params.id);
    if (!s) {
      res.status(404).send("This payment link is not valid.");
      return;
    }
    res.type("html").send(`<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>Pay deposit</title>
<style>body{font-family:sans-serif;max-width:420px;margin:48px auto;padding:0 16px;color:#17211D}button{font-size:18px;padding:14px 20px;background:#1F3A34;color:#fff;border:0;border-radius:10px;width:100%}</style></head>
<body><p>Local test payments: no real money moves.</p><h1>${escapeHtml(s.description)}</h1><p>Amount: ${(s.amount_total / 100).toFixed(2)} ${escapeHtml(s.currency.toUpperCase())}</p>
${s.payment_status === "paid" ? "<p>Paid. Thank you.</p>" : `<form method="post" action="/pay/${s.id}/complete"><button type="submit">Pay deposit</button></form>`}</body></html>`);
  });

  app.post("/pay/:id/complete", async (req, res) => {
    const s = sessions.get(req.params.id);
    if (!s) {
      res.status(404).send("This payment link is not valid.");
      return;
    }
    s.status = "complete";
    s.payment_status = "paid";
    const event = { id: `evt_${randomBytes(12).toString("hex")}`, object: "event", type: "checkout.session.completed", created: Math.floor(Date.now() / 1000), data: { object: s } };
    const payload = JSON.stringify(event);
    const signature = Stripe.webhooks.generateTestHeaderString({ payload, secret: webhookSecret });
    try {
      await fetch(options.webhookUrl(), { method: "POST", headers: { "Content-Type": "application/json", "Stripe-Signature": signature }, body: payload });
    } catch {
      // The merchant being down does not undo the payment; a real provider would retry.
    }
    res.redirect(303, s.success_url);
  });

  const server: Server = await new Promise((resolve) => {
    const s = app.listen(options.port ?? 0, "127.0.0.1", () => resolve(s));
  });
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    origin,
    secretKey,
    webhookSecret,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
