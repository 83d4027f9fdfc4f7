// The materials (bill of materials) of a plan: what to buy and what the electrician installs,
// counted from the evaluated plan. Pure: the desk shows it, the server prices it and writes the CSV.
//
// - PoE switches and injectors: the closet's own, grouped by type, ports and budget; plus the extra
//   switches the rules estimate for devices left without a port.
// - Splitters: grouped by output volts, rated amps and plug (the rules' grouping).
// - Battery backup: one line per capacity.
// - Cable: by category, indoor and outdoor-rated apart, ordered with slack (10 % + a 3 m service loop
//   per drop, common practice). A run captured as copper-clad aluminium is ordered as solid copper.
// - Terminations per drop: a keystone jack at each end, a wall plate indoors or a weatherproof box outdoors.
// - The electrician: each new outlet or doorbell transformer (mains work, licensed electrician, local code).
// Each line has a price key, the same on every site for the same thing, so a unit price carries over.
import * as v from "valibot";
import { injectorClassWords, localInjectorClass } from "./decisions";
import type { Site } from "./model/site";
import { orderLengthM, type SiteEvaluation } from "./rules/evaluate-site";
import { CABLE_CATEGORY_NAMES, CHANNEL_LIMITS, type CableCategory } from "./standards/cabling";
import { PLANNING } from "./standards/planning-defaults";
import type { PoeClass } from "./standards/poe-classes";
import { poeTypeName, type PoeType } from "./standards/poe-types";
import { formatNumber, metresToFeet, type UnitSystem } from "./units";

export const MATERIAL_GROUPS = ["switches", "injectors", "splitters", "battery", "cable", "terminations", "electrician"] as const;
export type MaterialGroup = (typeof MATERIAL_GROUPS)[number];

export const MATERIAL_GROUP_NAMES: Readonly<Record<MaterialGroup, string>> = {
  switches: "PoE switches",
  injectors: "PoE injectors",
  splitters: "PoE splitters",
  battery: "Battery backup",
  cable: "Cable",
  terminations: "Wall plates and keystones",
  electrician: "For the electrician",
};

export interface MaterialLine {
  /** Price key: the same thing has the same key on every site. */
  readonly key: string;
  readonly group: MaterialGroup;
  readonly item: string;
  /** What it is for: names of sources, devices or rooms. */
  readonly detail: string;
  readonly quantity: number;
  readonly unit: "each" | "m" | "ft";
  readonly deviceIds: readonly string[];
  /** A caution or remark that goes with the line. */
  readonly note: string;
}

export interface PricedLine extends MaterialLine {
  readonly unitPrice: number | null;
  readonly lineTotal: number | null;
}

export interface PricedMaterials {
  readonly lines: readonly PricedLine[];
  /** Sum of the priced lines. */
  readonly total: number;
  readonly pricedCount: number;
  readonly unpricedCount: number;
}

function slug(s: string): string {
  return s
    .toLowerCase()
    .replace(/×/g, "x")
    .replace(/[^a-z0-9.]+/g, "-")
    .replace(/^-+|-+$/g, "");
}

function names(list: readonly string[]): string {
  const counts = new Map<string, number>();
  for (const n of list) counts.set(n, (counts.get(n) ?? 0) + 1);
  return [...counts].map(([n, c]) => (c > 1 ? `${n} ×${c}` : n)).join("; ");
}

function lengthIn(units: UnitSystem, metres: number): number {
  return Math.ceil((units === "imperial" ? metresToFeet(metres) : metres) - 1e-9);
}

/** Counts the materials of an evaluated plan (the site as evaluated, and its evaluation). */
export function buildMaterials(site: Site, evaluation: SiteEvaluation): MaterialLine[] {
  const lines: MaterialLine[] = [];
  const units = site.settings.units;
  const deviceById = new Map(site.devices.map((d) => [d.id, d]));
  const deviceName = (id: string) => deviceById.get(id)?.name ?? id;

  // Switches and injectors of the closet, grouped by what one would buy.
  const sourceGroups = new Map<string, { group: MaterialGroup; item: string; names: string[] }>();
  for (const s of site.powerSources) {
    if (s.kind === "poe_switch") {
      const key = `poe-switch:type${s.poeType}:${s.poePorts}-port:${formatNumber(s.budgetW)}w`;
      const g = sourceGroups.get(key) ?? { group: "switches", item: `PoE switch, ${poeTypeName(s.poeType)}, ${s.poePorts} PoE ports, ${formatNumber(s.budgetW)} W budget`, names: [] };
      g.names.push(s.name);
      sourceGroups.set(key, g);
    } else if (s.kind === "injector") {
      const key = `injector:type${s.poeType}:${s.ports}-port`;
      const g = sourceGroups.get(key) ?? { group: "injectors", item: `PoE injector, ${poeTypeName(s.poeType)}, ${s.ports} port${s.ports === 1 ? "" : "s"}`, names: [] };
      g.names.push(s.name);
      sourceGroups.set(key, g);
    }
  }
  for (const [key, g] of sourceGroups) {
    lines.push({ key, group: g.group, item: g.item, detail: names(g.names), quantity: g.names.length, unit: "each", deviceIds: [], note: "" });
  }
  const extra = evaluation.summary.switches;
  if (extra.additionalNeeded > 0) {
    let ports = PLANNING.placeholderSwitch.value.ports;
    let budget = PLANNING.placeholderSwitch.value.budgetW;
    let best = -1;
    for (const s of site.powerSources) {
      if (s.kind === "poe_switch" && s.budgetW > best) [best, ports, budget] = [s.budgetW, s.poePorts, s.budgetW];
    }
    const unassigned = evaluation.assignment.unassigned.map((u) => u.deviceId);
    // The ports must be of the highest type the devices left over need (a splitter's class counts).
    const byId = new Map(evaluation.devices.map((d) => [d.deviceId, d]));
    let needType = 1;
    for (const id of unassigned) {
      const d = byId.get(id);
      const t = d?.poe?.poeType ?? d?.splitter?.poeType ?? 1;
      if (t > needType) needType = t;
    }
    lines.push({
      key: `poe-switch:additional:${ports}-port:${formatNumber(budget)}w`,
      group: "switches",
      item: `Additional PoE switch, ${poeTypeName(needType as PoeType)} or better, ${ports} PoE ports, ${formatNumber(budget)} W budget (estimate)`,
      detail: `for ${names(unassigned.map(deviceName))}`,
      quantity: extra.additionalNeeded,
      unit: "each",
      deviceIds: unassigned,
      note: extra.additionalBasis ? `Estimated as ${extra.additionalBasis}.` : "",
    });
  }

  for (const s of evaluation.summary.splitters) {
    lines.push({
      key: `splitter:${formatNumber(s.outputVolts)}v:${formatNumber(s.ratingAmps)}a:${slug(s.plug)}`,
      group: "splitters",
      item: `PoE splitter, ${formatNumber(s.outputVolts)} V · ${formatNumber(s.ratingAmps)} A · ${s.plug}, accepts Class ${s.maxPoeClass}`,
      detail: names(s.deviceIds.map(deviceName)),
      quantity: s.count,
      unit: "each",
      deviceIds: s.deviceIds,
      note: s.plug.includes("polarity unknown") ? "Check the device's plug polarity before buying." : "Check plug size and polarity against the device before connecting.",
    });
  }

  // A PoE device the designer put on an outlet takes a standard injector next to it, by the class it serves.
  const localInjectors = new Map<PoeClass, string[]>();
  for (const e of evaluation.devices) {
    const device = e.outlet?.via === "poe_injector" ? deviceById.get(e.deviceId) : undefined;
    if (device === undefined) continue;
    const c = localInjectorClass(device, e);
    localInjectors.set(c, [...(localInjectors.get(c) ?? []), e.deviceId]);
  }
  for (const [c, ids] of [...localInjectors].sort((a, b) => a[0] - b[0])) {
    lines.push({
      key: `injector-at-device:class${c}`,
      group: "injectors",
      item: `PoE injector at the device, ${injectorClassWords(c)}`,
      detail: names(ids.map(deviceName)),
      quantity: ids.length,
      unit: "each",
      deviceIds: ids,
      note: "Plugs into the outlet next to the device. A standard (802.3) injector only, never a passive one.",
    });
  }

  const batteryGroups = new Map<string, { wh: number; names: string[] }>();
  for (const b of evaluation.batteries) {
    const key = `battery:${formatNumber(b.capacityWh, 0)}wh`;
    const g = batteryGroups.get(key) ?? { wh: b.capacityWh, names: [] };
    g.names.push(`${b.name} (about ${b.runtimeText} on battery)`);
    batteryGroups.set(key, g);
  }
  for (const [key, g] of batteryGroups) {
    lines.push({
      key,
      group: "battery",
      item: `Battery backup (UPS), ${formatNumber(g.wh, 0)} Wh`,
      detail: names(g.names),
      quantity: g.names.length,
      unit: "each",
      deviceIds: [],
      note: "Runtimes are estimates; place and ventilate it as its instructions say.",
    });
  }

  // Cable and terminations, per drop.
  const cableGroups = new Map<string, { category: CableCategory; outdoor: boolean; metres: number; drops: number; cca: number; tooLong: number; deviceIds: string[] }>();
  const plates = { indoor: [] as string[], outdoor: [] as string[] };
  const keystones = new Map<CableCategory, string[]>();
  for (const run of evaluation.cableRuns) {
    const device = deviceById.get(run.deviceId);
    const outdoor = Boolean(device && (device.outdoor || device.cableAccess === "exterior"));
    const key = `${run.category}|${outdoor}`;
    const g = cableGroups.get(key) ?? { category: run.category, outdoor, metres: 0, drops: 0, cca: 0, tooLong: 0, deviceIds: [] };
    g.metres += orderLengthM(run.lengthM);
    g.drops++;
    if (run.cca) g.cca++;
    if (!run.withinChannel) g.tooLong++;
    g.deviceIds.push(run.deviceId);
    cableGroups.set(key, g);
    (outdoor ? plates.outdoor : plates.indoor).push(run.deviceId);
    const k = keystones.get(run.category) ?? [];
    k.push(run.deviceId);
    keystones.set(run.category, k);
  }
  const order: CableCategory[] = ["cat5e", "cat6", "cat6a"];
  const cableLines = [...cableGroups.values()].sort((a, b) => order.indexOf(a.category) - order.indexOf(b.category) || Number(a.outdoor) - Number(b.outdoor));
  for (const g of cableLines) {
    const cat = CABLE_CATEGORY_NAMES[g.category];
    const unit = units === "imperial" ? "ft" : "m";
    const notes = [`${g.drops} drop${g.drops === 1 ? "" : "s"}, with 10 % slack and a 3 m service loop each.`];
    if (g.cca) notes.push(`${g.cca} run${g.cca === 1 ? " was" : "s were"} captured as copper-clad aluminium: order solid copper, never CCA.`);
    if (g.tooLong) {
      notes.push(`${g.tooLong === 1 ? "1 run is" : `${g.tooLong} runs are`} longer than a network cable may be (${CHANNEL_LIMITS.channelMaxM} m with its cords, TIA-568) and counted as captured: a switch nearer the device shortens ${g.tooLong === 1 ? "it" : "them"}.`);
    }
    if (g.outdoor) notes.push("Outdoor runs need UV / burial rated cable, surge protection and bonding where they enter the house.");
    lines.push({
      key: `cable:${g.category}:${g.outdoor ? "outdoor" : "indoor"}:${unit}`,
      group: "cable",
      item: `${cat} cable, solid copper, ${g.outdoor ? "outdoor rated" : "indoor (CM / CMR where it rises between floors)"}`,
      detail: names(g.deviceIds.map(deviceName)),
      quantity: lengthIn(units, g.metres),
      unit,
      deviceIds: g.deviceIds,
      note: notes.join(" "),
    });
  }
  for (const cat of order) {
    const ids = keystones.get(cat);
    if (!ids) continue;
    lines.push({
      key: `keystone:${cat}`,
      group: "terminations",
      item: `Keystone jack, ${CABLE_CATEGORY_NAMES[cat]}`,
      detail: "one at each end of every drop",
      quantity: ids.length * 2,
      unit: "each",
      deviceIds: ids,
      note: "",
    });
  }
  if (plates.indoor.length) {
    lines.push({ key: "wall-plate:1-port", group: "terminations", item: "Wall plate, 1 port", detail: names(plates.indoor.map(deviceName)), quantity: plates.indoor.length, unit: "each", deviceIds: plates.indoor, note: "Keep network cable out of boxes that hold mains wiring." });
  }
  if (plates.outdoor.length) {
    lines.push({ key: "outdoor-box:1-port", group: "terminations", item: "Weatherproof outdoor box, 1 port", detail: names(plates.outdoor.map(deviceName)), quantity: plates.outdoor.length, unit: "each", deviceIds: plates.outdoor, note: "" });
  }

  const outlets = evaluation.summary.newOutlets.filter((o) => o.via !== "transformer");
  const transformers = evaluation.summary.newOutlets.filter((o) => o.via === "transformer");
  const where = (rows: typeof outlets) => names(rows.map((o) => `${o.roomName}: ${o.deviceName}${o.mustStayUp ? " (on a battery-fed circuit)" : ""}`));
  if (outlets.length) {
    lines.push({
      key: "electrician:new-outlet",
      group: "electrician",
      item: "New outlet, installed by a licensed electrician",
      detail: where(outlets),
      quantity: outlets.length,
      unit: "each",
      deviceIds: outlets.map((o) => o.deviceId),
      note: "Mains work: a licensed electrician, to local code.",
    });
  }
  if (transformers.length) {
    lines.push({
      key: "electrician:doorbell-transformer",
      group: "electrician",
      item: "Doorbell transformer (at least 16 V, 30 VA), installed by a licensed electrician",
      detail: where(transformers),
      quantity: transformers.length,
      unit: "each",
      deviceIds: transformers.map((o) => o.deviceId),
      note: "Its primary side is mains: a licensed electrician, to local code.",
    });
  }
  return lines;
}

/** Money is added in cents, so totals never drift. */
function cents(x: number): number {
  return Math.round(x * 100);
}

/** Puts unit prices on the lines and adds them up; a line without a price stays unpriced. */
export function priceMaterials(lines: readonly MaterialLine[], prices: Readonly<Record<string, number>>): PricedMaterials {
  let total = 0;
  let pricedCount = 0;
  const priced = lines.map((l) => {
    const unitPrice = Object.prototype.hasOwnProperty.call(prices, l.key) ? prices[l.key] : null;
    if (unitPrice === null || unitPrice === undefined) return { ...l, unitPrice: null, lineTotal: null };
    const lineCents = Math.round(cents(unitPrice) * l.quantity);
    total += lineCents;
    pricedCount++;
    return { ...l, unitPrice, lineTotal: lineCents / 100 };
  });
  return { lines: priced, total: total / 100, pricedCount, unpricedCount: lines.length - pricedCount };
}

export const PRICE_KEY_PATTERN = /^[a-z0-9][a-z0-9.:-]{0,159}$/;
export const MAX_UNIT_PRICE = 1_000_000;

/** `{key: unit price}`; `null` removes a price. At most two decimals. */
export const PricesInputSchema = v.pipe(
  v.record(
    v.pipe(v.string(), v.regex(PRICE_KEY_PATTERN, "A price key is lower-case letters, digits, dots, colons and dashes, as the materials list gives it.")),
    v.nullable(
      v.pipe(
        v.number("A unit price must be a number."),
        v.finite("A unit price must be a finite number."),
        v.minValue(0, "A unit price cannot be negative."),
        v.maxValue(MAX_UNIT_PRICE, `A unit price can be at most ${MAX_UNIT_PRICE.toLocaleString("en")}.`),
        v.check((x) => Math.abs(x * 100 - Math.round(x * 100)) < 1e-6, "Give the unit price to the cent (at most two decimals)."),
      ),
    ),
    "Send the prices as an object of price keys and unit prices.",
  ),
  v.check((r) => Object.keys(r).length > 0, "Send at least one price."),
  v.check((r) => Object.keys(r).length <= 500, "Send at most 500 prices at once."),
);
export type PricesInput = v.InferOutput<typeof PricesInputSchema>;

/** The rows of the CSV export, header first: plain values, quoting is the writer's job. */
export function materialsCsvRows(m: PricedMaterials, site: { name: string }): (string | number)[][] {
  const rows: (string | number)[][] = [["Group", "Item", "For", "Quantity", "Unit", "Unit price", "Line total", "Note", "Price key"]];
  for (const l of m.lines) {
    rows.push([MATERIAL_GROUP_NAMES[l.group], l.item, l.detail, l.quantity, l.unit, l.unitPrice === null ? "" : l.unitPrice.toFixed(2), l.lineTotal === null ? "" : l.lineTotal.toFixed(2), l.note, l.key]);
  }
  rows.push(["Total", `${site.name}: ${m.pricedCount} priced line${m.pricedCount === 1 ? "" : "s"}${m.unpricedCount ? `, ${m.unpricedCount} without a price` : ""}`, "", "", "", "", m.total.toFixed(2), "", ""]);
  return rows;
}

/** The currency of every price and total: unit prices are typed in it and reports state it. */
export const MATERIALS_CURRENCY = "USD";
