/**
 * API benchmark: a signed-in read (GET /api/sites) under autocannon, against a hello-world Express
 * route served with the same process settings, plus the server's peak resident memory during the load.
 *
 *   npx tsx tests/bench/api-bench.ts
 */
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { spawn } from "node:child_process";
import autocannon from "autocannon";
import request from "supertest";
import { createDb } from "../../db/client";
import { findFreePort } from "../../db/cluster";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { runMigrations } from "../../db/migrate";
import { seedDemoOnce } from "../../db/seed";
import { projectRoot } from "../../server/config";
import { startSmtpSink } from "../../server/mail/smtp-sink";
import { startFakePaymentProvider } from "../../server/payments/fake-payment-provider";
import { startLocalObjectStore } from "../../server/storage/local-object-store";
import { csrfToken } from "../support/auth-client";
import { buildServer, spawnServer } from "../support/server-process";
import { withBenchDatabase } from "./sync-bench";

function load(url: string, headers: Record<string, string> = {}): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => {
    autocannon({ url, connections: 10, duration: 6, headers }, (err, result) => (err ? reject(err) : resolve(result)));
  });
}

/** Peak resident memory of a process, from the kernel's own high-water mark. */
function peakRssMb(pid: number): number {
  const status = fs.readFileSync(`/proc/${pid}/status`, "utf8");
  const kb = Number(/VmHWM:\s+(\d+) kB/.exec(status)?.[1] ?? 0);
  return Math.round(kb / 1024);
}

/** CPU time (user + system) a process has used so far, in ms, from /proc (clock ticks of 10 ms). */
function cpuMs(pid: number): number {
  const fields = fs.readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1].split(" ");
  return (Number(fields[11]) + Number(fields[12])) * 10;
}

/** Load `url` and also report the CPU the serving process spent per request (less noisy than latency on a shared machine). */
async function loadMeasured(pid: number, url: string, headers: Record<string, string> = {}) {
  const before = cpuMs(pid);
  const result = await load(url, headers);
  return { result, cpuUsPerRequest: ((cpuMs(pid) - before) * 1000) / Math.max(1, result.requests.total) };
}

/** A hello-world Express route in its own process, run the way the production server runs (plain node, NODE_ENV=production). */
async function spawnHelloWorld(port: number) {
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-hello-")), "hello.mjs");
  fs.writeFileSync(file, `import express from ${JSON.stringify(path.join(projectRoot, "node_modules", "express", "index.js"))};\nconst app = express();\napp.disable("x-powered-by");\napp.get("/hello", (_req, res) => { res.json({ ok: true }); });\napp.listen(${port}, "127.0.0.1", () => console.log("listening on ${port}"));\n`);
  const child = spawn(process.execPath, [file], { cwd: projectRoot, stdio: ["ignore", "pipe", "inherit"], env: { ...process.env, NODE_ENV: "production" } });
  await new Promise<void>((resolve) => child.stdout!.on("data", (d) => String(d).includes("listening") && resolve()));
  return child;
}

/** Extra Node flags for the server process, e.g. BENCH_SERVER_NODE_ARGS="--cpu-prof --cpu-prof-dir=/tmp/prof" to profile it. */
function serverNodeArgs(): string[] {
  return (process.env.BENCH_SERVER_NODE_ARGS ?? "").split(/\s+/).filter(Boolean);
}

export async function runApiBench(): Promise<{ name: string; figures: Record<string, number | string> }> {
  return withBenchDatabase(async (databaseUrl) => {
    const db = createDb(databaseUrl);
    await runMigrations(db);
    await seedDemoOnce(db);
    await db.$client.end();
    const port = await findFreePort(47_000, 3000);
    // The hosted services' local stand-ins run here, in the bench process, so the server process
    // measured is shaped like a deployment: it talks to an object store, a mail relay and a payments
    // provider over the network instead of carrying them inside.
    const objectStore = await startLocalObjectStore(fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-bench-objects-")));
    const sinkDb = createDb(databaseUrl, { max: 2 });
    const mailSink = await startSmtpSink(sinkDb, { port: 0 });
    const payments = await startFakePaymentProvider({ webhookUrl: () => `http://127.0.0.1:${port}/api/payments/webhook` });
    buildServer();
    const server = await spawnServer({
      entry: "build",
      databaseUrl,
      port,
      authSecret: randomBytes(32).toString("base64url"),
      nodeArgs: serverNodeArgs(),
      extra: {
        NODE_ENV: "production",
        AUTH_RATE_LIMIT: "100000",
        S3_ENDPOINT: objectStore.endpoint,
        S3_ACCESS_KEY_ID: objectStore.credentials.accessKeyId,
        S3_SECRET_ACCESS_KEY: objectStore.credentials.secretAccessKey,
        SMTP_URL: `smtp://127.0.0.1:${mailSink.port}`,
        PAYMENTS_SECRET_KEY: payments.secretKey,
        PAYMENTS_WEBHOOK_SECRET: payments.webhookSecret,
        PAYMENTS_API_ORIGIN: payments.origin,
      },
    });
    const helloPort = await findFreePort(50_000, 3000);
    const hello = await spawnHelloWorld(helloPort);
    try {
      const agent = request.agent(server.url);
      const token = await csrfToken(agent);
      const signed = await agent.post("/auth/callback/credentials").set("X-Auth-Return-Redirect", "1").type("form").send({ email: "tomas@lanternfield.test", password: DEMO_PASSWORD, csrfToken: token });
      const cookie = ([] as string[]).concat(signed.headers["set-cookie"]).find((c) => c.startsWith("authjs.session-token="))!.split(";")[0];
      await load(`${server.url}/api/sites`, { cookie }); // warm-up
      const { result: api, cpuUsPerRequest: apiCpu } = await loadMeasured(server.child.pid!, `${server.url}/api/sites`, { cookie });
      const serverPeak = peakRssMb(server.child.pid!);
      await load(`http://127.0.0.1:${helloPort}/hello`);
      const { result: base, cpuUsPerRequest: baseCpu } = await loadMeasured(hello.pid!, `http://127.0.0.1:${helloPort}/hello`);
      return {
        name: "api: signed-in GET /api/sites under autocannon (10 connections, 6 s), the production build (npm run build:server) in its own process, hosted services outside it",
        figures: {
          "signed-in read p50 (ms)": api.latency.p50,
          "signed-in read p99 (ms)": api.latency.p99,
          "signed-in read requests/s": Math.round(api.requests.average),
          "hello-world p50 (ms)": base.latency.p50,
          "hello-world p99 (ms)": base.latency.p99,
          "p50 ratio (target ≤ 3×)": Number((api.latency.p50 / Math.max(base.latency.p50, 0.5)).toFixed(2)),
          "server CPU per signed-in read (µs)": Math.round(apiCpu),
          "server CPU per hello-world request (µs)": Math.round(baseCpu),
          "CPU per request ratio": Number((apiCpu / Math.max(baseCpu, 1)).toFixed(2)),
          "errors or non-2xx": api.errors + api.non2xx,
          "server peak resident memory, whole run (MB, target < 300)": serverPeak,
        },
      };
    } finally {
      server.child.kill("SIGTERM");
      await server.exited;
      hello.kill("SIGKILL");
      await Promise.all([objectStore.close(), mailSink.close(), payments.close()]);
      await sinkDb.$client.end();
    }
  });
}

if (/api-bench\.ts$/.test(process.argv[1] ?? "")) {
  runApiBench().then((r) => {
    console.log(r.name);
    for (const [k, v] of Object.entries(r.figures)) console.log(`  ${k}: ${v}`);
  });
}
