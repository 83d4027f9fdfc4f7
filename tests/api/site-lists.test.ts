// Each team's site list as a running server remembers it (server/services/site-lists.ts) against real
// Postgres: the triggers of migration 0008 send a notice for every change to a site or to who is assigned
// to it, every listening server forgets that team's list, a server whose listening connection is cut
// reads fresh until it listens again, and a write through a server holds at once at that server.
import { sql } from "drizzle-orm";
import pino from "pino";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID, seedDemoOnce } from "../../db/seed";
import { createApp } from "../../server/app";
import { SiteListCache, startSiteLists, type SiteLists } from "../../server/services/site-lists";
import { signInWithPassword } from "../support/auth-client";
import { createTestDb, type TestDb } from "../support/test-db";
import { testContext } from "../support/test-server";

let testDb: TestDb;
let teamId: string;
let priyaId: string;
const logger = pino({ level: "silent" });

beforeAll(async () => {
  testDb = await createTestDb();
  await seedDemoOnce(testDb.db);
  const found = await testDb.db.execute(sql`select team_id, (select id from users where email = 'priya@lanternfield.test') as priya from sites where id = ${DEMO_SITE_ID}`);
  teamId = found.rows[0].team_id as string;
  priyaId = found.rows[0].priya as string;
});
afterAll(() => testDb.drop());

const lists = () => startSiteLists({ connectionString: testDb.url, db: testDb.db, pool: testDb.db.$client, logger });

/** A change the triggers do not see (replica mode skips them): only a fresh read can know of it. */
async function silently(change: ReturnType<typeof sql>) {
  await testDb.db.transaction(async (tx) => {
    await tx.execute(sql`set local session_replication_role = replica`);
    await tx.execute(change);
  });
}

const demoSite = async (l: SiteLists) => (await l.find(teamId))?.find((s) => s.id === DEMO_SITE_ID);
const siteNames = async (l: SiteLists) => (await l.find(teamId))?.map((s) => s.name).sort();

describe("site lists", () => {
  it("remembers a team's list while listening; every server forgets it when a site or an assignment changes", async () => {
    const [a, b] = await Promise.all([lists(), lists()]);
    const { name: original, address } = (await demoSite(a))!;
    try {
      expect(a.isListening && b.isListening).toBe(true);
      expect((await demoSite(b))?.surveyorIds).toEqual([priyaId]);
      await silently(sql`update sites set name = 'Renamed unseen' where id = ${DEMO_SITE_ID}`);
      expect((await demoSite(a))?.name).toBe(original); // remembered: no notice was sent
      await silently(sql`update sites set name = ${original} where id = ${DEMO_SITE_ID}`);

      await testDb.db.execute(sql`update sites set address = '12 Quarry Lane' where id = ${DEMO_SITE_ID}`);
      await expect.poll(async () => (await demoSite(a))?.address, { timeout: 2000, interval: 10 }).toBe("12 Quarry Lane");
      await expect.poll(async () => (await demoSite(b))?.address, { timeout: 2000, interval: 10 }).toBe("12 Quarry Lane");

      await testDb.db.execute(sql`delete from site_assignments where site_id = ${DEMO_SITE_ID}`);
      await expect.poll(async () => (await demoSite(b))?.surveyorIds, { timeout: 2000, interval: 10 }).toEqual([]);
      await testDb.db.execute(sql`insert into site_assignments (site_id, user_id) values (${DEMO_SITE_ID}, ${priyaId})`);
      await expect.poll(async () => (await demoSite(b))?.surveyorIds, { timeout: 2000, interval: 10 }).toEqual([priyaId]);

      await testDb.db.execute(sql`insert into sites (id, team_id, name) values ('site_shed', ${teamId}, 'Garden shed')`);
      await expect.poll(() => siteNames(a), { timeout: 2000, interval: 10 }).toContain("Garden shed");
      await testDb.db.execute(sql`delete from sites where id = 'site_shed'`);
      await expect.poll(() => siteNames(a), { timeout: 2000, interval: 10 }).not.toContain("Garden shed");

      // Deleting the homeowner's account clears the site's client (a foreign key's SET NULL): that too is a change.
      await testDb.db.execute(sql`insert into users (id, email, name) values ('user_brief_client', 'brief-client@okonkwo-lindqvist.test', 'Brief')`);
      const clientBefore = (await demoSite(a))!.clientUserId;
      await testDb.db.execute(sql`update sites set client_user_id = 'user_brief_client' where id = ${DEMO_SITE_ID}`);
      await expect.poll(async () => (await demoSite(a))?.clientUserId, { timeout: 2000, interval: 10 }).toBe("user_brief_client");
      await testDb.db.execute(sql`delete from users where id = 'user_brief_client'`);
      await expect.poll(async () => (await demoSite(a))?.clientUserId, { timeout: 2000, interval: 10 }).toBeNull();
      await testDb.db.execute(sql`update sites set client_user_id = ${clientBefore} where id = ${DEMO_SITE_ID}`);
    } finally {
      await testDb.db.execute(sql`delete from sites where id = 'site_shed'`);
      await testDb.db.execute(sql`insert into site_assignments (site_id, user_id) values (${DEMO_SITE_ID}, ${priyaId}) on conflict do nothing`);
      await testDb.db.execute(sql`update sites set address = ${address} where id = ${DEMO_SITE_ID}`);
      await a.close();
      await b.close();
    }
  });

  it("tells both teams when a site moves between them, and every team when a table is truncated", async () => {
    const a = await lists();
    await testDb.db.execute(sql`insert into teams (id, name) values ('team_other', 'Another crew')`);
    const other = (l: SiteLists) => l.find("team_other");
    try {
      await testDb.db.execute(sql`insert into sites (id, team_id, name) values ('site_barn', ${teamId}, 'Barn')`);
      await expect.poll(() => siteNames(a), { timeout: 2000, interval: 10 }).toContain("Barn");
      expect(await other(a)).toEqual([]);
      await testDb.db.execute(sql`update sites set team_id = 'team_other' where id = 'site_barn'`);
      await expect.poll(async () => (await other(a))?.map((s) => s.name), { timeout: 2000, interval: 10 }).toEqual(["Barn"]);
      await expect.poll(() => siteNames(a), { timeout: 2000, interval: 10 }).not.toContain("Barn");

      // A truncate names no row: every team's list is forgotten.
      await testDb.db.execute(sql`insert into site_assignments (site_id, user_id) values ('site_barn', ${priyaId})`);
      await expect.poll(async () => (await other(a))?.[0].surveyorIds, { timeout: 2000, interval: 10 }).toEqual([priyaId]);
      await demoSite(a);
      await testDb.db.execute(sql`truncate site_assignments`);
      await expect.poll(async () => (await demoSite(a))?.surveyorIds, { timeout: 2000, interval: 10 }).toEqual([]);
      await expect.poll(async () => (await other(a))?.[0].surveyorIds, { timeout: 2000, interval: 10 }).toEqual([]);
    } finally {
      await testDb.db.execute(sql`insert into site_assignments (site_id, user_id) values (${DEMO_SITE_ID}, ${priyaId}) on conflict do nothing`);
      await testDb.db.execute(sql`delete from sites where id = 'site_barn'`);
      await testDb.db.execute(sql`delete from teams where id = 'team_other'`);
      await a.close();
    }
  });

  it("keeps the lists it hands out, their surveyors and settings from being changed by a caller", async () => {
    const a = await lists();
    try {
      const [site] = (await a.find(teamId))!;
      expect(() => (site.surveyorIds as string[]).push("user_intruder")).toThrow(TypeError);
      expect(() => { (site.settings as Record<string, unknown>).units = "imperial"; }).toThrow(TypeError);
      expect(() => { (site as { name: string }).name = "Changed in memory"; }).toThrow(TypeError);
      expect((await a.find(teamId))![0].surveyorIds).toEqual([priyaId]);
    } finally {
      await a.close();
    }
  });

  it("reads fresh while its listening connection is gone, and remembers again once it listens again", async () => {
    const a = await lists();
    const original = (await demoSite(a))!.name;
    try {
      await testDb.db.execute(sql`select pg_terminate_backend(pid) from pg_stat_activity where application_name = 'dropwise-site-list-changes' and datname = current_database()`);
      await expect.poll(() => a.isListening, { timeout: 2000, interval: 10 }).toBe(false);
      await silently(sql`update sites set name = 'Renamed while deaf' where id = ${DEMO_SITE_ID}`);
      expect((await demoSite(a))?.name).toBe("Renamed while deaf"); // nothing remembered while deaf
      await expect.poll(() => a.isListening, { timeout: 5000, interval: 50 }).toBe(true);
      await demoSite(a);
      await silently(sql`update sites set name = 'Renamed unseen' where id = ${DEMO_SITE_ID}`);
      expect((await demoSite(a))?.name).toBe("Renamed while deaf"); // remembering again
    } finally {
      await silently(sql`update sites set name = ${original} where id = ${DEMO_SITE_ID}`);
      await a.close();
    }
  });

  it("closes its connection when the server stops", async () => {
    const a = await lists();
    await a.close();
    const open = async () =>
      (await testDb.db.execute(sql`select count(*)::int as n from pg_stat_activity where application_name = 'dropwise-site-list-changes' and datname = current_database()`)).rows[0].n;
    await expect.poll(open, { timeout: 2000, interval: 20 }).toBe(0);
  });
});

describe("a server's own site changes", () => {
  // A cache that is listening but never hears a notice: only this server's own forgetting can make a change visible.
  it("hold at the next read on the server that made them, even over a read made while the write was on its way", async () => {
    const siteLists = new SiteListCache(testDb.db);
    siteLists.setListening(true);
    const app = createApp({ ...testContext(testDb.db), siteLists });
    const designer = await signInWithPassword(app, "tomas@lanternfield.test", DEMO_PASSWORD);
    const priya = await signInWithPassword(app, "priya@lanternfield.test", DEMO_PASSWORD);
    const listed = async (agent: typeof priya) => (await agent.get("/api/sites").expect(200)).body.sites as { id: string; name: string }[];
    const original = (await listed(designer)).find((s) => s.id === DEMO_SITE_ID)!.name;
    expect((await listed(priya)).map((s) => s.id)).toEqual([DEMO_SITE_ID]);
    let created: string | undefined;
    try {
      await designer.patch(`/api/sites/${DEMO_SITE_ID}`).send({ name: "The house on Quarry Lane" }).expect(200);
      expect((await listed(priya)).find((s) => s.id === DEMO_SITE_ID)?.name).toBe("The house on Quarry Lane");

      // The site's row is held, so the rename waits; the list read meanwhile (the old name) must not outlive it.
      const holder = await testDb.db.$client.connect();
      let renamed: Promise<unknown>;
      try {
        await holder.query("begin");
        await holder.query("select id from sites where id = $1 for update", [DEMO_SITE_ID]);
        renamed = designer.patch(`/api/sites/${DEMO_SITE_ID}`).send({ name: "Quarry Lane, second pass" }).expect(200).then((r) => r);
        await expect.poll(async () => (await testDb.db.execute(sql`select count(*)::int as n from pg_stat_activity where datname = current_database() and wait_event_type = 'Lock'`)).rows[0].n, { timeout: 2000, interval: 10 }).toBe(1);
        expect((await listed(priya)).find((s) => s.id === DEMO_SITE_ID)?.name).toBe("The house on Quarry Lane");
      } finally {
        await holder.query("commit");
        holder.release();
      }
      await renamed!;
      expect((await listed(priya)).find((s) => s.id === DEMO_SITE_ID)?.name).toBe("Quarry Lane, second pass");

      await designer.put(`/api/sites/${DEMO_SITE_ID}/surveyors`).send({ surveyorIds: [] }).expect(200);
      expect(await listed(priya)).toEqual([]);
      await designer.put(`/api/sites/${DEMO_SITE_ID}/surveyors`).send({ surveyorIds: [priyaId] }).expect(200);
      expect((await listed(priya)).map((s) => s.id)).toEqual([DEMO_SITE_ID]);

      created = (await designer.post("/api/sites").send({ name: "Boathouse", address: "", units: "metric" }).expect(201)).body.site.id;
      expect((await listed(designer)).map((s) => s.id)).toContain(created);
    } finally {
      await silently(sql`update sites set name = ${original} where id = ${DEMO_SITE_ID}`);
      if (created) await silently(sql`delete from sites where id = ${created}`);
      await testDb.db.execute(sql`insert into site_assignments (site_id, user_id) values (${DEMO_SITE_ID}, ${priyaId}) on conflict do nothing`);
    }
  });

  it("are not forgotten for reads that are posted", async () => {
    const siteLists = new SiteListCache(testDb.db);
    const forget = vi.spyOn(siteLists, "forget");
    siteLists.setListening(true);
    const app = createApp({ ...testContext(testDb.db), siteLists });
    const priya = await signInWithPassword(app, "priya@lanternfield.test", DEMO_PASSWORD);
    await priya.post("/api/sync/pull").send({ clientId: "0d5c2a47-8f0e-4f43-9d55-5b8a3b8d1c11", cursor: 0, knownSiteIds: [] }).expect(200);
    expect(forget).not.toHaveBeenCalled();
    await priya.post("/api/sync/push").send({ clientId: "0d5c2a47-8f0e-4f43-9d55-5b8a3b8d1c11", mutations: [] }).expect((r) => expect(r.status).toBeLessThan(500));
    expect(forget).toHaveBeenCalledWith(teamId);
  });
});
