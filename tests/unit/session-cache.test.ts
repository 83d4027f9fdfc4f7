// The signed-in request path opens a session cookie once per process (server/auth/session-cache.ts):
// the answer must be exactly Auth.js's own, expired tokens stay refused, and forged ones never pass.
import { encode } from "@auth/core/jwt";
import { afterEach, describe, expect, it, vi } from "vitest";
import { sessionReader } from "../../server/auth/session-cache";

const secret = "a-test-secret-that-is-long-enough-for-hkdf-000";
const salt = "authjs.session-token";
const header = (token: string) => `authjs.csrf-token=abc%7Cdef; authjs.session-token=${token}; other=1`;

afterEach(() => vi.useRealTimers());

describe("session reader", () => {
  it("opens a session cookie to the same claims Auth.js encoded, the first time and the next", async () => {
    const read = sessionReader({ secret, secureCookie: false });
    const token = await encode({ token: { sub: "user_priya", uid: "user_priya" }, secret, salt, maxAge: 3600 });
    const first = await read(header(token));
    const second = await read(header(token));
    expect(first).toMatchObject({ sub: "user_priya", uid: "user_priya" });
    expect(second).toEqual(first);
  });

  it("reads only the secure cookie behind https", async () => {
    const secureSalt = "__Secure-authjs.session-token";
    const token = await encode({ token: { sub: "user_priya" }, secret, salt: secureSalt, maxAge: 3600 });
    expect(await sessionReader({ secret, secureCookie: true })(`__Secure-authjs.session-token=${token}`)).toMatchObject({ sub: "user_priya" });
    expect(await sessionReader({ secret, secureCookie: false })(`__Secure-authjs.session-token=${token}`)).toBeNull();
  });

  it("refuses a token sealed with another secret, or altered by one character, and does not remember the refusal", async () => {
    const read = sessionReader({ secret, secureCookie: false });
    const token = await encode({ token: { sub: "user_priya" }, secret, salt, maxAge: 3600 });
    expect(await sessionReader({ secret: `${secret}-other`, secureCookie: false })(header(token))).toBeNull();
    const flipped = token.slice(0, -3) + (token.at(-3) === "A" ? "B" : "A") + token.slice(-2);
    expect(await read(header(flipped))).toBeNull();
    expect(await read(header(token))).toMatchObject({ sub: "user_priya" });
  });

  it("stops answering from memory once the token itself has expired", async () => {
    vi.useFakeTimers({ toFake: ["Date"] });
    vi.setSystemTime(new Date("2026-12-01T10:00:00Z"));
    const read = sessionReader({ secret, secureCookie: false });
    const token = await encode({ token: { sub: "user_priya" }, secret, salt, maxAge: 60 });
    expect(await read(header(token))).toMatchObject({ sub: "user_priya" });
    vi.setSystemTime(new Date("2026-12-01T10:02:00Z")); // two minutes on: past exp and Auth.js's 15 s tolerance
    expect(await read(header(token))).toBeNull();
  });
});
