// The signed-in request path opens a session cookie once per process (server/auth/session-cache.ts):
// the answer must be exactly Auth.js's own, expired tokens stay refused, and forged ones never pass.
import { encode } from "@auth/core/jwt";
import { afterEach, describe, expect, it, vi } from "vitest";
import { sessionCookiePart, sessionReader } from "../../server/auth/session-cache";

// Count how often Auth.js actually opens a cookie, to see what is answered from memory.
const opened = vi.hoisted(() => ({ count: 0 }));
vi.mock("@auth/core/jwt", async (importOriginal) => {
  const real = await importOriginal<typeof import("@auth/core/jwt")>();
  return { ...real, getToken: (...args: Parameters<typeof real.getToken>) => (opened.count++, real.getToken(...args)) };
});

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

  it("answers a session cookie it has opened from memory, whatever other cookies come along", async () => {
    const read = sessionReader({ secret, secureCookie: false });
    const token = await encode({ token: { sub: "user_priya" }, secret, salt, maxAge: 3600 });
    const before = opened.count;
    await read(header(token));
    await read(`theme=dark; authjs.session-token=${token}`);
    await read(`authjs.session-token=${token}; authjs.callback-url=%2Fwalks`);
    expect(opened.count - before).toBe(1);
  });

  it("keeps two members apart when their other cookies are the same", async () => {
    const read = sessionReader({ secret, secureCookie: false });
    const priya = await encode({ token: { sub: "user_priya" }, secret, salt, maxAge: 3600 });
    const tomas = await encode({ token: { sub: "user_tomas" }, secret, salt, maxAge: 3600 });
    expect(await read(header(priya))).toMatchObject({ sub: "user_priya" });
    expect(await read(header(tomas))).toMatchObject({ sub: "user_tomas" });
    expect(await read(header(priya))).toMatchObject({ sub: "user_priya" });
  });

  it("finds the session cookie and its numbered chunks, and nothing else", () => {
    expect(sessionCookiePart("a=1; authjs.session-token.0=x; authjs.session-token.1=y; b=2", false)).toBe("authjs.session-token.0=x; authjs.session-token.1=y");
    expect(sessionCookiePart("authjs.session-tokenish=x; authjs.csrf-token=z", false)).toBeNull();
    expect(sessionCookiePart("__Secure-authjs.session-token=x", false)).toBeNull();
    expect(sessionCookiePart("__Secure-authjs.session-token=x", true)).toBe("__Secure-authjs.session-token=x");
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
    const before = opened.count;
    expect(await read(header(flipped))).toBeNull();
    expect(await read(header(flipped))).toBeNull();
    expect(opened.count - before).toBe(2); // opened again each time: a refusal is not remembered
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
