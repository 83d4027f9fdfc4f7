// Automatic port assignment (critical devices first, never over a budget or the planning ceiling),
// the closet's battery, unit prices with totals, the CSV export parsed back, and the desk's table.
import { parse } from "csv-parse/sync";
import { eq } from "drizzle-orm";
import type { Express } from "express";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID, seedDemoOnce } from "../../db/seed";
import { decisionHistory, items, sitePlans } from "../../db/schema";
import { createApp } from "../../server/app";
import type { PlanView } from "../../server/services/plan";
import { walkProgress } from "../../survey/walk/gaps";
import { signInWithPassword, type Agent } from "../support/auth-client";
import { createTestDb, type TestDb } from "../support/test-db";
import { testContext } from "../support/test-server";

let testDb: TestDb;
let app: Express;
let tomas: Agent;
let priya: Agent;

const base = `/api/sites/${DEMO_SITE_ID}`;
const plan = async (): Promise<PlanView> => (await tomas.get(`${base}/plan`).expect(200)).body.plan;
const item = async (id: string) => (await testDb.db.select().from(items).where(eq(items.id, id)))[0];
const CRITICAL = ["cam-yard", "ap-living", "cam-porch", "hub-kitchen"];

beforeAll(async () => {
  testDb = await createTestDb();
  await seedDemoOnce(testDb.db);
  app = createApp(testContext(testDb.db));
  tomas = await signInWithPassword(app, "tomas@lanternfield.test", DEMO_PASSWORD);
  priya = await signInWithPassword(app, "priya@lanternfield.test", DEMO_PASSWORD);
});
afterAll(() => testDb.drop());

describe("automatic port assignment", () => {
  it("writes the rules' placement as pins, critical devices on the lowest ports", async () => {
    const res = await tomas.post(`${base}/assign-ports`).send({}).expect(200);
    const p: PlanView = res.body.plan;
    expect(res.body.placed).toBe(8);
    const sw = p.switches.find((s) => s.sourceId === "sw-closet")!;
    expect(sw.rows.slice(0, 4).map((r) => r.deviceId).sort()).toEqual([...CRITICAL].sort());
    expect(sw.basisW).toBeLessThanOrEqual(sw.ceilingW);
    for (const r of sw.rows) expect((await item(r.deviceId)).data).toMatchObject({ sourceId: "sw-closet", port: r.port });
    // The surveyor's own pin (office access point on its injector) stays.
    expect((await item("ap-office")).data).toMatchObject({ sourceId: "inj-office", port: 1 });
    expect(p.autoPlaced.sort()).toEqual(sw.rows.map((r) => r.deviceId).sort());
    const history = await testDb.db.select().from(decisionHistory).where(eq(decisionHistory.action, "auto_placed"));
    expect(history).toHaveLength(8);
    // Running it again changes nothing.
    const again = await tomas.post(`${base}/assign-ports`).send({}).expect(200);
    expect(again.body.moved).toBe(0);
  });

  it("with few ports, the critical devices get them and the rest are listed with a reason", async () => {
    await tomas.patch(`${base}/closet/sources/sw-closet`).send({ poePorts: 4 }).expect(400); // ports 5–8 are pinned
    // Free the pins first: remove the automatic ones by re-running on a switch with ports to spare, then shrink.
    await testDb.db.update(sitePlans).set({ autoPlaced: [] }).where(eq(sitePlans.siteId, DEMO_SITE_ID));
    for (const id of ["sw-bed2", "ap-garage", "cam-drive", "bell-back", ...CRITICAL]) {
      await testDb.db.update(items).set({ data: { ...(await item(id)).data, sourceId: undefined, port: undefined } }).where(eq(items.id, id));
    }
    await tomas.patch(`${base}/closet/sources/sw-closet`).send({ poePorts: 4 }).expect(200);
    const res = await tomas.post(`${base}/assign-ports`).send({ reason: "Four ports until the second switch arrives." }).expect(200);
    const p: PlanView = res.body.plan;
    const sw = p.switches.find((s) => s.sourceId === "sw-closet")!;
    expect(sw.rows.map((r) => r.deviceId).sort()).toEqual([...CRITICAL].sort());
    expect(res.body.unassigned.map((u: { deviceId: string }) => u.deviceId).sort()).toEqual(["ap-garage", "bell-back", "cam-drive", "sw-bed2"]);
    expect(res.body.unassigned[0].reason).toMatch(/ports .* taken/);
    expect(p.summary.switches.additionalNeeded).toBe(1);
    expect(p.materials.lines.some((l) => l.key.startsWith("poe-switch:additional"))).toBe(true);
    expect(p.history["cam-yard"][0].reason).toBe("Four ports until the second switch arrives.");
  });

  it("never goes over the planning ceiling: a small budget takes only what fits, critical devices first", async () => {
    await tomas.patch(`${base}/closet/sources/sw-closet`).send({ poePorts: 8, budgetW: 50 }).expect(200);
    const res = await tomas.post(`${base}/assign-ports`).send({}).expect(200);
    const p: PlanView = res.body.plan;
    const sw = p.switches.find((s) => s.sourceId === "sw-closet")!;
    expect(sw.ceilingW).toBe(40);
    expect(sw.basisW).toBeLessThanOrEqual(40);
    expect(sw.overCeiling).toBe(false);
    expect(sw.rows.map((r) => r.deviceId).sort()).toEqual(["ap-living", "cam-porch", "cam-yard"]);
    expect(p.assignment.unassigned.find((u) => u.deviceId === "hub-kitchen")!.code).toBe("over_ceiling");
    // The devices that lost their automatic pins are unpinned in the items too.
    expect((await item("hub-kitchen")).data.sourceId).toBeUndefined();
  });

  it("a surveyor cannot run it", async () => {
    await priya.post(`${base}/assign-ports`).send({}).expect(403);
  });
});

describe("the closet's battery", () => {
  it("names each bad field, then runs the outage from what was saved", async () => {
    const bad = await tomas.patch(`${base}/closet/batteries/ups-closet`).send({ depthOfDischarge: 1.5, ageFactor: 0, feeds: ["sw-closet", "nowhere"] }).expect(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(["ageFactor", "depthOfDischarge"]);
    const feeds = await tomas.patch(`${base}/closet/batteries/ups-closet`).send({ feeds: ["sw-closet", "nowhere"] }).expect(400);
    expect(feeds.body.error.fields["feeds.1"][0]).toMatch(/no power source "nowhere"/);
    const before = (await plan()).batteries[0];
    const res = await tomas.patch(`${base}/closet/batteries/ups-closet`).send({ capacity: { by: "wh", wh: 432 }, ageFactor: 0.8 }).expect(200);
    const after = (res.body.plan as PlanView).batteries[0];
    expect(after.capacityWh).toBe(432);
    expect(after.usableWh).toBeCloseTo(432 * 0.8 * 0.9 * 0.8, 3);
    expect(after.runtimeMinutes!).toBeGreaterThan(before.runtimeMinutes!);
    const porch = (res.body.plan as PlanView).outage.devices.find((d) => d.deviceId === "cam-porch")!;
    expect(porch).toMatchObject({ staysUp: true, minutes: after.runtimeMinutes });
  });
});

describe("materials", () => {
  it("prices lines by key, totals them in cents, and refuses a bad price naming it", async () => {
    const bad = await tomas.put(`${base}/prices`).send({ "wall-plate:1-port": -1, "keystone:cat6": 1.234, "Bad Key!": 3 }).expect(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(["Bad Key!", "keystone:cat6", "wall-plate:1-port"]);
    const res = await tomas.put(`${base}/prices`).send({ "wall-plate:1-port": 3.1, "keystone:cat6": 4.45, "cable:cat6:indoor:m": 0.7 }).expect(200);
    const m = (res.body.plan as PlanView).materials;
    const line = (key: string) => m.lines.find((l) => l.key === key)!;
    expect(line("wall-plate:1-port").lineTotal).toBeCloseTo(line("wall-plate:1-port").quantity * 3.1, 6);
    const expected = Math.round(line("wall-plate:1-port").quantity * 310 + line("keystone:cat6").quantity * 445 + line("cable:cat6:indoor:m").quantity * 70) / 100;
    expect(m.total).toBe(expected);
    expect(m.pricedCount).toBe(3);
    expect(m.unpricedCount).toBe(m.lines.length - 3);
    // null removes a price; the others stay.
    const cleared = await tomas.put(`${base}/prices`).send({ "cable:cat6:indoor:m": null }).expect(200);
    expect(cleared.body.prices).toEqual({ "wall-plate:1-port": 3.1, "keystone:cat6": 4.45 });
    await priya.put(`${base}/prices`).send({ "wall-plate:1-port": 1 }).expect(403);
  });

  it("exports a CSV that parses back to the same lines, with a BOM and formulas escaped", async () => {
    await tomas.patch(`${base}/closet/sources/sw-closet`).send({ name: '=SUM(A1:A9), "closet" switch' }).expect(200);
    const p = await plan();
    const res = await tomas.get(`${base}/materials.csv`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on("data", (c: Buffer) => chunks.push(c));
      r.on("end", () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    expect(res.headers["content-type"]).toMatch(/^text\/csv/);
    expect(res.headers["content-disposition"]).toMatch(/attachment; filename="the-okonkwo-lindqvist-house-materials.csv"/);
    const body = res.body as Buffer;
    expect([...body.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const rows: string[][] = parse(body, { bom: true });
    expect(rows[0]).toEqual(["Group", "Item", "For", "Quantity", "Unit", "Unit price", "Line total", "Note", "Price key"]);
    expect(rows).toHaveLength(p.materials.lines.length + 2);
    p.materials.lines.forEach((l, i) => {
      expect(rows[i + 1][1]).toBe(l.item);
      expect(Number(rows[i + 1][3])).toBe(l.quantity);
      expect(rows[i + 1][8]).toBe(l.key);
      expect(rows[i + 1][5]).toBe(l.unitPrice === null ? "" : l.unitPrice.toFixed(2));
    });
    const switchRow = rows.find((r) => r[8].startsWith("poe-switch:type2"))!;
    expect(switchRow[2]).toBe(`'=SUM(A1:A9), "closet" switch`);
    expect(rows.at(-1)![0]).toBe("Total");
    expect(Number(rows.at(-1)![6])).toBe(p.materials.total);
  });
});

describe("the desk's table of sites", () => {
  it("lists every site of the team with its people, checklist and last sync", async () => {
    await tomas.post("/api/sites").send({ name: "An empty house" }).expect(201);
    const res = await tomas.get("/api/desk/sites").expect(200);
    const demo = res.body.sites.find((s: { id: string }) => s.id === DEMO_SITE_ID);
    expect(demo).toMatchObject({
      name: "The Okonkwo-Lindqvist house",
      status: "surveying",
      clientName: "June Okonkwo-Lindqvist",
      surveyors: [{ id: "user_priya", name: "Priya Halloway" }],
      // The walk's own count of the same items: two typical power figures and a polarity not read.
      devices: { total: 16, complete: 13, withGaps: 3, leftOut: 0 },
    });
    expect(new Date(demo.lastSyncAt).getTime()).toBeGreaterThan(Date.now() - 60_000);
    const empty = res.body.sites.find((s: { name: string }) => s.name === "An empty house");
    expect(empty).toMatchObject({ devices: { total: 0, complete: 0, withGaps: 0, leftOut: 0 }, lastSyncAt: null, surveyors: [] });
    await priya.get("/api/desk/sites").expect(403);
  });

  it("counts a device the walk has not finished as left out of the plan, as the walk on the phone does", async () => {
    await testDb.db.insert(items).values({ id: "half-done", teamId: "team_lanternfield", siteId: DEMO_SITE_ID, kind: "device", data: { name: "Half-captured camera", kind: "camera", roomId: "rm-hall" }, version: 99 });
    const res = await tomas.get("/api/desk/sites").expect(200);
    const counts = { total: 17, complete: 13, withGaps: 3, leftOut: 1 };
    expect(res.body.sites.find((s: { id: string }) => s.id === DEMO_SITE_ID).devices).toEqual(counts);
    const p = await plan();
    expect(p.completeness).toEqual({ ...counts, leftOutDevices: [{ id: "half-done", name: "Half-captured camera" }] });
    // The phone counts the same items the same way: what a surveyor pulls gives these numbers.
    const rows = await testDb.db.select().from(items).where(eq(items.siteId, DEMO_SITE_ID));
    const walk = walkProgress({ closetRoomId: "rm-closet" }, rows);
    expect({ total: walk.devices, complete: walk.devicesComplete, withGaps: walk.devicesWithGaps, leftOut: walk.devicesLeftOut }).toEqual(counts);
    const decide = await tomas.put(`${base}/devices/half-done/decision`).send({ method: "poe", reason: "x" }).expect(409);
    expect(decide.body.error.code).toBe("device_incomplete");
  });
});
