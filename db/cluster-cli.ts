// `npm run db:start` / `npm run db:stop`: the start command's private cluster on its own.
import path from "node:path";
import { ensureDatabase, startCluster } from "./cluster";

const dataDir = path.join(process.env.DROPWISE_DATA_DIR ?? path.join(import.meta.dirname, "..", ".data"), "postgres");
const port = Number(process.env.PGPORT ?? 54329);

async function main(action: string | undefined) {
  const cluster = await startCluster({ dataDir, port, log: (l) => console.log(`dropwise: ${l}`) });
  if (action === "stop") {
    cluster.stop();
    console.log("dropwise: database stopped.");
    return;
  }
  await ensureDatabase(cluster, "dropwise");
  console.log(`dropwise: database running: psql -h 127.0.0.1 -p ${port} -U postgres dropwise`);
}

main(process.argv[2]).catch((err) => {
  console.error(`dropwise: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
