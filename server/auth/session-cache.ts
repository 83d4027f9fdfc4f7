import { decode, type JWT, type JWTDecodeParams } from "@auth/core/jwt";
import { LRUCache } from "lru-cache";

/**
 * Auth.js's own JWT decode with a bounded memory of tokens already opened.
 *
 * A session cookie is an encrypted, authenticated token: the same cookie string always opens to the
 * same claims, so opening it once per process is enough. Each entry lives until the token's own
 * expiry (never longer than `maxAgeMs`), so an expired session is refused exactly as before. Who the
 * member is and what they may do is still read from the database on every request (see actor.ts),
 * so a changed role or a removal takes effect at once. Nothing here is shared between servers: each
 * instance decodes a cookie the first time it sees it.
 */
export function cachedSessionDecode(options: { maxEntries?: number; maxAgeMs?: number } = {}) {
  const maxAgeMs = options.maxAgeMs ?? 5 * 60_000;
  const opened = new LRUCache<string, { claims: JWT; expiresAt: number }>({ max: options.maxEntries ?? 10_000 });
  return async function decodeSession(params: JWTDecodeParams): Promise<JWT | null> {
    const key = `${params.salt}\u0000${params.token ?? ""}`;
    const hit = opened.get(key);
    if (hit && hit.expiresAt > Date.now()) return hit.claims;
    if (hit) opened.delete(key);
    const claims = await decode(params);
    if (!claims) return null;
    const tokenExpiry = typeof claims.exp === "number" ? claims.exp * 1000 : Date.now();
    const expiresAt = Math.min(tokenExpiry, Date.now() + maxAgeMs);
    if (expiresAt > Date.now()) opened.set(key, { claims, expiresAt });
    return claims;
  };
}
