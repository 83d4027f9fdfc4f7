import type { BatteryBackup } from '../model/battery';
import { isPoeSource, type PoeSource, type PowerSource } from '../model/power-source';
import type { Site } from '../model/site';
import { assignPortsWith, type PortAssignment, type PortPlacement } from './assign-ports';
import { evaluateDevice } from './recommend-device';
import type { DeviceEvaluation } from './result-types';

/**
 * Everything evaluated once per site and shared by the switch, battery and
 * summary rules, so that the whole evaluation stays linear in the number of devices.
 */
export interface PlanContext {
  readonly site: Site;
  readonly devices: readonly DeviceEvaluation[];
  readonly deviceById: ReadonlyMap<string, DeviceEvaluation>;
  readonly sourceById: ReadonlyMap<string, PowerSource>;
  readonly poeSources: readonly PoeSource[];
  readonly batteryBySource: ReadonlyMap<string, BatteryBackup>;
  readonly assignment: PortAssignment;
  readonly placementsBySource: ReadonlyMap<string, readonly PortPlacement[]>;
  readonly placementByDevice: ReadonlyMap<string, PortPlacement>;
}

export function buildPlanContext(site: Site, devices?: readonly DeviceEvaluation[]): PlanContext {
  const evals = devices ?? site.devices.map((d) => evaluateDevice(d, site));
  const deviceById = new Map<string, DeviceEvaluation>();
  for (const e of evals) deviceById.set(e.deviceId, e);
  const sourceById = new Map<string, PowerSource>();
  const poeSources: PoeSource[] = [];
  for (const s of site.powerSources) {
    sourceById.set(s.id, s);
    if (isPoeSource(s)) poeSources.push(s);
  }
  const batteryBySource = new Map<string, BatteryBackup>();
  for (const b of site.batteries) for (const id of b.feeds) batteryBySource.set(id, b);

  const assignment = assignPortsWith(site, evals, sourceById, poeSources, batteryBySource);
  const placementsBySource = new Map<string, PortPlacement[]>();
  const placementByDevice = new Map<string, PortPlacement>();
  for (const p of assignment.placements) {
    let list = placementsBySource.get(p.sourceId);
    if (list === undefined) {
      list = [];
      placementsBySource.set(p.sourceId, list);
    }
    list.push(p);
    placementByDevice.set(p.deviceId, p);
  }
  for (const list of placementsBySource.values()) list.sort((a, b) => a.port - b.port);
  return {
    site, devices: evals, deviceById, sourceById, poeSources, batteryBySource,
    assignment, placementsBySource, placementByDevice,
  };
}

/** A source is on battery if a battery in the plan feeds it, or the designer flagged it. */
export function sourceOnBattery(ctx: PlanContext, s: PowerSource): boolean {
  return ctx.batteryBySource.has(s.id) || s.onBattery;
}
