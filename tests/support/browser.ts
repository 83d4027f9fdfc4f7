// Debian's Chromium driven by playwright-core (its own browser download cannot work here).
import fs from "node:fs";
import path from "node:path";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";

export const PHONE = { width: 390, height: 844 } as const;
export const DESKTOP = { width: 1280, height: 800 } as const;
export const artifactsDir = path.resolve(import.meta.dirname, "..", "artifacts");

export async function launchBrowser(): Promise<Browser> {
  // A plain launch gives every run a fresh, empty profile of its own.
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
}

/** Collects console errors and failed requests so a test can assert there were none. */
export function watchPage(page: Page) {
  const problems: string[] = [];
  const requests: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error") problems.push(`console: ${m.text()}`);
  });
  page.on("pageerror", (e) => problems.push(`page error: ${e.message}`));
  page.on("request", (r) => requests.push(r.url()));
  page.on("requestfailed", (r) => problems.push(`request failed: ${r.url()} ${r.failure()?.errorText ?? ""}`));
  return { problems, requests };
}

export async function newContext(browser: Browser, viewport: { width: number; height: number }): Promise<BrowserContext> {
  return browser.newContext({ viewport, deviceScaleFactor: 1 });
}

export async function screenshot(page: Page, name: string) {
  fs.mkdirSync(artifactsDir, { recursive: true });
  const file = path.join(artifactsDir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: false });
  return file;
}
