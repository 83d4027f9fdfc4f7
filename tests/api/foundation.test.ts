import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import express from "express";
import request from "supertest";
import * as v from "valibot";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { testContext } from "../support/test-server";
import { errorHandler, parseInput } from "../../server/errors";
import { createTestDb, type TestDb } from "../support/test-db";
import { runMigrations } from "../../db/migrate";
import { createDb } from "../../db/client";

let testDb: TestDb;
let app: express.Express;

beforeAll(async () => {
  testDb = await createTestDb();
  app = createApp(testContext(testDb.db, { version: "9.9.9-test" }));
});
afterAll(() => testDb.drop());

describe("GET /api/health", () => {
  it("answers ok after a real query, with the version", async () => {
    const res = await request(app).get("/api/health").expect(200);
    expect(res.body).toEqual({ ok: true, db: "ok", version: "9.9.9-test" });
  });

  it("reports the database unreachable with a 503, not a crash", async () => {
    const deadDb = createDb("postgres://postgres@127.0.0.1:1/nowhere", { connectionTimeoutMillis: 500 });
    const deadApp = createApp(testContext(deadDb));
    const res = await request(deadApp).get("/api/health").expect(503);
    expect(res.body).toMatchObject({ ok: false, db: "unreachable" });
    await deadDb.$client.end();
  });

  it("sends the cross-origin isolation headers expo-sqlite needs, and a request id", async () => {
    const res = await request(app).get("/api/health");
    expect(res.headers["cross-origin-opener-policy"]).toBe("same-origin");
    expect(res.headers["cross-origin-embedder-policy"]).toBe("require-corp");
    expect(res.headers["x-request-id"]).toMatch(/^[\w-]{8,}$/);
  });

  it("sends a Content-Security-Policy (the browser tests run the whole app under it) and no framework banner", async () => {
    const res = await request(app).get("/sites/x");
    const csp = res.headers["content-security-policy"];
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self' 'wasm-unsafe-eval'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(res.headers["x-content-type-options"]).toBe("nosniff");
    expect(res.headers["x-powered-by"]).toBeUndefined();
  });

  it("keeps a well-formed incoming request id", async () => {
    const res = await request(app).get("/api/health").set("X-Request-Id", "trace-12345678");
    expect(res.headers["x-request-id"]).toBe("trace-12345678");
  });
});

describe("errors come in one shape", () => {
  it("anything but the public routes asks an anonymous caller to sign in, as JSON", async () => {
    const res = await request(app).get("/api/does-not-exist").expect(401);
    expect(res.body).toEqual({ error: { code: "signed_out", message: "Sign in to continue." } });
  });

  it("malformed JSON is a 400 that says so", async () => {
    const res = await request(app).post("/api/health").set("Content-Type", "application/json").send("{oops").expect(400);
    expect(res.body.error.code).toBe("invalid_json");
  });

  it("validation failures name each bad field; unexpected failures hide their details", async () => {
    const probe = express();
    probe.use(express.json());
    probe.post("/v", (req, res) => {
      res.json(parseInput(v.object({ watts: v.pipe(v.number(), v.minValue(0, "Watts cannot be negative.")), name: v.string("Name is required.") }), req.body));
    });
    probe.get("/boom", () => {
      throw new Error("secret internal detail");
    });
    probe.use(errorHandler);
    const bad = await request(probe).post("/v").send({ watts: -3 }).expect(400);
    expect(bad.body.error.code).toBe("invalid_input");
    expect(bad.body.error.fields).toEqual({ watts: ["Watts cannot be negative."], name: ["This field is required."] });
    const boom = await request(probe).get("/boom").expect(500);
    expect(JSON.stringify(boom.body)).not.toContain("secret internal detail");
    expect(boom.body.error.code).toBe("internal");
  });
});

describe("the web app", () => {
  it("falls back to the app shell for client-side routes, with isolation headers", async () => {
    const res = await request(app).get("/sites/some-site/plan");
    expect([200, 503]).toContain(res.status); // 503 only when no build exists yet
    expect(res.headers["cross-origin-embedder-policy"]).toBe("require-corp");
    if (res.status === 200) expect(res.text).toContain("<div id=\"root\"");
  });
});

describe("caching of answers", () => {
  it("API answers are no-store and carry no ETag; the app shell, its files and the service worker keep validators", async () => {
    const dist = fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-dist-"));
    fs.writeFileSync(path.join(dist, "index.html"), '<!doctype html><div id="root"></div>');
    fs.mkdirSync(path.join(dist, "_expo"));
    fs.writeFileSync(path.join(dist, "_expo", "entry-abc123.js"), "console.log(1);");
    const web = createApp(testContext(testDb.db, { webDist: dist }));

    const api = await request(web).get("/api/health").expect(200);
    expect(api.headers["cache-control"]).toBe("no-store");
    expect(api.headers.etag).toBeUndefined();

    const shell = await request(web).get("/walks").expect(200);
    expect(shell.headers["last-modified"]).toBeTruthy();
    await request(web).get("/walks").set("If-Modified-Since", shell.headers["last-modified"]).expect(304);

    const bundle = await request(web).get("/_expo/entry-abc123.js").expect(200);
    expect(bundle.headers.etag).toBeTruthy();
    await request(web).get("/_expo/entry-abc123.js").set("If-None-Match", bundle.headers.etag).expect(304);

    const sw = await request(web).get("/sw.js").expect(200);
    expect(sw.headers.etag).toMatch(/^"[\w-]{27}"$/);
    await request(web).get("/sw.js").set("If-None-Match", sw.headers.etag).expect(304);
    fs.writeFileSync(path.join(dist, "_expo", "entry-def456.js"), "console.log(2);"); // a new build: a new script
    const next = await request(web).get("/sw.js").set("If-None-Match", sw.headers.etag).expect(200);
    expect(next.headers.etag).not.toBe(sw.headers.etag);
  });
});

describe("migrations", () => {
  it("can run concurrently from several servers without failing (advisory lock)", async () => {
    const fresh = await createTestDb();
    // The template is migrated already; drop the journal so every runner has real work to race on.
    const dbs = [0, 1, 2].map(() => createDb(fresh.url));
    await Promise.all(dbs.map((d) => runMigrations(d)));
    const journal = await fresh.db.$client.query("select count(*)::int as n from drizzle.__drizzle_migrations");
    expect(journal.rows[0].n).toBeGreaterThan(0);
    await Promise.all(dbs.map((d) => d.$client.end()));
    await fresh.drop();
  });
});
