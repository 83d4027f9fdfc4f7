// A one-time sign-in link for a homeowner, made the way Auth.js's e-mail provider makes them (a
// random token, stored hashed with the secret), so an e-mail can open the scope signed in.
import { createHash, randomBytes } from "node:crypto";
import { verificationTokens } from "../../db/schema";
import type { AppContext } from "../context";

export const REPORT_LINK_HOURS = 72;

export async function createSignInLink(ctx: AppContext, email: string, callbackPath: string, hours = REPORT_LINK_HOURS): Promise<string> {
  const token = randomBytes(32).toString("hex");
  const hashed = createHash("sha256").update(`${token}${ctx.config.authSecret}`).digest("hex");
  await ctx.db.insert(verificationTokens).values({ identifier: email, token: hashed, expires: new Date(Date.now() + hours * 3600_000) });
  const origin = ctx.config.publicOrigin;
  const params = new URLSearchParams({ callbackUrl: `${origin}${callbackPath}`, token, email });
  return `${origin}/auth/callback/nodemailer?${params.toString()}`;
}
