import { describe, expect, it } from "vitest";
import { applyDecisions } from "../../survey/decisions";
import { demoSite } from "../../survey/demo-site";
import { buildMaterials, materialsCsvRows, priceMaterials, PricesInputSchema } from "../../survey/materials";
import { parseSite, type Site } from "../../survey/model";
import { evaluateDevice } from "../../survey/rules/recommend-device";
import { evaluateSite, orderLengthM } from "../../survey/rules/evaluate-site";
import * as v from "valibot";

const materialsOf = (site: Site) => buildMaterials(site, evaluateSite(site));
const line = (lines: ReturnType<typeof materialsOf>, key: string) => lines.find((l) => l.key === key);

function site(patch: (s: ReturnType<typeof structuredClone<typeof demoSite>>) => void): Site {
  const s = structuredClone(demoSite);
  patch(s);
  const r = parseSite(s);
  if (!r.ok) throw new Error(r.errors.map((e) => `${e.path}: ${e.message}`).join("; "));
  return r.value;
}

describe("materials of the demo house", () => {
  const lines = materialsOf(demoSite);

  it("has the closet's switch and injector, one line per kind of thing", () => {
    expect(line(lines, "poe-switch:type2:8-port:120w")).toMatchObject({ quantity: 1, group: "switches", detail: "Closet PoE switch" });
    expect(line(lines, "injector:type3:1-port")).toMatchObject({ quantity: 1, item: "PoE injector, 802.3bt Type 3, 1 port" });
    expect(new Set(lines.map((l) => l.key)).size).toBe(lines.length);
  });

  it("groups splitters by output volts, amps and plug", () => {
    const splitters = lines.filter((l) => l.group === "splitters");
    expect(splitters.map((l) => [l.key, l.quantity])).toEqual([
      ["splitter:5v:1a:usb-c", 1],
      ["splitter:12v:0.5a:5.5x2.5-mm-polarity-unknown", 1],
    ]);
    expect(splitters[1].note).toMatch(/polarity/);
  });

  it("orders cable by category with slack, outdoor-rated apart, and copper in place of CCA", () => {
    const runs = demoSite.devices.filter((d) => d.run);
    const outdoorCat6 = runs.filter((d) => d.run!.category === "cat6" && (d.outdoor || d.cableAccess === "exterior"));
    expect(line(lines, "cable:cat6:outdoor:m")!.quantity).toBe(Math.ceil(outdoorCat6.reduce((s, d) => s + orderLengthM(d.run!.lengthM), 0)));
    const cca = line(lines, "cable:cat5e:indoor:m")!;
    expect(cca.item).toMatch(/solid copper/);
    expect(cca.note).toMatch(/never CCA/);
    expect(line(lines, "cable:cat6:outdoor:m")!.note).toMatch(/surge protection/);
  });

  it("counts a keystone at each end and a plate or outdoor box per drop", () => {
    const drops = demoSite.devices.filter((d) => d.run).length;
    const keystones = lines.filter((l) => l.key.startsWith("keystone:")).reduce((s, l) => s + l.quantity, 0);
    expect(keystones).toBe(drops * 2);
    expect(line(lines, "wall-plate:1-port")!.quantity + line(lines, "outdoor-box:1-port")!.quantity).toBe(drops);
  });

  it("lists the battery and the electrician's new outlet with their cautions", () => {
    expect(line(lines, "battery:108wh")).toMatchObject({ quantity: 1, group: "battery" });
    expect(line(lines, "electrician:new-outlet")).toMatchObject({ quantity: 1, deviceIds: ["display-hall"], note: expect.stringMatching(/licensed electrician/) });
  });

  it("in imperial units orders cable in feet", () => {
    const imperial = site((s) => void (s.settings.units = "imperial"));
    const l = materialsOf(imperial);
    const m = line(lines, "cable:cat6:indoor:m")!;
    const ft = line(l, "cable:cat6:indoor:ft")!;
    expect(ft.unit).toBe("ft");
    expect(ft.quantity).toBeGreaterThan(m.quantity * 3.2);
  });
});

describe("what changes the materials", () => {
  it("a doorbell transformer and the estimated extra switch show up when needed", () => {
    const s = site((x) => {
      const sw = x.powerSources[0] as { poePorts: number };
      sw.poePorts = 2;
      const bell = x.devices.find((d) => d.id === "bell-front")! as { outletDistanceM?: number };
      delete bell.outletDistanceM;
    });
    const l = materialsOf(s);
    expect(line(l, "electrician:doorbell-transformer")).toMatchObject({ quantity: 1, deviceIds: ["bell-front"] });
    const extra = l.find((x) => x.key.startsWith("poe-switch:additional"))!;
    expect(extra.quantity).toBeGreaterThan(0);
    expect(extra.deviceIds.length).toBeGreaterThan(0);
    // Its ports are of the highest PoE type the devices left over need (IEEE 802.3: Class 0–3 → Type 1, 4 → Type 2, 5–6 → 3, 7–8 → 4).
    const ev = evaluateSite(s);
    const typeOf = (id: string) => { const d = ev.devices.find((x) => x.deviceId === id)!; return d.poe?.poeType ?? d.splitter?.poeType ?? 1; };
    const need = Math.max(...extra.deviceIds.map(typeOf));
    expect(extra.item).toContain(need >= 3 ? `802.3bt Type ${need} or better` : need === 2 ? "802.3at or better" : "802.3af or better");
  });

  it("a run longer than a network cable may be is ordered as captured, and its line says so", () => {
    // TIA-568: 100 m channel, 90 m permanent link + cords (../shared/reference/poe-facts.md).
    expect(line(materialsOf(demoSite), "cable:cat6:indoor:m")!.note).not.toMatch(/longer than a network cable may be/);
    const s = site((x) => {
      const ap = x.devices.find((d) => d.id === "ap-living")! as { run?: { lengthM: number; category: string } };
      ap.run = { lengthM: 150, category: "cat6" };
    });
    expect(line(materialsOf(s), "cable:cat6:indoor:m")!.note).toMatch(/1 run is longer than a network cable may be \(100 m with its cords, TIA-568\) and counted as captured: a switch nearer the device shortens it\./);
  });

  it("a designer decision moves a device between groups", () => {
    const base = demoSite.devices.map((d) => evaluateDevice(d, demoSite));
    const applied = applyDecisions(demoSite, base, new Map([["hub-hall", { method: "poe_splitter" as const, reason: "keep the hub on the cable" }]]));
    const l = buildMaterials(demoSite, evaluateSite(demoSite, applied.devices));
    expect(l.find((x) => x.group === "splitters" && x.deviceIds.includes("hub-hall"))).toBeDefined();
  });
});

describe("prices", () => {
  const lines = materialsOf(demoSite);

  it("totals priced lines in cents and leaves the others unpriced", () => {
    const cable = line(lines, "cable:cat6:indoor:m")!;
    const m = priceMaterials(lines, { "cable:cat6:indoor:m": 0.1, "wall-plate:1-port": 0.2, "keystone:cat6": 0.7 });
    const expected = (cable.quantity * 10 + line(lines, "wall-plate:1-port")!.quantity * 20 + line(lines, "keystone:cat6")!.quantity * 70) / 100;
    expect(m.total).toBe(expected);
    expect(m.pricedCount).toBe(3);
    expect(m.unpricedCount).toBe(lines.length - 3);
    expect(m.lines.find((l) => l.key === "battery:108wh")).toMatchObject({ unitPrice: null, lineTotal: null });
  });

  it("a price of 0 counts as priced", () => {
    const m = priceMaterials(lines, { "battery:108wh": 0 });
    expect(m.pricedCount).toBe(1);
    expect(m.lines.find((l) => l.key === "battery:108wh")!.lineTotal).toBe(0);
  });

  it("refuses negative prices, fractions of a cent and bad keys, naming each", () => {
    const r = v.safeParse(PricesInputSchema, { "battery:108wh": -2, "keystone:cat6": 0.001, "NOT A KEY": 1 });
    expect(r.success).toBe(false);
    const paths = (r.issues ?? []).map((i) => v.getDotPath(i));
    expect(paths).toEqual(expect.arrayContaining(["battery:108wh", "keystone:cat6", "NOT A KEY"]));
    expect(v.safeParse(PricesInputSchema, { "battery:108wh": 129.99, "keystone:cat6": null }).success).toBe(true);
  });

  it("writes CSV rows with a header and a total row", () => {
    const m = priceMaterials(lines, { "battery:108wh": 120 });
    const rows = materialsCsvRows(m, { name: "A house" });
    expect(rows[0][0]).toBe("Group");
    expect(rows).toHaveLength(lines.length + 2);
    expect(rows.at(-1)).toEqual(["Total", "A house: 1 priced line, " + (lines.length - 1) + " without a price", "", "", "", "", "120.00", "", ""]);
  });
});
