import type { Site } from '../model/site';
import type { AwgGauge } from '../standards/awg';
import { CABLE_SLACK, TSB_184_A, type CableCategory } from '../standards/cabling';
import { CAUTIONS, SITE_CAUTION_IDS, type Caution } from '../standards/cautions';
import { PLANNING } from '../standards/planning-defaults';
import type { UnitSystem } from '../units';
import { roundTo } from '../units';
import type { PortAssignment, UnassignedDevice } from './assign-ports';
import { evaluateBatteriesWith, type BatteryEvaluation, type OutageReport } from './battery';
import { deferredField } from './deferred-text';
import { buildPlanContext } from './plan-context';
import { type DeviceEvaluation, type PlanWarning, type Recommendation, type Severity } from './result-types';
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

const CATEGORY_INDEX: Readonly<Record<CableCategory, number>> = { cat5e: 0, cat6: 1, cat6a: 2 };

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
  let reservedW = 0;
  let expectedW = 0;
  const splitterGroups = new Map<string, { outputVolts: number; ratingAmps: number; plug: string; maxPoeClass: number; deviceIds: string[] }>();
  const newOutlets: NewOutletRow[] = [];
  // Indexed by category × cca, already in display order.
  const cableGroups: ({ category: CableCategory; cca: boolean; runs: number; runM: number; slackM: number } | undefined)[] = [];
  const cableRuns: CableScheduleRow[] = [];
  let highPowerRuns = 0;
  let mustStayUp = 0;
  const warnings: PlanWarning[] = [];

  for (const e of ctx.devices) {
    byRecommendation[e.recommendation]++;
    if (e.mustStayUp) mustStayUp++;
    for (const w of e.warnings) warnings.push(w);
    if (e.poe !== null) {
      reservedW += e.poe.reservedW;
      expectedW += e.poe.expectedPseW;
      if (e.poe.poeType >= 3) highPowerRuns++;
    }
    const s = e.splitter;
    if (e.recommendation === 'poe_splitter' && s !== null) {
      const key = `${s.outputVolts}|${s.ratingAmps}|${s.plug.label}`;
      let g = splitterGroups.get(key);
      if (g === undefined) {
        g = { outputVolts: s.outputVolts, ratingAmps: s.ratingAmps, plug: s.plug.label, maxPoeClass: s.poeClass, deviceIds: [] };
        splitterGroups.set(key, g);
      }
      if (s.poeClass > g.maxPoeClass) g.maxPoeClass = s.poeClass;
      g.deviceIds.push(e.deviceId);
    }
    if (e.recommendation === 'new_outlet' && e.outlet !== null) {
      newOutlets.push({
        deviceId: e.deviceId, deviceName: e.name, roomId: e.roomId, roomName: roomName.get(e.roomId) ?? e.roomId,
        via: e.outlet.via, mustStayUp: e.mustStayUp,
      });
    }
    const c = e.cable;
    if (c !== null) {
      const gi = CATEGORY_INDEX[c.category] * 2 + (c.cca ? 1 : 0);
      let g = cableGroups[gi];
      if (g === undefined) cableGroups[gi] = g = { category: c.category, cca: c.cca, runs: 0, runM: 0, slackM: 0 };
      const order = orderLengthM(c.lengthM);
      g.runs++;
      g.runM += c.lengthM;
      g.slackM += order - c.lengthM;
      cableRuns.push({
        deviceId: e.deviceId, category: c.category, gauge: c.gauge, cca: c.cca,
        lengthM: c.lengthM, channelM: c.channelM, orderM: roundTo(order, 1), withinChannel: c.withinChannel,
        loopOhm: c.loopOhm, ok: c.ok,
      });
    }
  }

  for (const w of ctx.assignment.warnings) warnings.push(w);
  for (const u of ctx.assignment.unassigned) {
    const name = ctx.deviceById.get(u.deviceId)!.name;
    warnings.push(deferredField<PlanWarning, 'message'>(
      { code: UNASSIGNED_CODE[u.code], severity: 'error', deviceId: u.deviceId, message: '' }, 'message', () => `${name}: ${u.reason}`));
  }
  for (const s of switches) for (const w of s.warnings) warnings.push(w);
  for (const b of batteryReport.batteries) for (const w of b.warnings) warnings.push(w);
  for (const w of batteryReport.outage.warnings) warnings.push(w);
  if (highPowerRuns > TSB_184_A.maxCablesPerBundle) {
    warnings.push({
      code: 'bundle_size', severity: 'warning',
      message: `${highPowerRuns} high-power (802.3bt) runs: split them into loose bundles of at most ${TSB_184_A.maxCablesPerBundle} cables (TSB-184-A).`,
    });
  }

  // Additional switches for unassigned devices: pack them (next fit, largest first)
  // into switches like the largest one in the plan, or our 8-port / 120 W placeholder.
  let additionalNeeded = 0;
  let additionalBasis: string | null = null;
  const unassignedPoe = ctx.assignment.unassigned;
  if (unassignedPoe.length > 0) {
    let ref: { ports: number; budgetW: number; name: string | null } = { ...PLANNING.placeholderSwitch.value, name: null };
    let found = false;
    for (const s of ctx.poeSources) {
      if (s.kind === 'poe_switch' && (!found || s.budgetW > ref.budgetW)) {
        ref = { ports: s.poePorts, budgetW: s.budgetW, name: s.name };
        found = true;
      }
    }
    const byClass = site.settings.budgetBasis === 'class';
    const demands = unassignedPoe.map((u) => {
      const p = ctx.deviceById.get(u.deviceId)!.poe!;
      return byClass ? p.reservedW : p.expectedPseW;
    }).sort((a, b) => b - a);
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

  const warningCounts: Record<Severity, number> = { info: 0, warning: 0, error: 0 };
  for (const w of warnings) warningCounts[w.severity]++;

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
  for (const g of splitterGroups.values()) {
    splitters.push({ outputVolts: g.outputVolts, ratingAmps: g.ratingAmps, plug: g.plug, count: g.deviceIds.length, maxPoeClass: g.maxPoeClass, deviceIds: g.deviceIds });
  }
  splitters.sort((a, b) => a.outputVolts - b.outputVolts || a.ratingAmps - b.ratingAmps || (a.plug < b.plug ? -1 : a.plug > b.plug ? 1 : 0));

  let criticalUp = 0;
  for (const o of batteryReport.outage.devices) if (o.mustStayUp && o.staysUp) criticalUp++;

  const summary: SiteSummary = {
    deviceCount: ctx.devices.length,
    byRecommendation,
    poeWatts: { reservedW: roundTo(reservedW, 3), expectedW: roundTo(expectedW, 3) },
    switches: {
      inPlan: ctx.poeSources.filter((s) => s.kind === 'poe_switch').length,
      injectorsInPlan: ctx.poeSources.filter((s) => s.kind === 'injector').length,
      withDevices: switches.filter((s) => s.kind === 'poe_switch' && s.portsUsed > 0).length,
      additionalNeeded,
      additionalBasis,
    },
    unassignedCount: unassignedPoe.length,
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
