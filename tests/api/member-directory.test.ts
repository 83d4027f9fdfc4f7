// The member directory of a running server (server/auth/member-directory.ts) against real Postgres: the
// triggers of migration 0007 send a notice for every membership or member change, every listening server
// forgets that member, and a server whose listening connection is cut reads fresh until it listens again.
import { sql } from "drizzle-orm";
import pg from "pg";
import pino from "pino";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { seedDemoOnce } from "../../db/seed";
import { createApp } from "../../server/app";
import { membershipLookup } from "../../server/auth/auth-config";
import { MemberCache, startMemberDirectory } from "../../server/auth/member-directory";
import { signInWithPassword } from "../support/auth-client";
import { createTestDb, type TestDb } from "../support/test-db";
import { testContext } from "../support/test-server";

let testDb: TestDb;
let priyaId: string;
const logger = pino({ level: "silent" });

beforeAll(async () => {
  testDb = await createTestDb();
  await seedDemoOnce(testDb.db);
  const found = await testDb.db.execute(sql`select id from users where email = 'priya@lanternfield.test'`);
  priyaId = found.rows[0].id as string;
});
afterAll(() => testDb.drop());

const directory = (options: { heartbeatMs?: number; heartbeatTimeoutMs?: number } = {}) =>
  startMemberDirectory({ connectionString: testDb.url, pool: testDb.db.$client, lookup: membershipLookup(testDb.db), logger, ...options });

/** A change the triggers do not see (replica mode skips them): only a fresh read can know of it. */
async function silentRoleChange(role: string) {
  await testDb.db.transaction(async (tx) => {
    await tx.execute(sql`set local session_replication_role = replica`);
    await tx.execute(sql`update memberships set role = ${role} where user_id = ${priyaId}`);
  });
}

describe("member directory", () => {
  it("remembers a member while listening; every server forgets them when their role, name or membership changes", async () => {
    const [a, b] = await Promise.all([directory(), directory()]);
    try {
      expect(a.isListening && b.isListening).toBe(true);
      expect((await a.find(priyaId))?.role).toBe("surveyor");
      expect((await b.find(priyaId))?.role).toBe("surveyor");
      await silentRoleChange("designer");
      expect((await a.find(priyaId))?.role).toBe("surveyor"); // remembered: no notice was sent
      await silentRoleChange("surveyor");

      await testDb.db.execute(sql`update memberships set role = 'designer' where user_id = ${priyaId}`);
      await expect.poll(async () => (await a.find(priyaId))?.role, { timeout: 2000, interval: 10 }).toBe("designer");
      await expect.poll(async () => (await b.find(priyaId))?.role, { timeout: 2000, interval: 10 }).toBe("designer");

      await testDb.db.execute(sql`update users set name = 'Priya R.' where id = ${priyaId}`);
      await expect.poll(async () => (await b.find(priyaId))?.name, { timeout: 2000, interval: 10 }).toBe("Priya R.");

      const [kept] = (await testDb.db.execute(sql`delete from memberships where user_id = ${priyaId} returning team_id, role`)).rows;
      await expect.poll(async () => a.find(priyaId), { timeout: 2000, interval: 10 }).toBeUndefined();
      await testDb.db.execute(sql`insert into memberships (team_id, user_id, role) values (${kept.team_id}, ${priyaId}, 'surveyor')`);
      await expect.poll(async () => (await a.find(priyaId))?.role, { timeout: 2000, interval: 10 }).toBe("surveyor");
    } finally {
      await a.close();
      await b.close();
    }
  });

  it("reads fresh while its listening connection is gone, and remembers again once it listens again", async () => {
    const a = await directory();
    try {
      await a.find(priyaId);
      await testDb.db.execute(sql`select pg_terminate_backend(pid) from pg_stat_activity where application_name = 'dropwise-member-changes' and datname = current_database()`);
      await expect.poll(() => a.isListening, { timeout: 2000, interval: 10 }).toBe(false);
      await silentRoleChange("designer");
      expect((await a.find(priyaId))?.role).toBe("designer"); // nothing remembered while deaf
      await expect.poll(() => a.isListening, { timeout: 5000, interval: 50 }).toBe(true);
      await a.find(priyaId);
      await silentRoleChange("surveyor");
      expect((await a.find(priyaId))?.role).toBe("designer"); // remembering again
    } finally {
      await silentRoleChange("surveyor");
      await a.close();
    }
  });

  it("counts a connection whose notices stop arriving as lost, even when it never says so", async () => {
    // Heartbeats sent into another database never come back, as with a path that silently died.
    const elsewhere = new pg.Pool({ connectionString: inject("pgAdminUrl"), max: 1 });
    const deaf = await startMemberDirectory({ connectionString: testDb.url, pool: elsewhere, lookup: membershipLookup(testDb.db), logger, heartbeatMs: 50, heartbeatTimeoutMs: 100 });
    const healthy = await directory({ heartbeatMs: 50, heartbeatTimeoutMs: 500 });
    try {
      expect(deaf.isListening).toBe(true);
      await expect.poll(() => deaf.isListening, { timeout: 2000, interval: 10 }).toBe(false);
      await new Promise((r) => setTimeout(r, 400)); // several heartbeats
      expect(healthy.isListening).toBe(true);
    } finally {
      await deaf.close();
      await healthy.close();
      await elsewhere.end();
    }
  });

  it("forgets a member whose user is deleted", async () => {
    const a = await directory();
    try {
      await testDb.db.execute(sql`insert into users (id, email, name) values ('user_brief', 'brief@lanternfield.test', 'Brief')`);
      await testDb.db.execute(sql`insert into memberships (team_id, user_id, role) select team_id, 'user_brief', 'surveyor' from memberships where user_id = ${priyaId}`);
      expect((await a.find("user_brief"))?.role).toBe("surveyor");
      await testDb.db.execute(sql`delete from users where id = 'user_brief'`);
      await expect.poll(async () => a.find("user_brief"), { timeout: 2000, interval: 10 }).toBeUndefined();
    } finally {
      await a.close();
    }
  });

  it("closes its connection when the server stops", async () => {
    const a = await directory();
    await a.close();
    const open = async () =>
      (await testDb.db.execute(sql`select count(*)::int as n from pg_stat_activity where application_name = 'dropwise-member-changes' and datname = current_database()`)).rows[0].n;
    await expect.poll(open, { timeout: 2000, interval: 20 }).toBe(0);
  });
});

describe("a server's own membership changes", () => {
  // A cache that is listening but never hears a notice: only the routes' own forget() can make a change visible.
  it("hold at the member's next request on the server that made them", async () => {
    const members = new MemberCache(membershipLookup(testDb.db), { maxAgeMs: 60_000, maxEntries: 100 });
    members.setListening(true);
    const app = createApp({ ...testContext(testDb.db), members });
    const admin = await signInWithPassword(app, "imke@lanternfield.test", DEMO_PASSWORD);
    const priya = await signInWithPassword(app, "priya@lanternfield.test", DEMO_PASSWORD);
    expect((await priya.get("/api/me").expect(200)).body.role).toBe("surveyor");

    await admin.patch(`/api/team/members/${priyaId}`).send({ role: "designer" }).expect(200);
    expect((await priya.get("/api/me").expect(200)).body.role).toBe("designer");

    await priya.patch("/api/me").send({ name: "Priya Ramaswamy" }).expect(200);
    expect((await priya.get("/api/me").expect(200)).body.user.name).toBe("Priya Ramaswamy");

    await admin.delete(`/api/team/members/${priyaId}`).expect(204);
    await priya.get("/api/sites").expect(401);
  });
});
