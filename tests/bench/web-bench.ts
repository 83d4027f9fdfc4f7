/**
 * Web benchmark:
 *  - first-load JavaScript (gzip): the JS the browser actually requests when it opens the app's
 *    first screen cold (fresh profile, empty cache, no service worker), against an empty Expo Router
 *    app exported with the same settings in the same run and opened the same way. Routes load on
 *    demand (Expo Router async routes), so this is less than the export's total JS, which is also
 *    printed, for both;
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
import express from "express";
import type { Browser, Page } from "playwright-core";
import pino from "pino";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID, seedDemoOnce } from "../../db/seed";
import { projectRoot, readConfig } from "../../server/config";
import { startServer } from "../../server/index";
import { buildWebIfChanged } from "../../server/web-build";
import { DESKTOP, PHONE, launchBrowser } from "../support/browser";
import { findFreePort } from "../../db/cluster";
import { withBenchDatabase } from "./sync-bench";

/** Every .js file of an export, gzipped one by one: all the JS there is, whether a screen asks for it or not. */
function totalJsGzipBytes(distDir: string): number {
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
  // Its own temporary folder, so its own bundler cache: Metro keys cached transforms by the real
  // paths of the files, and node_modules here is ours, so a shared cache would hand this app our
  // app's routes, or ours this app's ("No routes found").
  const tmp = path.join(dir, "tmp");
  fs.mkdirSync(tmp);
  const result = spawnSync(path.join(projectRoot, "node_modules", ".bin", "expo"), ["export", "--platform", "web", "--output-dir", out], { cwd: dir, encoding: "utf8", env: { ...process.env, CI: "1", EXPO_NO_TELEMETRY: "1", TMPDIR: tmp } });
  if (result.status !== 0) throw new Error(`empty app export failed: ${(result.stderr || result.stdout).slice(-800)}`);
  return out;
}

/** Serves an export like our server does for the web app: static files, the isolation headers, the single-page fallback. */
async function serveStatic(distDir: string): Promise<{ url: string; close: () => Promise<void> }> {
  const app = express();
  app.use((_req, res, next) => {
    res.setHeader("Cross-Origin-Opener-Policy", "same-origin");
    res.setHeader("Cross-Origin-Embedder-Policy", "require-corp");
    next();
  });
  app.use(express.static(distDir, { index: false }));
  app.get("/{*splat}", (_req, res) => res.sendFile(path.join(distDir, "index.html")));
  const server = await new Promise<import("node:http").Server>((resolve) => {
    const s = app.listen(0, "127.0.0.1", () => resolve(s));
  });
  const { port } = server.address() as import("node:net").AddressInfo;
  return { url: `http://127.0.0.1:${port}`, close: () => new Promise((resolve) => server.close(() => resolve())) };
}

interface FirstLoad {
  gzip: number;
  files: number;
}

/**
 * Opens `url` in a fresh context (empty cache, service workers blocked so nothing is fetched ahead),
 * waits until `ready` says the first screen is there and the network is idle, and adds up the
 * JavaScript the page (and any worker it started) received: each response gzipped at level 9.
 */
async function measureFirstLoadJs(browser: Browser, url: string, ready: (page: Page) => Promise<void>, storageState?: Awaited<ReturnType<import("playwright-core").BrowserContext["storageState"]>>): Promise<FirstLoad> {
  const context = await browser.newContext({ viewport: PHONE, serviceWorkers: "block", storageState });
  const page = await context.newPage();
  const bodies: Promise<number>[] = [];
  const seen = new Set<string>();
  page.on("response", (response) => {
    const type = response.headers()["content-type"] ?? "";
    const isJs = /javascript/.test(type) || new URL(response.url()).pathname.endsWith(".js");
    if (!isJs || seen.has(response.url())) return;
    seen.add(response.url());
    bodies.push(response.body().then((b) => gzipSync(b, { level: 9 }).byteLength, () => 0));
  });
  try {
    await page.goto(url, { waitUntil: "domcontentloaded" });
    await ready(page);
    await page.waitForLoadState("networkidle");
    await page.waitForTimeout(500); // anything the screen asks for just after it shows
    await page.waitForLoadState("networkidle");
    const sizes = await Promise.all(bodies);
    return { gzip: sizes.reduce((a, b) => a + b, 0), files: sizes.length };
  } finally {
    await context.close();
  }
}

const kb = (bytes: number) => Math.round(bytes / 1024);

export async function runWebBench(): Promise<{ name: string; figures: Record<string, number | string> }> {
  const figures: Record<string, number | string> = {};
  const dist = path.join(projectRoot, "dist");
  buildWebIfChanged(dist, () => {});
  const emptyDist = exportEmptyApp();
  const oursTotal = totalJsGzipBytes(dist);
  const emptyTotal = totalJsGzipBytes(emptyDist);
  const emptyServer = await serveStatic(emptyDist);

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

      // First-load JS. The empty app's first screen is its "Hello" text; ours, opened cold at "/", is the sign-in form.
      const empty = await measureFirstLoadJs(browser, `${emptyServer.url}/`, (p) => p.getByText("Hello").waitFor());
      const ours = await measureFirstLoadJs(browser, `${running.url}/`, (p) => p.getByRole("textbox", { name: "E-mail" }).waitFor());
      // For the record (not the target): a signed-in surveyor opening the app cold, with an empty cache.
      const session = await browser.newContext({ viewport: PHONE, serviceWorkers: "block" });
      const sp = await session.newPage();
      await signIn(sp, "priya@lanternfield.test");
      const signedInState = await session.storageState();
      await session.close();
      const surveyor = await measureFirstLoadJs(
        browser,
        `${running.url}/`,
        async (p) => {
          await p.getByRole("navigation", { name: "Main" }).waitFor();
          await p.getByRole("link", { name: /Okonkwo-Lindqvist house/ }).first().waitFor();
        },
        signedInState,
      );
      figures["first-load JS, gzip: JS requested to show the first screen (sign-in) cold (KB)"] = kb(ours.gzip);
      figures["empty Expo Router app, same settings, its first screen cold (KB)"] = kb(empty.gzip);
      figures["JS ratio (target ≤ 1.5×)"] = Number((ours.gzip / empty.gzip).toFixed(2));
      figures["  files requested: ours / empty"] = `${ours.files} / ${empty.files}`;
      figures["  signed-in surveyor's home, cold (KB, for the record)"] = kb(surveyor.gzip);
      figures["  total JS in the export, every chunk: ours / empty (KB)"] = `${kb(oursTotal)} / ${kb(emptyTotal)}`;
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
      // The walk view is interactive once its sync pill and its "Add room" buttons are there. The page is
      // watched on every animation frame: a locator's waitFor() polls with a back-off (0, 20, 50, 100, 100,
      // then every 500 ms), which would add up to half a second that is Playwright's, not the app's.
      // (No named helpers inside: the page's CSP allows no eval, and the function is sent as it is.)
      const capturing = () =>
        [['a, [role="link"]', "Sync: "], ['button, [role="button"]', "Add room to "]].every(([selector, prefix]) =>
          Array.from(document.querySelectorAll(selector)).some((e) => (e.getAttribute("aria-label") ?? e.textContent ?? "").trim().startsWith(prefix)),
        );
      const reloadTimes = async (wait: () => Promise<unknown>) => {
        const times: number[] = [];
        for (let i = 0; i < 5; i++) {
          const t = Date.now();
          await page.reload({ waitUntil: "domcontentloaded" });
          await wait();
          times.push(Date.now() - t);
          // Same screen, checked by role and accessible name.
          await page.getByRole("link", { name: /^Sync: / }).first().waitFor({ timeout: 20_000 });
          await page.getByRole("button", { name: /^Add room to / }).first().waitFor({ timeout: 20_000 });
        }
        return times.sort((a, b) => a - b)[2];
      };
      figures["offline reload to the capture screen (ms, median of 5; target < 1,000)"] = await reloadTimes(() => page.waitForFunction(capturing, undefined, { polling: "raf", timeout: 20_000 }));
      figures["  the same, seen through locator waitFor() polling (ms, for comparison)"] = await reloadTimes(async () => {
        await page.getByRole("link", { name: /^Sync: / }).first().waitFor({ timeout: 20_000 });
        await page.getByRole("button", { name: /^Add room to / }).first().waitFor({ timeout: 20_000 });
      });
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
  }).finally(async () => {
    await emptyServer.close();
    fs.rmSync(path.dirname(emptyDist), { recursive: true, force: true });
  });
  return { name: "web: bundle size, offline reload, memory", figures };
}

if (/web-bench\.ts$/.test(process.argv[1] ?? "")) {
  runWebBench().then((r) => {
    console.log(r.name);
    for (const [k, v] of Object.entries(r.figures)) console.log(`  ${k}: ${v}`);
  });
}
