import * as v from "valibot";
import { describe, expect, it } from "vitest";
import { applyDecision, applyDecisions, DecisionInputSchema } from "../../survey/decisions";
import { demoSite } from "../../survey/demo-site";
import { evaluateDevice } from "../../survey/rules/recommend-device";
import { evaluateSite } from "../../survey/rules/evaluate-site";
import { buildMaterials } from "../../survey/materials";

const dev = (id: string) => demoSite.devices.find((d) => d.id === id)!;
const baseOf = (id: string) => evaluateDevice(dev(id), demoSite);
const decideOn = (id: string, d: Parameters<typeof applyDecision>[2]) => applyDecision(dev(id), baseOf(id), d, demoSite.settings);

describe("the decision schema", () => {
  it("needs a reason that is not blank", () => {
    for (const reason of [undefined, "", "  \n "]) {
      const r = v.safeParse(DecisionInputSchema, { method: "poe", reason });
      expect(r.success).toBe(false);
      expect(r.issues![0].message).toMatch(/Give a reason/);
    }
    expect(v.safeParse(DecisionInputSchema, { method: "poe", reason: " ok " }).output).toMatchObject({ reason: "ok", force: false });
  });
});

describe("applying a decision", () => {
  it("PoE + splitter for an outlet device gives it a port plan sized from its need", () => {
    const r = decideOn("cam-garage", { method: "poe_splitter", reason: "r" });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.evaluation.recommendation).toBe("poe_splitter");
    expect(r.evaluation.splitter).toMatchObject({ outputVolts: 12, ratingAmps: 1, minAmps: 1 });
    expect(r.evaluation.poe!.pdLoadW).toBeCloseTo(12 / 0.85, 3);
    expect(r.evaluation.poe!.poeClass).toBe(4);
    expect(r.evaluation.reasons[0]).toBe("Designer decision: r");
  });

  it("a splitter rated above the need keeps the class the need asks for", () => {
    const r = decideOn("cam-drive", { method: "poe_splitter", splitter: { volts: 12, amps: 2 }, reason: "spare" });
    expect(r.ok && r.evaluation.splitter).toMatchObject({ ratingAmps: 2, poeClass: 3 });
  });

  it("a higher class override reserves more; a class below the need is refused", () => {
    const up = decideOn("ap-garage", { method: "poe", poeClass: 5, reason: "future" });
    expect(up.ok && up.evaluation.poe).toMatchObject({ poeClass: 5, poeType: 3, reservedW: 45 });
    const down = decideOn("sw-bed2", { method: "poe", poeClass: 3, reason: "x" });
    expect(!down.ok && down.errors.poeClass[0]).toMatch(/Class 3 guarantees only 12.95 W/);
  });

  it("refuses unsafe or impossible methods with the field to fix", () => {
    const acSplitter = decideOn("bell-front", { method: "poe_splitter", reason: "x" });
    expect(!acSplitter.ok && acSplitter.errors.method[0]).toMatch(/cannot power it/);
    const passive = decideOn("link-shed", { method: "poe_splitter", reason: "x" });
    expect(!passive.ok && passive.errors.method[0]).toMatch(/never connect it to a standard PoE port/);
    const usb = decideOn("hub-kitchen", { method: "poe_splitter", splitter: { volts: 12, amps: 1 }, reason: "x" });
    expect(!usb.ok && usb.errors["splitter.volts"][0]).toMatch(/USB-C supplies 5, 9, 15, 20 V/);
    const classOnOutlet = decideOn("hub-hall", { method: "existing_outlet", poeClass: 3, reason: "x" });
    expect(!classOnOutlet.ok && classOnOutlet.errors.poeClass).toBeDefined();
  });

  it("an existing outlet far from the device carries a warning; a new outlet the electrician's caution", () => {
    const far = decideOn("display-hall", { method: "existing_outlet", reason: "extension is fine" });
    expect(far.ok && far.evaluation.warnings.map((w) => w.code)).toContain("outlet_not_near");
    const newer = decideOn("ap-living", { method: "new_outlet", reason: "x" });
    expect(newer.ok && newer.evaluation.cautions.map((c) => c.id)).toContain("mains_electrician");
    expect(newer.ok && newer.evaluation.poe).toBeNull();
  });

  it("a PoE device on an outlet is fed by a standard injector next to it, never by an adapter it does not have", () => {
    // ap-living states Class 4; Class 4 needs at least an 802.3at (Type 2) port (poe-facts §1.3, the IEEE 802.3 class table).
    const r = decideOn("ap-living", { method: "existing_outlet", reason: "local outlet on the ceiling" });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.evaluation.outlet).toMatchObject({ via: "poe_injector", location: "device", electrician: false });
    expect(r.evaluation.reasons.join(" ")).toContain("a standard PoE injector next to it (Class 4, 802.3at or better) plugs into an existing outlet");
    expect(r.evaluation.reasons.join(" ")).not.toMatch(/adapter/);
    const site = { ...demoSite, devices: demoSite.devices };
    const base = demoSite.devices.map((d) => evaluateDevice(d, demoSite));
    const applied = applyDecisions(site, base, new Map([["ap-living", { method: "existing_outlet" as const, reason: "local outlet" }], ["sw-bed2", { method: "new_outlet" as const, reason: "own outlet" }]]));
    const lines = buildMaterials(demoSite, evaluateSite(demoSite, applied.devices));
    expect(lines.find((l) => l.key === "injector-at-device:class4")).toMatchObject({ group: "injectors", quantity: 2, deviceIds: ["ap-living", "sw-bed2"] });
  });

  it("PoE over a run that is too long is marked as failing", () => {
    const long = { ...dev("ap-garage"), run: { lengthM: 120, category: "cat6" as const, cca: false } };
    const r = applyDecision(long, evaluateDevice(long, demoSite), { method: "poe", reason: "x" }, demoSite.settings);
    expect(r.ok && r.poeProblem).toMatch(/longer than/);
    expect(r.ok && r.evaluation.warnings.map((w) => w.code)).toContain("decision_poe_fails");
  });
});

describe("decisions across the site", () => {
  it("the switch budget and the battery follow the decisions", () => {
    const base = demoSite.devices.map((d) => evaluateDevice(d, demoSite));
    const plain = evaluateSite(demoSite);
    const applied = applyDecisions(demoSite, base, new Map([["sw-bed2", { method: "existing_outlet" as const, reason: "own outlet" }]]));
    const e = evaluateSite(demoSite, applied.devices);
    const before = plain.switches.find((s) => s.sourceId === "sw-closet")!;
    const after = e.switches.find((s) => s.sourceId === "sw-closet")!;
    expect(after.expectedW).toBeCloseTo(before.expectedW - plain.devices.find((d) => d.deviceId === "sw-bed2")!.poe!.expectedPseW, 3);
    expect(e.batteries[0].runtimeMinutes!).toBeGreaterThan(plain.batteries[0].runtimeMinutes!);
  });

  it("a decision that no longer fits is not applied, with a warning", () => {
    const base = demoSite.devices.map((d) => evaluateDevice(d, demoSite));
    const applied = applyDecisions(demoSite, base, new Map([["cam-porch", { method: "poe_splitter" as const, reason: "old" }]]));
    const porch = applied.devices.find((d) => d.deviceId === "cam-porch")!;
    expect(porch.recommendation).toBe("poe");
    expect(porch.warnings[0].code).toBe("decision_stale");
    expect(applied.stale.get("cam-porch")).toMatch(/takes PoE itself/);
  });
});
