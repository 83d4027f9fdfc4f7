// expo-sqlite (on the web: SQLite in the browser's origin-private file system) behind SqlDb.
import * as SQLite from "expo-sqlite";
import type { SqlDb, SqlValue } from "./local-store";

function wrap(db: SQLite.SQLiteDatabase, exclusive: (fn: (tx: SqlDb) => Promise<unknown>) => Promise<unknown>): SqlDb {
  return {
    run: async (sql, params = []) => {
      await db.runAsync(sql, params as SQLite.SQLiteBindValue[]);
    },
    all: <T>(sql: string, params: SqlValue[] = []) => db.getAllAsync<T>(sql, params as SQLite.SQLiteBindValue[]),
    exclusive: exclusive as SqlDb["exclusive"],
  };
}

/** One database file per signed-in user, so one person's queue can never be sent as another's. */
export async function openUserDatabase(userId: string): Promise<SqlDb> {
  const db = await SQLite.openDatabaseAsync(`dropwise-${userId.replace(/[^\w-]/g, "_")}.db`);
  let chain: Promise<unknown> = Promise.resolve();
  const self: SqlDb = wrap(db, (fn) => {
    // Serialise our own exclusive sections too, so two taps never race for the next mutation id.
    const run = chain.then(async () => {
      let result: unknown;
      await db.withExclusiveTransactionAsync(async (txn) => {
        // Nested exclusive sections run inside this same transaction.
        const inTx: SqlDb = wrap(txn, (inner) => inner(inTx));
        result = await fn(inTx);
      });
      return result;
    });
    chain = run.catch(() => undefined);
    return run;
  });
  return self;
}
