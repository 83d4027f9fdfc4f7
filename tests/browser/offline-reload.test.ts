// A walk with no signal, as a surveyor lives it: capture a room and two devices offline, reload the
// app offline and find them, come back online while the server dies mid-push and restarts; in the
// end Postgres has every change exactly once.
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { sql } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { findFreePort } from "../../db/cluster";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID, seedDemoOnce } from "../../db/seed";
import { signInWithPassword } from "../support/auth-client";
import { PHONE, launchBrowser, screenshot } from "../support/browser";
import { spawnServer, type ServerProcess } from "../support/server-process";
import { createTestDb, type TestDb } from "../support/test-db";

let testDb: TestDb;
let browser: Browser;
let server: ServerProcess;
let port: number;
const secret = randomUUID() + randomUUID();
const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-offline-"));

const start = async () => (server = await spawnServer({ databaseUrl: testDb.url, port, authSecret: secret, objectsDir: dataDir }));

beforeAll(async () => {
  testDb = await createTestDb();
  await seedDemoOnce(testDb.db);
  port = await findFreePort(44_000, 5000);
  await start();
  browser = await launchBrowser();
}, 60_000);
afterAll(async () => {
  await browser?.close();
  server?.child.kill("SIGKILL");
  await testDb?.drop();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

async function openWalk(page: Page) {
  await page.getByRole("link", { name: /Okonkwo-Lindqvist house/ }).first().click();
  await page.getByRole("link", { name: /^Sync: up to date/ }).waitFor({ timeout: 20_000 });
}

describe("offline walk", () => {
  it("captures offline, survives an offline reload, and syncs once through a server crash", async () => {
    const context = await browser.newContext({ viewport: PHONE });
    const page = await context.newPage();
    await page.goto(`${server.url}/sign-in`, { waitUntil: "networkidle" });
    await page.getByRole("textbox", { name: "E-mail" }).fill("priya@lanternfield.test");
    await page.getByRole("textbox", { name: "Password" }).fill(DEMO_PASSWORD);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByRole("heading", { name: "Walks" }).waitFor();
    await openWalk(page);
    // The service worker keeps the app; from the next load on it answers when the network cannot.
    await page.evaluate(async () => {
      await navigator.serviceWorker.ready;
    });
    await page.reload({ waitUntil: "networkidle" });
    expect(await page.evaluate(() => Boolean(navigator.serviceWorker.controller))).toBe(true);
    await page.getByRole("link", { name: /^Sync: up to date/ }).waitFor({ timeout: 20_000 });

    await context.setOffline(true);
    await page.getByRole("button", { name: "Add room to Ground floor" }).click();
    await page.getByRole("group", { name: "Add a room to Ground floor" }).getByRole("textbox", { name: "Or a room by name" }).fill("Reading nook");
    await page.getByRole("button", { name: "Add this room" }).click();
    await page.getByRole("heading", { name: "Reading nook" }).waitFor();
    await page.getByRole("button", { name: "Add camera" }).click();
    await page.getByRole("link", { name: /^Reading nook camera: / }).waitFor();
    await page.getByRole("button", { name: "Add hub" }).click();
    await page.getByRole("link", { name: /^Reading nook hub: / }).waitFor();

    // Reload with no network: the app opens from the phone and the capture is still there.
    await page.reload({ waitUntil: "domcontentloaded" });
    await page.getByRole("heading", { name: "Reading nook" }).waitFor({ timeout: 20_000 });
    await page.getByRole("link", { name: /^Reading nook camera: / }).waitFor();
    await page.getByRole("link", { name: /^Reading nook hub: / }).waitFor();
    await page.getByRole("link", { name: /^Sync: saved on this phone/ }).waitFor();
    await screenshot(page, "offline-reload-phone");

    // Back online, the first push reaches a server that dies while answering it.
    let killed = false;
    await page.route("**/api/sync/push", async (route) => {
      if (!killed) {
        killed = true;
        server.child.kill("SIGKILL");
        await server.exited;
      }
      await route.continue().catch(() => undefined);
    });
    await context.setOffline(false);
    await page.evaluate(() => window.dispatchEvent(new Event("online")));
    await expect.poll(() => killed, { timeout: 20_000 }).toBe(true);
    await page.unroute("**/api/sync/push");
    await start();
    await page.getByRole("link", { name: /^Sync: up to date/ }).waitFor({ timeout: 60_000 });

    // Postgres, through the API and directly: the room and both devices, once each.
    const designer = await signInWithPassword(server.url, "tomas@lanternfield.test", DEMO_PASSWORD);
    const pulled = await designer.post("/api/sync/pull").send({ clientId: randomUUID(), cursor: 0, knownSiteIds: [] }).expect(200);
    const items = pulled.body.items as { id: string; kind: string; data: { name?: string; roomId?: string } }[];
    const rooms = items.filter((i) => i.kind === "room" && i.data.name === "Reading nook");
    expect(rooms).toHaveLength(1);
    expect(items.filter((i) => i.kind === "device" && i.data.roomId === rooms[0].id).map((i) => i.data.name).sort()).toEqual(["Reading nook camera", "Reading nook hub"]);
    const counts = await testDb.db.execute(sql`select count(*)::int as n from items where site_id = ${DEMO_SITE_ID} and data->>'name' like 'Reading nook%'`);
    expect(counts.rows[0].n).toBe(3);
    const client = await testDb.db.execute(sql`select last_mutation_id from sync_clients where user_id = 'user_priya'`);
    expect(client.rows.map((r) => Number(r.last_mutation_id))).toEqual([3]);
    await context.close();
  }, 180_000);
});
