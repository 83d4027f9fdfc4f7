// `npm run backup -- <folder>`: dump the database and the photos of this install into <folder>.
// `npm run restore -- <folder>`: restore them into a fresh private cluster (an empty DROPWISE_DATA_DIR).
import fs from "node:fs";
import path from "node:path";
import { readConfig } from "../server/config";
import { startLocalObjectStore } from "../server/storage/local-object-store";
import { createObjectStore } from "../server/storage/object-store";
import { backupTo, restoreFrom } from "./backup";
import { ensureDatabase, startCluster } from "./cluster";

async function main(action: string | undefined, folder: string | undefined) {
  if ((action !== "backup" && action !== "restore") || !folder) {
    throw new Error("Usage: npm run backup -- <folder>   or   npm run restore -- <folder>");
  }
  const config = readConfig();
  const dataRoot = process.env.DROPWISE_DATA_DIR ?? path.resolve(import.meta.dirname, "..", ".data");
  const pgDir = path.join(dataRoot, "postgres");
  if (action === "restore" && fs.existsSync(path.join(pgDir, "PG_VERSION"))) {
    throw new Error(`${pgDir} already holds a database. Restore into a fresh one: DROPWISE_DATA_DIR=<new folder> npm run restore -- ${folder}`);
  }
  const cluster = config.databaseUrl ? undefined : await startCluster({ dataDir: pgDir, port: Number(process.env.PGPORT ?? 54329), log: (l) => console.log(`dropwise: ${l}`) });
  let databaseUrl = config.databaseUrl;
  if (cluster) {
    await ensureDatabase(cluster, "dropwise");
    databaseUrl = cluster.url("dropwise");
  }
  const local = config.s3.endpoint ? undefined : await startLocalObjectStore(path.join(dataRoot, "objects"));
  const objects = createObjectStore(local ? { ...config.s3, ...local.credentials, endpoint: local.endpoint } : { ...config.s3, endpoint: config.s3.endpoint! });
  try {
    const summary = action === "backup" ? await backupTo(path.resolve(folder), databaseUrl, objects) : await restoreFrom(path.resolve(folder), databaseUrl, objects);
    console.log(`dropwise: ${action} done: database ${Math.round(summary.databaseBytes / 1024)} KB, ${summary.objects} photos (${path.resolve(folder)}).`);
  } finally {
    await local?.close();
    cluster?.stop();
  }
}

main(process.argv[2], process.argv[3]).catch((err) => {
  console.error(`dropwise: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
