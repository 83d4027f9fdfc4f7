// The production server (npm run build:server → build/server.mjs) runs on plain node, without the
// TypeScript loader: it migrates an empty database, answers, signs a member in and serves the API.
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { findFreePort } from "../../db/cluster";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { seedDemoOnce } from "../../db/seed";
import { startLocalObjectStore, type LocalObjectStore } from "../../server/storage/local-object-store";
import { signInWithPassword } from "../support/auth-client";
import { buildServer, builtServerEntry, spawnServer, type ServerProcess } from "../support/server-process";
import { createTestDb, type TestDb } from "../support/test-db";

let testDb: TestDb;
let objects: LocalObjectStore;
let server: ServerProcess;

beforeAll(async () => {
  fs.rmSync(builtServerEntry, { force: true });
  buildServer();
  testDb = await createTestDb({ migrated: false });
  objects = await startLocalObjectStore(fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-build-objects-")));
  server = await spawnServer({
    entry: "build",
    databaseUrl: testDb.url,
    port: await findFreePort(48_500, 500),
    authSecret: randomBytes(32).toString("base64url"),
    extra: { NODE_ENV: "production", S3_ENDPOINT: objects.endpoint, S3_ACCESS_KEY_ID: objects.credentials.accessKeyId, S3_SECRET_ACCESS_KEY: objects.credentials.secretAccessKey },
  });
}, 60_000);

afterAll(async () => {
  server?.child.kill("SIGTERM");
  await server?.exited;
  await objects?.close();
  await testDb?.drop();
});

describe("the production build", () => {
  it("is one file that loads no TypeScript loader", () => {
    const source = fs.readFileSync(builtServerEntry, "utf8");
    expect(source).not.toMatch(/from "tsx/);
    expect(source.length).toBeGreaterThan(10_000);
  });

  it("migrated the empty database and answers its health check", async () => {
    const res = await request(server.url).get("/api/health").expect(200);
    expect(res.body).toMatchObject({ ok: true, db: "ok" });
  });

  it("signs a member in and serves their sites", async () => {
    await seedDemoOnce(testDb.db);
    const tomas = await signInWithPassword(server.url, "tomas@lanternfield.test", DEMO_PASSWORD);
    const res = await tomas.get("/api/sites").expect(200);
    expect(res.body.sites.map((s: { name: string }) => s.name)).toContain("The Okonkwo-Lindqvist house");
  });
});
