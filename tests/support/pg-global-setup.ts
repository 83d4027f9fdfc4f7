// Vitest global setup: one throwaway Postgres cluster for the run, in a fresh temporary folder
// (the checkout's parents may be closed to the postgres user), with a migrated template database.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { createDb } from "../../db/client";
import { ensureDatabase, findFreePort, startCluster } from "../../db/cluster";
import { runMigrations } from "../../db/migrate";

declare module "vitest" {
  export interface ProvidedContext {
    pgAdminUrl: string;
    pgTemplate: string;
  }
}

export const TEMPLATE_DB = "dropwise_template";


export default async function setup(project: TestProject) {
  const base = fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-test-pg-"));
  fs.chmodSync(base, 0o755);
  const cluster = await startCluster({ dataDir: path.join(base, "data"), port: await findFreePort(55_400), throwaway: true });
  await ensureDatabase(cluster, TEMPLATE_DB);
  const db = createDb(cluster.url(TEMPLATE_DB));
  await runMigrations(db);
  await db.$client.end();
  project.provide("pgAdminUrl", cluster.url("postgres"));
  project.provide("pgTemplate", TEMPLATE_DB);
  return () => {
    cluster.stop();
    fs.rmSync(base, { recursive: true, force: true });
  };
}
