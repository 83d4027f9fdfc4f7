import type { Page } from "playwright-core";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import type { TestServer } from "./test-server";
import { screenshot } from "./browser";
import { waitForMail } from "./mail";

/** Signs in through the real sign-in screen, as a person would. */
export async function signInThroughUi(page: Page, server: TestServer, email: string, password = DEMO_PASSWORD) {
  await page.goto(`${server.url}/sign-in`, { waitUntil: "networkidle" });
  await page.getByRole("textbox", { name: "E-mail" }).fill(email);
  await page.getByRole("textbox", { name: "Password" }).fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(`${server.url}/`);
  await page
    .getByRole("navigation", { name: "Main" })
    .waitFor({ timeout: 15_000 })
    .catch(async (err) => {
      await screenshot(page, `sign-in-stuck-${email.split("@")[0]}`);
      throw new Error(`signed in as ${email} but no navigation appeared; the page says: ${(await page.locator("body").innerText()).slice(0, 400)}`, { cause: err });
    });
}

/** A homeowner asks for a link on the sign-in screen, then opens the captured e-mail's link. */
export async function signInByLinkThroughUi(page: Page, server: TestServer, email: string) {
  await page.goto(`${server.url}/sign-in`, { waitUntil: "networkidle" });
  await page.getByRole("radio", { name: "I'm the homeowner" }).click();
  await page.getByRole("textbox", { name: "E-mail" }).fill(email);
  const since = new Date();
  await page.getByRole("button", { name: "Send me a link" }).click();
  await page.getByText("Check your e-mail").waitFor();
  const mail = await waitForMail(server.ctx.db, email, since);
  const link = mail.links.find((l) => l.includes("/auth/callback/nodemailer"))!;
  await page.goto(link, { waitUntil: "networkidle" });
  await page.getByRole("navigation", { name: "Main" }).waitFor();
}
