// SqlDb over sql.js (SQLite compiled to WebAssembly) so the phone's store runs under vitest.
import initSqlJs, { type Database } from "sql.js";
import type { SqlDb, SqlValue } from "../../sync/local-store";

let sqlJs: Awaited<ReturnType<typeof initSqlJs>> | undefined;

export async function memoryDb(): Promise<SqlDb & { raw: Database }> {
  sqlJs ??= await initSqlJs();
  const raw = new sqlJs.Database();
  let chain: Promise<unknown> = Promise.resolve();
  let depth = 0;
  const db: SqlDb & { raw: Database } = {
    raw,
    async run(sql, params = []) {
      raw.run(sql, params as never);
    },
    async all<T>(sql: string, params: SqlValue[] = []) {
      const stmt = raw.prepare(sql);
      stmt.bind(params as never);
      const rows: T[] = [];
      while (stmt.step()) rows.push(stmt.getAsObject() as T);
      stmt.free();
      return rows;
    },
    exclusive<T>(fn: (tx: SqlDb) => Promise<T>): Promise<T> {
      if (depth > 0) return fn(db);
      const run = chain.then(async () => {
        depth++;
        raw.run("begin exclusive");
        try {
          const result = await fn(db);
          raw.run("commit");
          return result;
        } catch (err) {
          raw.run("rollback");
          throw err;
        } finally {
          depth--;
        }
      });
      chain = run.catch(() => undefined);
      return run;
    },
  };
  return db;
}
