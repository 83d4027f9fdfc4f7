// The real server as a separate process, so a test can kill -9 it, SIGTERM it and start it again.
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { projectRoot } from "../../server/config";

export interface ServerProcess {
  url: string;
  child: ChildProcess;
  exited: Promise<number | null>;
  output: () => string;
}

export const builtServerEntry = path.join(projectRoot, "build", "server.mjs");

/** Builds the production server bundle (what `npm run build:server` does). */
export function buildServer(): void {
  const result = spawnSync("npm", ["run", "--silent", "build:server"], { cwd: projectRoot, encoding: "utf8" });
  if (result.status !== 0) throw new Error(`npm run build:server failed: ${result.stderr || result.stdout}`);
}

export async function spawnServer(env: { databaseUrl: string; port: number; authSecret: string; objectsDir?: string; extra?: Record<string, string>; nodeArgs?: string[]; entry?: "source" | "build" }): Promise<ServerProcess> {
  // `node --import tsx`, not the tsx wrapper: the pid we hold must be the server itself, or kill -9
  // would leave it running.
  // The production build (npm run build:server) runs on plain node; the sources through tsx.
  const entry = env.entry === "build" ? [builtServerEntry] : ["--import", "tsx", path.join(projectRoot, "server", "main.ts")];
  const child = spawn(process.execPath, [...(env.nodeArgs ?? []), ...entry], {
    cwd: projectRoot,
    env: {
      ...process.env,
      DATABASE_URL: env.databaseUrl,
      PORT: String(env.port),
      HOST: "127.0.0.1",
      AUTH_SECRET: env.authSecret,
      LOG_LEVEL: "warn",
      AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: "true",
      DROPWISE_DATA_DIR: env.objectsDir ?? fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-proc-")),
      ...env.extra,
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let out = "";
  child.stdout!.on("data", (d) => (out += d));
  child.stderr!.on("data", (d) => (out += d));
  const exited = new Promise<number | null>((resolve) => child.once("exit", (code) => resolve(code)));
  const url = `http://127.0.0.1:${env.port}`;
  const deadline = Date.now() + 30_000;
  while (!out.includes("listening on")) {
    if (child.exitCode !== null) throw new Error(`server exited: ${out}`);
    if (Date.now() > deadline) {
      child.kill("SIGKILL");
      throw new Error(`server did not start: ${out}`);
    }
    await new Promise((r) => setTimeout(r, 50));
  }
  return { url, child, exited, output: () => out };
}
