import { capacityWh, type BatteryBackup } from '../model/battery';
import type { Site } from '../model/site';
import { CAUTIONS, type Caution } from '../standards/cautions';
import { formatMinutes, formatPercent, formatWattHours, formatWatts, roundTo } from '../units';
import { deferredList } from './deferred-text';
import { REC_CODE } from './site-plan';
import { buildPlanContext, poeSourceIndex, sourceOnBattery, type PlanContext } from './plan-context';
import type { PlanWarning } from './result-types';

/**
 * Battery backup (UPS) runtime, facts §3:
 *
 *   usable Wh   = capacity Wh (or V × Ah) × depth of discharge × inverter efficiency × age factor   [CONFIRMED S34]
 *   runtime min = usable Wh ÷ load W × 60                                                            [CONFIRMED S32, S33]
 *
 * Load on the battery:
 *   each PoE switch it feeds:  Σ expected PSE draw of its ports ÷ supply efficiency + own draw
 *                              (own draw taken as measured at the wall; facts §3 [PRACTICE])
 *   each injector it feeds:    Σ expected PSE draw ÷ injector efficiency
 *   each outlet it feeds:      Σ need of the devices pinned to that outlet (their adapter
 *                              losses are not counted)
 *   plus the other loads listed on it (modem, router…).
 * The expected draw (not the class reservation) is used: runtime is about what is
 * really drawn. High-rate (Peukert) losses are not modelled; see the battery caution.
 */

export interface BatteryLoadRow {
  readonly sourceId: string;
  readonly name: string;
  readonly kind: 'poe_switch' | 'injector' | 'outlet';
  /** Power delivered to devices by this source (W): PoE draw at the PSE, or device needs on an outlet. */
  readonly deliveredW: number;
  readonly efficiency: number;
  readonly ownDrawW: number;
  /** What it takes from the battery (W). */
  readonly wallW: number;
  readonly deviceIds: readonly string[];
}

export interface BatteryEvaluation {
  readonly batteryId: string;
  readonly name: string;
  readonly capacityWh: number;
  readonly depthOfDischarge: number;
  readonly inverterEfficiency: number;
  readonly ageFactor: number;
  readonly usableWh: number;
  readonly loads: readonly BatteryLoadRow[];
  readonly otherLoadsW: number;
  readonly totalLoadW: number;
  /** null when nothing is on it. */
  readonly runtimeMinutes: number | null;
  readonly runtimeText: string;
  /** Devices that stay up on this battery. */
  readonly deviceIds: readonly string[];
  readonly reasons: readonly string[];
  readonly warnings: readonly PlanWarning[];
  readonly cautions: readonly Caution[];
}

export interface OutageDevice {
  readonly deviceId: string;
  readonly mustStayUp: boolean;
  readonly staysUp: boolean;
  readonly batteryId: string | null;
  /** How long it stays up; null when it goes down, or when the runtime is unknown. */
  readonly minutes: number | null;
  readonly reason: string;
}

export interface OutageReport {
  readonly devices: readonly OutageDevice[];
  readonly staysUpCount: number;
  readonly goesDownCount: number;
  /** Must-stay-up devices that would go down. */
  readonly criticalDown: readonly string[];
  readonly warnings: readonly PlanWarning[];
}

export interface BatteryReport {
  readonly batteries: readonly BatteryEvaluation[];
  readonly outage: OutageReport;
}

/** Whether a device stays up in a power cut, on which battery, for how long, and why. */
interface Verdict {
  readonly staysUp: boolean;
  readonly batteryId: string | null;
  readonly minutes: number | null;
  readonly reason: string;
}

function goesDown(reason: string): Verdict {
  return Object.freeze({ staysUp: false, batteryId: null, minutes: null, reason });
}
const NO_SOURCE = goesDown('It has no power source in this plan.');
const NO_PORT = goesDown('It has no PoE port assigned yet.');
const OUTLET_NOT_BACKED = goesDown('Its outlet is not on a battery backup.');

/** Usable energy (Wh) = capacity × DoD × η × age. */
export function usableWattHours(b: Pick<BatteryBackup, 'capacity' | 'depthOfDischarge' | 'inverterEfficiency' | 'ageFactor'>): number {
  return capacityWh(b.capacity) * b.depthOfDischarge * b.inverterEfficiency * b.ageFactor;
}

/** Runtime (min) = usable Wh ÷ load × 60; null for no load. */
export function runtimeMinutes(usableWh: number, loadW: number): number | null {
  return loadW > 0 ? (usableWh / loadW) * 60 : null;
}

/** @internal */
export function evaluateBatteriesWith(ctx: PlanContext): BatteryReport {
  const site = ctx.site;
  const plan = ctx.plan;
  // The devices pinned to each outlet, by site index.
  const outletDevices = new Map<string, number[]>();
  for (let i = 0; i < plan.size; i++) {
    if (!plan.pinned(i) || plan.outletVia(i) === null) continue;
    const src = ctx.sourceById.get(site.devices[i].sourceId!);
    if (src === undefined || src.kind !== 'outlet') continue;
    let list = outletDevices.get(src.id);
    if (list === undefined) outletDevices.set(src.id, (list = []));
    list.push(i);
  }

  const runtimeByBattery = new Map<string, number | null>();
  const batteries: BatteryEvaluation[] = [];
  for (const b of site.batteries) {
    const loads: BatteryLoadRow[] = [];
    const deviceIds: string[] = [];
    for (const id of b.feeds) {
      const src = ctx.sourceById.get(id);
      if (src === undefined) continue;
      if (src.kind === 'outlet') {
        const ids: string[] = [];
        let w = 0;
        for (const i of outletDevices.get(src.id) ?? []) {
          w += roundTo(plan.needW[i], 3);
          ids.push(site.devices[i].id);
        }
        loads.push({ sourceId: src.id, name: src.name, kind: 'outlet', deliveredW: roundTo(w, 3), efficiency: 1, ownDrawW: 0, wallW: roundTo(w, 3), deviceIds: ids });
        for (const dId of ids) deviceIds.push(dId);
      } else {
        let w = 0;
        const ids: string[] = [];
        const s = poeSourceIndex(ctx, src);
        for (let k = ctx.sourceStart[s]; k < ctx.sourceStart[s + 1]; k++) {
          const i = ctx.onSource[k];
          w += plan.expectedPseW[i];
          ids.push(site.devices[i].id);
          deviceIds.push(site.devices[i].id);
        }
        const eff = src.kind === 'poe_switch' ? src.supplyEfficiency : src.efficiency;
        const own = src.kind === 'poe_switch' ? src.ownDrawW : 0;
        loads.push({ sourceId: src.id, name: src.name, kind: src.kind, deliveredW: roundTo(w, 3), efficiency: eff, ownDrawW: own, wallW: roundTo(w / eff + own, 3), deviceIds: ids });
      }
    }
    let otherLoadsW = 0;
    for (const o of b.otherLoads) otherLoadsW += o.watts;
    let total = otherLoadsW;
    for (const l of loads) total += l.wallW;
    const cap = capacityWh(b.capacity);
    const usable = usableWattHours(b);
    const rt = runtimeMinutes(usable, total);
    const runtime = rt === null ? null : roundTo(rt, 1);
    runtimeByBattery.set(b.id, runtime);

    const reasons: string[] = [];
    const warnings: PlanWarning[] = [];
    reasons.push(`${formatWattHours(cap)} battery; about ${formatWattHours(usable)} usable after depth of discharge (${formatPercent(b.depthOfDischarge)}), inverter efficiency (${formatPercent(b.inverterEfficiency)}) and age (${formatPercent(b.ageFactor)}).`);
    if (runtime === null) {
      reasons.push('Nothing is plugged into it yet.');
    } else {
      reasons.push(`It carries ${formatWatts(roundTo(total, 1))} in a power cut, so it lasts about ${formatMinutes(runtime)}.`);
      if (runtime < 15) {
        warnings.push({
          code: 'short_runtime', severity: 'warning', batteryId: b.id,
          message: `"${b.name}" would last only about ${formatMinutes(runtime)}: consider a bigger battery or fewer loads on it.`,
        });
      }
    }
    batteries.push({
      batteryId: b.id,
      name: b.name,
      capacityWh: roundTo(cap, 3),
      depthOfDischarge: b.depthOfDischarge,
      inverterEfficiency: b.inverterEfficiency,
      ageFactor: b.ageFactor,
      usableWh: roundTo(usable, 3),
      loads,
      otherLoadsW: roundTo(otherLoadsW, 3),
      totalLoadW: roundTo(total, 3),
      runtimeMinutes: runtime,
      runtimeText: runtime === null ? 'no load' : formatMinutes(runtime),
      deviceIds,
      reasons,
      warnings,
      cautions: [CAUTIONS.battery],
    });
  }

  // Outage: who stays up, and for how long. Verdicts (with their reasons) are shared per source;
  // each device's own record is made when the list is first read.
  /** Site indexes of the must-stay-up devices that go down. */
  const criticalDown: number[] = [];
  const perSource = new Map<string, Verdict>();
  const sourceVerdict = (srcId: string): Verdict => {
    let v = perSource.get(srcId);
    if (v !== undefined) return v;
    const src = ctx.sourceById.get(srcId)!;
    const bat = ctx.batteryBySource.get(src.id);
    if (bat !== undefined) {
      const minutes = runtimeByBattery.get(bat.id) ?? null;
      v = { staysUp: true, batteryId: bat.id, minutes, reason: `It runs from "${src.name}", fed by "${bat.name}"${minutes === null ? '' : ` (about ${formatMinutes(minutes)})`}.` };
    } else if (sourceOnBattery(ctx, src)) {
      v = { staysUp: true, batteryId: null, minutes: null, reason: `"${src.name}" is marked as on a battery backup that is not in the plan, so the runtime is unknown.` };
    } else {
      v = { staysUp: false, batteryId: null, minutes: null, reason: `"${src.name}" is not on a battery backup.` };
    }
    perSource.set(srcId, v);
    return v;
  };
  let up = 0;
  const devices = site.devices;
  const verdicts: Verdict[] = new Array(devices.length);
  const poeVerdict: (Verdict | undefined)[] = new Array(ctx.poeSources.length);
  const cannotPower = REC_CODE.cannot_power;
  for (let i = 0; i < devices.length; i++) {
    const source = ctx.sourceOf[i];
    let v: Verdict;
    if (plan.recommendationCode[i] === cannotPower) v = NO_SOURCE;
    else if (source >= 0) v = poeVerdict[source] ??= sourceVerdict(ctx.poeSources[source].id);
    else if (plan.hasPoe(i)) v = NO_PORT;
    else if (plan.pinned(i) && plan.outletVia(i) !== null && ctx.sourceById.has(devices[i].sourceId!)) v = sourceVerdict(devices[i].sourceId!);
    else v = OUTLET_NOT_BACKED;
    verdicts[i] = v;
    if (v.staysUp) up++;
    else if (plan.mustStayUp(i)) criticalDown.push(i);
  }
  // One warning per must-stay-up device that goes down (all of severity "warning"), listed on first read.
  const warnings = deferredList<PlanWarning>((into) => {
    for (const i of criticalDown) {
      const d = devices[i];
      into.push({
        code: 'critical_goes_down', severity: 'warning', deviceId: d.id,
        message: `"${d.name}" must keep working in a power cut, but it would go down: ${verdicts[i].reason}`,
      });
    }
  });
  const outageDevices = deferredList<OutageDevice>((into) => {
    for (let i = 0; i < devices.length; i++) {
      const d = devices[i];
      const v = verdicts[i];
      into.push({ deviceId: d.id, mustStayUp: d.mustStayUp, staysUp: v.staysUp, batteryId: v.batteryId, minutes: v.minutes, reason: v.reason });
    }
  });

  return {
    batteries,
    outage: {
      devices: outageDevices, staysUpCount: up, goesDownCount: devices.length - up,
      criticalDown: criticalDown.map((i) => devices[i].id), warnings,
    },
  };
}

/** Battery runtimes and the outage picture for a site. */
export function evaluateBattery(site: Site, ctx?: PlanContext): BatteryReport {
  return evaluateBatteriesWith(ctx ?? buildPlanContext(site));
}
