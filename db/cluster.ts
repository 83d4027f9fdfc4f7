// A private PostgreSQL 15 cluster on 127.0.0.1, owned by this project: never the system cluster.
// initdb and pg_ctl refuse to run as root, so as root they run as the `postgres` user.
import { execFileSync, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";

export const PG_BIN = process.env.PG_BIN ?? "/usr/lib/postgresql/15/bin";
const isRoot = typeof process.getuid === "function" && process.getuid() === 0;

export class ClusterError extends Error {}

export interface ClusterOptions {
  dataDir: string;
  port: number;
  /** Test clusters trade durability for speed; never set this for a cluster that keeps real data. */
  throwaway?: boolean;
  log?: (line: string) => void;
}

export interface Cluster {
  port: number;
  dataDir: string;
  url(database: string): string;
  stop(): void;
}

/** Installs Debian's postgresql-15 when its binaries are missing (see ensure-postgres.sh). */
export function ensurePostgresInstalled(): void {
  if (fs.existsSync(path.join(PG_BIN, "pg_ctl"))) return;
  const script = path.join(import.meta.dirname, "ensure-postgres.sh");
  const result = spawnSync("bash", [script], { stdio: "inherit" });
  if (result.status !== 0) {
    throw new ClusterError(
      "PostgreSQL 15 is missing and could not be installed. Install Debian's postgresql-15 package, or set PG_BIN to its bin folder.",
    );
  }
}

function runAsOwner(bin: string, args: string[], opts: { quiet?: boolean } = {}) {
  const file = path.join(PG_BIN, bin);
  const [cmd, argv] = isRoot ? ["runuser", ["-u", "postgres", "--", file, ...args]] : [file, args];
  const result = spawnSync(cmd, argv, { cwd: "/", encoding: "utf8" });
  if (result.status !== 0 && !opts.quiet) {
    const detail = `${result.stderr ?? ""}${result.stdout ?? ""}`.trim().split("\n").slice(-6).join("\n");
    throw new ClusterError(`${bin} failed (exit ${result.status}):\n${detail}`);
  }
  return result;
}

/** Can the `postgres` user (when we are root) reach the folder that holds this data folder? */
export function canPostgresReach(dir: string): boolean {
  if (!isRoot) return true;
  // Walk up to the nearest folder that exists: the rest will be created for postgres.
  let parent = path.dirname(dir);
  while (!fs.existsSync(parent)) parent = path.dirname(parent);
  const probe = spawnSync("runuser", ["-u", "postgres", "--", "test", "-x", parent], { cwd: "/" });
  return probe.status === 0;
}

export function portIsFree(port: number, host = "127.0.0.1"): Promise<boolean> {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once("error", () => resolve(false));
    server.listen(port, host, () => server.close(() => resolve(true)));
  });
}

function prepareDataDir(dataDir: string) {
  // Parents stay traversable (the postgres user must reach the data folder); the folder itself is private.
  fs.mkdirSync(path.dirname(dataDir), { recursive: true, mode: 0o755 });
  fs.mkdirSync(dataDir, { recursive: true, mode: 0o700 });
  try {
    fs.accessSync(dataDir, fs.constants.W_OK);
  } catch {
    throw new ClusterError(`The database folder ${dataDir} is not writable. Fix its permissions or set DROPWISE_DATA_DIR.`);
  }
  if (isRoot) {
    execFileSync("chown", ["-R", "postgres:postgres", dataDir]);
    fs.chmodSync(dataDir, 0o700);
  }
}

function writeSettings(dataDir: string, port: number, throwaway: boolean) {
  const lines = [
    "# Written by Dropwise: a private cluster on loopback only.",
    `port = ${port}`,
    "listen_addresses = '127.0.0.1'",
    "unix_socket_directories = ''",
    "max_connections = 100",
    "shared_buffers = 64MB",
  ];
  if (throwaway) lines.push("fsync = off", "synchronous_commit = off", "full_page_writes = off");
  const file = path.join(dataDir, "postgresql.auto.conf");
  fs.writeFileSync(file, lines.join("\n") + "\n");
  if (isRoot) execFileSync("chown", ["postgres:postgres", file]);
}

function isRunning(dataDir: string): boolean {
  return runAsOwner("pg_ctl", ["status", "-D", dataDir], { quiet: true }).status === 0;
}

async function sleep(ms: number) {
  await new Promise((r) => setTimeout(r, ms));
}

export async function startCluster(options: ClusterOptions): Promise<Cluster> {
  const { dataDir, port, throwaway = false, log = () => {} } = options;
  ensurePostgresInstalled();
  if (!canPostgresReach(dataDir)) {
    throw new ClusterError(`The postgres user cannot reach ${path.dirname(dataDir)}.`);
  }
  prepareDataDir(dataDir);
  const fresh = !fs.existsSync(path.join(dataDir, "PG_VERSION"));
  if (fresh) {
    log(`creating a private PostgreSQL cluster in ${dataDir}`);
    runAsOwner("initdb", ["-D", dataDir, "-U", "postgres", "--auth=trust", "--encoding=UTF8", "--locale=C.UTF-8"]);
  }
  writeSettings(dataDir, port, throwaway);

  if (!isRunning(dataDir)) {
    if (!(await portIsFree(port))) {
      throw new ClusterError(`Port ${port} on 127.0.0.1 is taken, so the private database cannot start. Set PGPORT to a free port.`);
    }
    const logFile = path.join(dataDir, "server.log");
    // After a hard kill a stale postmaster.pid may refuse the start for a moment: retry briefly.
    let lastError: unknown;
    for (let attempt = 0; attempt < 6; attempt++) {
      try {
        runAsOwner("pg_ctl", ["start", "-w", "-t", "30", "-D", dataDir, "-l", logFile, "-s"]);
        lastError = undefined;
        break;
      } catch (err) {
        lastError = err;
        await sleep(700);
      }
    }
    if (lastError) throw lastError;
  }
  const cluster: Cluster = {
    port,
    dataDir,
    url: (database) => `postgres://postgres@127.0.0.1:${port}/${database}`,
    stop: () => {
      runAsOwner("pg_ctl", ["stop", "-D", dataDir, "-m", "fast", "-w", "-s"], { quiet: true });
    },
  };
  return cluster;
}

/** Creates a database if it does not exist yet (connects to the maintenance database). */
export async function ensureDatabase(cluster: Cluster, name: string): Promise<void> {
  const { default: pg } = await import("pg");
  const client = new pg.Client({ connectionString: cluster.url("postgres") });
  await client.connect();
  try {
    const found = await client.query("select 1 from pg_database where datname = $1", [name]);
    if (found.rowCount === 0) await client.query(`create database "${name.replace(/"/g, '""')}"`);
  } finally {
    await client.end();
  }
}

/** A free loopback port, searched from a random point in [from, from + spread). */
export async function findFreePort(from: number, spread = 2000): Promise<number> {
  for (let port = from + Math.floor(Math.random() * spread); port < 65535; port++) if (await portIsFree(port)) return port;
  throw new ClusterError(`No free port found above ${from}.`);
}
