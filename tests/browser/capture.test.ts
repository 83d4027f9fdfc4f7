import { eq } from "drizzle-orm";
import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { items, sites } from "../../db/schema";
import { DESKTOP, PHONE, screenshot, watchPage } from "../support/browser";
import { signInThroughUi } from "../support/browser-auth";
import { serverAndBrowser } from "../support/browser-suite";

/** A 1×1 PNG. */
const TINY_PNG = "iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==";

const suite = serverAndBrowser();

/** What the server holds now (the pill cannot tell a round that already ran from one still to come). */
async function serverItemData(id: string) {
  const [row] = await suite.server.ctx.db.select({ data: items.data }).from(items).where(eq(items.id, id));
  return row?.data as Record<string, unknown> | undefined;
}
async function serverSiteUnits(id: string) {
  const [row] = await suite.server.ctx.db.select({ settings: sites.settings }).from(sites).where(eq(sites.id, id));
  return (row?.settings as { units?: string } | undefined)?.units;
}

/** Problems on a page, except requests cancelled by our own page loads (a sync in flight is simply retried). */
function realProblems(watch: ReturnType<typeof watchPage>): string[] {
  return watch.problems.filter((p) => !(p.startsWith("request failed:") && p.endsWith("net::ERR_ABORTED")));
}

async function checklistLines(page: Page): Promise<string[]> {
  const list = page.getByRole("list", { name: "Site checklist" });
  return (await list.getByRole("listitem").allInnerTexts()).map((t) => t.trim());
}

async function openDemoWalk(page: Page, progress = /\d+ devices captured · (\d+ gaps|no gaps)/, shot?: string) {
  await page.getByRole("heading", { name: "Walks" }).waitFor();
  // The surveyor's list comes from the phone's own store, with the walk's progress.
  const site = page.getByRole("link", { name: new RegExp(`Okonkwo-Lindqvist house.*${progress.source}`) });
  await site.waitFor();
  if (shot) await screenshot(page, shot);
  await site.click();
  await page.waitForURL(`${suite.server.url}/sites/site_larchmere`);
  await page.getByRole("region", { name: "Checklist" }).waitFor();
}

/** From the walk view to one device, through the rooms, as a person taps. */
async function openDevice(page: Page, room: string, device: string) {
  await page.getByRole("link", { name: new RegExp(`^${room}: `) }).click();
  await page.getByRole("link", { name: new RegExp(`^${device}: `) }).click();
  await page.getByRole("heading", { name: device }).waitFor();
}

/** A designer opens the demo site from the desk. */
async function openDemoSiteFromDesk(page: Page) {
  await page.getByText("Okonkwo-Lindqvist house").first().click();
  await page.getByRole("region", { name: "Checklist" }).waitFor();
}

describe("capturing a walk on the phone", () => {
  it("adds a room from the list and two devices, fills one in, and sees the advice and the checklist change", async () => {
    const context = await suite.browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    const watch = watchPage(page);
    await signInThroughUi(page, suite.server, "priya@lanternfield.test");
    await openDemoWalk(page, /16 devices captured · 3 gaps/, "capture-walks-phone");
    await page.getByRole("link", { name: /^Sync: up to date/ }).waitFor();
    await expect.poll(() => checklistLines(page)).toEqual(["2 devices have only a typical power figure", "The plug polarity of Driveway camera is not read yet"]);
    await screenshot(page, "capture-walk-phone");

    // A room from the short list: it opens at once, empty.
    await page.getByRole("button", { name: "Add room to Ground floor" }).click();
    await page.getByRole("group", { name: "Add a room to Ground floor" }).getByRole("button", { name: "Bathroom", exact: true }).click();
    await page.getByRole("heading", { name: "Bathroom", exact: true }).waitFor();
    await page.getByText("No devices in this room yet.").waitFor();

    // Two devices from their kinds, each with its kind's typical power.
    await page.getByRole("button", { name: "Add camera" }).click();
    await page.getByRole("link", { name: "Bathroom camera: 5 gaps" }).waitFor();
    await page.getByRole("button", { name: "Add hub" }).click();
    await page.getByRole("link", { name: "Bathroom hub: 5 gaps" }).waitFor();
    await page.getByRole("list", { name: "Room checklist" }).getByText("2 devices have only a typical power figure").waitFor();
    await page.getByRole("heading", { name: "Bathroom", exact: true }).scrollIntoViewIfNeeded();
    await screenshot(page, "capture-room-phone");

    // The camera: fill what the rules need. The advice follows what is on screen.
    await page.getByRole("link", { name: "Bathroom camera: 5 gaps" }).click();
    await page.getByRole("heading", { name: "Bathroom camera" }).waitFor();
    const advice = page.getByRole("region", { name: "Advice" });
    await advice.getByText("The advice appears as soon as these are filled:").waitFor();
    expect(await page.getByRole("textbox", { name: "Power need" }).inputValue()).toBe("7");
    await page.getByText("typical", { exact: true }).waitFor();
    await page.getByRole("radiogroup", { name: "Mount point" }).getByRole("radio", { name: "Ceiling" }).click();
    await page.getByRole("textbox", { name: "Power need" }).fill("6");
    await page.getByRole("radio", { name: "PoE (802.3af/at/bt)" }).click();
    await page.getByRole("radio", { name: "Open attic above" }).click();
    await page.getByRole("radio", { name: "Cat 6", exact: true }).click();
    // A slip of the thumb: marked on the field, kept as typed, and the rest is still saved.
    await page.getByRole("textbox", { name: "Cable run to the closet" }).fill("18 m");
    await page.getByRole("button", { name: "Save device" }).click();
    await page.getByRole("alert").filter({ hasText: "Cable run must be a number" }).waitFor();
    expect(await page.getByRole("textbox", { name: "Cable run to the closet" }).inputValue()).toBe("18 m");
    expect(await page.getByRole("textbox", { name: "Cable run to the closet" }).getAttribute("aria-invalid")).toBe("true");
    // The keyboard is taken to the field to fix.
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute("aria-label") ?? (document.activeElement as HTMLInputElement | null)?.labels?.[0]?.textContent ?? "")).toMatch(/Cable run to the closet/);
    // The run's parts are saved together: its category waits with the bad length, and the notice says so.
    await page.getByText("One entry needs fixing", { exact: true }).waitFor();
    await page.getByText(/Fix Cable run to the closet \(marked in the form\)\. Until then the cable run \(its length, category, gauge and copper-clad aluminium are saved together\) is not saved; what you typed is still here\. The other fields are saved on this phone\./).waitFor();
    await page.getByRole("textbox", { name: "Cable run to the closet" }).evaluate((e) => e.scrollIntoView({ block: "center" }));
    await screenshot(page, "capture-device-error-phone");
    await page.getByRole("textbox", { name: "Cable run to the closet" }).fill("18");
    await page.getByRole("button", { name: "Save device" }).click();
    await page.getByText("Saved on this phone.", { exact: true }).waitFor();
    await advice.getByText("PoE (Class 2, 802.3af port)").waitFor();
    await advice.getByText(/It takes power over its network cable \(PoE\)/).waitFor();
    // Passive PoE picked before its volts: no advice from the stored PoE input, only what it waits for.
    await page.getByRole("radio", { name: "Passive PoE" }).click();
    await advice.getByText("The advice waits until these fields are right:").waitFor();
    await advice.getByText(/^Passive PoE volts: /).waitFor();
    expect(await advice.getByText("PoE (Class 2, 802.3af port)").count()).toBe(0);
    await page.getByRole("radio", { name: "PoE (802.3af/at/bt)" }).click();
    await advice.getByText("PoE (Class 2, 802.3af port)").waitFor();
    expect(await page.getByText("typical", { exact: true }).count()).toBe(0);
    await page.getByRole("heading", { name: "Bathroom camera" }).scrollIntoViewIfNeeded();
    await screenshot(page, "capture-device-phone");

    // The hub: a USB device beside an outlet gets the existing outlet.
    await page.getByRole("link", { name: "Back to Bathroom" }).click();
    await page.getByRole("link", { name: "Bathroom camera: PoE (Class 2, 802.3af port)" }).waitFor();
    await page.getByRole("link", { name: /^Bathroom hub:/ }).click();
    await page.getByRole("heading", { name: "Bathroom hub" }).waitFor();
    await page.getByRole("radio", { name: "Volts × amps (adapter)" }).click();
    await page.getByRole("textbox", { name: "Adapter volts" }).fill("5");
    await page.getByRole("textbox", { name: "Adapter amps" }).fill("1");
    await page.getByRole("radio", { name: "Micro-USB" }).click();
    await page.getByRole("textbox", { name: "Nearest outlet distance" }).fill("0.5");
    await page.getByRole("button", { name: "Save device" }).click();
    await page.getByText("Saved on this phone.", { exact: true }).waitFor();
    await page.getByRole("region", { name: "Advice" }).getByText("The advice appears as soon as these are filled:").waitFor();

    // Back on the walk: the checklist says what is left, device by device.
    await page.getByRole("link", { name: "Back to Bathroom" }).click();
    await page.getByRole("link", { name: /^Back to .*Okonkwo-Lindqvist house/ }).click();
    await page.getByRole("region", { name: "Checklist" }).waitFor();
    await expect
      .poll(() => checklistLines(page))
      .toEqual(["No mount point for Bathroom hub", "2 devices have only a typical power figure", "No cable access for Bathroom hub", "No run length for Bathroom hub", "The plug polarity of Driveway camera is not read yet"]);
    await page.getByRole("link", { name: /^Bathroom: 2 devices, 3 gaps/ }).waitFor();
    await page.getByRole("link", { name: /^Sync: up to date/ }).waitFor();
    await screenshot(page, "capture-checklist-phone");
    expect(watch.problems).toEqual([]);
    await context.close();
  });

  it("at desktop size shows the walk beside its checklist", async () => {
    const context = await suite.browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    const watch = watchPage(page);
    await signInThroughUi(page, suite.server, "priya@lanternfield.test");
    await openDemoWalk(page);
    const floors = (await page.getByRole("region", { name: "Ground floor" }).boundingBox())!;
    const checklist = (await page.getByRole("region", { name: "Checklist" }).boundingBox())!;
    expect(checklist.x).toBeGreaterThan(floors.x + floors.width - 1); // side by side, not stacked
    await screenshot(page, "capture-walk-desktop");
    // Lengths follow the site's units: the same stored 16 m shows as feet, advice included.
    await page.getByRole("radiogroup", { name: "Lengths on this site" }).getByRole("radio", { name: "Feet" }).click();
    await expect.poll(() => serverSiteUnits("site_larchmere")).toBe("imperial");
    await page.getByRole("link", { name: /^Living room: 1 device/ }).click();
    await page.getByRole("link", { name: /^Living room access point: PoE/ }).click();
    await expect.poll(() => page.getByRole("textbox", { name: "Cable run to the closet" }).inputValue()).toBe("52.49");
    await page.getByRole("region", { name: "Advice" }).getByText(/Over its 52\.5 ft run and 16\.4 ft of patch cords \(68\.9 ft of Cat 6/).waitFor();
    await screenshot(page, "capture-device-desktop");
    await page.getByRole("link", { name: "Back to Living room" }).click();
    await page.getByRole("link", { name: /^Back to .*Okonkwo-Lindqvist house/ }).click();
    await page.getByRole("radiogroup", { name: "Lengths on this site" }).getByRole("radio", { name: "Metres" }).click();
    await expect.poll(() => serverSiteUnits("site_larchmere")).toBe("metric");
    expect(watch.problems).toEqual([]);
    await context.close();
  });

  it("keeps changes on the phone while offline and says so, then sends them", async () => {
    const context = await suite.browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    await signInThroughUi(page, suite.server, "priya@lanternfield.test");
    await openDemoWalk(page);
    await page.getByRole("link", { name: /^Sync: up to date/ }).waitFor();
    await context.setOffline(true);
    // The pill says the phone is offline at once, before anything waits to be sent.
    await page.getByRole("link", { name: "Sync: offline" }).waitFor();
    await page.getByRole("button", { name: "Add room to Upper floor" }).click();
    await page.getByRole("group", { name: "Add a room to Upper floor" }).getByRole("textbox", { name: "Or a room by name" }).fill("Sewing room");
    await page.getByRole("button", { name: "Add this room" }).click();
    await page.getByRole("heading", { name: "Sewing room" }).waitFor();
    // A photo taken offline is kept on the phone and shows as a thumbnail from its own bytes.
    await page.getByRole("radio", { name: "Ceiling access" }).click();
    const chooser = page.waitForEvent("filechooser");
    await page.getByRole("button", { name: "Add photo" }).click();
    await (await chooser).setFiles({ name: "hatch.png", mimeType: "image/png", buffer: Buffer.from(TINY_PNG, "base64") });
    const thumb = page.getByRole("img", { name: "Photo: Ceiling access" });
    await thumb.waitFor();
    await expect.poll(() => thumb.evaluate((img) => (img as HTMLImageElement).complete && (img as HTMLImageElement).naturalWidth)).toBe(1);
    await page.getByText("on this phone", { exact: true }).waitFor();
    await page.getByRole("link", { name: "Sync: saved on this phone · offline, 1 change and 1 photo to send" }).click();
    await page.getByRole("heading", { name: "Sync" }).waitFor();
    await page.getByText(/^This phone is offline: what you capture is kept here and sent by itself/).waitFor();
    await page.getByLabel("Changes to send: 1").waitFor();
    await page.getByLabel("Photos waiting: 1").waitFor();
    await screenshot(page, "capture-sync-offline-phone");
    await context.setOffline(false);
    await page.getByText(/^This phone is offline/).waitFor({ state: "detached" });
    await page.getByRole("button", { name: "Send now" }).click();
    await page.getByLabel("Changes to send: 0").waitFor();
    await page.getByLabel("Photos waiting: 0").waitFor();
    await page.getByRole("heading", { name: "up to date" }).waitFor();
    await page.getByLabel(/^Last synced: (just now|\d+ min ago)$/).waitFor();
    // Someone else sees the room and its photo, now served by the API.
    const other = await suite.browser.newContext({ viewport: PHONE });
    const op = await other.newPage();
    const watch = watchPage(op);
    await signInThroughUi(op, suite.server, "tomas@lanternfield.test");
    await openDemoSiteFromDesk(op);
    await op.getByRole("link", { name: /^Sewing room: 0 devices, no gaps/ }).click();
    const served = op.getByRole("img", { name: "Photo: Ceiling access" });
    await served.waitFor();
    expect(await served.getAttribute("src")).toMatch(/\/api\/photos\/[0-9a-f-]{36}$/);
    await expect.poll(() => served.evaluate((img) => (img as HTMLImageElement).complete && (img as HTMLImageElement).naturalWidth)).toBe(1);
    expect(realProblems(watch)).toEqual([]);
    await other.close();
    await context.close();
  });

  it("tells the person whose value was replaced, once, and lets them dismiss it", async () => {
    const a = await suite.browser.newContext({ viewport: PHONE });
    const pa = await a.newPage();
    await signInThroughUi(pa, suite.server, "priya@lanternfield.test");
    await openDemoWalk(pa);
    await openDevice(pa, "Hall", "Hall smart-home hub");
    await pa.getByRole("link", { name: /^Sync: up to date/ }).waitFor();
    // The surveyor changes the outlet distance in a basement with no signal…
    await a.setOffline(true);
    await pa.getByRole("textbox", { name: "Nearest outlet distance" }).fill("0.8");
    await pa.getByRole("button", { name: "Save device" }).click();
    await pa.getByRole("link", { name: "Sync: saved on this phone · offline, 1 change to send" }).waitFor();

    // …while the designer sets the same field from the office.
    const b = await suite.browser.newContext({ viewport: PHONE });
    const pb = await b.newPage();
    const watch = watchPage(pb);
    await signInThroughUi(pb, suite.server, "tomas@lanternfield.test");
    await openDemoSiteFromDesk(pb);
    await openDevice(pb, "Hall", "Hall smart-home hub");
    await pb.getByRole("link", { name: /^Sync: up to date/ }).waitFor();
    await pb.getByRole("textbox", { name: "Nearest outlet distance" }).fill("2");
    await pb.getByRole("button", { name: "Save device" }).click();
    await pb.getByText("Saved on this phone.", { exact: true }).waitFor();
    await expect.poll(async () => (await serverItemData("hub-hall"))?.outletDistanceM, { timeout: 20_000 }).toBe(2);

    // The surveyor's change arrives later and wins; the designer is told what was lost.
    await a.setOffline(false);
    await pa.getByRole("link", { name: /^Sync: up to date$/ }).waitFor();
    expect((await serverItemData("hub-hall"))?.outletDistanceM).toBe(0.8);
    await pb.getByRole("link", { name: /^Sync: up to date/ }).click();
    await pb.getByRole("heading", { name: "Sync" }).waitFor();
    await pb.getByRole("button", { name: "Send now" }).click();
    const text = "Your value 2 m for nearest outlet distance was replaced by 0.8 m from another surveyor.";
    await pb.getByText(text).waitFor();
    await screenshot(pb, "capture-sync-notice-phone");
    // Until it is read, the walk's pill says so.
    await pb.goBack();
    await pb.getByRole("link", { name: "Sync: needs you, 1 notice to read" }).click();
    await pb.getByRole("button", { name: `Dismiss: ${text}` }).click();
    await pb.getByText("Nothing needs you").waitFor();
    expect(await pb.getByText(text).count()).toBe(0);
    // Shown once: back on the device, the pill has nothing left to read.
    await pb.goBack();
    await pb.getByRole("heading", { name: "Hall smart-home hub" }).waitFor();
    await pb.getByRole("link", { name: /^Sync: up to date$/ }).waitFor();
    // The winner is not told anything.
    expect(await pa.getByRole("link", { name: /notice/ }).count()).toBe(0);
    expect(realProblems(watch)).toEqual([]);
    await a.close();
    await b.close();
  });
  it("a room typed with a name the walk has is added once, numbered, and says so", async () => {
    const context = await suite.browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    const watch = watchPage(page);
    await signInThroughUi(page, suite.server, "priya@lanternfield.test");
    await openDemoWalk(page);
    await page.getByRole("button", { name: "Add room to Ground floor" }).click();
    const name = page.getByRole("group", { name: "Add a room to Ground floor" }).getByRole("textbox", { name: "Or a room by name" });
    await name.fill("Kitchen ");
    // Enter in the field and a click on the button straight after: one room, not two.
    await name.press("Enter");
    await page.getByRole("button", { name: "Add this room" }).click({ timeout: 1000 }).catch(() => undefined);
    await page.getByRole("heading", { name: "Kitchen 2", exact: true }).waitFor();
    await page.getByText('The walk already has a room called "Kitchen", so this one was given a number. Change its room name below if it has a better one.').waitFor();
    await screenshot(page, "capture-room-numbered-phone");
    await page.getByRole("link", { name: /^Back to .*Okonkwo-Lindqvist house/ }).click();
    await page.getByRole("link", { name: /^Kitchen 2: / }).waitFor();
    expect(await page.getByRole("link", { name: /^Kitchen \d: / }).count()).toBe(1);
    expect(realProblems(watch)).toEqual([]);
    await context.close();
  });
});
