import type { Site } from '../model/site';
import type { AwgGauge } from '../standards/awg';
import { CABLE_SLACK, TSB_184_A, type CableCategory } from '../standards/cabling';
import { CAUTIONS, SITE_CAUTION_IDS, type Caution } from '../standards/cautions';
import { PLANNING } from '../standards/planning-defaults';
import type { UnitSystem } from '../units';
import { roundTo } from '../units';
import type { PortAssignment, UnassignedDevice } from './assign-ports';
import { evaluateBatteriesWith, type BatteryEvaluation, type OutageReport } from './battery';
import { deferredField, deferredList } from './deferred-text';
import { countBySeverity } from './device-flags';
import { buildPlanContext } from './plan-context';
import { RECOMMENDATION_VALUES, type DeviceEvaluation, type PlanWarning, type Recommendation, type Severity } from './result-types';
import { REC_CODE } from './site-plan';
import { evaluateSwitchWith, type SwitchEvaluation } from './switch-budget';

export interface SplitterGroup {
  readonly outputVolts: number;
  readonly ratingAmps: number;
  readonly plug: string;
  readonly count: number;
  /** Highest PoE class among the group (what the splitter must accept). */
  readonly maxPoeClass: number;
  readonly deviceIds: readonly string[];
}

export interface NewOutletRow {
  readonly deviceId: string;
  readonly deviceName: string;
  readonly roomId: string;
  readonly roomName: string;
  readonly via: string;
  readonly mustStayUp: boolean;
}

export interface CableTotal {
  readonly category: CableCategory;
  readonly cca: boolean;
  readonly runs: number;
  readonly runM: number;
  /** 10 % of the run + a 3 m service loop per drop — common practice, no source. */
  readonly slackM: number;
  readonly totalM: number;
}

export interface CableScheduleRow {
  readonly deviceId: string;
  readonly category: CableCategory;
  readonly gauge: AwgGauge;
  readonly cca: boolean;
  readonly lengthM: number;
  readonly channelM: number;
  readonly orderM: number;
  readonly withinChannel: boolean;
  readonly loopOhm: number;
  readonly ok: boolean;
}

export interface SiteSummary {
  readonly deviceCount: number;
  readonly byRecommendation: Readonly<Record<Recommendation, number>>;
  /** Over every device with a PoE port plan (assigned or not). */
  readonly poeWatts: { readonly reservedW: number; readonly expectedW: number };
  readonly switches: {
    readonly inPlan: number;
    readonly injectorsInPlan: number;
    readonly withDevices: number;
    /** More switches needed for the devices left unassigned (estimate). */
    readonly additionalNeeded: number;
    readonly additionalBasis: string | null;
  };
  readonly unassignedCount: number;
  readonly splitters: readonly SplitterGroup[];
  readonly newOutlets: readonly NewOutletRow[];
  readonly cable: readonly CableTotal[];
  readonly cableTotalM: number;
  readonly mustStayUp: { readonly total: number; readonly staysUp: number; readonly goesDown: number };
  readonly warningCounts: Readonly<Record<Severity, number>>;
}

export interface SiteEvaluation {
  readonly siteId: string;
  readonly name: string;
  readonly units: UnitSystem;
  readonly devices: readonly DeviceEvaluation[];
  readonly assignment: PortAssignment;
  readonly switches: readonly SwitchEvaluation[];
  readonly batteries: readonly BatteryEvaluation[];
  readonly outage: OutageReport;
  readonly cableRuns: readonly CableScheduleRow[];
  readonly summary: SiteSummary;
  readonly warnings: readonly PlanWarning[];
  readonly cautions: readonly Caution[];
}

const UNASSIGNED_CODE: Readonly<Record<UnassignedDevice['code'], string>> = {
  no_port_of_type: 'unassigned_no_port_of_type',
  ports_full: 'unassigned_ports_full',
  over_ceiling: 'unassigned_over_ceiling',
  pinned_type_too_low: 'unassigned_pinned_type_too_low',
  pinned_source_full: 'unassigned_pinned_source_full',
};

/** Order length for one drop: run + 10 % + 3 m service loop ([PRACTICE], common practice, no source). */
export function orderLengthM(runM: number): number {
  return runM * (1 + CABLE_SLACK.fraction) + CABLE_SLACK.serviceLoopM;
}

/**
 * Evaluate a whole (validated) site: every device, the port assignment, every
 * switch and injector, every battery, the cable schedule and a summary.
 * Linear in the number of devices. Validate input first with `parseSite`.
 * `devices` may carry device results already worked out (one per site device, in site order),
 * e.g. with designer decisions applied; the port assignment, budgets and battery then follow them.
 * Such results change only how a device is powered: their ids, names, rooms and must-stay-up are
 * the site's own (the summary and lists read those from the site).
 * The site is frozen (see `freezeSite`): records are written from it when first read.
 */
export function evaluateSite(site: Site, devices?: readonly DeviceEvaluation[]): SiteEvaluation {
  const ctx = buildPlanContext(site, devices);
  const switches: SwitchEvaluation[] = [];
  for (const s of ctx.poeSources) switches.push(evaluateSwitchWith(ctx, s));
  const batteryReport = evaluateBatteriesWith(ctx);

  const roomName = new Map<string, string>();
  for (const r of site.rooms) roomName.set(r.id, r.name);

  const byRecommendation: Record<Recommendation, number> = {
    poe: 0, poe_splitter: 0, existing_outlet: 0, new_outlet: 0, cannot_power: 0,
  };
  const warningCounts: Record<Severity, number> = { info: 0, warning: 0, error: 0 };
  let reservedW = 0;
  let expectedW = 0;
  // Splitters grouped by plug, output volts and rating (maps keyed by figures, not by a written key).
  type Group = { outputVolts: number; ratingAmps: number; plug: string; maxPoeClass: number; deviceIds: string[] };
  const splitterGroups: Group[] = [];
  const groupIndex = new Map<string, Map<number, Map<number, Group>>>();
  const newOutlets: NewOutletRow[] = [];
  // Indexed by the run's kind (category × cca), already in display order.
  const cableGroups: ({ category: CableCategory; cca: boolean; runs: number; runM: number; slackM: number } | undefined)[] = [];
  let highPowerRuns = 0;
  let mustStayUp = 0;

  const plan = ctx.plan;
  const siteDevices = site.devices;
  const recCounts = new Int32Array(RECOMMENDATION_VALUES.length);
  const splitterCode = REC_CODE.poe_splitter;
  const newOutletCode = REC_CODE.new_outlet;
  for (let i = 0; i < plan.size; i++) {
    const rec = plan.recommendationCode[i];
    recCounts[rec]++;
    const critical = plan.mustStayUp(i);
    if (critical) mustStayUp++;
    if (!plan.fromResults) countBySeverity(plan.warningBits[i], warningCounts);
    if (plan.poeClass[i] >= 0) {
      reservedW += plan.reservedW[i];
      expectedW += plan.expectedPseW[i];
      if (plan.poeType[i] >= 3) highPowerRuns++;
    }
    if (rec === splitterCode && plan.splitterClass[i] >= 0) {
      const outputVolts = plan.splitterVolts[i];
      const ratingAmps = plan.splitterRatingAmps[i];
      const label = plan.plug[i]!.label;
      const poeClass = plan.splitterClass[i];
      let byVolts = groupIndex.get(label);
      if (byVolts === undefined) groupIndex.set(label, (byVolts = new Map()));
      let byAmps = byVolts.get(outputVolts);
      if (byAmps === undefined) byVolts.set(outputVolts, (byAmps = new Map()));
      let g = byAmps.get(ratingAmps);
      if (g === undefined) {
        g = { outputVolts, ratingAmps, plug: label, maxPoeClass: poeClass, deviceIds: [] };
        byAmps.set(ratingAmps, g);
        splitterGroups.push(g);
      }
      if (poeClass > g.maxPoeClass) g.maxPoeClass = poeClass;
      g.deviceIds.push(siteDevices[i].id);
    }
    if (rec === newOutletCode) {
      const via = plan.outletVia(i);
      if (via !== null) {
        const d = siteDevices[i];
        newOutlets.push({
          deviceId: d.id, deviceName: d.name, roomId: d.roomId, roomName: roomName.get(d.roomId) ?? d.roomId, via, mustStayUp: critical,
        });
      }
    }
    if (plan.hasRun(i)) {
      const gi = plan.runKind[i];
      const lengthM = plan.runLengthM[i];
      let g = cableGroups[gi];
      if (g === undefined) cableGroups[gi] = g = { category: plan.runCategory(i), cca: plan.runCca(i), runs: 0, runM: 0, slackM: 0 };
      g.runs++;
      g.runM += lengthM;
      g.slackM += orderLengthM(lengthM) - lengthM;
    }
  }
  RECOMMENDATION_VALUES.forEach((r, code) => {
    byRecommendation[r] = recCounts[code];
  });
  const cableRuns = deferredList<CableScheduleRow>((into) => {
    for (let i = 0; i < plan.size; i++) {
      if (!plan.hasRun(i)) continue;
      const lengthM = plan.runLengthM[i];
      into.push({
        deviceId: siteDevices[i].id, category: plan.runCategory(i), gauge: plan.runGauge[i] as AwgGauge, cca: plan.runCca(i),
        lengthM, channelM: plan.runChannelM[i], orderM: roundTo(orderLengthM(lengthM), 1), withinChannel: plan.runWithinChannel(i),
        loopOhm: plan.runLoopOhm[i], ok: plan.runOk(i),
      });
    }
  });

  // The site's warnings, in order: each device's, the port assignment's, each switch's, each
  // battery's and the outage's, then the site's own. They are counted now and listed on first read.
  if (plan.fromResults) for (const e of ctx.devices) for (const w of e.warnings) warningCounts[w.severity]++;
  for (const w of ctx.assignment.warnings) warningCounts[w.severity]++;
  const unassignedCount = ctx.unassignedDevice.length;
  warningCounts.error += unassignedCount;
  for (const s of switches) for (const w of s.warnings) warningCounts[w.severity]++;
  for (const b of batteryReport.batteries) for (const w of b.warnings) warningCounts[w.severity]++;
  warningCounts.warning += batteryReport.outage.criticalDown.length; // each one's warning
  const bundleWarning: PlanWarning | null = highPowerRuns > TSB_184_A.maxCablesPerBundle
    ? {
      code: 'bundle_size', severity: 'warning',
      message: `${highPowerRuns} high-power (802.3bt) runs: split them into loose bundles of at most ${TSB_184_A.maxCablesPerBundle} cables (TSB-184-A).`,
    }
    : null;
  if (bundleWarning !== null) warningCounts[bundleWarning.severity]++;
  const warnings = deferredList<PlanWarning>((into) => {
    for (const e of ctx.devices) for (const w of e.warnings) into.push(w);
    for (const w of ctx.assignment.warnings) into.push(w);
    ctx.assignment.unassigned.forEach((u, k) => {
      const name = site.devices[ctx.unassignedDevice[k]].name;
      into.push(deferredField<PlanWarning, 'message'>(
        { code: UNASSIGNED_CODE[u.code], severity: 'error', deviceId: u.deviceId, message: '' }, 'message', () => `${name}: ${u.reason}`));
    });
    for (const s of switches) for (const w of s.warnings) into.push(w);
    for (const b of batteryReport.batteries) for (const w of b.warnings) into.push(w);
    for (const w of batteryReport.outage.warnings) into.push(w);
    if (bundleWarning !== null) into.push(bundleWarning);
  });

  // Additional switches for unassigned devices: pack them (next fit, largest first)
  // into switches like the largest one in the plan, or our 8-port / 120 W placeholder.
  let additionalNeeded = 0;
  let additionalBasis: string | null = null;
  if (unassignedCount > 0) {
    let ref: { ports: number; budgetW: number; name: string | null } = { ...PLANNING.placeholderSwitch.value, name: null };
    let found = false;
    for (const s of ctx.poeSources) {
      if (s.kind === 'poe_switch' && (!found || s.budgetW > ref.budgetW)) {
        ref = { ports: s.poePorts, budgetW: s.budgetW, name: s.name };
        found = true;
      }
    }
    const byClass = site.settings.budgetBasis === 'class';
    const demands = new Float64Array(unassignedCount);
    ctx.unassignedDevice.forEach((i, k) => {
      demands[k] = byClass ? plan.reservedW[i] : plan.expectedPseW[i];
    });
    demands.sort().reverse();
    const limit = ref.budgetW * site.settings.planningCeiling;
    let ports = 0;
    let watts = 0;
    for (const w of demands) {
      if (additionalNeeded === 0 || ports >= ref.ports || watts + w > limit + 1e-9) {
        additionalNeeded++;
        ports = 0;
        watts = 0;
      }
      ports++;
      watts += w;
    }
    additionalBasis = `${ref.ports}-port switches with a ${ref.budgetW} W budget${ref.name ? ` (like "${ref.name}")` : ''}, of a PoE type high enough for the devices left over`;
  }

  const cautions: Caution[] = SITE_CAUTION_IDS.map((id) => CAUTIONS[id]);
  if (site.batteries.length > 0) cautions.push(CAUTIONS.battery);

  const cable: CableTotal[] = [];
  let cableTotalM = 0;
  for (const g of cableGroups) {
    if (g === undefined) continue;
    const totalM = g.runM + g.slackM;
    cableTotalM += totalM;
    cable.push({ category: g.category, cca: g.cca, runs: g.runs, runM: roundTo(g.runM, 1), slackM: roundTo(g.slackM, 1), totalM: roundTo(totalM, 1) });
  }

  const splitters: SplitterGroup[] = [];
  for (const g of splitterGroups) {
    splitters.push({ outputVolts: g.outputVolts, ratingAmps: g.ratingAmps, plug: g.plug, count: g.deviceIds.length, maxPoeClass: g.maxPoeClass, deviceIds: g.deviceIds });
  }
  splitters.sort((a, b) => a.outputVolts - b.outputVolts || a.ratingAmps - b.ratingAmps || (a.plug < b.plug ? -1 : a.plug > b.plug ? 1 : 0));

  // Every must-stay-up device either stays up or is listed as going down.
  const criticalUp = mustStayUp - batteryReport.outage.criticalDown.length;

  const summary: SiteSummary = {
    deviceCount: plan.size,
    byRecommendation,
    poeWatts: { reservedW: roundTo(reservedW, 3), expectedW: roundTo(expectedW, 3) },
    switches: {
      inPlan: ctx.poeSources.filter((s) => s.kind === 'poe_switch').length,
      injectorsInPlan: ctx.poeSources.filter((s) => s.kind === 'injector').length,
      withDevices: switches.filter((s) => s.kind === 'poe_switch' && s.portsUsed > 0).length,
      additionalNeeded,
      additionalBasis,
    },
    unassignedCount,
    splitters,
    newOutlets,
    cable,
    cableTotalM: roundTo(cableTotalM, 1),
    mustStayUp: { total: mustStayUp, staysUp: criticalUp, goesDown: mustStayUp - criticalUp },
    warningCounts,
  };

  return {
    siteId: site.id,
    name: site.name,
    units: site.settings.units,
    devices: ctx.devices,
    assignment: ctx.assignment,
    switches,
    batteries: batteryReport.batteries,
    outage: batteryReport.outage,
    cableRuns,
    summary,
    warnings,
    cautions,
  };
}
