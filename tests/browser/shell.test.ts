import { describe, expect, it } from "vitest";
import { DESKTOP, PHONE, screenshot, watchPage } from "../support/browser";
import { signInThroughUi } from "../support/browser-auth";
import { serverAndBrowser } from "../support/browser-suite";

const suite = serverAndBrowser();

describe("the app shell", () => {
  it("sends a signed-out visitor to sign-in, rendered in the shipped font with nothing from other hosts", async () => {
    const context = await suite.browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    const watch = watchPage(page);
    await page.goto(`${suite.server.url}/`, { waitUntil: "networkidle" });
    await page.waitForURL(`${suite.server.url}/sign-in`);
    const heading = page.getByRole("heading", { name: "Sign in" });
    await heading.waitFor();
    const fontLoaded = await page.evaluate(async () => {
      await document.fonts.ready;
      return Array.from(document.fonts as unknown as Iterable<FontFace>).some((f) => f.family.includes("NunitoSans") && f.status === "loaded");
    });
    expect(fontLoaded).toBe(true);
    expect(await heading.evaluate((el) => getComputedStyle(el).fontFamily)).toContain("NunitoSans");
    expect(await page.evaluate(() => globalThis.crossOriginIsolated)).toBe(true);
    expect(watch.requests.filter((u) => !u.startsWith(suite.server.url))).toEqual([]);
    expect(watch.problems).toEqual([]);
    await screenshot(page, "sign-in-phone");
    await context.close();
  });

  it("a second tab says the walk is open in the first, and opens it once the first is closed", async () => {
    const context = await suite.browser.newContext({ viewport: PHONE });
    const first = await context.newPage();
    await signInThroughUi(first, suite.server, "priya@lanternfield.test");
    await first.getByText("Okonkwo-Lindqvist house").waitFor();
    const second = await context.newPage();
    await second.goto(`${suite.server.url}/`, { waitUntil: "networkidle" });
    await second.getByText("Dropwise is open in another tab").waitFor();
    await screenshot(second, "second-tab-phone");
    await first.close();
    await second.getByRole("button", { name: "Try again" }).click();
    await second.getByText("Okonkwo-Lindqvist house").waitFor();
    await context.close();
  });

  it("at phone size shows a bottom navigation", async () => {
    const context = await suite.browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    const watch = watchPage(page);
    await signInThroughUi(page, suite.server, "priya@lanternfield.test");
    await page.getByRole("heading", { name: "Walks" }).waitFor();
    await page.getByText("Okonkwo-Lindqvist house").waitFor();
    const box = (await page.getByRole("navigation", { name: "Main" }).boundingBox())!;
    expect(box.y + box.height).toBeGreaterThan(PHONE.height - 4); // pinned to the bottom
    expect(box.width).toBeGreaterThan(PHONE.width - 4);
    expect(watch.problems).toEqual([]);
    await screenshot(page, "shell-phone");
    await context.close();
  });

  it("at desktop size shows a side navigation and wider content", async () => {
    const context = await suite.browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    const watch = watchPage(page);
    await signInThroughUi(page, suite.server, "tomas@lanternfield.test");
    await page.getByRole("heading", { name: "Desk" }).waitFor();
    const box = (await page.getByRole("navigation", { name: "Main" }).boundingBox())!;
    expect(box.x).toBeLessThan(2);
    expect(box.height).toBeGreaterThan(DESKTOP.height - 4); // a full-height rail
    expect(box.width).toBeLessThan(320);
    expect(watch.problems).toEqual([]);
    await screenshot(page, "shell-desktop");
    await page.getByText("Okonkwo-Lindqvist house").click();
    await page.getByRole("tab", { name: "Rooms" }).waitFor();
    await page.getByText("People on this site").waitFor();
    await screenshot(page, "site-desktop");
    await context.close();
  });

  it("shows a not-found page for unknown paths", async () => {
    const context = await suite.browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    const watch = watchPage(page);
    await page.goto(`${suite.server.url}/no/such/place`, { waitUntil: "networkidle" });
    await page.getByText("This page is not on the plan").waitFor();
    expect(watch.problems).toEqual([]);
    await context.close();
  });
});
