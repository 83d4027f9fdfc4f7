// The server keeps no state of its own: two instances on two ports over one Postgres and one object
// store serve the same users, and their migrations run once when both start together.
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID } from "../../db/seed";
import { migrationsFolder } from "../../db/migrate";
import { startLocalObjectStore, type LocalObjectStore } from "../../server/storage/local-object-store";
import request from "supertest";
import { csrfToken, signInWithPassword } from "../support/auth-client";
import { createTestDb, type TestDb } from "../support/test-db";
import { startTestServer, type TestServer } from "../support/test-server";

let testDb: TestDb;
let objects: LocalObjectStore;
let a: TestServer;
let b: TestServer;
const secret = randomUUID() + randomUUID();

beforeAll(async () => {
  testDb = await createTestDb({ migrated: false });
  objects = await startLocalObjectStore(fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-shared-objects-")));
  const shared = { authSecret: secret, s3: { endpoint: objects.endpoint, bucket: "shared-photos", region: "us-east-1", ...objects.credentials } };
  // Both start at once on an empty database: the advisory lock lets one migrate, the other waits.
  [a, b] = await Promise.all([startTestServer({ reuse: testDb, seed: true, config: shared }), startTestServer({ reuse: testDb, seed: true, config: shared })]);
}, 60_000);
afterAll(async () => {
  await a?.stop();
  await b?.stop();
  await objects?.close();
  await testDb?.drop();
});

describe("two servers, one database", () => {
  it("ran each migration once and seeded the demo once", async () => {
    const journal = JSON.parse(fs.readFileSync(path.join(migrationsFolder, "meta", "_journal.json"), "utf8")) as { entries: unknown[] };
    const applied = await testDb.db.execute(sql`select count(*)::int as n from drizzle.__drizzle_migrations`);
    expect(applied.rows[0].n).toBe(journal.entries.length);
    const teamsRows = await testDb.db.execute(sql`select count(*)::int as n from teams`);
    expect(teamsRows.rows[0].n).toBe(1);
  });

  it("a session from one server works on the other; a push through one is pulled through the other", async () => {
    const onA = request.agent(a.url);
    const token = await csrfToken(onA);
    const signed = await onA.post("/auth/callback/credentials").set("X-Auth-Return-Redirect", "1").type("form").send({ email: "priya@lanternfield.test", password: DEMO_PASSWORD, csrfToken: token });
    const session = ([] as string[]).concat(signed.headers["set-cookie"]).find((c) => c.startsWith("authjs.session-token="))!.split(";")[0];
    // The session cookie server A issued is accepted by server B: sessions live in the cookie, not in a server.
    const me = await request(b.url).get("/api/me").set("Cookie", session).expect(200);
    expect(me.body.user.email).toBe("priya@lanternfield.test");
    const clientId = randomUUID();
    const roomId = randomUUID();
    await onA
      .post("/api/sync/push")
      .send({ clientId, mutations: [{ id: 1, name: "item.put", args: { itemId: roomId, siteId: DEMO_SITE_ID, kind: "room", fields: { id: roomId, name: "Wine cellar", floorId: "fl-basement" }, baseVersion: 0 } }] })
      .expect(200);
    const onB = await signInWithPassword(b.url, "priya@lanternfield.test", DEMO_PASSWORD);
    const pulled = await onB.post("/api/sync/pull").send({ clientId, cursor: 0, knownSiteIds: [] }).expect(200);
    expect(pulled.body.lastMutationId).toBe(1);
    expect(pulled.body.items.find((i: { id: string }) => i.id === roomId)).toMatchObject({ data: { name: "Wine cellar" } });
    // The same client id continues through the other server without a gap or a repeat.
    await onB
      .post("/api/sync/push")
      .send({ clientId, mutations: [{ id: 2, name: "item.put", args: { itemId: roomId, siteId: DEMO_SITE_ID, kind: "room", fields: { notes: "Cool and dry" }, baseVersion: 0 } }] })
      .expect(200);
    const back = await onA.post("/api/sync/pull").send({ clientId, cursor: pulled.body.cursor, knownSiteIds: [DEMO_SITE_ID] }).expect(200);
    expect(back.body.items.find((i: { id: string }) => i.id === roomId).data).toMatchObject({ name: "Wine cellar", notes: "Cool and dry" });
  });

  it("a site renamed or reassigned through one server shows in the other's site list as soon as the notice arrives", async () => {
    expect(a.ctx.siteLists?.isListening && b.ctx.siteLists?.isListening).toBe(true);
    const onA = await signInWithPassword(a.url, "imke@lanternfield.test", DEMO_PASSWORD);
    const onB = await signInWithPassword(b.url, "imke@lanternfield.test", DEMO_PASSWORD);
    const priyaOnB = await signInWithPassword(b.url, "priya@lanternfield.test", DEMO_PASSWORD);
    const listed = async (agent: typeof onB) => (await agent.get("/api/sites").expect(200)).body.sites as { id: string; name: string }[];
    const before = (await listed(onB)).find((s) => s.id === DEMO_SITE_ID)!; // B now remembers the team's list
    expect((await listed(priyaOnB)).map((s) => s.id)).toContain(DEMO_SITE_ID);
    const priyaId = (await onA.get("/api/team/members").expect(200)).body.members.find((m: { email: string }) => m.email === "priya@lanternfield.test").id;
    try {
      await onA.patch(`/api/sites/${DEMO_SITE_ID}`).send({ name: "The Okonkwo-Lindqvist house (east wing)" }).expect(200);
      await expect.poll(async () => (await listed(onB)).find((s) => s.id === DEMO_SITE_ID)?.name, { timeout: 2000, interval: 20 }).toBe("The Okonkwo-Lindqvist house (east wing)");
      await onA.put(`/api/sites/${DEMO_SITE_ID}/surveyors`).send({ surveyorIds: [] }).expect(200);
      await expect.poll(async () => (await listed(priyaOnB)).map((s) => s.id), { timeout: 2000, interval: 20 }).not.toContain(DEMO_SITE_ID);
    } finally {
      await onA.put(`/api/sites/${DEMO_SITE_ID}/surveyors`).send({ surveyorIds: [priyaId] }).expect(200);
      await onA.patch(`/api/sites/${DEMO_SITE_ID}`).send({ name: before.name }).expect(200);
    }
    await expect.poll(async () => (await listed(priyaOnB)).find((s) => s.id === DEMO_SITE_ID)?.name, { timeout: 2000, interval: 20 }).toBe(before.name);
  });

  it("a role changed through one server holds on the other as soon as the database's notice arrives", async () => {
    // Both remember members (they listen for the database's notices), so B must hear of A's change.
    expect(a.ctx.members?.isListening && b.ctx.members?.isListening).toBe(true);
    const admin = await signInWithPassword(a.url, "imke@lanternfield.test", DEMO_PASSWORD);
    const onB = await signInWithPassword(b.url, "tomas@lanternfield.test", DEMO_PASSWORD);
    expect((await onB.get("/api/me").expect(200)).body.role).toBe("designer"); // B now remembers Tomas
    const tomas = (await admin.get("/api/team/members").expect(200)).body.members.find((m: { email: string }) => m.email === "tomas@lanternfield.test");
    await admin.patch(`/api/team/members/${tomas.id}`).send({ role: "surveyor" }).expect(200);
    await expect.poll(async () => (await onB.get("/api/me")).body.role, { timeout: 2000, interval: 20 }).toBe("surveyor");
    await admin.delete(`/api/team/members/${tomas.id}`).expect(204);
    await expect.poll(async () => (await onB.get("/api/sites")).status, { timeout: 2000, interval: 20 }).toBe(401);
  });

  it("a photo uploaded through one server is served by the other", async () => {
    const onA = await signInWithPassword(a.url, "priya@lanternfield.test", DEMO_PASSWORD);
    const onB = await signInWithPassword(b.url, "priya@lanternfield.test", DEMO_PASSWORD);
    const id = randomUUID();
    const jpeg = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.alloc(300, 3)]);
    await onA.post("/api/photos").field("id", id).field("siteId", DEMO_SITE_ID).attach("file", jpeg, "p.jpg").expect(201);
    const res = await onB.get(`/api/photos/${id}`).expect(200);
    expect(res.headers["content-length"]).toBe(String(jpeg.byteLength));
  });
});
