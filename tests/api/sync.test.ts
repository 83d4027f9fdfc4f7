// The sync protocol against a real Postgres: exactly-once pushes, gap refusal, atomic batches,
// cursors that miss and repeat nothing, the merge rules and the client id binding.
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { eq, sql } from "drizzle-orm";
import type { Express } from "express";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID, seedDemoOnce } from "../../db/seed";
import { items, siteAssignments, syncClients, teams, users, memberships } from "../../db/schema";
import { hashPassword } from "../../server/auth/passwords";
import { createApp } from "../../server/app";
import type { Mutation, PullResponse } from "../../sync/protocol";
import { signInWithPassword, type Agent } from "../support/auth-client";
import { createTestDb, type TestDb } from "../support/test-db";
import { testContext } from "../support/test-server";

let testDb: TestDb;
let app: Express;
let priya: Agent; // surveyor assigned to the demo site
let noor: Agent; // a second surveyor on the same site
let tomas: Agent; // designer

beforeAll(async () => {
  testDb = await createTestDb();
  await seedDemoOnce(testDb.db);
  await testDb.db.insert(users).values({ id: "user_noor", email: "noor@lanternfield.test", name: "Noor Aziz", passwordHash: await hashPassword(DEMO_PASSWORD) });
  await testDb.db.insert(memberships).values({ teamId: "team_lanternfield", userId: "user_noor", role: "surveyor" });
  await testDb.db.insert(siteAssignments).values({ siteId: DEMO_SITE_ID, userId: "user_noor" });
  const ctx = testContext(testDb.db);
  if (process.env.DEBUG_SYNC) ctx.logger = (await import("pino")).default({ level: "error" });
  app = createApp(ctx);
  priya = await signInWithPassword(app, "priya@lanternfield.test", DEMO_PASSWORD);
  noor = await signInWithPassword(app, "noor@lanternfield.test", DEMO_PASSWORD);
  tomas = await signInWithPassword(app, "tomas@lanternfield.test", DEMO_PASSWORD);
});
afterAll(() => testDb.drop());

const room = (id: number, itemId: string, name: string, baseVersion = 0): Mutation => ({
  id,
  name: "item.put",
  args: { itemId, siteId: DEMO_SITE_ID, kind: "room", fields: { id: itemId, name, floorId: "floor-ground" }, baseVersion },
});

async function teamVersion() {
  const [t] = await testDb.db.select({ v: teams.version }).from(teams).where(eq(teams.id, "team_lanternfield"));
  return t.v;
}
async function itemRow(id: string) {
  const [row] = await testDb.db.select().from(items).where(eq(items.id, id));
  return row;
}
const push = (agent: Agent, clientId: string, mutations: Mutation[]) => agent.post("/api/sync/push").send({ clientId, mutations });
const pull = async (agent: Agent, clientId: string, cursor: number, knownSiteIds = [DEMO_SITE_ID]) => {
  const res = await agent.post("/api/sync/pull").send({ clientId, cursor, knownSiteIds }).expect(200);
  return res.body as PullResponse;
};

describe("push applies each change exactly once", () => {
  it("the same batch twice, and an overlapping batch, change state and the version once", async () => {
    const client = randomUUID();
    const a = randomUUID();
    const b = randomUUID();
    const before = await teamVersion();
    const batch = [room(1, a, "Pantry"), room(2, b, "Mud room")];
    expect((await push(priya, client, batch).expect(200)).body).toEqual({ lastMutationId: 2 });
    expect((await push(priya, client, batch).expect(200)).body).toEqual({ lastMutationId: 2 });
    expect(await teamVersion()).toBe(before + 1);
    // Overlap: 2 was applied already, 3 is new. A rename at 3 must not be undone by replaying 2.
    const overlap = [room(2, b, "Mud room"), { ...room(3, b, "Boot room"), args: { ...room(3, b, "Boot room").args, fields: { name: "Boot room" } } } as Mutation];
    expect((await push(priya, client, overlap).expect(200)).body).toEqual({ lastMutationId: 3 });
    expect(await teamVersion()).toBe(before + 2);
    expect((await itemRow(b)).data).toMatchObject({ name: "Boot room" });
    expect((await itemRow(a)).version).toBe(before + 1);
  });

  it("a gap is refused with 409 and nothing of the batch is applied", async () => {
    const client = randomUUID();
    const x = randomUUID();
    await push(priya, client, [room(1, x, "Attic")]).expect(200);
    const before = await teamVersion();
    const y = randomUUID();
    const res = await push(priya, client, [room(3, y, "Loft")]).expect(409);
    expect(res.body.error.code).toBe("mutation_gap");
    expect(res.body.error.message).toContain("starting at 2");
    // A batch that is consecutive at first but then jumps is refused whole, too.
    await push(priya, client, [room(2, y, "Loft"), room(4, randomUUID(), "Eaves")]).expect(409);
    expect(await itemRow(y)).toBeUndefined();
    expect(await teamVersion()).toBe(before);
  });

  it("a failure in the middle of a batch leaves nothing behind, and the retry applies it all", async () => {
    const client = randomUUID();
    const ok1 = randomUUID();
    const poison = randomUUID();
    // Fault injection: the database refuses one specific row, as a crashed disk or a constraint would.
    await testDb.db.execute(sql.raw(`
      create or replace function refuse_poison() returns trigger as $$
      begin if new.id = '${poison}' then raise exception 'injected failure'; end if; return new; end $$ language plpgsql;
      create trigger refuse_poison before insert or update on items for each row execute function refuse_poison();`));
    const before = await teamVersion();
    const res = await push(priya, client, [room(1, ok1, "Den"), room(2, poison, "Study")]);
    expect(res.status).toBe(500);
    expect(JSON.stringify(res.body)).not.toContain("injected failure");
    expect(await itemRow(ok1)).toBeUndefined();
    expect(await teamVersion()).toBe(before);
    const [c] = await testDb.db.select().from(syncClients).where(eq(syncClients.clientId, client));
    expect(c?.lastMutationId ?? 0).toBe(0);
    await testDb.db.execute(sql`drop trigger refuse_poison on items`);
    expect((await push(priya, client, [room(1, ok1, "Den"), room(2, poison, "Study")]).expect(200)).body.lastMutationId).toBe(2);
    expect(await itemRow(poison)).toBeDefined();
  });

  it("a domain rejection is recorded and returned, and does not block the queue", async () => {
    const client = randomUUID();
    const good = randomUUID();
    const bad: Mutation = { id: 1, name: "item.put", args: { itemId: randomUUID(), siteId: DEMO_SITE_ID, kind: "device", fields: { name: "Hall camera", power: { by: "watts", watts: -4 } }, baseVersion: 0 } };
    const cursor = await teamVersion();
    expect((await push(priya, client, [bad, room(2, good, "Hall")]).expect(200)).body.lastMutationId).toBe(2);
    expect(await itemRow(good)).toBeDefined();
    const changes = await pull(priya, client, cursor);
    // Each item reads as the protocol says: the stored row, its version a number like the cursor.
    const pulledRoom = changes.items.find((i) => i.id === good)!;
    expect(pulledRoom).toEqual({ id: good, siteId: DEMO_SITE_ID, kind: "room", data: expect.objectContaining({ name: "Hall" }), deleted: false, version: expect.any(Number) });
    expect(pulledRoom.version).toBe((await itemRow(good)).version);
    expect(changes.rejections).toHaveLength(1);
    expect(changes.rejections[0]).toMatchObject({ mutationId: 1, code: "invalid" });
    expect(changes.rejections[0].message).toMatch(/power/i);
  });

  it("a client id presented by another user answers 403, on push and on pull", async () => {
    const client = randomUUID();
    await push(priya, client, [room(1, randomUUID(), "Laundry")]).expect(200);
    const res = await push(noor, client, [room(2, randomUUID(), "Laundry")]).expect(403);
    expect(res.body.error.code).toBe("client_of_another_user");
    await noor.post("/api/sync/pull").send({ clientId: client, cursor: 0, knownSiteIds: [] }).expect(403);
  });

  it("a client cannot push to a site it may not see, and a client (homeowner) cannot capture", async () => {
    const client = randomUUID();
    await testDb.db.insert(teams).values({ id: "team_other", name: "Other Installs" }).onConflictDoNothing();
    const foreign: Mutation = { id: 1, name: "item.put", args: { itemId: randomUUID(), siteId: "site-of-nobody", kind: "room", fields: { name: "X" }, baseVersion: 0 } };
    const cursor = await teamVersion();
    await push(tomas, client, [foreign]).expect(200);
    const back = await pull(tomas, client, cursor);
    expect(back.rejections[0].code).toBe("site_unavailable");
  });

  it("bad envelopes are a 400 naming the field", async () => {
    const res = await push(priya, "not-a-uuid", []).expect(400);
    expect(res.body.error.fields.clientId).toEqual(["The client id must be a UUID."]);
    const anon = await request(app).post("/api/sync/push").send({ clientId: randomUUID(), mutations: [] }).expect(401);
    expect(anon.body.error.code).toBe("signed_out");
  });
});

describe("merge rules", () => {
  it("edits to different fields of one item merge", async () => {
    const id = randomUUID();
    const c1 = randomUUID();
    const c2 = randomUUID();
    await push(priya, c1, [room(1, id, "Guest room")]).expect(200);
    const v = (await itemRow(id)).version;
    await push(priya, c1, [{ id: 2, name: "item.put", args: { itemId: id, siteId: DEMO_SITE_ID, kind: "room", fields: { notes: "Attic hatch in closet" }, baseVersion: v } }]).expect(200);
    await push(noor, c2, [{ id: 1, name: "item.put", args: { itemId: id, siteId: DEMO_SITE_ID, kind: "room", fields: { outdoor: false, name: "Guest room" }, baseVersion: v } }]).expect(200);
    expect((await itemRow(id)).data).toMatchObject({ name: "Guest room", notes: "Attic hatch in closet", outdoor: false });
  });

  it("the same field goes to the later arrival; the lost value is kept and pulled once", async () => {
    const id = randomUUID();
    const c1 = randomUUID();
    const c2 = randomUUID();
    await push(priya, c1, [room(1, id, "Nursery")]).expect(200);
    const v = (await itemRow(id)).version;
    const cursor = await teamVersion();
    const rename = (mid: number, name: string): Mutation => ({ id: mid, name: "item.put", args: { itemId: id, siteId: DEMO_SITE_ID, kind: "room", fields: { name }, baseVersion: v } });
    await push(priya, c1, [rename(2, "Playroom")]).expect(200);
    await push(noor, c2, [rename(1, "Craft room")]).expect(200);
    expect((await itemRow(id)).data.name).toBe("Craft room");
    const changes = await pull(priya, c1, cursor);
    const note = changes.conflicts.find((c) => c.itemId === id)!;
    expect(note).toMatchObject({ field: "name", lostValue: "Playroom", keptValue: "Craft room", lostBy: "user_priya", keptBy: "user_noor" });
    const later = await pull(priya, c1, changes.cursor);
    expect(later.conflicts.find((c) => c.itemId === id)).toBeUndefined();
  });

  it("a surveyor's own successive edits are not a conflict", async () => {
    const id = randomUUID();
    const c1 = randomUUID();
    const cursor = await teamVersion();
    await push(priya, c1, [room(1, id, "Office")]).expect(200);
    await push(priya, c1, [{ ...room(2, id, "Home office"), args: { ...room(2, id, "Home office").args, fields: { name: "Home office" } } } as Mutation]).expect(200);
    expect((await pull(priya, c1, cursor)).conflicts.filter((c) => c.itemId === id)).toEqual([]);
  });

  it("delete beats update: an edit arriving after a delete is refused with a reason", async () => {
    const id = randomUUID();
    const c1 = randomUUID();
    const c2 = randomUUID();
    await push(priya, c1, [room(1, id, "Sunroom")]).expect(200);
    const v = (await itemRow(id)).version;
    await push(priya, c1, [{ id: 2, name: "item.delete", args: { itemId: id, siteId: DEMO_SITE_ID } }]).expect(200);
    const cursor = await teamVersion();
    await push(noor, c2, [{ id: 1, name: "item.put", args: { itemId: id, siteId: DEMO_SITE_ID, kind: "room", fields: { notes: "skylight" }, baseVersion: v } }]).expect(200);
    expect((await itemRow(id)).deleted).toBe(true);
    const back = await pull(noor, c2, cursor);
    expect(back.rejections).toEqual([expect.objectContaining({ mutationId: 1, code: "deleted" })]);
    // The tombstone reaches others so they drop it too.
    const seen = await pull(priya, c1, cursor - 1);
    expect(seen.items.find((i) => i.id === id)).toMatchObject({ deleted: true });
  });
});

describe("stored field writes", () => {
  it("migration 0006 turns per-field versions into per-write lists, and a conflict is still found after it", async () => {
    const id = randomUUID();
    const c1 = randomUUID();
    await push(priya, c1, [room(1, id, "Pantry")]).expect(200);
    const row = await itemRow(id);
    // The layout before the migration: one {v, c} entry per field.
    const perField = Object.fromEntries(Object.keys(row.data).map((f) => [f, { v: row.version, c: c1 }]));
    await testDb.db.update(items).set({ fieldVersions: perField as never }).where(eq(items.id, id));
    const migration = fs.readFileSync(path.join(import.meta.dirname, "..", "..", "db", "migrations", "0006_field-writes.sql"), "utf8");
    await testDb.db.execute(sql.raw(migration));
    await testDb.db.execute(sql.raw(migration)); // running it twice changes nothing
    expect((await itemRow(id)).fieldVersions).toEqual({ [`${row.version}:${c1}`]: Object.keys(row.data).sort() });
    // Another surveyor renames from the version before: the converted record still names priya's write.
    const cursor = await teamVersion();
    await push(noor, randomUUID(), [{ id: 1, name: "item.put", args: { itemId: id, siteId: DEMO_SITE_ID, kind: "room", fields: { name: "Larder" }, baseVersion: row.version - 1 } }]).expect(200);
    expect((await pull(priya, c1, cursor)).conflicts.find((c) => c.itemId === id)).toMatchObject({ field: "name", lostValue: "Pantry", keptValue: "Larder" });
  });
});

describe("pull", () => {
  it("under concurrent pushes, a chain of pulls misses nothing and repeats nothing", async () => {
    const start = await teamVersion();
    const writers = Array.from({ length: 4 }, () => ({ client: randomUUID(), ids: Array.from({ length: 12 }, () => randomUUID()) }));
    let stop = false;
    const pulled = new Map<string, number>(); // item id → version last seen
    let repeats = 0;
    const puller = (async () => {
      const client = randomUUID();
      let cursor = start;
      while (!stop) {
        const page = await pull(tomas, client, cursor);
        for (const item of page.items) {
          expect(item.version).toBeGreaterThan(cursor);
          expect(item.version).toBeLessThanOrEqual(page.cursor);
          if (pulled.get(item.id) === item.version) repeats++;
          pulled.set(item.id, item.version);
        }
        cursor = page.cursor;
      }
      // One last pull after every writer finished.
      const last = await pull(tomas, client, cursor);
      for (const item of last.items) pulled.set(item.id, item.version);
    })();
    await Promise.all(
      writers.map(async (w, wi) => {
        const agent = wi % 2 ? noor : priya;
        for (let i = 0; i < w.ids.length; i++) await push(agent, w.client, [room(i + 1, w.ids[i], `Room ${wi}.${i}`)]).expect(200);
      }),
    );
    stop = true;
    await puller;
    expect(repeats).toBe(0);
    for (const w of writers) for (const id of w.ids) expect(pulled.get(id)).toBe((await itemRow(id)).version);
  });

  it("a site newly assigned to a surveyor comes whole; a site taken away is listed as removed", async () => {
    const client = randomUUID();
    await testDb.db.insert(users).values({ id: "user_wren", email: "wren@lanternfield.test", name: "Wren", passwordHash: await hashPassword(DEMO_PASSWORD) });
    await testDb.db.insert(memberships).values({ teamId: "team_lanternfield", userId: "user_wren", role: "surveyor" });
    const wren = await signInWithPassword(app, "wren@lanternfield.test", DEMO_PASSWORD);
    const first = await pull(wren, client, 0, []);
    expect(first.sites).toEqual([]);
    await testDb.db.insert(siteAssignments).values({ siteId: DEMO_SITE_ID, userId: "user_wren" });
    const second = await pull(wren, client, first.cursor, []);
    expect(second.sites.map((s) => s.id)).toEqual([DEMO_SITE_ID]);
    expect(second.items.length).toBeGreaterThan(0);
    expect(second.items.every((i) => !i.deleted)).toBe(true);
    await testDb.db.delete(siteAssignments).where(eq(siteAssignments.userId, "user_wren"));
    const third = await pull(wren, client, second.cursor, [DEMO_SITE_ID]);
    expect(third.removedSiteIds).toEqual([DEMO_SITE_ID]);
  });
});
