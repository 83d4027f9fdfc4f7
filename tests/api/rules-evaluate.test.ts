import request from "supertest";
import type { Express } from "express";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { seedDemoOnce } from "../../db/seed";
import { createApp } from "../../server/app";
import { demoSite, demoSiteInput, evaluateSite } from "../../survey";
import { signInWithPassword, type Agent } from "../support/auth-client";
import { createTestDb, type TestDb } from "../support/test-db";
import { testContext } from "../support/test-server";

let testDb: TestDb;
let app: Express;
let designer: Agent;
beforeAll(async () => {
  testDb = await createTestDb();
  await seedDemoOnce(testDb.db);
  app = createApp(testContext(testDb.db));
  designer = await signInWithPassword(app, "tomas@lanternfield.test", DEMO_PASSWORD);
});
afterAll(() => testDb.drop());

describe("POST /api/rules/evaluate", () => {
  it("returns the same evaluation the phone computes", async () => {
    const res = await designer.post("/api/rules/evaluate").send(demoSiteInput).expect(200);
    expect(res.body).toEqual(JSON.parse(JSON.stringify(evaluateSite(demoSite))));
    expect(res.body.summary).toBeDefined();
  });

  it("names each bad field: negative watts, a class that does not exist, a 10 km run, a barrel that does not exist", async () => {
    const bad = structuredClone(demoSiteInput) as unknown as { devices: Record<string, unknown>[] };
    bad.devices[0] = { ...bad.devices[0], power: { by: "watts", watts: -5 } };
    bad.devices[1] = { ...bad.devices[1], input: { type: "poe", class: 9 } };
    bad.devices[2] = { ...bad.devices[2], run: { lengthM: 10_000, category: "cat6" } };
    bad.devices[3] = { ...bad.devices[3], input: { type: "dc_barrel", outerMm: 5.5, innerMm: 3.0, polarity: "centre_positive", volts: 12 } };
    const res = await designer.post("/api/rules/evaluate").send(bad).expect(400);
    const keys = Object.keys(res.body.error.fields);
    expect(keys.some((k) => k.startsWith("devices.0.power"))).toBe(true);
    expect(keys.some((k) => k.startsWith("devices.1.input"))).toBe(true);
    expect(keys.some((k) => k.startsWith("devices.2.run"))).toBe(true);
    expect(keys.some((k) => k.startsWith("devices.3.input"))).toBe(true);
    const text = JSON.stringify(res.body.error.fields);
    expect(text).toContain("not a barrel size we know");
    expect(text).toMatch(/class 9 does not exist/i);
    expect(text).not.toContain("NaN");
  });

  it("needs a signed-in member", async () => {
    await request(app).post("/api/rules/evaluate").send(demoSiteInput).expect(401);
  });
});
