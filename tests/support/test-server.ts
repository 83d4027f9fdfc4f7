import { randomBytes } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
// A real Dropwise server on a free port, against a database of its own, for API and browser tests.
import path from "node:path";
import pino from "pino";
import type { Db } from "../../db/client";
import { seedDemoOnce } from "../../db/seed";
import type { AppContext } from "../../server/context";
import { createMailer } from "../../server/mail/mailer";
import { memoryObjectStore } from "./memory-object-store";
import { projectRoot, readConfig, type ServerConfig } from "../../server/config";
import { startServer, type RunningServer } from "../../server/index";
import { createTestDb, type TestDb } from "./test-db";
import { findFreePort } from "../../db/cluster";


export interface TestServer extends RunningServer {
  testDb: TestDb;
  stop(): Promise<void>;
}

export async function startTestServer({ seed = true, config: overrides = {}, reuse }: { seed?: boolean; config?: Partial<ServerConfig>; reuse?: TestDb } = {}): Promise<TestServer> {
  // `reuse` restarts a server over an existing test database (its data must survive).
  const testDb = reuse ?? (await createTestDb());
  // A fixed free port, so the public origin (and every link in captured mail) is the real address.
  // The port is free when chosen, but the stand-ins the server starts first (mail sink, payments,
  // object store) listen on ports the system picks, which can be that one: then choose again.
  let running: RunningServer | undefined;
  for (let attempt = 1; !running; attempt++) {
    const port = overrides.port ?? (await findFreePort(42_000, 8000));
    const config = testConfig({ databaseUrl: testDb.url, port, publicOrigin: `http://127.0.0.1:${port}`, ...overrides });
    try {
      running = await startServer(config, { logger: pino({ level: "silent" }) });
    } catch (err) {
      if (overrides.port !== undefined || attempt >= 5 || !/already in use/.test(String(err))) throw err;
    }
  }
  if (seed) await seedDemoOnce(running.ctx.db);
  return {
    ...running,
    testDb,
    async stop() {
      await running.close();
      if (!reuse) await testDb.drop();
    },
  };
}

/** A server configuration for tests: random secret, free port, the shared web build. */
export function testConfig(overrides: Partial<ServerConfig> = {}): ServerConfig {
  return readConfig({}, {
    port: 0,
    host: "127.0.0.1",
    webDist: path.join(projectRoot, "dist"),
    authSecret: randomBytes(32).toString("base64url"),
    authRateLimit: 1000,
    objectsDir: fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-objects-")),
    ...overrides,
  });
}

/** An app context without a running server, for supertest against createApp(); mail is not delivered. */
export function testContext(db: Db, overrides: Partial<ServerConfig> = {}): AppContext {
  const config = testConfig({ databaseUrl: "postgres://unused", ...overrides });
  return { db, config, logger: pino({ level: "silent" }), mailer: createMailer({ transport: { jsonTransport: true }, from: config.mailFrom }), objects: memoryObjectStore() };
}
