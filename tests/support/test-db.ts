// Each test file gets its own database, cloned from the migrated template (about 0.1 s).
import { randomBytes } from "node:crypto";
import pg from "pg";
import { inject } from "vitest";
import { createDb, type Db } from "../../db/client";

export interface TestDb {
  db: Db;
  url: string;
  name: string;
  drop(): Promise<void>;
}

/** A database of its own, cloned from the migrated template — or empty (`migrated: false`). */
export async function createTestDb({ migrated = true }: { migrated?: boolean } = {}): Promise<TestDb> {
  const adminUrl = inject("pgAdminUrl");
  const template = migrated ? inject("pgTemplate") : "template1";
  const name = `t_${randomBytes(6).toString("hex")}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  try {
    await admin.query(`create database ${name} template ${template}`);
  } finally {
    await admin.end();
  }
  const url = adminUrl.replace(/\/postgres$/, `/${name}`);
  const db = createDb(url);
  return {
    db,
    url,
    name,
    async drop() {
      await db.$client.end();
      const c = new pg.Client({ connectionString: adminUrl });
      await c.connect();
      await c.query(`drop database if exists ${name} with (force)`);
      await c.end();
    },
  };
}
