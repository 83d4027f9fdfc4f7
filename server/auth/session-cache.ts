import { getToken, type JWT } from "@auth/core/jwt";
import { LRUCache } from "lru-cache";

export interface SessionReaderOptions {
  secret: string;
  /** Sessions travel in `__Secure-` cookies (behind https). */
  secureCookie: boolean;
  maxEntries?: number;
  /** Longest an opened session is remembered, even if the token itself lives longer. */
  maxAgeMs?: number;
  /** Memory the remembered Cookie headers may take, counted in characters. */
  maxChars?: number;
}

/**
 * Reads the Auth.js session from a request's Cookie header with Auth.js's own `getToken`, and
 * remembers what a header opened to.
 *
 * A session cookie is an encrypted, authenticated token: the same Cookie header always opens to the
 * same claims, so opening it once per process is enough. Each entry lives until the token's own
 * expiry (never longer than `maxAgeMs`), so an expired session is refused exactly as before; headers
 * that do not open are never remembered. The session only says which user this is; their team and
 * role come from the member directory on every request (member-directory.ts), which forgets a member
 * as soon as their membership changes. Nothing here is shared between servers: each instance opens a
 * cookie the first time it sees it.
 */
export function sessionReader(options: SessionReaderOptions) {
  const { secret, secureCookie } = options;
  const maxAgeMs = options.maxAgeMs ?? 5 * 60_000;
  const opened = new LRUCache<string, { claims: JWT; expiresAt: number }>({
    max: options.maxEntries ?? 10_000,
    maxSize: options.maxChars ?? 16_000_000,
    sizeCalculation: (_value, key) => key.length + 500,
  });
  return async function readSession(cookieHeader: string): Promise<JWT | null> {
    const hit = opened.get(cookieHeader);
    if (hit && hit.expiresAt > Date.now()) return hit.claims;
    if (hit) opened.delete(cookieHeader);
    const claims = await getToken({ req: { headers: { cookie: cookieHeader } }, secret, secureCookie }).catch(() => null);
    if (!claims) return null;
    const tokenExpiry = typeof claims.exp === "number" ? claims.exp * 1000 : Date.now();
    const expiresAt = Math.min(tokenExpiry, Date.now() + maxAgeMs);
    if (expiresAt > Date.now()) opened.set(cookieHeader, { claims, expiresAt });
    return claims;
  };
}
