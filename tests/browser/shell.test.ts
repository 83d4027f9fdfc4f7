import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DESKTOP, PHONE, launchBrowser, screenshot, watchPage } from "../support/browser";
import { startTestServer, type TestServer } from "../support/test-server";

let server: TestServer;
let browser: Browser;

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

async function openShell(viewport: { width: number; height: number }, name: string) {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  const watch = watchPage(page);
  await page.goto(`${server.url}/`, { waitUntil: "networkidle" });
  await page.getByRole("heading", { name: "Sites" }).waitFor();
  const fontReady = await page.evaluate(async () => {
    await document.fonts.ready;
    return document.fonts.check('16px "NunitoSans_400Regular"') && Array.from(document.fonts as unknown as Iterable<FontFace>).some((f) => f.family.includes("NunitoSans") && f.status === "loaded");
  });
  const headingFont = await page.getByRole("heading", { name: "Sites" }).evaluate((el) => getComputedStyle(el).fontFamily);
  const isolated = await page.evaluate(() => globalThis.crossOriginIsolated);
  const shot = await screenshot(page, name);
  return { context, page, watch, fontReady, headingFont, isolated, shot };
}

describe("the app shell", () => {
  it("at phone size shows a bottom navigation with the shipped font and no errors", async () => {
    const { context, page, watch, fontReady, headingFont, isolated } = await openShell(PHONE, "shell-phone");
    expect(watch.problems).toEqual([]);
    expect(fontReady).toBe(true);
    expect(headingFont).toContain("NunitoSans");
    expect(isolated).toBe(true);
    // Every request stays on our own origin: no font host, no analytics.
    expect(watch.requests.filter((u) => !u.startsWith(server.url))).toEqual([]);
    const nav = page.getByRole("navigation", { name: "Main" });
    const box = await nav.boundingBox();
    expect(box).not.toBeNull();
    expect(box!.y + box!.height).toBeGreaterThan(PHONE.height - 4); // pinned to the bottom
    expect(box!.width).toBeGreaterThan(PHONE.width - 4);
    await expect(nav.getByRole("link", { name: "Sites" }).isVisible()).resolves.toBe(true);
    await context.close();
  });

  it("at desktop size shows a side navigation and wider content", async () => {
    const { context, page, watch } = await openShell(DESKTOP, "shell-desktop");
    expect(watch.problems).toEqual([]);
    const nav = page.getByRole("navigation", { name: "Main" });
    const box = await nav.boundingBox();
    expect(box!.x).toBeLessThan(2);
    expect(box!.height).toBeGreaterThan(DESKTOP.height - 4); // full-height rail
    expect(box!.width).toBeLessThan(320);
    await context.close();
  });

  it("navigates between sections and shows a not-found page for unknown paths", async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    const watch = watchPage(page);
    await page.goto(`${server.url}/`, { waitUntil: "networkidle" });
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Account" }).click();
    await page.getByRole("heading", { name: "Account" }).waitFor();
    expect(page.url()).toBe(`${server.url}/account`);
    await page.goto(`${server.url}/no/such/place`, { waitUntil: "networkidle" });
    await page.getByText("This page is not on the plan").waitFor();
    expect(watch.problems).toEqual([]);
    await context.close();
  });
});
