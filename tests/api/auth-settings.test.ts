import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { seedDemoOnce } from "../../db/seed";
import { createApp } from "../../server/app";
import { loadLocalEnv } from "../../server/local-env";
import { createMailer } from "../../server/mail/mailer";
import { signInWithPassword } from "../support/auth-client";
import { createTestDb, type TestDb } from "../support/test-db";
import { testContext } from "../support/test-server";
import { invites } from "../../db/schema";
import { eq } from "drizzle-orm";

let testDb: TestDb;
beforeAll(async () => {
  testDb = await createTestDb();
  await seedDemoOnce(testDb.db);
});
afterAll(() => testDb.drop());

describe("cookies behind https", () => {
  it("use the __Secure- prefix and the Secure flag when the public origin is https", async () => {
    const app = createApp(testContext(testDb.db, { publicOrigin: "https://dropwise.example.org" }));
    // The test talks plain http, so carry the Secure cookies by hand as a browser on https would.
    const csrf = await request(app).get("/auth/csrf").expect(200);
    const token = csrf.body.csrfToken as string;
    const csrfCookie = ([] as string[]).concat(csrf.headers["set-cookie"]).map((c) => c.split(";")[0]);
    expect(csrfCookie.join(";")).toContain("__Host-authjs.csrf-token=");
    const res = await request(app)
      .post("/auth/callback/credentials")
      .set("Cookie", csrfCookie.join("; "))
      .set("X-Auth-Return-Redirect", "1")
      .type("form")
      .send({ email: "tomas@lanternfield.test", password: DEMO_PASSWORD, csrfToken: token });
    const cookies = ([] as string[]).concat(res.headers["set-cookie"] ?? []);
    const session = cookies.find((c) => c.startsWith("__Secure-authjs.session-token="));
    expect(session).toBeDefined();
    expect(session).toMatch(/;\s*Secure/i);
    expect(session).toMatch(/HttpOnly/i);
  });
});

describe("the session endpoint", () => {
  it("answers null for a visitor and the role for a member, without a 401", async () => {
    const app = createApp(testContext(testDb.db));
    const anon = await request(app).get("/api/session").expect(200);
    expect(anon.body).toEqual({ session: null });
    const agent = await signInWithPassword(app, "priya@lanternfield.test", DEMO_PASSWORD);
    const me = await agent.get("/api/session").expect(200);
    expect(me.body.session).toMatchObject({ role: "surveyor", user: { email: "priya@lanternfield.test" } });
  });
});

describe("AUTH_SECRET", () => {
  it("is generated once into the local env file, then kept", () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-env-"));
    const file = path.join(dir, ".env.local");
    const saved = process.env.AUTH_SECRET;
    delete process.env.AUTH_SECRET;
    try {
      expect(loadLocalEnv(file).created).toBe(true);
      const first = process.env.AUTH_SECRET;
      expect(first).toMatch(/^[\w-]{40,}$/);
      delete process.env.AUTH_SECRET;
      expect(loadLocalEnv(file).created).toBe(false);
      expect(process.env.AUTH_SECRET).toBe(first);
      expect(fs.statSync(file).mode & 0o077).toBe(0);
    } finally {
      process.env.AUTH_SECRET = saved;
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it("missing makes the server refuse to start with a clear message", async () => {
    const { startServer } = await import("../../server/index");
    const config = testContext(testDb.db, { authSecret: "" }).config;
    await expect(startServer(config)).rejects.toThrow(/AUTH_SECRET is not set/);
  });
});

describe("when e-mail cannot be sent", () => {
  it("an invitation answers 502 with what to do, and nothing is saved", async () => {
    const ctx = testContext(testDb.db);
    const app = createApp({ ...ctx, mailer: createMailer({ sinkPort: 9, from: ctx.config.mailFrom }) });
    const agent = await signInWithPassword(app, "imke@lanternfield.test", DEMO_PASSWORD);
    const res = await agent.post("/api/team/invites").send({ email: "lost@lanternfield.test", role: "designer" }).expect(502);
    expect(res.body.error.code).toBe("mail_failed");
    expect(res.body.error.message).toContain("Nothing was saved");
    expect(await testDb.db.select().from(invites).where(eq(invites.email, "lost@lanternfield.test"))).toEqual([]);
  });
});
