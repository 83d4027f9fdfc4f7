// expo-sqlite (on the web: SQLite in the browser's origin-private file system) behind SqlDb.
//
// expo-sqlite's exclusive transactions are not available on the web, and its plain transaction
// picks up any other statement that runs meanwhile. So every statement of the store goes through
// one queue here: a transaction holds the queue until it commits, and nothing interleaves with it.
import * as SQLite from "expo-sqlite";
import type { SqlDb, SqlValue } from "./local-store";

function direct(db: SQLite.SQLiteDatabase, exclusive: SqlDb["exclusive"]): SqlDb {
  return {
    run: async (sql, params = []) => {
      await db.runAsync(sql, params as SQLite.SQLiteBindValue[]);
    },
    all: <T>(sql: string, params: SqlValue[] = []) => db.getAllAsync<T>(sql, params as SQLite.SQLiteBindValue[]),
    exclusive,
  };
}

/** One database file per signed-in user, so one person's queue can never be sent as another's. */
export async function openUserDatabase(userId: string): Promise<SqlDb> {
  const db = await SQLite.openDatabaseAsync(`dropwise-${userId.replace(/[^\w-]/g, "_")}.db`);
  let queue: Promise<unknown> = Promise.resolve();
  const enqueue = <T>(task: () => Promise<T>): Promise<T> => {
    const run = queue.then(task);
    queue = run.catch(() => undefined);
    return run;
  };
  const exclusive = <T>(fn: (tx: SqlDb) => Promise<T>): Promise<T> =>
    enqueue(async () => {
      let result!: T;
      // Inside the transaction, statements (and nested sections) run directly: we hold the queue.
      const inTx: SqlDb = direct(db, (inner) => inner(inTx) as never);
      await db.withTransactionAsync(async () => {
        result = await fn(inTx);
      });
      return result;
    });
  const outer = direct(db, exclusive);
  return {
    run: (sql, params) => enqueue(() => outer.run(sql, params)),
    all: <T>(sql: string, params?: SqlValue[]) => enqueue(() => outer.all<T>(sql, params)),
    exclusive,
  };
}
