// Every screen, at phone and desktop size, passes axe-core with no serious or critical violations.
import AxeBuilder from "@axe-core/playwright";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID } from "../../db/seed";
import { signInWithPassword } from "../support/auth-client";
import { DESKTOP, PHONE, launchBrowser, screenshot } from "../support/browser";
import { signInByLinkThroughUi, signInThroughUi } from "../support/browser-auth";
import { startTestServer, type TestServer } from "../support/test-server";

let server: TestServer;
let browser: Browser;
let inviteLink = "";

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
  const designer = await signInWithPassword(server.url, "tomas@lanternfield.test", DEMO_PASSWORD);
  await designer.post(`/api/sites/${DEMO_SITE_ID}/reports`).send({}).expect(201);
  const admin = await signInWithPassword(server.url, "imke@lanternfield.test", DEMO_PASSWORD);
  await admin.post("/api/team/invites").send({ email: "axe@lanternfield.test", role: "surveyor" }).expect(201);
  const { waitForMail } = await import("../support/mail");
  inviteLink = (await waitForMail(server.ctx.db, "axe@lanternfield.test")).links[0];
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

async function audit(page: Page, name: string) {
  await page.waitForLoadState("networkidle");
  await page.waitForTimeout(300);
  const result = await new AxeBuilder({ page: page as never }).analyze();
  const bad = result.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  if (bad.length) await screenshot(page, `axe-${name}`);
  return bad.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(" ")).join(" | ")}`);
}

const SCREENS: { who: "anonymous" | "surveyor" | "designer" | "admin" | "client"; path: () => string; name: string }[] = [
  { who: "anonymous", path: () => "/sign-in", name: "sign-in" },
  { who: "anonymous", path: () => new URL(inviteLink).pathname, name: "invite" },
  { who: "anonymous", path: () => "/no/such/page", name: "not-found" },
  { who: "surveyor", path: () => "/", name: "walks" },
  { who: "surveyor", path: () => `/sites/${DEMO_SITE_ID}`, name: "site-walk" },
  { who: "surveyor", path: () => `/sites/${DEMO_SITE_ID}/rooms/rm-living`, name: "room" },
  { who: "surveyor", path: () => `/sites/${DEMO_SITE_ID}/devices/ap-living`, name: "device" },
  { who: "surveyor", path: () => "/sync", name: "sync" },
  { who: "surveyor", path: () => "/account", name: "account" },
  { who: "designer", path: () => "/", name: "desk" },
  { who: "designer", path: () => `/sites/${DEMO_SITE_ID}/plan`, name: "plan" },
  { who: "designer", path: () => `/sites/${DEMO_SITE_ID}/report`, name: "report-team" },
  { who: "admin", path: () => "/team", name: "team" },
  { who: "client", path: () => `/sites/${DEMO_SITE_ID}/report`, name: "scope" },
];

const EMAIL = { surveyor: "priya@lanternfield.test", designer: "tomas@lanternfield.test", admin: "imke@lanternfield.test", client: "june@okonkwo-lindqvist.test" } as const;

describe("accessibility (axe-core)", () => {
  for (const [size, viewport] of [["phone", PHONE], ["desktop", DESKTOP]] as const) {
    it(`every screen at ${size} size has no serious or critical violations`, async () => {
      const failures: string[] = [];
      const contexts = new Map<string, Page>();
      for (const screen of SCREENS) {
        let page = contexts.get(screen.who);
        if (!page) {
          const context = await browser.newContext({ viewport });
          page = await context.newPage();
          if (screen.who === "client") await signInByLinkThroughUi(page, server, EMAIL.client);
          else if (screen.who !== "anonymous") await signInThroughUi(page, server, EMAIL[screen.who]);
          contexts.set(screen.who, page);
        }
        await page.goto(`${server.url}${screen.path()}`, { waitUntil: "networkidle" });
        for (const v of await audit(page, `${screen.name}-${size}`)) failures.push(`${screen.name}: ${v}`);
      }
      for (const page of contexts.values()) await page.context().close();
      expect(failures).toEqual([]);
    }, 180_000);
  }

  it("the sign-in form works with the keyboard alone", async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    await page.goto(`${server.url}/sign-in`, { waitUntil: "networkidle" });
    await page.getByRole("textbox", { name: "E-mail" }).focus();
    await page.keyboard.type("priya@lanternfield.test");
    await page.keyboard.press("Tab");
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press("Enter");
    await page.getByRole("navigation", { name: "Main" }).waitFor();
    await context.close();
  });

  it("a row of choices is one Tab stop, and the arrow keys move the choice", async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    await page.goto(`${server.url}/sign-in`, { waitUntil: "networkidle" });
    const team = page.getByRole("radio", { name: "I'm on the team" });
    const homeowner = page.getByRole("radio", { name: "I'm the homeowner" });
    expect(await team.getAttribute("aria-checked")).toBe("true");
    expect(await team.getAttribute("tabindex")).toBe("0");
    expect(await homeowner.getAttribute("tabindex")).toBe("-1");
    await team.focus();
    await page.keyboard.press("ArrowRight");
    await expect.poll(() => homeowner.getAttribute("aria-checked")).toBe("true");
    expect(await page.evaluate(() => document.activeElement?.getAttribute("aria-label"))).toBe("I'm the homeowner");
    expect(await homeowner.getAttribute("tabindex")).toBe("0");
    await page.getByRole("button", { name: "Send me a link" }).waitFor();
    await page.keyboard.press("ArrowLeft");
    await expect.poll(() => team.getAttribute("aria-checked")).toBe("true");
    await context.close();
  });
});
