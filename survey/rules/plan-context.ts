import type { BatteryBackup } from '../model/battery';
import { isPoeSource, type PoeSource, type PowerSource } from '../model/power-source';
import type { Site } from '../model/site';
import { freezeSite } from '../model/validate';
import { assignPortsWith, type PortAssignment } from './assign-ports';
import { deferredList } from './deferred-text';
import { evaluateDevice } from './recommend-device';
import type { DeviceEvaluation } from './result-types';
import { planOfResults, planSite, type SitePlan } from './site-plan';

/**
 * Everything worked out once per site and shared by the switch, battery and summary rules,
 * so that the whole evaluation stays linear in the number of devices.
 *
 * The site rules read the devices' plans (site-plan.ts: decisions and figures, as columns).
 * The devices' full results, with their words, are worked out when `devices` is first read,
 * so the site is frozen here: after it is evaluated, an edit throws instead of changing a result.
 */
export interface PlanContext {
  readonly site: Site;
  /** Every device's plan, by site index. */
  readonly plan: SitePlan;
  /** One full result per site device, in site order (written on first read when not given). */
  readonly devices: readonly DeviceEvaluation[];
  readonly sourceById: ReadonlyMap<string, PowerSource>;
  readonly poeSources: readonly PoeSource[];
  /** The index of each PoE source in `poeSources`, by id. */
  readonly poeIndexById: ReadonlyMap<string, number>;
  readonly batteryBySource: ReadonlyMap<string, BatteryBackup>;
  readonly assignment: PortAssignment;
  /** For each device (site index): the index in `poeSources` of its source (−1 for none), and its port. */
  readonly sourceOf: Int32Array;
  readonly portOf: Int32Array;
  /** 1 for each device placed on the port it is pinned to. */
  readonly pinned: Uint8Array;
  /** The site index of the device of each entry of `assignment.unassigned`. */
  readonly unassignedDevice: readonly number[];
  /** The devices on each PoE source, by port: `onSource.subarray(sourceStart[s], sourceStart[s + 1])`. */
  readonly sourceStart: Int32Array;
  readonly onSource: Int32Array;
}

export function buildPlanContext(site: Site, devices?: readonly DeviceEvaluation[]): PlanContext {
  // Results are read from the site later, so it must not change: freeze it (a parsed site already is).
  freezeSite(site);
  const settings = site.settings;
  const plan = devices === undefined ? planSite(site.devices, settings) : planOfResults(site.devices, devices);
  // The rules are pure, so a device's full result is the same whenever it is worked out.
  const evaluations = devices ?? deferredList<DeviceEvaluation>((into) => {
    for (const d of site.devices) into.push(evaluateDevice(d, site));
  });
  const sourceById = new Map<string, PowerSource>();
  const poeSources: PoeSource[] = [];
  const poeIndexById = new Map<string, number>();
  for (const s of site.powerSources) {
    sourceById.set(s.id, s);
    if (isPoeSource(s)) poeIndexById.set(s.id, poeSources.push(s) - 1);
  }
  const batteryBySource = new Map<string, BatteryBackup>();
  for (const b of site.batteries) for (const id of b.feeds) batteryBySource.set(id, b);

  const work = assignPortsWith(site, plan, sourceById, poeSources, batteryBySource);

  // Group the placed devices by source (counting sort, in placement order), then order each source's by port.
  const sourceOf = work.sourceOf;
  const portOf = work.portOf;
  const sourceStart = new Int32Array(poeSources.length + 1);
  for (let i = 0; i < sourceOf.length; i++) if (sourceOf[i] >= 0) sourceStart[sourceOf[i] + 1]++;
  for (let s = 0; s < poeSources.length; s++) sourceStart[s + 1] += sourceStart[s];
  const onSource = new Int32Array(work.placedOrder.length);
  const fill = sourceStart.slice(0, poeSources.length);
  for (const i of work.placedOrder) onSource[fill[sourceOf[i]]++] = i;
  for (let s = 0; s < poeSources.length; s++) {
    // Insertion sort: a source's devices are few, and mostly in port order already.
    for (let k = sourceStart[s] + 1; k < sourceStart[s + 1]; k++) {
      const i = onSource[k];
      let j = k - 1;
      while (j >= sourceStart[s] && portOf[onSource[j]] > portOf[i]) {
        onSource[j + 1] = onSource[j];
        j--;
      }
      onSource[j + 1] = i;
    }
  }
  return {
    site, plan, devices: evaluations, sourceById, poeSources, poeIndexById, batteryBySource,
    assignment: work.assignment, sourceOf, portOf, pinned: work.pinned, unassignedDevice: work.unassignedDevice, sourceStart, onSource,
  };
}

/** A source is on battery if a battery in the plan feeds it, or the designer flagged it. */
export function sourceOnBattery(ctx: PlanContext, s: PowerSource): boolean {
  return ctx.batteryBySource.has(s.id) || s.onBattery;
}

/** The index in the context's `poeSources` of the PoE source with this source's id (−1 for none). */
export function poeSourceIndex(ctx: PlanContext, src: PoeSource): number {
  return ctx.poeIndexById.get(src.id) ?? -1;
}
