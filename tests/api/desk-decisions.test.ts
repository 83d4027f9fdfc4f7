// The designer's decisions against a real Postgres: a reason is required, every change is kept in
// the history, the evaluation follows the decision, pins reach the phones, and only designers and
// admins may decide. Hand placements that would overload a switch are refused unless forced.
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import type { Express } from "express";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID, seedDemoOnce } from "../../db/seed";
import { decisionHistory, items, teams } from "../../db/schema";
import { createApp } from "../../server/app";
import type { PlanView } from "../../server/services/plan";
import { deviceDecisionNote } from "../../hooks/queries/plan";
import type { PullResponse } from "../../sync/protocol";
import { signInWithPassword, type Agent } from "../support/auth-client";
import { createTestDb, type TestDb } from "../support/test-db";
import { testContext } from "../support/test-server";

let testDb: TestDb;
let app: Express;
let tomas: Agent; // designer
let imke: Agent; // admin
let priya: Agent; // surveyor on the demo site

const base = `/api/sites/${DEMO_SITE_ID}`;
const decide = (agent: Agent, deviceId: string, body: object) => agent.put(`${base}/devices/${deviceId}/decision`).send(body);
const plan = async (agent: Agent = tomas): Promise<PlanView> => (await agent.get(`${base}/plan`).expect(200)).body.plan;
const device = (p: PlanView, id: string) => p.devices.find((d) => d.deviceId === id)!;
const teamVersion = async () => (await testDb.db.select({ v: teams.version }).from(teams).where(eq(teams.id, "team_lanternfield")))[0].v;
const item = async (id: string) => (await testDb.db.select().from(items).where(eq(items.id, id)))[0];

beforeAll(async () => {
  testDb = await createTestDb();
  await seedDemoOnce(testDb.db);
  app = createApp(testContext(testDb.db));
  tomas = await signInWithPassword(app, "tomas@lanternfield.test", DEMO_PASSWORD);
  imke = await signInWithPassword(app, "imke@lanternfield.test", DEMO_PASSWORD);
  priya = await signInWithPassword(app, "priya@lanternfield.test", DEMO_PASSWORD);
});
afterAll(() => testDb.drop());

describe("the plan of the demo site", () => {
  it("is the rules' evaluation of the captured items, grouped by floor and room, with the checklist", async () => {
    const p = await plan();
    expect(p.devices).toHaveLength(16);
    expect(p.completeness).toMatchObject({ total: 16, complete: 13, withGaps: 3, leftOut: 0, leftOutDevices: [] });
    expect(p.floors.map((f) => f.name)).toEqual(["Basement", "Ground floor", "Upper floor"]);
    expect(p.floors[1].rooms.find((r) => r.name === "Porch")!.deviceIds).toEqual(["cam-porch", "bell-front"]);
    expect(device(p, "ap-living").label).toBe("PoE (Class 4, 802.3at port)");
    expect(device(p, "display-hall").recommendation).toBe("new_outlet");
    expect(device(p, "ap-living").decision).toBeNull();
    const sw = p.switches.find((s) => s.sourceId === "sw-closet")!;
    expect(sw.portsUsed).toBe(8);
    expect(sw.basisW).toBeLessThanOrEqual(sw.ceilingW);
    expect(p.site.surveyorNames).toEqual(["Priya Halloway"]);
    expect(p.lastSyncAt).toEqual(expect.any(String));
  });

  it("a surveyor of the site reads it (the homeowner's 403 is in the access matrix)", async () => {
    expect((await plan(priya)).devices).toHaveLength(16);
  });
});

describe("a decision needs a reason", () => {
  it("refuses a missing, empty or blank reason with a 400 that names the field, and saves nothing", async () => {
    const before = await teamVersion();
    for (const reason of [undefined, "", "   "]) {
      const res = await decide(tomas, "cam-garage", { method: "poe_splitter", ...(reason === undefined ? {} : { reason }) }).expect(400);
      expect(res.body.error.code).toBe("invalid_input");
      expect(res.body.error.fields.reason[0]).toMatch(/Give a reason/);
    }
    expect(device(await plan(), "cam-garage").decision).toBeNull();
    expect(await testDb.db.select().from(decisionHistory)).toHaveLength(0);
    expect(await teamVersion()).toBe(before);
  });

  it("names every bad field of the decision", async () => {
    const res = await decide(tomas, "cam-garage", { method: "wireless", poeClass: 11, port: 0, reason: "x" }).expect(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(["method", "poeClass", "port"]);
  });

  it("refuses what cannot power the device: PoE into a barrel plug, a splitter at the wrong voltage or too small", async () => {
    const poe = await decide(tomas, "cam-garage", { method: "poe", reason: "try" }).expect(400);
    expect(poe.body.error.fields.method[0]).toMatch(/not PoE: choose PoE \+ splitter or an outlet/);
    const volts = await decide(tomas, "cam-garage", { method: "poe_splitter", splitter: { volts: 24, amps: 1 }, reason: "try" }).expect(400);
    expect(volts.body.error.fields["splitter.volts"][0]).toMatch(/takes 12 V/);
    const amps = await decide(tomas, "cam-garage", { method: "poe_splitter", splitter: { volts: 12, amps: 0.5 }, reason: "try" }).expect(400);
    expect(amps.body.error.fields["splitter.amps"][0]).toMatch(/at least 1 A/);
    const passive = await decide(tomas, "link-shed", { method: "poe", reason: "try" }).expect(400);
    expect(passive.body.error.fields.method[0]).toMatch(/passive PoE/);
    const low = await decide(tomas, "ap-living", { method: "poe", poeClass: 2, reason: "try" }).expect(400);
    expect(low.body.error.fields.poeClass[0]).toMatch(/Class 2 guarantees only 6.49 W/);
  });

  it("a surveyor, a homeowner and another team cannot decide", async () => {
    expect((await decide(priya, "cam-garage", { method: "poe_splitter", reason: "mine" })).status).toBe(403);
    const other = await decide(tomas, "no-such-device", { method: "existing_outlet", reason: "x" });
    expect(other.status).toBe(404);
  });
});

describe("a decision changes the evaluation and is kept", () => {
  it("a splitter for the garage camera: it counts as PoE, takes a port and shows as a designer decision", async () => {
    const before = await plan();
    expect(device(before, "cam-garage").recommendation).toBe("existing_outlet");
    // The closet switch's ports are all used: taking one for the camera leaves another device without
    // one. That is refused by name, and saves nothing, unless forced with a reason.
    const placedBefore = new Set(before.devices.filter((d) => d.placement !== null).map((d) => d.deviceId));
    const version = await teamVersion();
    const refused = await decide(tomas, "cam-garage", { method: "poe_splitter", reason: "The outlet there is switched by the light; keep the camera on the cable." }).expect(409);
    expect(refused.body.error.code).toBe("displaces_device");
    expect(refused.body.error.message).toMatch(/^"[^"]+" would lose its port: .*Choose another method, port or source, or confirm with "force"/);
    expect(await teamVersion()).toBe(version);
    expect(device(await plan(), "cam-garage").decision).toBeNull();
    const res = await decide(tomas, "cam-garage", { method: "poe_splitter", reason: "The outlet there is switched by the light; keep the camera on the cable.", force: true }).expect(200);
    const p: PlanView = res.body.plan;
    const named = /^"([^"]+)"/.exec(refused.body.error.message)![1];
    const lost = p.devices.find((d) => d.name === named)!;
    expect(placedBefore.has(lost.deviceId)).toBe(true);
    expect(lost.placement).toBeNull();
    expect(device(p, "cam-garage").decision).toMatchObject({ forced: true });
    const cam = device(p, "cam-garage");
    expect(cam.recommendation).toBe("poe_splitter");
    expect(cam.label).toBe("PoE + splitter (12 V · 1 A · 5.5×2.1 mm, centre-positive)");
    expect(cam.rule).toEqual({ recommendation: "existing_outlet", label: "existing outlet" });
    expect(cam.decision).toMatchObject({ method: "poe_splitter", reason: expect.stringContaining("switched by the light"), decidedBy: "Tomas Ferreira-Lund" });
    expect(cam.reasons[0]).toMatch(/^Designer decision: /);
    expect(cam.warnings.map((w) => w.code)).toContain("designer_decision");
    // Its CCA run still carries the no-CCA error, now with the PoE checks.
    expect(cam.warnings.some((w) => w.code.includes("cca"))).toBe(true);
    // It now needs a port: the summary counts a splitter for it.
    expect(p.summary.byRecommendation.poe_splitter).toBe(before.summary.byRecommendation.poe_splitter + 1);
    expect(p.materials.lines.some((l) => l.group === "splitters" && l.deviceIds.includes("cam-garage"))).toBe(true);
    expect(p.history["cam-garage"][0]).toMatchObject({ action: "decided", by: "Tomas Ferreira-Lund", reason: expect.stringContaining("switched by the light") });
  });

  it("an outlet for a PoE device takes it off the switch: the budget and the battery follow", async () => {
    const before = await plan();
    const swBefore = before.switches.find((s) => s.sourceId === "sw-closet")!;
    const res = await decide(imke, "sw-bed2", { method: "new_outlet", reason: "The homeowner wants the desk switch on its own outlet." }).expect(200);
    const p: PlanView = res.body.plan;
    const sw = p.switches.find((s) => s.sourceId === "sw-closet")!;
    expect(device(p, "sw-bed2")).toMatchObject({ recommendation: "new_outlet", poe: null, placement: null });
    expect(sw.rows.map((r) => r.deviceId)).not.toContain("sw-bed2");
    expect(p.materials.lines.find((l) => l.key === "electrician:new-outlet")!.deviceIds).toContain("sw-bed2");
    // It takes power only over its cable: a standard injector next to it, plugged into the new outlet.
    expect(device(p, "sw-bed2").outlet).toMatchObject({ via: "poe_injector" });
    expect(p.materials.lines.find((l) => l.key === "injector-at-device:class4")!.deviceIds).toEqual(["sw-bed2"]);
    expect(device(p, "sw-bed2").cautions.map((c) => c.id)).toContain("mains_electrician");
    // The battery carries less, so it lasts longer.
    expect(p.batteries[0].runtimeMinutes!).toBeGreaterThan(before.batteries[0].runtimeMinutes!);
    void swBefore;
  });

  it("a second decision replaces the first and the history keeps both; removing it needs a reason too", async () => {
    await decide(tomas, "cam-garage", { method: "existing_outlet", reason: "Back to the outlet after all." }).expect(200);
    const p = await plan();
    expect(device(p, "cam-garage").decision!.method).toBe("existing_outlet");
    expect(p.history["cam-garage"].map((h) => h.action)).toEqual(["decided", "decided"]);
    expect(p.history["cam-garage"][0].before).toMatchObject({ method: "poe_splitter" });

    const noReason = await tomas.delete(`${base}/devices/cam-garage/decision`).send({}).expect(400);
    expect(noReason.body.error.fields.reason).toBeDefined();
    const cleared = await tomas.delete(`${base}/devices/cam-garage/decision`).send({ reason: "The rules' advice is fine." }).expect(200);
    const after: PlanView = cleared.body.plan;
    expect(device(after, "cam-garage").decision).toBeNull();
    expect(device(after, "cam-garage").recommendation).toBe("existing_outlet");
    expect(after.history["cam-garage"].map((h) => h.action)).toEqual(["cleared", "decided", "decided"]);
    await tomas.delete(`${base}/devices/cam-garage/decision`).send({ reason: "again" }).expect(404);
  });

  it("the surveyor's walk reads the decision from the plan, and is told when a later capture no longer fits it", async () => {
    await decide(tomas, "cam-drive", { method: "poe_splitter", reason: "Keep the driveway camera up in a power cut." }).expect(200);
    const note = deviceDecisionNote(await plan(priya), "cam-drive")!;
    // The rules already advise a splitter for it outdoors; the decision pins that choice down.
    expect(note).toMatchObject({ ruleLabel: note.label, stale: null, decision: { method: "poe_splitter", reason: "Keep the driveway camera up in a power cut.", decidedBy: "Tomas Ferreira-Lund" } });
    expect(note.label).toMatch(/^PoE \+ splitter \(12 V/);
    expect(deviceDecisionNote(await plan(priya), "cam-porch")).toBeNull();
    // A later walk finds it takes mains through its own plug: a splitter cannot power that.
    const captured = await item("cam-drive");
    await testDb.db.update(items).set({ data: { ...captured.data, input: { type: "ac_plug" }, power: { by: "watts", watts: 6 } }, version: captured.version + 1 }).where(eq(items.id, "cam-drive"));
    const stale = deviceDecisionNote(await plan(priya), "cam-drive")!;
    expect(stale.stale).toMatch(/^The designer decision \(PoE \+ splitter\) no longer fits what was captured: .+ The rules' advice applies until it is changed\.$/);
    await testDb.db.update(items).set({ data: captured.data, version: captured.version + 2 }).where(eq(items.id, "cam-drive"));
    await tomas.delete(`${base}/devices/cam-drive/decision`).send({ reason: "Back to the rules." }).expect(200);
  });

  it("a class override changes what the switch reserves", async () => {
    const before = (await plan()).switches.find((s) => s.sourceId === "sw-closet")!;
    const res = await decide(tomas, "ap-garage", { method: "poe", poeClass: 4, reason: "A newer access point may replace it." }).expect(200);
    const sw = (res.body.plan as PlanView).switches.find((s) => s.sourceId === "sw-closet")!;
    expect(sw.reservedW).toBeCloseTo(before.reservedW - 15.4 + 30, 3);
  });
});

describe("placing a device by hand", () => {
  let bench: string;

  it("a new switch in the closet is an item: validated, versioned, pulled by the phones", async () => {
    const bad = await tomas.post(`${base}/closet/sources`).send({ kind: "poe_switch", name: "", poeType: 7, budgetW: -30, poePorts: 4.5, colour: "red" }).expect(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(["budgetW", "colour", "name", "poePorts", "poeType"]);
    const before = await teamVersion();
    const res = await tomas.post(`${base}/closet/sources`).send({ kind: "poe_switch", name: "Bench switch", poeType: 2, budgetW: 30, poePorts: 4, ownDrawW: 4 }).expect(201);
    bench = res.body.id;
    const row = await item(bench);
    expect(row).toMatchObject({ kind: "source", deleted: false, version: before + 1, updatedBy: "user_tomas" });
    expect(row.data).toMatchObject({ name: "Bench switch", roomId: "rm-closet" });
    const pulled = (await priya.post("/api/sync/pull").send({ clientId: randomUUID(), cursor: before, knownSiteIds: [DEMO_SITE_ID] }).expect(200)).body as PullResponse;
    expect(pulled.items.map((i) => i.id)).toContain(bench);
  });

  it("pins the device to the port: the item carries the pin, the phones pull it, the budgets reflect it", async () => {
    const before = await teamVersion();
    const res = await decide(tomas, "sw-bed2", { method: "poe", sourceId: bench, port: 2, reason: "Bedroom runs go to the bench switch." }).expect(200);
    const p: PlanView = res.body.plan;
    expect(device(p, "sw-bed2").placement).toMatchObject({ sourceId: bench, port: 2, pinned: true });
    expect(p.switches.find((s) => s.sourceId === bench)!.rows.map((r) => r.deviceId)).toEqual(["sw-bed2"]);
    expect((await item("sw-bed2")).data).toMatchObject({ sourceId: bench, port: 2 });
    expect((await item("sw-bed2")).version).toBe(before + 1);
    const pulled = (await priya.post("/api/sync/pull").send({ clientId: randomUUID(), cursor: before, knownSiteIds: [DEMO_SITE_ID] }).expect(200)).body as PullResponse;
    expect(pulled.items.find((i) => i.id === "sw-bed2")!.data).toMatchObject({ sourceId: bench, port: 2 });
  });

  it("a device moved by hand takes its port and every other device keeps its own, except the one it bumps", async () => {
    const at = (p: PlanView) => new Map(p.devices.filter((d) => d.placement).map((d) => [d.deviceId, `${d.placement!.sourceId}:${d.placement!.port}`]));
    const before = await plan();
    const was = at(before);
    const bumped = [...was].find(([, where]) => where === "sw-closet:2")?.[0];
    const portOf = (where: string) => Number(where.split(":")[1]);
    const mover = [...was]
      .filter(([id, where]) => where.startsWith("sw-closet:") && id !== bumped && device(before, id).recommendation === "poe")
      .sort((a, b) => portOf(b[1]) - portOf(a[1]))[0][0];
    const res = await decide(tomas, mover, { method: "poe", sourceId: "sw-closet", port: 2, reason: "Shortest patch lead to the panel." }).expect(200);
    const now = at(res.body.plan);
    expect(now.get(mover)).toBe("sw-closet:2");
    for (const [id, where] of was) if (id !== mover && id !== bumped) expect([id, now.get(id)]).toEqual([id, where]);
    if (bumped) expect(now.get(bumped)).not.toBe("sw-closet:2");
    // The held ports are the automatic assignment's: "Assign ports" may still move them.
    const held = [...was.keys()].filter((id) => {
      const placed = device(before, id).placement!;
      return id !== mover && id !== bumped && (!placed.pinned || placed.auto);
    });
    expect(held.length).toBeGreaterThan(0);
    for (const id of held) expect(device(res.body.plan, id).placement).toMatchObject({ pinned: true, auto: true });
  });

  it("refuses a taken port and a port that does not exist", async () => {
    const taken = await decide(tomas, "ap-living", { method: "poe", sourceId: bench, port: 2, reason: "try" }).expect(409);
    expect(taken.body.error.code).toBe("port_taken");
    expect(taken.body.error.fields.port[0]).toMatch(/Bedroom 2 desk switch/);
    const missing = await decide(tomas, "ap-living", { method: "poe", sourceId: bench, port: 9, reason: "try" }).expect(400);
    expect(missing.body.error.fields.port[0]).toMatch(/has 4 PoE ports/);
    const outlet = await decide(tomas, "ap-living", { method: "poe", sourceId: "out-closet-battery", reason: "try" }).expect(400);
    expect(outlet.body.error.fields.sourceId[0]).toMatch(/is an outlet/);
  });

  it("refuses a port of too low a type, even when forced", async () => {
    const res = await decide(tomas, "ap-office", { method: "poe", sourceId: bench, reason: "try", force: true }).expect(409);
    expect(res.body.error.code).toBe("pinned_type_too_low");
  });

  it("refuses a placement over the budget with the reason, unless forced with a reason", async () => {
    const before = await teamVersion();
    const pinBefore = (await item("cam-yard")).data.sourceId;
    const res = await decide(tomas, "cam-yard", { method: "poe", sourceId: bench, port: 1, reason: "Move the yard camera too." }).expect(409);
    expect(res.body.error.code).toBe("over_budget");
    expect(res.body.error.message).toMatch(/"Bench switch" would draw 38.\d+ W, over its 30 W budget/);
    expect(await teamVersion()).toBe(before);
    expect((await item("cam-yard")).data.sourceId).toBe(pinBefore);

    const forced = await decide(tomas, "cam-yard", { method: "poe", sourceId: bench, port: 1, reason: "Temporary: a bigger switch is on order.", force: true }).expect(200);
    const p: PlanView = forced.body.plan;
    const sw = p.switches.find((s) => s.sourceId === bench)!;
    expect(sw.overBudget).toBe(true);
    expect(device(p, "cam-yard").decision).toMatchObject({ forced: true, sourceId: bench, port: 1 });
    expect(p.history["cam-yard"][0]).toMatchObject({ forced: true, reason: "Temporary: a bigger switch is on order." });
    expect(p.warnings.some((w) => w.code === "over_budget" && w.sourceId === bench)).toBe(true);
  });

  it("removing the switch unpins its devices and records why", async () => {
    const res = await tomas.delete(`${base}/closet/sources/${bench}`).expect(200);
    const p: PlanView = res.body.plan;
    expect(p.closet.sources.map((s) => s.id)).not.toContain(bench);
    expect((await item("cam-yard")).data.sourceId).toBeUndefined();
    expect(device(p, "cam-yard").decision).toMatchObject({ sourceId: null, port: null });
    expect(p.history["cam-yard"][0]).toMatchObject({ action: "source_removed" });
    expect(device(p, "cam-yard").placement!.sourceId).toBe("sw-closet");
  });
});
