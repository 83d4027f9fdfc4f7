import { describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID } from "../../db/seed";
import { signInWithPassword } from "../support/auth-client";
import { DESKTOP, PHONE, screenshot, watchPage } from "../support/browser";
import { signInThroughUi } from "../support/browser-auth";
import { waitForMail } from "../support/mail";
import { serverAndBrowser } from "../support/browser-suite";

const suite = serverAndBrowser();

describe("the homeowner signs off on a phone", () => {
  it("opens the e-mailed link, reads the summary, comments on one item, signs; the desk shows signed", async () => {
    const designer = await signInWithPassword(suite.server.url, "tomas@lanternfield.test", DEMO_PASSWORD);
    const since = new Date();
    await designer.post(`/api/sites/${DEMO_SITE_ID}/reports`).send({}).expect(201);
    const mail = await waitForMail(suite.server.ctx.db, "june@okonkwo-lindqvist.test", since);
    const link = mail.links.find((l) => l.includes("/auth/callback/nodemailer"))!;

    const context = await suite.browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    const watch = watchPage(page);
    await page.goto(link, { waitUntil: "networkidle" });
    await page.waitForURL(`${suite.server.url}/sites/${DEMO_SITE_ID}/report`);
    await page.getByRole("heading", { name: "What this plan does" }).waitFor();
    await screenshot(page, "scope-phone");

    const commentButton = page.getByRole("button", { name: /^Comment on / }).first();
    const deviceName = ((await commentButton.getAttribute("aria-label")) ?? "").replace("Comment on ", "");
    const scope = (await designer.get(`/api/sites/${DEMO_SITE_ID}/reports`).expect(200)).body.reports[0];
    const content = (await designer.get(`/api/reports/${scope.id}`).expect(200)).body.content;
    const commentedId: string = content.rooms.flatMap((r: { devices: { id: string; name: string }[] }) => r.devices).find((d: { name: string }) => d.name === deviceName).id;

    // Each device reads in everyday words first; the rules' technical reasons open on request.
    const first: { name: string; plain: string[]; reasons: string[] } = content.rooms[0].devices[0];
    await page.getByText(first.plain[0], { exact: true }).waitFor();
    expect(await page.getByText(`• ${first.reasons[0]}`, { exact: true }).count()).toBe(0);
    const detail = page.getByRole("button", { name: `Technical detail for ${first.name}` });
    expect(await detail.getAttribute("aria-expanded")).toBe("false");
    await detail.click();
    await page.getByText(`• ${first.reasons[0]}`, { exact: true }).waitFor();
    expect(await detail.getAttribute("aria-expanded")).toBe("true");
    await screenshot(page, "scope-technical-detail-phone");

    await commentButton.click();
    await page.getByRole("radio", { name: "Ask for a change" }).click();
    await page.getByRole("textbox", { name: `Your comment on ${deviceName}` }).fill("Could this go a little higher on the wall?");
    await page.getByRole("button", { name: "Ask for this change" }).click();
    await page.getByText("Could this go a little higher on the wall?").waitFor();

    // Signing without the confirmations marks both boxes: agreeing to the scope, and signing it
    // without the change just asked for. The keyboard ticks them with Space, as any checkbox.
    await page.getByText("You asked for a change", { exact: true }).waitFor();
    await page.getByText(new RegExp(`^About ${deviceName}\\. Your installer answers with a new version`)).waitFor();
    await page.getByRole("textbox", { name: "Your full name" }).fill("June Okonkwo-Lindqvist");
    await page.getByRole("button", { name: "Sign off" }).click();
    await page.getByText("Tick the box to confirm you agree to this scope.").waitFor();
    await page.getByText(/^Tick to sign version \d+ as it is, without the changes you asked for/).waitFor();
    await screenshot(page, "sign-off-changes-asked-phone");
    const agree = page.getByRole("checkbox", { name: "I have read this scope and agree to it" });
    await agree.focus();
    await page.keyboard.press("Space");
    expect(await agree.getAttribute("aria-checked")).toBe("true");
    const despite = page.getByRole("checkbox", { name: "Sign this version as it is, without the changes I asked for" });
    await despite.focus();
    await page.keyboard.press("Space");
    expect(await despite.getAttribute("aria-checked")).toBe("true");
    await page.getByRole("button", { name: "Sign off" }).click();
    await page.getByText(/^Signed by June Okonkwo-Lindqvist on /).waitFor();
    await screenshot(page, "signed-phone");
    expect(watch.problems).toEqual([]);
    await context.close();

    // The link works once: opened again, it says so and offers a new link, not the team's password form.
    const again = await suite.browser.newContext({ viewport: PHONE });
    const usedPage = await again.newPage();
    await usedPage.goto(link, { waitUntil: "networkidle" });
    await usedPage.getByText(/That sign-in link has expired or was already used/).waitFor();
    await usedPage.getByRole("button", { name: "Send me a link" }).waitFor();
    expect(await usedPage.getByRole("textbox", { name: "Password" }).count()).toBe(0);
    await screenshot(usedPage, "sign-in-link-used-phone");
    await again.close();

    // The surveyor's walk says the scope is signed: what is captured now reaches the homeowner only in a new version.
    const walker = await suite.browser.newContext({ viewport: PHONE });
    const wp = await walker.newPage();
    await signInThroughUi(wp, suite.server, "priya@lanternfield.test");
    await wp.getByRole("link", { name: /Okonkwo-Lindqvist house/ }).click();
    await wp.getByText("The homeowner signed this scope").waitFor();
    await wp.getByText(/What you change now is not in what they signed/).waitFor();
    await screenshot(wp, "walk-signed-phone");
    await walker.close();

    const desk = await suite.browser.newContext({ viewport: DESKTOP });
    const dp = await desk.newPage();
    await signInThroughUi(dp, suite.server, "tomas@lanternfield.test");
    await dp.getByText("signed", { exact: true }).first().waitFor();
    await screenshot(dp, "desk-signed-desktop");

    // A price set after the sign-off: the plan says the signature covers the older version only.
    await dp.goto(`${suite.server.url}/sites/${DEMO_SITE_ID}/plan`);
    await dp.getByRole("tablist", { name: "Plan parts" }).waitFor();
    expect(await dp.getByText("Changed since the homeowner signed").count()).toBe(0);
    await designer.put(`/api/sites/${DEMO_SITE_ID}/prices`).send({ "wall-plate:1-port": 2.5 }).expect(200);
    await dp.reload();
    await dp.getByText("Changed since the homeowner signed version 1").waitFor();
    await dp.getByText(/Materials total 0\.00 → .*publish version 2 on the Report tab/).waitFor();
    await screenshot(dp, "plan-changed-since-signed-desktop");
    // The homeowner's comment shows on the device's row of the plan, where the designer works.
    const commented = dp.getByTestId(`device-${commentedId}`);
    await commented.getByText("homeowner asked for changes", { exact: true }).waitFor();
    await commented.getByLabel(`What the homeowner wrote about ${deviceName}`).getByText(/Could this go a little higher on the wall\?/).waitFor();
    await dp.goto(`${suite.server.url}/sites/${DEMO_SITE_ID}/report`);
    await dp.getByText("Changed since the homeowner signed version 1").waitFor();
    await desk.close();
  });
});
