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
import type { AddressInfo } from "node:net";
import autocannon from "autocannon";
import express from "express";
import pino from "pino";
import request from "supertest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { seedDemoOnce } from "../../db/seed";
import { readConfig } from "../../server/config";
import { startServer } from "../../server/index";
import { csrfToken } from "../support/auth-client";
import { withBenchDatabase } from "./sync-bench";

function load(url: string, headers: Record<string, string> = {}): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => {
    autocannon({ url, connections: 10, duration: 6, headers }, (err, result) => (err ? reject(err) : resolve(result)));
  });
}

export async function runApiBench(): Promise<{ name: string; figures: Record<string, number | string> }> {
  return withBenchDatabase(async (databaseUrl) => {
    const config = readConfig({}, {
      port: 0,
      databaseUrl,
      authSecret: randomBytes(32).toString("base64url"),
      authRateLimit: 100_000,
      objectsDir: fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-bench-objects-")),
    });
    const running = await startServer(config, { logger: pino({ level: "silent" }) });
    await seedDemoOnce(running.ctx.db);
    const agent = request.agent(running.url);
    const token = await csrfToken(agent);
    const signed = await agent.post("/auth/callback/credentials").set("X-Auth-Return-Redirect", "1").type("form").send({ email: "tomas@lanternfield.test", password: DEMO_PASSWORD, csrfToken: token });
    const cookie = ([] as string[]).concat(signed.headers["set-cookie"]).find((c) => c.startsWith("authjs.session-token="))!.split(";")[0];

    const hello = express();
    hello.disable("x-powered-by");
    hello.get("/hello", (_req, res) => {
      res.json({ ok: true });
    });
    const helloServer = await new Promise<import("node:http").Server>((resolve) => {
      const s = hello.listen(0, "127.0.0.1", () => resolve(s));
    });

    let peakRss = process.memoryUsage().rss;
    const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);
    await load(`${running.url}/api/sites`, { cookie }); // warm-up
    const api = await load(`${running.url}/api/sites`, { cookie });
    clearInterval(sampler);
    await load(`http://127.0.0.1:${(helloServer.address() as AddressInfo).port}/hello`);
    const base = await load(`http://127.0.0.1:${(helloServer.address() as AddressInfo).port}/hello`);
    helloServer.close();
    await running.close();

    const errors = api.errors + api.non2xx;
    return {
      name: "api: signed-in GET /api/sites under autocannon (10 connections, 6 s)",
      figures: {
        "signed-in read p50 (ms)": api.latency.p50,
        "signed-in read p99 (ms)": api.latency.p99,
        "signed-in read requests/s": Math.round(api.requests.average),
        "hello-world p50 (ms)": base.latency.p50,
        "hello-world p99 (ms)": base.latency.p99,
        "p50 ratio (target ≤ 3×)": Number((api.latency.p50 / Math.max(base.latency.p50, 0.5)).toFixed(2)),
        "errors or non-2xx": errors,
        "server peak resident memory during the load (MB, target < 300)": Math.round(peakRss / 1024 / 1024),
      },
    };
  });
}

if (/api-bench\.ts$/.test(process.argv[1] ?? "")) {
  runApiBench().then((r) => {
    console.log(r.name);
    for (const [k, v] of Object.entries(r.figures)) console.log(`  ${k}: ${v}`);
  });
}
