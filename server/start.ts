// `npm start`: the private database, migrations, the demo data (once), the web build (when its
// sources changed) and the server, at http://127.0.0.1:8080. Ctrl-C stops the server and the database.
// This project runs on Node 20; the object-store SDK prints a notice about its future releases at every start.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= "true";

import { createHash } from "node:crypto";
import path from "node:path";
import { canPostgresReach, ClusterError, ensureDatabase, portIsFree, startCluster, type Cluster } from "../db/cluster";
import { DEMO_PASSWORD, demoAccounts } from "../db/demo-accounts";
import { seedDemoOnce } from "../db/seed";
import { projectRoot, readConfig } from "./config";
import { startServer, type RunningServer } from "./index";
import { createLogger } from "./logger";
import { loadLocalEnv } from "./local-env";
import { buildWebIfChanged } from "./web-build";

const say = (line: string) => console.log(`dropwise: ${line}`);

function dataFolder(): string {
  const preferred = process.env.DROPWISE_DATA_DIR ?? path.join(projectRoot, ".data");
  const pgDir = path.join(preferred, "postgres");
  if (canPostgresReach(pgDir)) return pgDir;
  const fallback = path.join("/var/tmp", `dropwise-${createHash("sha256").update(projectRoot).digest("hex").slice(0, 10)}`, "postgres");
  say(`the postgres user cannot reach ${preferred}; keeping the database in ${fallback} instead.`);
  return fallback;
}

async function main() {
  const { created } = loadLocalEnv();
  if (created) say("generated AUTH_SECRET into .env.local (ignored by git).");
  const config = readConfig();
  if (!(await portIsFree(config.port, config.host))) {
    throw new Error(`Port ${config.port} on ${config.host} is already in use. Stop the other program or start with PORT=<free port> npm start.`);
  }
  const pgPort = Number(process.env.PGPORT ?? 54329);
  let cluster: Cluster | undefined;
  let running: RunningServer | undefined;
  let stopping = false;
  const stop = async (code = 0) => {
    if (stopping) return;
    stopping = true;
    say("stopping…");
    await running?.close().catch(() => {});
    cluster?.stop();
    say("stopped. Your data is kept for the next start.");
    process.exit(code);
  };
  process.on("SIGINT", () => void stop(0));
  process.on("SIGTERM", () => void stop(0));

  try {
    if (!config.databaseUrl) {
      cluster = await startCluster({ dataDir: dataFolder(), port: pgPort, log: say });
      await ensureDatabase(cluster, "dropwise");
      config.databaseUrl = cluster.url("dropwise");
      say(`database ready on 127.0.0.1:${pgPort}`);
    }
    if (buildWebIfChanged(config.webDist, say)) say("web app built.");
    running = await startServer(config, {
      logger: createLogger(process.env.LOG_LEVEL ?? "warn"),
      onMail: (mail) => say(`mail to ${mail.to}: "${mail.subject}"${mail.links.length ? ` ${mail.links.join(" ")}` : ""}`),
    });
    const seeded = await seedDemoOnce(running.ctx.db);
    if (seeded) say("demo data loaded (the Okonkwo-Lindqvist house).");
    say(`Dropwise is running at ${running.url}`);
    say("demo sign-in accounts:");
    for (const a of demoAccounts) {
      const how = a.role === "client" ? "sign in with an e-mailed link" : `password ${DEMO_PASSWORD}`;
      console.log(`    ${a.role.padEnd(9)} ${a.email.padEnd(30)} ${how}`);
    }
    if (config.mailSink) say(`e-mail is captured locally (no SMTP_URL set): admins see it under Team › Outbox, and each message is printed here.`);
    say("press Ctrl-C to stop.");
  } catch (err) {
    const message = err instanceof ClusterError || err instanceof Error ? err.message : String(err);
    console.error(`dropwise: could not start.\n${message}`);
    await stop(1);
  }
}

void main();
