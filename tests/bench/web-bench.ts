/**
 * Web benchmark:
 *  - first-load JavaScript of the web build (gzip) against an empty Expo Router app exported with
 *    the same settings in the same run;
 *  - reload with no network to an interactive capture screen, in headless Chromium;
 *  - the browser's JS heap with the demo site open in the plan view.
 *
 *   npx tsx tests/bench/web-bench.ts
 */
import { randomBytes } from "node:crypto";
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { gzipSync } from "node:zlib";
import pino from "pino";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID, seedDemoOnce } from "../../db/seed";
import { projectRoot, readConfig } from "../../server/config";
import { startServer } from "../../server/index";
import { buildWebIfChanged } from "../../server/web-build";
import { DESKTOP, PHONE, launchBrowser } from "../support/browser";
import { findFreePort } from "../../db/cluster";
import { withBenchDatabase } from "./sync-bench";

function jsGzipBytes(distDir: string): number {
  let total = 0;
  const walk = (dir: string) => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (entry.name.endsWith(".js")) total += gzipSync(fs.readFileSync(full), { level: 9 }).byteLength;
    }
  };
  walk(path.join(distDir, "_expo"));
  return total;
}

/** An empty Expo Router app (one layout, one screen) with our app.json settings, exported like ours. */
function exportEmptyApp(): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-empty-app-"));
  fs.mkdirSync(path.join(dir, "app"));
  fs.symlinkSync(path.join(projectRoot, "node_modules"), path.join(dir, "node_modules"), "dir");
  fs.writeFileSync(path.join(dir, "package.json"), JSON.stringify({ name: "empty", version: "1.0.0", main: "expo-router/entry" }));
  const appJson = JSON.parse(fs.readFileSync(path.join(projectRoot, "app.json"), "utf8"));
  delete appJson.expo.icon;
  delete appJson.expo.web.favicon;
  fs.writeFileSync(path.join(dir, "app.json"), JSON.stringify(appJson));
  fs.copyFileSync(path.join(projectRoot, "metro.config.js"), path.join(dir, "metro.config.js"));
  fs.writeFileSync(path.join(dir, "tsconfig.json"), JSON.stringify({ extends: "expo/tsconfig.base" }));
  fs.writeFileSync(path.join(dir, "app", "_layout.tsx"), 'import { Stack } from "expo-router";\nexport default function Layout() { return <Stack />; }\n');
  fs.writeFileSync(path.join(dir, "app", "index.tsx"), 'import { Text } from "react-native";\nexport default function Home() { return <Text>Hello</Text>; }\n');
  const out = path.join(dir, "dist");
  const result = spawnSync(path.join(projectRoot, "node_modules", ".bin", "expo"), ["export", "--platform", "web", "--output-dir", out], { cwd: dir, encoding: "utf8", env: { ...process.env, CI: "1", EXPO_NO_TELEMETRY: "1" } });
  if (result.status !== 0) throw new Error(`empty app export failed: ${(result.stderr || result.stdout).slice(-800)}`);
  return out;
}

export async function runWebBench(): Promise<{ name: string; figures: Record<string, number | string> }> {
  const figures: Record<string, number | string> = {};
  const dist = path.join(projectRoot, "dist");
  buildWebIfChanged(dist, () => {});
  const ours = jsGzipBytes(dist);
  const emptyDist = exportEmptyApp();
  const empty = jsGzipBytes(emptyDist);
  fs.rmSync(path.dirname(emptyDist), { recursive: true, force: true });
  figures["first-load JS, gzip (KB)"] = Math.round(ours / 1024);
  figures["empty Expo Router app, same settings (KB)"] = Math.round(empty / 1024);
  figures["JS ratio (target ≤ 1.5×)"] = Number((ours / empty).toFixed(2));

  await withBenchDatabase(async (databaseUrl) => {
    const port = await findFreePort(46_000, 4000);
    const config = readConfig({}, { port, publicOrigin: `http://127.0.0.1:${port}`, databaseUrl, authSecret: randomBytes(32).toString("base64url"), authRateLimit: 10_000, objectsDir: fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-bench-objects-")) });
    const running = await startServer(config, { logger: pino({ level: "silent" }) });
    await seedDemoOnce(running.ctx.db);
    const browser = await launchBrowser();
    try {
      const signIn = async (page: import("playwright-core").Page, email: string) => {
        await page.goto(`${running.url}/sign-in`, { waitUntil: "networkidle" });
        await page.getByRole("textbox", { name: "E-mail" }).fill(email);
        await page.getByRole("textbox", { name: "Password" }).fill(DEMO_PASSWORD);
        await page.getByRole("button", { name: "Sign in" }).click();
        await page.getByRole("navigation", { name: "Main" }).waitFor();
      };
      // Offline reload: the surveyor opens the walk once online (the service worker keeps the app), then reloads with no network.
      const phone = await browser.newContext({ viewport: PHONE, serviceWorkers: "allow" });
      const page = await phone.newPage();
      await signIn(page, "priya@lanternfield.test");
      await page.getByRole("link", { name: /Okonkwo-Lindqvist house/ }).first().click();
      await page.getByRole("link", { name: /^Sync: up to date/ }).waitFor({ timeout: 20_000 });
      await page.evaluate(async () => {
        await navigator.serviceWorker.ready;
      });
      await page.reload({ waitUntil: "networkidle" }); // now under the service worker's control
      await page.getByRole("link", { name: /^Sync: up to date/ }).waitFor({ timeout: 20_000 });
      await phone.setOffline(true);
      const times: number[] = [];
      for (let i = 0; i < 5; i++) {
        const t = Date.now();
        await page.reload({ waitUntil: "domcontentloaded" });
        // The walk view is interactive once its sync pill and its "Add room" buttons are there.
        await page.getByRole("link", { name: /^Sync: / }).first().waitFor({ timeout: 20_000 });
        await page.getByRole("button", { name: /^Add room to / }).first().waitFor({ timeout: 20_000 });
        times.push(Date.now() - t);
      }
      times.sort((a, b) => a - b);
      figures["offline reload to the capture screen (ms, median of 5; target < 1,000)"] = times[2];
      await phone.close();

      // JS heap with the plan open.
      const desk = await browser.newContext({ viewport: DESKTOP });
      const dp = await desk.newPage();
      await signIn(dp, "tomas@lanternfield.test");
      await dp.goto(`${running.url}/sites/${DEMO_SITE_ID}/plan`, { waitUntil: "networkidle" });
      await dp.waitForTimeout(1500);
      const cdp = await desk.newCDPSession(dp);
      await cdp.send("HeapProfiler.collectGarbage");
      const heap = (await cdp.send("Runtime.getHeapUsage")) as { usedSize: number };
      figures["browser JS heap, plan view of the demo site (MB)"] = Number((heap.usedSize / 1024 / 1024).toFixed(1));
      await desk.close();
    } finally {
      await browser.close();
      await running.close();
    }
  });
  return { name: "web: bundle size, offline reload, memory", figures };
}

if (/web-bench\.ts$/.test(process.argv[1] ?? "")) {
  runWebBench().then((r) => {
    console.log(r.name);
    for (const [k, v] of Object.entries(r.figures)) console.log(`  ${k}: ${v}`);
  });
}
