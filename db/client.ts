import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import pg from "pg";
import * as schema from "./schema";

export type Db = NodePgDatabase<typeof schema> & { $client: pg.Pool };

export function createDb(connectionString: string, poolOptions: pg.PoolConfig = {}): Db {
  const pool = new pg.Pool({ connectionString, max: 10, ...poolOptions });
  // An idle client that loses its server (Postgres restarted) must not crash the process.
  pool.on("error", () => {});
  return drizzle(pool, { schema, casing: "snake_case" }) as Db;
}

export { schema };
