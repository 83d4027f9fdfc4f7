// The signed-in request path opens a session cookie once per process (server/auth/session-cache.ts):
// the answer must be exactly Auth.js's own, expired tokens stay refused, and forged ones never pass.
import { encode } from "@auth/core/jwt";
import { afterEach, describe, expect, it, vi } from "vitest";
import { cachedSessionDecode } from "../../server/auth/session-cache";

const secret = "a-test-secret-that-is-long-enough-for-hkdf-000";
const salt = "authjs.session-token";

afterEach(() => vi.useRealTimers());

describe("cached session decode", () => {
  it("opens a token to the same claims Auth.js encoded, the first time and the next", async () => {
    const decode = cachedSessionDecode();
    const token = await encode({ token: { sub: "user_priya", uid: "user_priya" }, secret, salt, maxAge: 3600 });
    const first = await decode({ token, secret, salt });
    const second = await decode({ token, secret, salt });
    expect(first).toMatchObject({ sub: "user_priya", uid: "user_priya" });
    expect(second).toEqual(first);
  });

  it("refuses a token sealed with another secret, or altered by one character", async () => {
    const decode = cachedSessionDecode();
    const token = await encode({ token: { sub: "user_priya" }, secret, salt, maxAge: 3600 });
    await expect(decode({ token, secret: `${secret}-other`, salt })).rejects.toThrow();
    const flipped = token.slice(0, -3) + (token.at(-3) === "A" ? "B" : "A") + token.slice(-2);
    await expect(decode({ token: flipped, secret, salt })).rejects.toThrow();
  });

  it("stops answering from memory once the token itself has expired", async () => {
    vi.useFakeTimers({ toFake: ["Date"] });
    vi.setSystemTime(new Date("2026-12-01T10:00:00Z"));
    const decode = cachedSessionDecode();
    const token = await encode({ token: { sub: "user_priya" }, secret, salt, maxAge: 60 });
    expect(await decode({ token, secret, salt })).toMatchObject({ sub: "user_priya" });
    vi.setSystemTime(new Date("2026-12-01T10:02:00Z")); // two minutes on: past exp and Auth.js's 15 s tolerance
    await expect(decode({ token, secret, salt })).rejects.toThrow(/exp/);
  });
});
