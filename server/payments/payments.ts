// Deposits through the payments provider's official Node SDK. In production PAYMENTS_SECRET_KEY and
// PAYMENTS_WEBHOOK_SECRET point it at the real service; here at the local fake the server starts.
import Stripe from "stripe";

export interface Payments {
  client: Stripe;
  webhookSecret: string;
}

export function createPayments(settings: { secretKey: string; webhookSecret: string; apiOrigin?: string }): Payments {
  const api = settings.apiOrigin ? new URL(settings.apiOrigin) : undefined;
  const client = new Stripe(settings.secretKey, {
    maxNetworkRetries: 0,
    telemetry: false,
    ...(api ? { host: api.hostname, port: Number(api.port), protocol: api.protocol.replace(":", "") as "http" | "https" } : {}),
  });
  return { client, webhookSecret: settings.webhookSecret };
}
