import { describe, expect, it } from "vitest";
import { PHONE, screenshot, watchPage } from "../support/browser";
import { signInByLinkThroughUi, signInThroughUi } from "../support/browser-auth";
import { serverAndBrowser } from "../support/browser-suite";
import { DEMO_SITE_ID } from "../../db/seed";
import { demoSiteInput } from "../../survey/demo-site";

const suite = serverAndBrowser();

const ROLES = [
  { role: "admin", email: "imke@lanternfield.test", nav: ["Sites", "Team", "Account"] },
  { role: "designer", email: "tomas@lanternfield.test", nav: ["Desk", "Account"] },
  { role: "surveyor", email: "priya@lanternfield.test", nav: ["Walks", "Sync", "Account"] },
  { role: "client", email: "june@okonkwo-lindqvist.test", nav: ["Scope", "Account"] },
] as const;

describe("each demo role at phone size sees its own navigation", () => {
  for (const { role, email, nav } of ROLES) {
    it(`${role}: ${nav.join(" · ")}`, async () => {
      const context = await suite.browser.newContext({ viewport: PHONE });
      const page = await context.newPage();
      const watch = watchPage(page);
      if (role === "client") await signInByLinkThroughUi(page, suite.server, email);
      else await signInThroughUi(page, suite.server, email);
      const links = await page.getByRole("navigation", { name: "Main" }).getByRole("link").allInnerTexts();
      expect(links.map((l) => l.trim())).toEqual(nav);
      await screenshot(page, `role-${role}-phone`);
      if (role === "client") {
        // The walk's rooms and devices are the team's: their addresses take the homeowner to the scope.
        for (const path of [`rooms/${demoSiteInput.rooms[0].id}`, `devices/${demoSiteInput.devices[0].id}`]) {
          await page.goto(`${suite.server.url}/sites/${DEMO_SITE_ID}/${path}`, { waitUntil: "networkidle" });
          await page.waitForURL(`**/sites/${DEMO_SITE_ID}/report`);
          await page.getByRole("navigation", { name: "Main" }).waitFor();
        }
        // The admin sees the homeowner's captured sign-in mail with a word on what opening its link does.
        const adminContext = await suite.browser.newContext({ viewport: PHONE });
        const admin = await adminContext.newPage();
        await signInThroughUi(admin, suite.server, "imke@lanternfield.test");
        await admin.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Team" }).click();
        await admin.getByText(`A one-time sign-in link for ${email}: opening it in this browser uses it up`).first().waitFor();
        await adminContext.close();
      }
      expect(watch.problems).toEqual([]);
      await context.close();
    });
  }

  it("a wrong password is marked on the sign-in screen", async () => {
    const context = await suite.browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    await page.goto(`${suite.server.url}/sign-in`, { waitUntil: "networkidle" });
    await page.getByRole("textbox", { name: "E-mail" }).fill("tomas@lanternfield.test");
    await page.getByRole("textbox", { name: "Password" }).fill("definitely-wrong");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByText("That e-mail and password don't match").waitFor();
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByRole("textbox", { name: "E-mail" }).fill("not an address");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByText("That does not look like an e-mail address.").waitFor();
    expect(await page.getByRole("textbox", { name: "E-mail" }).getAttribute("aria-invalid")).toBe("true");
    await screenshot(page, "sign-in-error-phone");
    await context.close();
  });

  it("an admin invites a surveyor who joins through the link and lands signed in", async () => {
    const context = await suite.browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    await signInThroughUi(page, suite.server, "imke@lanternfield.test");
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Team" }).click();
    await page.getByRole("heading", { name: "Team" }).waitFor();
    await page.getByRole("textbox", { name: "E-mail" }).fill("wren@lanternfield.test");
    await page.getByRole("radio", { name: "Surveyor" }).first().click();
    await page.getByRole("button", { name: "Send invitation" }).click();
    await page.getByText("Invitation sent to wren@lanternfield.test").waitFor();
    const link = await page.getByText(/\/invite\//).first().innerText();
    await screenshot(page, "team-phone");
    const joiner = await suite.browser.newContext({ viewport: PHONE });
    const jp = await joiner.newPage();
    await jp.goto(link.trim(), { waitUntil: "networkidle" });
    await jp.getByRole("heading", { name: "Join Lanternfield Low Voltage" }).waitFor();
    await jp.getByRole("textbox", { name: "Your name" }).fill("Wren Adeyemi");
    await jp.getByRole("textbox", { name: "Password" }).fill("wren-walks-attics");
    await jp.getByRole("button", { name: "Join the team" }).click();
    await jp.getByRole("heading", { name: "Walks" }).waitFor();
    await joiner.close();
    // Someone else opening the same link later is told it was used.
    const later = await suite.browser.newContext({ viewport: PHONE });
    const lp = await later.newPage();
    await lp.goto(link.trim(), { waitUntil: "networkidle" });
    await lp.getByText(/already used/).waitFor();
    await screenshot(lp, "invite-used-phone");
    await later.close();
    // Removing a member asks once more, saying what they lose, before it goes through.
    // The new member shows up on the open team screen by itself (it looks again every 15 s), no reload.
    await page.getByRole("button", { name: "Remove Wren Adeyemi" }).waitFor({ timeout: 25_000 });
    await page.getByRole("button", { name: "Remove Wren Adeyemi" }).click();
    const ask = page.getByRole("alertdialog", { name: "Remove Wren Adeyemi from the team?" });
    await ask.getByText(/changes still only on their phone no longer reach the team/).waitFor();
    await ask.getByRole("button", { name: "Yes, remove them" }).click();
    await ask.waitFor({ state: "detached" });
    await page.getByRole("button", { name: "Remove Wren Adeyemi" }).waitFor({ state: "detached" });
    await context.close();
  });
});
