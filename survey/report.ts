// The recommendation report: what a published version of a plan says, frozen as plain data so it
// can be hashed, shown on screen, printed to PDF and compared with the next version. Pure.
import type { SiteEvaluation } from "./rules";
import type { SiteInput } from "./model/site";
import { formatLength } from "./units";
import { plainWords, type PortSource } from "./plain-words";

export interface ReportDevice {
  id: string;
  name: string;
  kind: string;
  label: string;
  recommendation: string;
  /**
   * The device in everyday words (how it is powered, a power cut, the cable work), for the homeowner;
   * `reasons` are then the technical detail. Absent in versions published before these were written.
   */
  plain?: string[];
  reasons: string[];
  warnings: string[];
  mustStayUp: boolean;
  /** Set when a designer chose differently from the rules, with their reason. */
  decision: { label: string; reason: string; by: string } | null;
}

export interface ReportMaterialLine {
  key: string;
  description: string;
  quantity: number;
  unit: string;
  unitPrice: number;
  total: number;
  /** False for a line without a unit price yet (its 0 is not a price); absent in versions published before it was kept. */
  priced?: boolean;
}

/** A line's amount as the homeowner reads it: "to be priced" rather than a 0 that looks free. */
export function lineAmount(line: Pick<ReportMaterialLine, "total" | "priced">, currency: string): string {
  return line.priced === false ? "to be priced" : `${line.total.toFixed(2)} ${currency}`;
}

export interface ReportContent {
  site: { id: string; name: string; address: string };
  team: string;
  version: number;
  publishedAt: string;
  units: "metric" | "imperial";
  summary: {
    devices: number;
    onPoe: number;
    onSplitters: number;
    onExistingOutlets: number;
    newOutlets: number;
    cannotPower: number;
    poeReservedW: number;
    poeExpectedW: number;
    staysUpOnBattery: number;
    mustStayUp: number;
    shortestRuntimeMin: number | null;
  };
  rooms: { id: string; name: string; floor: string; devices: ReportDevice[] }[];
  switches: { id: string; name: string; standard: string; budgetW: number; ceilingW: number; reservedW: number; expectedW: number; ports: number; portsUsed: number; overBudget: boolean }[];
  outage: { deviceId: string; name: string; staysUp: boolean; minutes: number | null; reason: string }[];
  cableRuns: { deviceId: string; name: string; category: string; length: string; ok: boolean; note: string | null }[];
  /** `unpricedCount`: lines still without a price (the total covers the priced ones); absent in versions published before it was kept. */
  materials: { lines: ReportMaterialLine[]; total: number; currency: string; unpricedCount?: number };
  cautions: { id: string; text: string; source: string }[];
  standards: string[];
}

/** Where the numbers come from, printed at the end of every report. */
export const REPORT_STANDARDS = [
  "IEEE 802.3af/at/bt (Clause 33 and 145): PoE Types 1–4 and Classes 0–8, power at the switch port and at the device",
  "ANSI/TIA-568 and ISO/IEC 11801: 90 m permanent link, 100 m channel",
  "TIA TSB-184-A: cable bundles for PoE, Cat 6A for new installations",
  "AWG conductor resistance (ASTM B258 sizes, annealed copper 1.724 × 10⁻⁸ Ω·m)",
  "NFPA 70 (NEC) Articles 725 and 800: power-limited and communications cabling; local code decides",
  "Battery runtime: usable Wh = V × Ah × depth of discharge × inverter efficiency × age derate",
];

export interface ReportInput {
  site: SiteInput & { address?: string };
  team: string;
  version: number;
  publishedAt: string;
  evaluation: SiteEvaluation;
  decisions: Record<string, { label: string; reason: string; by: string }>;
  /** `unpricedCount`: lines still without a price (the total covers the priced ones); absent in versions published before it was kept. */
  materials: { lines: ReportMaterialLine[]; total: number; currency: string; unpricedCount?: number };
}

const round = (n: number, digits = 1) => Math.round(n * 10 ** digits) / 10 ** digits;

export function buildReportContent(input: ReportInput): ReportContent {
  const { site, evaluation: ev } = input;
  const units = ev.units;
  const floors = new Map((site.floors ?? []).map((f) => [f.id, f.name]));
  const names = new Map(ev.devices.map((d) => [d.deviceId, d.name]));
  const by = ev.summary.byRecommendation;
  // Each device's warnings as the plan has them: its own, then the plan's about it (no port left
  // for it, a switch over budget shedding it, going down in a power cut), so the scope leaves none out.
  const warningsOf = new Map<string, string[]>();
  for (const w of ev.warnings) {
    if (w.deviceId === undefined || w.severity === "info") continue;
    const list = warningsOf.get(w.deviceId);
    if (list === undefined) warningsOf.set(w.deviceId, [w.message]);
    else if (!list.includes(w.message)) list.push(w.message);
  }
  const siteDevices = new Map((site.devices ?? []).map((d) => [d.id, d]));
  const sources = new Map((site.powerSources ?? []).map((s) => [s.id, s]));
  const portOf = new Map<string, PortSource>();
  for (const pl of ev.assignment.placements) {
    const s = sources.get(pl.sourceId);
    if (s !== undefined && (s.kind === "poe_switch" || s.kind === "injector")) portOf.set(pl.deviceId, { name: s.name, kind: s.kind });
  }
  const outageOf = new Map(ev.outage.devices.map((o) => [o.deviceId, o]));
  const runtimes = ev.outage.devices.filter((o) => o.mustStayUp && o.staysUp && o.minutes !== null).map((o) => o.minutes!);
  const rooms = (site.rooms ?? [])
    .map((r) => ({
      id: r.id,
      name: r.name,
      floor: floors.get(r.floorId) ?? "",
      devices: ev.devices
        .filter((d) => d.roomId === r.id)
        .map((d) => ({
          id: d.deviceId,
          name: d.name,
          kind: d.kind,
          label: input.decisions[d.deviceId]?.label ?? d.label,
          recommendation: d.recommendation,
          plain: plainWords({
            evaluation: d,
            cableAccess: siteDevices.get(d.deviceId)!.cableAccess,
            inCloset: d.roomId === site.closetRoomId,
            port: portOf.get(d.deviceId) ?? null,
            outage: outageOf.get(d.deviceId),
            units,
          }),
          reasons: [...d.reasons],
          warnings: warningsOf.get(d.deviceId) ?? [],
          mustStayUp: d.mustStayUp,
          decision: input.decisions[d.deviceId] ?? null,
        })),
    }))
    .filter((r) => r.devices.length > 0);
  return {
    site: { id: site.id, name: site.name, address: site.address ?? "" },
    team: input.team,
    version: input.version,
    publishedAt: input.publishedAt,
    units,
    summary: {
      devices: ev.summary.deviceCount,
      onPoe: by.poe,
      onSplitters: by.poe_splitter,
      onExistingOutlets: by.existing_outlet,
      newOutlets: by.new_outlet,
      cannotPower: by.cannot_power,
      poeReservedW: round(ev.summary.poeWatts.reservedW),
      poeExpectedW: round(ev.summary.poeWatts.expectedW),
      staysUpOnBattery: ev.summary.mustStayUp.staysUp,
      mustStayUp: ev.summary.mustStayUp.total,
      shortestRuntimeMin: runtimes.length ? Math.round(Math.min(...runtimes)) : null,
    },
    rooms,
    switches: ev.switches.map((s) => ({
      id: s.sourceId,
      name: s.name,
      standard: s.standard,
      budgetW: round(s.budgetW),
      ceilingW: round(s.ceilingW),
      reservedW: round(s.reservedW),
      expectedW: round(s.expectedW),
      ports: s.ports,
      portsUsed: s.portsUsed,
      overBudget: s.overBudget,
    })),
    outage: ev.outage.devices
      .filter((o) => o.mustStayUp || o.staysUp)
      .map((o) => ({ deviceId: o.deviceId, name: names.get(o.deviceId) ?? o.deviceId, staysUp: o.staysUp, minutes: o.minutes === null ? null : Math.round(o.minutes), reason: o.reason })),
    cableRuns: ev.cableRuns.map((c) => ({
      deviceId: c.deviceId,
      name: names.get(c.deviceId) ?? c.deviceId,
      category: c.cca ? `${c.category} (copper-clad aluminium)` : c.category,
      length: formatLength(c.lengthM, units),
      ok: c.ok,
      note: c.ok ? null : c.withinChannel ? "Check this run: see the warnings on the device." : "Longer than the 100 m channel: PoE cannot be used on this run.",
    })),
    materials: input.materials,
    cautions: ev.cautions.map((c) => ({ id: c.id, text: c.text, source: c.source })),
    standards: REPORT_STANDARDS,
  };
}

export interface ReportChanges {
  added: { id: string; name: string }[];
  removed: { id: string; name: string }[];
  methodChanged: { id: string; name: string; before: string; after: string }[];
  totalBefore: number;
  totalAfter: number;
}

/** What changed between two published versions: for "what is new since you last looked". */
export function diffReports(before: ReportContent, after: ReportContent): ReportChanges {
  const list = (r: ReportContent) => new Map(r.rooms.flatMap((room) => room.devices).map((d) => [d.id, d]));
  const a = list(before);
  const b = list(after);
  return {
    added: [...b.values()].filter((d) => !a.has(d.id)).map((d) => ({ id: d.id, name: d.name })),
    removed: [...a.values()].filter((d) => !b.has(d.id)).map((d) => ({ id: d.id, name: d.name })),
    methodChanged: [...b.values()].flatMap((d) => {
      const old = a.get(d.id);
      return old && old.label !== d.label ? [{ id: d.id, name: d.name, before: old.label, after: d.label }] : [];
    }),
    totalBefore: before.materials.total,
    totalAfter: after.materials.total,
  };
}

/** A stable serialisation (sorted keys) so the same content always hashes the same. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== "object") return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([x], [y]) => (x < y ? -1 : x > y ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
}

/** The words under a scope's total when some lines have no price yet, or null. */
export function unpricedNote(materials: { unpricedCount?: number }): string | null {
  const n = materials.unpricedCount ?? 0;
  if (n === 0) return null;
  return `${n} line${n === 1 ? " is" : "s are"} still to be priced: the total covers the priced lines only.`;
}

/** A materials total as shown: "to be priced" while no line has a price yet, never a bare 0.00. */
export function materialsTotalWords(materials: { lines: readonly unknown[]; total: number; unpricedCount?: number }, money: (x: number) => string): string {
  const n = materials.unpricedCount ?? 0;
  return materials.lines.length > 0 && n >= materials.lines.length ? "to be priced" : money(materials.total);
}

/** The parts of a scope a reader names, in the order the report shows them. */
const SCOPE_PARTS: readonly { key: keyof ReportContent; words: string }[] = [
  { key: "site", words: "the site's name or address" },
  { key: "units", words: "the units" },
  { key: "rooms", words: "the devices' reasons or warnings" },
  { key: "switches", words: "the switch budgets" },
  { key: "outage", words: "what stays up on battery" },
  { key: "cableRuns", words: "the cable runs" },
  { key: "materials", words: "the materials or prices" },
  { key: "cautions", words: "the cautions" },
];

/**
 * A part of `now` as `published` can be compared with it: a version published before the devices'
 * everyday words were kept is compared without them, so their arrival alone is not a change.
 */
function comparableWith(published: ReportContent, now: ReportContent, key: keyof ReportContent): unknown {
  if (key !== "rooms") return now[key];
  const hadPlain = published.rooms.some((r) => r.devices.some((d) => d.plain !== undefined));
  if (hadPlain) return now.rooms;
  return now.rooms.map((r) => ({ ...r, devices: r.devices.map(({ plain: _plain, ...d }) => d) }));
}

/** How the plan as it stands now differs from the last published version of its scope. */
export interface ScopeDrift {
  sinceVersion: number;
  /** The homeowner signed that version: their signature covers it, not the plan as it is now. */
  signed: boolean;
  changed: boolean;
  changes: ReportChanges;
  /** Other parts that differ, in words ("the cable runs"), beyond the devices and the total in `changes`. */
  otherParts: string[];
}

/**
 * Compare a published scope with the scope the plan would publish now (`now`, built with any
 * version number: the version, publication time and team name are not part of the comparison).
 */
export function scopeDrift(published: ReportContent, now: ReportContent, signed: boolean): ScopeDrift {
  const changes = diffReports(published, now);
  const devicesNamed = changes.added.length + changes.removed.length + changes.methodChanged.length > 0;
  const otherParts = SCOPE_PARTS.filter(({ key }) => {
    if (canonicalJson(published[key]) === canonicalJson(comparableWith(published, now, key))) return false;
    // The rooms are the devices: added, removed and re-powered ones are listed already.
    if (key === "rooms" && devicesNamed) return false;
    // The total is listed already; lines and prices without a new total are still a change.
    if (key === "materials" && changes.totalBefore !== changes.totalAfter) return false;
    return true;
  }).map((p) => p.words);
  const changed = devicesNamed || changes.totalBefore !== changes.totalAfter || otherParts.length > 0;
  return { sinceVersion: published.version, signed, changed, changes, otherParts };
}

function namesOf(list: { name: string }[]): string {
  const shown = list.slice(0, 3).map((d) => d.name).join(", ");
  return list.length > 3 ? `${shown} and ${list.length - 3} more` : shown;
}

/** What changed, in one sentence a designer reads at a glance; null when nothing did. */
export function scopeDriftWords(drift: ScopeDrift, money: (x: number) => string): string | null {
  if (!drift.changed) return null;
  const c = drift.changes;
  const parts: string[] = [];
  if (c.added.length) parts.push(`added ${namesOf(c.added)}`);
  if (c.removed.length) parts.push(`removed ${namesOf(c.removed)}`);
  if (c.methodChanged.length) parts.push(`powered differently: ${namesOf(c.methodChanged)}`);
  if (c.totalBefore !== c.totalAfter) parts.push(`materials total ${money(c.totalBefore)} → ${money(c.totalAfter)}`);
  if (drift.otherParts.length) parts.push(`${parts.length ? "also " : ""}${drift.otherParts.join(", ")}`);
  const text = parts.join("; ");
  return `${text.charAt(0).toUpperCase()}${text.slice(1)}.`;
}

/** What the designer is asked to look at before a scope goes to the homeowner. */
export interface PublishReadinessInput {
  /** The plan's problems (errors): devices that cannot be powered as captured, ports short, runs too long… */
  readonly problems: number;
  readonly unpricedLines: number;
  readonly materialLines: number;
  readonly devicesWithGaps: number;
  readonly devicesLeftOut: number;
  /** The last published version compared with the plan now, or null before the first. */
  readonly sincePublished: { readonly version: number; readonly changed: boolean } | null;
}

const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * The lines the publish confirmation shows: each thing still open that the homeowner would read as
 * it is, in the order a designer would fix them. Empty when nothing is open.
 */
export function publishReadiness(r: PublishReadinessInput): string[] {
  const lines: string[] = [];
  if (r.problems > 0) lines.push(`${count(r.problems, "problem is", "problems are")} still open in the plan: the homeowner reads ${r.problems === 1 ? "it" : "them"} in the scope as they stand.`);
  if (r.devicesLeftOut > 0) lines.push(`${count(r.devicesLeftOut, "device is", "devices are")} left out of the plan: the walk has gaps for ${r.devicesLeftOut === 1 ? "it" : "them"}, so the scope does not cover ${r.devicesLeftOut === 1 ? "it" : "them"}.`);
  if (r.devicesWithGaps > 0) lines.push(`${count(r.devicesWithGaps, "device still has", "devices still have")} gaps from the walk (a typical power figure, a run not measured).`);
  if (r.unpricedLines > 0) lines.push(`${r.unpricedLines} of ${count(r.materialLines, "material line is", "material lines are")} not priced yet: the total covers the priced lines only.`);
  if (r.sincePublished && !r.sincePublished.changed) {
    lines.push(`Nothing changed since version ${r.sincePublished.version}: the homeowner gets the same scope again, as version ${r.sincePublished.version + 1}.`);
  }
  return lines;
}

/** A device's reasons as the scope lists them under its designer decision: the decision is said once, above them. */
export function reasonsBesideDecision(d: Pick<ReportDevice, "reasons" | "decision">): string[] {
  if (!d.decision) return d.reasons;
  const said = `Designer decision: ${d.decision.reason}`;
  return d.reasons.filter((r) => r !== said);
}
