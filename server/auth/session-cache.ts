import { getToken, type JWT } from "@auth/core/jwt";
import { LRUCache } from "lru-cache";

export interface SessionReaderOptions {
  secret: string;
  /** Sessions travel in `__Secure-` cookies (behind https). */
  secureCookie: boolean;
  maxEntries?: number;
  /** Longest an opened session is remembered, even if the token itself lives longer. */
  maxAgeMs?: number;
  /** Memory the remembered session cookies may take, counted in characters. */
  maxChars?: number;
}

/**
 * Reads the Auth.js session from a request's Cookie header with Auth.js's own `getToken`, and
 * remembers what each session cookie opened to (keyed by the session cookie alone, so other cookies
 * that come and go make no new entries).
 *
 * A session cookie is an encrypted, authenticated token: the same cookie always opens to the
 * same claims, so opening it once per process is enough. Each entry lives until the token's own
 * expiry (never longer than `maxAgeMs`), so an expired session is refused exactly as before; headers
 * that do not open are never remembered. The session only says which user this is; their team and
 * role come from the member directory on every request (member-directory.ts), which forgets a member
 * as soon as their membership changes. Nothing here is shared between servers: each instance opens a
 * cookie the first time it sees it.
 */
/**
 * The session cookie's part of a Cookie header (its name and value, and any numbered chunks), or
 * null when there is none: the key a session is remembered under, whatever other cookies come along.
 */
export function sessionCookiePart(cookieHeader: string, secureCookie: boolean): string | null {
  const name = secureCookie ? "__Secure-authjs.session-token" : "authjs.session-token";
  let part: string | null = null;
  for (const pair of cookieHeader.split(";")) {
    const cookie = pair.trim();
    if (cookie.startsWith(name) && (cookie[name.length] === "=" || cookie[name.length] === ".")) part = part === null ? cookie : `${part}; ${cookie}`;
  }
  return part;
}

export function sessionReader(options: SessionReaderOptions) {
  const { secret, secureCookie } = options;
  const maxAgeMs = options.maxAgeMs ?? 5 * 60_000;
  const opened = new LRUCache<string, { claims: JWT; expiresAt: number }>({
    max: options.maxEntries ?? 10_000,
    maxSize: options.maxChars ?? 16_000_000,
    sizeCalculation: (_value, key) => key.length + 500,
  });
  return async function readSession(cookieHeader: string): Promise<JWT | null> {
    const key = sessionCookiePart(cookieHeader, secureCookie);
    if (key === null) return null;
    const hit = opened.get(key);
    if (hit && hit.expiresAt > Date.now()) return hit.claims;
    if (hit) opened.delete(key);
    const claims = await getToken({ req: { headers: { cookie: key } }, secret, secureCookie }).catch(() => null);
    if (!claims) return null;
    const tokenExpiry = typeof claims.exp === "number" ? claims.exp * 1000 : Date.now();
    const expiresAt = Math.min(tokenExpiry, Date.now() + maxAgeMs);
    if (expiresAt > Date.now()) opened.set(key, { claims, expiresAt });
    return claims;
  };
}
