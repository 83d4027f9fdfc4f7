// A real Dropwise server on a free port, against a database of its own, for API and browser tests.
import path from "node:path";
import pino from "pino";
import { seedDemoOnce } from "../../db/seed";
import { projectRoot, readConfig } from "../../server/config";
import { startServer, type RunningServer } from "../../server/index";
import { createTestDb, type TestDb } from "./test-db";

export interface TestServer extends RunningServer {
  testDb: TestDb;
  stop(): Promise<void>;
}

export async function startTestServer({ seed = true } = {}): Promise<TestServer> {
  const testDb = await createTestDb();
  const config = readConfig({}, { port: 0, host: "127.0.0.1", databaseUrl: testDb.url, webDist: path.join(projectRoot, "dist") });
  const running = await startServer(config, pino({ level: "silent" }));
  if (seed) await seedDemoOnce(running.ctx.db);
  return {
    ...running,
    testDb,
    async stop() {
      await running.close();
      await testDb.drop();
    },
  };
}
