// The server alone, for production and for anything that runs it as a process (the fault tests):
// DATABASE_URL and AUTH_SECRET from the environment, no database or web build of its own.
// SIGTERM stops accepting, lets in-flight requests finish, closes the pool, then exits.
// This project runs on Node 20; the object-store SDK prints a notice about its future releases at every start.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= "true";

import { readConfig } from "./config";
import { startServer } from "./index";
import { createLogger } from "./logger";

async function main() {
  const config = readConfig();
  if (!config.databaseUrl) throw new Error("DATABASE_URL is not set. `npm start` runs a private database for you; a deployment sets DATABASE_URL.");
  const logger = createLogger();
  const running = await startServer(config, { logger });
  logger.info({ url: running.url }, "listening");
  console.log(`dropwise: listening on ${running.url}`);
  let stopping = false;
  process.on("SIGTERM", () => {
    if (stopping) return;
    stopping = true;
    logger.info("SIGTERM: finishing in-flight requests");
    running.close().then(
      () => process.exit(0),
      () => process.exit(1),
    );
  });
}

main().catch((err) => {
  console.error(`dropwise: could not start: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
