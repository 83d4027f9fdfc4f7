// A site's plan on the server: its items assembled and evaluated by the same survey/ rules the phone
// runs, with the designer's decisions applied, the materials priced, and the checklist counted.
import { desc, eq, inArray } from "drizzle-orm";
import type { Db } from "../../db/client";
import { decisionHistory, deviceDecisions, items, reportComments, reportVersions, signoffs, sitePlans, teams, users } from "../../db/schema";
import { assembleSite, type SiteItem } from "../../survey/capture";
import { applyDecision, applyDecisions, defaultSplitter, POWER_METHODS, type AppliedDecisions, type DecisionCore, type PowerMethod, type SplitterChoice } from "../../survey/decisions";
import type { CableRun, PowerInput } from "../../survey/model/device";
import { buildMaterials, MATERIALS_CURRENCY, priceMaterials, type PricedMaterials } from "../../survey/materials";
import { parseSite } from "../../survey/model/validate";
import type { PowerSource } from "../../survey/model/power-source";
import type { BatteryBackup } from "../../survey/model/battery";
import type { Site } from "../../survey/model/site";
import type { PoeClass } from "../../survey/standards/poe-classes";
import { evaluateDevice } from "../../survey/rules/recommend-device";
import { evaluateSite, type SiteEvaluation } from "../../survey/rules/evaluate-site";
import type { DeviceEvaluation, PlanWarning } from "../../survey/rules/result-types";
import { buildReportContent, scopeDrift, type ReportContent, type ReportInput, type ReportMaterialLine } from "../../survey/report";
import type { OutageDevice } from "../../survey/rules/battery";
import { walkProgress } from "../../survey/walk/gaps";
import { HttpError } from "../errors";
import type { SiteWithAccess } from "./site-access";

export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
type Reader = Db | Tx;
type ItemRow = typeof items.$inferSelect;
export type DecisionRow = typeof deviceDecisions.$inferSelect;

export interface PlanData {
  site: SiteWithAccess;
  items: ItemRow[];
  decisions: DecisionRow[];
  history: (typeof decisionHistory.$inferSelect & { actorName: string | null })[];
  prices: Record<string, number>;
  autoPlaced: string[];
  names: Map<string, string>;
  /** The latest published version of the site's scope, and when the homeowner signed it. */
  published: { version: number; publishedAt: Date; content: ReportContent; signedAt: Date | null } | null;
  /** What the homeowner wrote on the published versions, newest first. */
  comments: { itemRef: string; body: string; changeRequest: boolean; createdAt: Date; version: number }[];
}

/** Serialises plan writes with the team's pushes (same lock order as a push: the team row first). */
export async function lockTeam(tx: Tx, teamId: string) {
  await tx.select({ version: teams.version }).from(teams).where(eq(teams.id, teamId)).for("update");
}

export async function loadPlanData(db: Reader, site: SiteWithAccess): Promise<PlanData> {
  const itemRows = await db.select().from(items).where(eq(items.siteId, site.id));
  const decisions = await db.select().from(deviceDecisions).where(eq(deviceDecisions.siteId, site.id));
  const history = await db
    .select({ row: decisionHistory, actorName: users.name })
    .from(decisionHistory)
    .leftJoin(users, eq(users.id, decisionHistory.actorId))
    .where(eq(decisionHistory.siteId, site.id))
    .orderBy(desc(decisionHistory.createdAt))
    .limit(1000);
  const [plan] = await db.select().from(sitePlans).where(eq(sitePlans.siteId, site.id));
  const peopleIds = [...site.surveyorIds, ...(site.clientUserId ? [site.clientUserId] : [])];
  const people = peopleIds.length ? await db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(inArray(users.id, peopleIds)) : [];
  const names = new Map(people.map((p) => [p.id, p.name ?? p.email]));
  const [published] = await db
    .select({ version: reportVersions.version, publishedAt: reportVersions.publishedAt, content: reportVersions.content, signedAt: signoffs.signedAt })
    .from(reportVersions)
    .leftJoin(signoffs, eq(signoffs.reportId, reportVersions.id))
    .where(eq(reportVersions.siteId, site.id))
    .orderBy(desc(reportVersions.version))
    .limit(1);
  const comments = await db
    .select({ itemRef: reportComments.itemRef, body: reportComments.body, changeRequest: reportComments.changeRequest, createdAt: reportComments.createdAt, version: reportVersions.version })
    .from(reportComments)
    .innerJoin(reportVersions, eq(reportVersions.id, reportComments.reportId))
    .where(eq(reportVersions.siteId, site.id))
    .orderBy(desc(reportComments.createdAt))
    .limit(500);
  return {
    comments,
    site,
    items: itemRows,
    decisions,
    history: history.map((h) => ({ ...h.row, actorName: h.actorName })),
    prices: Object.fromEntries(Object.entries(plan?.prices ?? {}).map(([k, c]) => [k, c / 100])),
    autoPlaced: plan?.autoPlaced ?? [],
    names,
    published: published ? { ...published, content: published.content as ReportContent } : null,
  };
}

function siteItems(rows: ItemRow[]): SiteItem[] {
  return rows.map((r) => ({ id: r.id, siteId: r.siteId, kind: r.kind, data: r.data, deleted: r.deleted, version: r.version }));
}

export function siteMeta(site: SiteWithAccess) {
  return { id: site.id, name: site.name, address: site.address, closetRoomId: site.closetRoomId, settings: (site.settings ?? {}) as Record<string, unknown> };
}

export interface PlannableSite {
  site: Site;
  incompleteDeviceIds: string[];
  /** Pins, feeds or settings left out because they contradict the rest of the site. */
  dropped: PlanWarning[];
}

/**
 * The site as the rules take it. What was captured can contradict itself across phones (two devices
 * pinned to one port, a port beyond a switch's count); such pins and feeds are left out of the
 * evaluation with a warning instead of failing the whole plan. Nothing stored is changed.
 */
export function plannableSite(site: SiteWithAccess, rows: ItemRow[]): PlannableSite {
  const assembled = assembleSite(siteMeta(site), siteItems(rows));
  const input = JSON.parse(JSON.stringify(assembled.site)) as Record<string, unknown> & {
    devices: Record<string, unknown>[];
    batteries: { feeds?: (string | null)[] }[];
    powerSources: Record<string, unknown>[];
    settings: Record<string, unknown>;
  };
  const dropped: PlanWarning[] = [];
  let last: { path: string; message: string } | undefined;
  for (let attempt = 0; attempt < 5; attempt++) {
    const r = parseSite(input);
    if (r.ok) return { site: r.value, incompleteDeviceIds: assembled.incompleteDeviceIds, dropped };
    last = r.errors[0];
    let fixed = false;
    for (const e of r.errors) {
      let m: RegExpExecArray | null;
      if ((m = /^devices\.(\d+)\.(port|sourceId)$/.exec(e.path))) {
        const d = input.devices[Number(m[1])];
        if (d.sourceId !== undefined || d.port !== undefined) {
          delete d.sourceId;
          delete d.port;
          dropped.push({ code: "pin_left_out", severity: "warning", deviceId: String(d.id), message: `${e.message}: that pin is left out of the plan until it is fixed.` });
          fixed = true;
        }
      } else if ((m = /^batteries\.(\d+)\.feeds\.(\d+)$/.exec(e.path))) {
        const feeds = input.batteries[Number(m[1])].feeds;
        if (feeds && feeds[Number(m[2])] !== null) {
          feeds[Number(m[2])] = null;
          dropped.push({ code: "feed_left_out", severity: "warning", message: `${e.message}: left out of the plan.` });
          fixed = true;
        }
      } else if ((m = /^(powerSources|batteries)\.(\d+)\.roomId$/.exec(e.path))) {
        const list = input[m[1]] as Record<string, unknown>[];
        delete list[Number(m[2])].roomId;
        fixed = true;
      } else if ((m = /^settings\.(\w+)$/.exec(e.path))) {
        delete input.settings[m[1]];
        dropped.push({ code: "setting_left_out", severity: "warning", message: `Site setting ${m[1]}: ${e.message}; the default is used.` });
        fixed = true;
      }
    }
    for (const b of input.batteries) if (b.feeds) b.feeds = b.feeds.filter((f) => f !== null);
    if (!fixed) break;
  }
  throw new HttpError(409, "site_not_plannable", `The captured site cannot be planned yet. ${last ? `${last.path}: ${last.message}` : ""}`.trim());
}

export function decisionMap(rows: readonly DecisionRow[]): Map<string, DecisionCore> {
  return new Map(
    rows.map((r) => [
      r.deviceId,
      {
        method: r.method,
        poeClass: r.poeClass === null ? undefined : (r.poeClass as PoeClass),
        sourceId: r.sourceId ?? undefined,
        port: r.port ?? undefined,
        splitter: r.splitter ?? undefined,
        reason: r.reason,
      },
    ]),
  );
}

export interface Evaluated {
  base: DeviceEvaluation[];
  applied: AppliedDecisions;
  evaluation: SiteEvaluation;
}

/** The rules' results, the decisions applied, then the whole site evaluated from them. */
export function evaluatePlan(site: Site, decisions: ReadonlyMap<string, DecisionCore>): Evaluated {
  const base = site.devices.map((d) => evaluateDevice(d, site));
  const applied = applyDecisions(site, base, decisions);
  return { base, applied, evaluation: evaluateSite(site, applied.devices) };
}

/** The same site with one device's pins replaced (null removes a pin). */
export function withPins(site: Site, deviceId: string, pins: { sourceId: string | null; port: number | null }): Site {
  return {
    ...site,
    devices: site.devices.map((d) => {
      if (d.id !== deviceId) return d;
      const { sourceId: _s, port: _p, ...rest } = d;
      return { ...rest, ...(pins.sourceId ? { sourceId: pins.sourceId } : {}), ...(pins.sourceId && pins.port ? { port: pins.port } : {}) };
    }),
  };
}

export interface DecisionView {
  method: PowerMethod;
  poeClass: number | null;
  sourceId: string | null;
  port: number | null;
  splitter: { volts: number; amps: number; plug?: string } | null;
  reason: string;
  forced: boolean;
  decidedBy: string | null;
  decidedAt: string;
}

export interface HistoryView {
  id: string;
  action: string;
  after: Record<string, unknown> | null;
  before: Record<string, unknown> | null;
  reason: string;
  forced: boolean;
  by: string | null;
  at: string;
}

export interface PlanDevice extends DeviceEvaluation {
  /** What the rules advised on their own. */
  rule: { recommendation: string; label: string };
  decision: DecisionView | null;
  /** Why the decision is not applied (it no longer fits what was captured). */
  decisionStale: string | null;
  placement: { sourceId: string; sourceName: string; port: number; pinned: boolean; auto: boolean } | null;
  unassigned: { code: string; reason: string } | null;
  outage: OutageDevice | null;
  /** What the homeowner wrote about it on the published scope, if anything: counts and the latest. */
  homeowner: { comments: number; changesAsked: number; latest: { body: string; at: string; version: number; changeRequest: boolean } } | null;
  pins: { sourceId: string | null; port: number | null };
  /** What the walk captured that the desk form needs. */
  captured: { input: PowerInput; run: CableRun | null; outletDistanceM: number | null; outdoor: boolean };
  /** Methods a decision may choose for it (the others cannot power it). */
  methods: PowerMethod[];
  /** The splitter a PoE + splitter decision starts from. */
  splitterDefault: SplitterChoice | null;
}

export interface ClosetItem<T> {
  id: string;
  version: number;
  /** Valid items are in the plan; an invalid one (a phone's unfinished draft) is listed so it can be fixed. */
  valid: boolean;
  data: Record<string, unknown>;
  value: T | null;
}

/** Everything the desk shows for one site's plan. */
export function buildPlanView(data: PlanData) {
  const surveyorNames = data.site.surveyorIds.map((id) => data.names.get(id) ?? id);
  const planned = plannableSite(data.site, data.items);
  const site = planned.site;
  const decisions = decisionMap(data.decisions);
  const { base, applied, evaluation } = evaluatePlan(site, decisions);
  const decisionRows = new Map(data.decisions.map((d) => [d.deviceId, d]));
  const placementBy = new Map(evaluation.assignment.placements.map((p) => [p.deviceId, p]));
  const unassignedBy = new Map(evaluation.assignment.unassigned.map((u) => [u.deviceId, u]));
  const outageBy = new Map(evaluation.outage.devices.map((o) => [o.deviceId, o]));
  const sourceName = new Map(site.powerSources.map((s) => [s.id, s.name]));
  const autoPlaced = new Set(data.autoPlaced);
  const homeownerBy = new Map<string, NonNullable<PlanDevice["homeowner"]>>();
  for (const c of data.comments) {
    // Newest first: the first one seen is the latest.
    const seen = homeownerBy.get(c.itemRef);
    if (seen) {
      seen.comments++;
      if (c.changeRequest) seen.changesAsked++;
    } else {
      homeownerBy.set(c.itemRef, { comments: 1, changesAsked: c.changeRequest ? 1 : 0, latest: { body: c.body, at: c.createdAt.toISOString(), version: c.version, changeRequest: c.changeRequest } });
    }
  }
  const devices: PlanDevice[] = applied.devices.map((e, i) => {
    const d = site.devices[i];
    const row = decisionRows.get(e.deviceId);
    const p = placementBy.get(e.deviceId);
    return {
      ...e,
      rule: { recommendation: base[i].recommendation, label: base[i].label },
      decision: row
        ? {
            method: row.method,
            poeClass: row.poeClass,
            sourceId: row.sourceId,
            port: row.port,
            splitter: row.splitter,
            reason: row.reason,
            forced: row.forced,
            decidedBy: data.history.find((h) => h.deviceId === row.deviceId && h.action === "decided")?.actorName ?? null,
            decidedAt: row.decidedAt.toISOString(),
          }
        : null,
      decisionStale: applied.stale.get(e.deviceId) ?? null,
      placement: p ? { sourceId: p.sourceId, sourceName: sourceName.get(p.sourceId) ?? p.sourceId, port: p.port, pinned: p.pinned, auto: p.pinned && autoPlaced.has(p.deviceId) } : null,
      unassigned: unassignedBy.get(e.deviceId) ?? null,
      outage: outageBy.get(e.deviceId) ?? null,
      homeowner: homeownerBy.get(e.deviceId) ?? null,
      pins: { sourceId: d.sourceId ?? null, port: d.port ?? null },
      captured: { input: d.input, run: d.run ?? null, outletDistanceM: d.outletDistanceM ?? null, outdoor: d.outdoor },
      methods: POWER_METHODS.filter((method) => applyDecision(d, base[i], { method, reason: "check" }, site.settings).ok),
      splitterDefault: defaultSplitter(d, base[i]),
      warnings: [...planned.dropped.filter((w) => w.deviceId === e.deviceId), ...e.warnings],
    };
  });

  const live = data.items.filter((i) => !i.deleted);
  const floors = [...site.floors].sort((a, b) => a.level - b.level);
  const rooms = site.rooms;
  const materials: PricedMaterials = priceMaterials(buildMaterials(site, evaluation), data.prices);
  const validSource = new Map(site.powerSources.map((s) => [s.id, s]));
  const validBattery = new Map(site.batteries.map((b) => [b.id, b]));
  const nameOf = (i: ItemRow) => (typeof i.data.name === "string" ? i.data.name : i.id);
  // Devices counted exactly as the surveyor's walk counts them (walkProgress): the same numbers on both.
  const progress = walkProgress({ closetRoomId: data.site.closetRoomId }, data.items, planned.incompleteDeviceIds);
  const leftOut = progress.leftOutDeviceIds.map((id) => ({ id, name: nameOf(live.find((i) => i.id === id)!) }));
  const lastChange = live.reduce<Date | null>((m, i) => (m === null || i.updatedAt > m ? i.updatedAt : m), null);
  const published = data.published;
  // The scope the plan would publish now, against the last one published (and maybe signed).
  const scope = published === null
    ? null
    : {
        publishedAt: published.publishedAt.toISOString(),
        signedAt: published.signedAt?.toISOString() ?? null,
        ...scopeDrift(
          published.content,
          buildReportContent({
            ...reportPlanOf(data, site, applied, evaluation, materials),
            team: published.content.team, version: published.version, publishedAt: published.content.publishedAt,
          }),
          published.signedAt !== null,
        ),
      };

  return {
    site: {
      id: data.site.id,
      name: data.site.name,
      address: data.site.address,
      status: data.site.status,
      units: site.settings.units,
      closetRoomId: site.closetRoomId || null,
      settings: site.settings,
      clientName: data.site.clientUserId ? (data.names.get(data.site.clientUserId) ?? null) : null,
      surveyorNames,
    },
    /** The newest item version: changes when a surveyor's walk or the desk changes anything. */
    changeMark: Math.max(data.site.version, ...data.items.map((i) => i.version), 0),
    lastSyncAt: lastChange ? lastChange.toISOString() : null,
    completeness: {
      total: progress.devices,
      complete: progress.devicesComplete,
      withGaps: progress.devicesWithGaps,
      leftOut: progress.devicesLeftOut,
      leftOutDevices: leftOut,
    },
    floors: floors.map((f) => ({
      id: f.id,
      name: f.name,
      level: f.level,
      rooms: rooms.filter((r) => r.floorId === f.id).map((r) => ({ id: r.id, name: r.name, outdoor: r.outdoor, deviceIds: site.devices.filter((d) => d.roomId === r.id).map((d) => d.id) })),
    })),
    devices,
    history: Object.fromEntries(
      [...new Set(data.history.map((h) => h.deviceId))].map((id) => [
        id,
        data.history
          .filter((h) => h.deviceId === id)
          .map((h): HistoryView => ({ id: h.id, action: h.action, after: h.after, before: h.before, reason: h.reason, forced: h.forced, by: h.actorName, at: h.createdAt.toISOString() })),
      ]),
    ) as Record<string, HistoryView[]>,
    closet: {
      closetRoomId: site.closetRoomId || null,
      rooms: rooms.map((r) => ({ id: r.id, name: r.name })),
      sources: live
        .filter((i) => i.kind === "source")
        .map((i): ClosetItem<PowerSource> => ({ id: i.id, version: i.version, valid: validSource.has(i.id), data: i.data, value: validSource.get(i.id) ?? null })),
      batteries: live
        .filter((i) => i.kind === "battery")
        .map((i): ClosetItem<BatteryBackup> => ({ id: i.id, version: i.version, valid: validBattery.has(i.id), data: i.data, value: validBattery.get(i.id) ?? null })),
    },
    assignment: evaluation.assignment,
    switches: evaluation.switches,
    batteries: evaluation.batteries,
    outage: evaluation.outage,
    cableRuns: evaluation.cableRuns,
    summary: evaluation.summary,
    warnings: [...planned.dropped.filter((w) => !w.deviceId), ...evaluation.warnings],
    cautions: evaluation.cautions,
    materials,
    prices: data.prices,
    autoPlaced: data.autoPlaced,
    /** The last published scope, and how the plan now differs from it; null before the first. */
    scope,
  };
}

export type PlanView = ReturnType<typeof buildPlanView>;

/** The plan in the shape the published report takes, less its version, publication time and team. */
export type ReportPlan = Omit<ReportInput, "team" | "version" | "publishedAt">;

/**
 * The plan in the shape the published report takes (survey/report.ts): the evaluation with the
 * designer's decisions applied, each decision's label, reason and author, and the priced materials.
 * Every line the plan needs is listed; a line without a price yet shows as such rather than vanishing.
 */
function reportPlanOf(data: PlanData, site: Site, applied: AppliedDecisions, evaluation: SiteEvaluation, priced: PricedMaterials): ReportPlan {
  const decisions: Record<string, { label: string; reason: string; by: string }> = {};
  for (const row of data.decisions) {
    const e = applied.devices.find((d) => d.deviceId === row.deviceId);
    if (!e || applied.stale.has(row.deviceId)) continue;
    const by = data.history.find((h) => h.deviceId === row.deviceId && h.action === "decided")?.actorName ?? "";
    decisions[row.deviceId] = { label: e.label, reason: row.reason, by };
  }
  const lines: ReportMaterialLine[] = priced.lines.map((l) => ({
    key: l.key,
    description: l.item,
    quantity: l.quantity,
    unit: l.unit,
    unitPrice: l.unitPrice ?? 0,
    total: l.lineTotal ?? 0,
    priced: l.unitPrice !== null,
  }));
  return {
    site: { ...site, address: data.site.address },
    evaluation,
    decisions,
    materials: { lines, total: priced.total, unpricedCount: priced.lines.filter((l) => l.unitPrice === null).length, currency: MATERIALS_CURRENCY },
  };
}

/** The plan as it stands now, in the shape the published report takes. */
export async function planForReport(db: Reader, site: SiteWithAccess): Promise<ReportPlan> {
  const data = await loadPlanData(db, site);
  const planned = plannableSite(site, data.items);
  const { applied, evaluation } = evaluatePlan(planned.site, decisionMap(data.decisions));
  return reportPlanOf(data, planned.site, applied, evaluation, priceMaterials(buildMaterials(planned.site, evaluation), data.prices));
}
