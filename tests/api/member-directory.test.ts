// The member directory of a running server (server/auth/member-directory.ts) against real Postgres: the
// triggers of migration 0007 send a notice for every membership or member change, every listening server
// forgets that member, and a server whose listening connection is cut reads fresh until it listens again.
import { sql } from "drizzle-orm";
import pino from "pino";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemoOnce } from "../../db/seed";
import { membershipLookup } from "../../server/auth/auth-config";
import { startMemberDirectory } from "../../server/auth/member-directory";
import { createTestDb, type TestDb } from "../support/test-db";

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

const directory = () => startMemberDirectory({ connectionString: testDb.url, lookup: membershipLookup(testDb.db), logger });

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

  it("closes its connection when the server stops", async () => {
    const a = await directory();
    await a.close();
    const open = await testDb.db.execute(sql`select count(*)::int as n from pg_stat_activity where application_name = 'dropwise-member-changes' and datname = current_database()`);
    expect(open.rows[0].n).toBe(0);
  });
});
