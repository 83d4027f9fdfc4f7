/**
 * Sync benchmark, against a throwaway private Postgres started for the run:
 *  - push of 1,000 mutations through the sync service vs a raw `pg` multi-row INSERT of the same rows;
 *  - pull of a 2,000-device site through the sync service vs a raw `pg` SELECT of the same rows.
 * Both sides run in the same process on the same database; medians of several repetitions.
 *
 *   npx tsx tests/bench/sync-bench.ts
 */
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { createDb } from "../../db/client";
import { ensureDatabase, findFreePort, startCluster, type Cluster } from "../../db/cluster";
import { runMigrations } from "../../db/migrate";
import { memberships, siteAssignments, sites, teams, users } from "../../db/schema";
import { pullChanges } from "../../server/services/sync-pull";
import { pushChanges } from "../../server/services/sync-push";
import type { Actor } from "../../survey/policy";
import type { Mutation } from "../../sync/protocol";

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

export async function withBenchDatabase<T>(fn: (url: string) => Promise<T>): Promise<T> {
  const base = fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-bench-pg-"));
  fs.chmodSync(base, 0o755);
  let cluster: Cluster | undefined;
  try {
    cluster = await startCluster({ dataDir: path.join(base, "data"), port: await findFreePort(56_000), throwaway: true });
    await ensureDatabase(cluster, "bench");
    return await fn(cluster.url("bench"));
  } finally {
    cluster?.stop();
    fs.rmSync(base, { recursive: true, force: true });
  }
}

const device = (i: number) => ({
  id: `dev-${i}`,
  kind: "camera",
  name: `Camera ${i}`,
  roomId: "room-1",
  mount: "high_wall",
  power: { by: "watts", watts: 4 + (i % 9) },
  input: { type: "poe", class: 2 },
  cableAccess: "open_attic",
  run: { lengthM: 10 + (i % 70), category: "cat6" },
});

export async function runSyncBench(): Promise<{ name: string; figures: Record<string, number | string> }> {
  return withBenchDatabase(async (url) => {
    const db = createDb(url, { max: 4 });
    await runMigrations(db);
    await db.insert(teams).values({ id: "team-b", name: "Bench team" });
    await db.insert(users).values({ id: "user-b", email: "bench@team.test", name: "Bench" });
    await db.insert(memberships).values({ teamId: "team-b", userId: "user-b", role: "surveyor" });
    const actor: Actor = { userId: "user-b", teamId: "team-b", role: "surveyor" };
    const figures: Record<string, number | string> = {};

    // Push: 1,000 new devices per repetition, each rep on a fresh site and client.
    const pushTimes: number[] = [];
    const insertTimes: number[] = [];
    for (let rep = 0; rep < 7; rep++) {
      const siteId = `site-push-${rep}`;
      await db.insert(sites).values({ id: siteId, teamId: "team-b", name: "Push" });
      await db.insert(siteAssignments).values({ siteId, userId: "user-b" });
      const mutations: Mutation[] = Array.from({ length: 1000 }, (_, i) => {
        const d = device(i);
        return { id: i + 1, name: "item.put", args: { itemId: `${siteId}-${d.id}`, siteId, kind: "device", fields: { ...d, id: `${siteId}-${d.id}` }, baseVersion: 0 } };
      });
      const clientId = randomUUID();
      let t = performance.now();
      for (let i = 0; i < mutations.length; i += 500) await pushChanges(db, actor, { clientId, mutations: mutations.slice(i, i + 500) });
      pushTimes.push(performance.now() - t);

      // The same rows with one raw multi-row INSERT per 500 (the floor of what any push must do).
      const rawSite = `site-raw-${rep}`;
      await db.insert(sites).values({ id: rawSite, teamId: "team-b", name: "Raw" });
      const client = await db.$client.connect();
      t = performance.now();
      try {
        await client.query("begin");
        for (let i = 0; i < 1000; i += 500) {
          const values: unknown[] = [];
          const rows: string[] = [];
          for (let j = i; j < i + 500; j++) {
            const d = device(j);
            const k = values.length;
            rows.push(`($${k + 1}, 'team-b', $${k + 2}, 'device', $${k + 3}, 1)`);
            values.push(`${rawSite}-${d.id}`, rawSite, JSON.stringify(d));
          }
          await client.query(`insert into items (id, team_id, site_id, kind, data, version) values ${rows.join(",")}`, values);
        }
        await client.query("commit");
      } finally {
        client.release();
      }
      insertTimes.push(performance.now() - t);
    }
    figures["push 1,000 mutations (ms, median)"] = Number(median(pushTimes.slice(2)).toFixed(1));
    figures["raw multi-row INSERT of the same rows (ms)"] = Number(median(insertTimes.slice(2)).toFixed(1));
    figures["push ratio (target ≤ 3×)"] = Number((median(pushTimes.slice(2)) / median(insertTimes.slice(2))).toFixed(2));

    // Pull: a 2,000-device site from cursor 0, vs a raw SELECT of the same rows (a team of its own,
    // so the pull returns exactly those rows).
    const pullSite = "site-pull";
    await db.insert(teams).values({ id: "team-p", name: "Pull team" });
    await db.insert(users).values({ id: "user-p", email: "pull@team.test", name: "Pull" });
    await db.insert(memberships).values({ teamId: "team-p", userId: "user-p", role: "surveyor" });
    const puller: Actor = { userId: "user-p", teamId: "team-p", role: "surveyor" };
    await db.insert(sites).values({ id: pullSite, teamId: "team-p", name: "Pull" });
    await db.insert(siteAssignments).values({ siteId: pullSite, userId: "user-p" });
    const seedClient = randomUUID();
    const bulk: Mutation[] = Array.from({ length: 2000 }, (_, i) => ({ id: i + 1, name: "item.put", args: { itemId: `p-${i}`, siteId: pullSite, kind: "device", fields: { ...device(i), id: `p-${i}` }, baseVersion: 0 } }));
    for (let i = 0; i < bulk.length; i += 500) await pushChanges(db, puller, { clientId: seedClient, mutations: bulk.slice(i, i + 500) });
    const pullTimes: number[] = [];
    const selectTimes: number[] = [];
    let pulled = 0;
    for (let rep = 0; rep < 9; rep++) {
      let t = performance.now();
      const res = await pullChanges(db, puller, { clientId: randomUUID(), cursor: 0, knownSiteIds: [] });
      pullTimes.push(performance.now() - t);
      pulled = res.items.filter((i) => i.siteId === pullSite).length;
      t = performance.now();
      await db.$client.query("select id, site_id, kind, data, deleted, version from items where team_id = $1 and site_id = $2", ["team-p", pullSite]);
      selectTimes.push(performance.now() - t);
    }
    figures["pull of a 2,000-device site (ms, median)"] = Number(median(pullTimes.slice(2)).toFixed(1));
    figures["raw SELECT of the same rows (ms)"] = Number(median(selectTimes.slice(2)).toFixed(1));
    figures["pull ratio (target ≤ 2×)"] = Number((median(pullTimes.slice(2)) / median(selectTimes.slice(2))).toFixed(2));
    figures["devices pulled"] = pulled;
    await db.$client.end();
    return { name: "sync: push and pull against Postgres", figures };
  });
}

const invokedDirectly = /sync-bench\.ts$/.test(process.argv[1] ?? "");
if (invokedDirectly) {
  runSyncBench().then((r) => {
    console.log(r.name);
    for (const [k, v] of Object.entries(r.figures)) console.log(`  ${k}: ${v}`);
  });
}
