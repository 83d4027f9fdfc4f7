import type { BatteryBackup } from '../model/battery';
import { isPoeSource, type PoeSource, type PowerSource } from '../model/power-source';
import type { Site } from '../model/site';
import { freezeSite } from '../model/validate';
import { poeTypeName, POE_TYPES, type PoeType } from '../standards/poe-types';
import { formatPercent, formatWatts, roundTo } from '../units';
import { deferredField, deferredList } from './deferred-text';
import type { DeviceEvaluation, PlanWarning } from './result-types';
import { planOfResults, planSite, type SitePlan } from './site-plan';

/**
 * Automatic port assignment.
 *
 * 1. Devices pinned by hand to a port (sourceId + port) are placed there first;
 *    devices pinned to a source without a port get its lowest free port. Pins are
 *    respected as given — even over budget, which the switch check then reports —
 *    except that a port whose PoE type is too low for the device is never used.
 * 2. The remaining PoE devices (recommendation poe or poe_splitter) are placed
 *    critical (must stay up) first, then largest demand first (first-fit
 *    decreasing), ties by their order in the site.
 * 3. Each goes to the first source, in this order, with a port of a high enough
 *    PoE type, a free port and room in its budget:
 *      critical devices: battery-backed switches, battery-backed injectors, other switches, other injectors;
 *      other devices:    switches, then injectors (site order within each group).
 *    "Room" means: the switch's load on the site's budget basis (class reservation
 *    or expected draw) stays within budget × planning ceiling (80 % by default,
 *    common practice, no standard). Injectors have a fixed per-port power and are
 *    checked against their budget only.
 * 4. Ports are given lowest number first, so critical devices, placed first, get
 *    the low port numbers — which are shed last on a tie (facts §3, S43v).
 *
 * Devices that fit nowhere are listed as unassigned with a reason.
 */

export interface PortPlacement {
  readonly deviceId: string;
  readonly sourceId: string;
  readonly port: number;
  readonly pinned: boolean;
  readonly critical: boolean;
  readonly reservedW: number;
  readonly expectedPseW: number;
}

export interface UnassignedDevice {
  readonly deviceId: string;
  readonly code: 'no_port_of_type' | 'ports_full' | 'over_ceiling' | 'pinned_type_too_low' | 'pinned_source_full';
  readonly reason: string;
}

export interface PortAssignment {
  readonly placements: readonly PortPlacement[];
  readonly unassigned: readonly UnassignedDevice[];
  readonly warnings: readonly PlanWarning[];
}

/** @internal The assignment as columns; its lists of records are made when first read. */
export interface AssignmentWork {
  readonly assignment: PortAssignment;
  /** For each device (site index): the index in `poeSources` of its source (−1 for none), and its port (0 for none). */
  readonly sourceOf: Int32Array;
  readonly portOf: Int32Array;
  /** 1 for each device placed on the port it is pinned to. */
  readonly pinned: Uint8Array;
  /** The site indexes of the devices with a port, in the order they were placed. */
  readonly placedOrder: readonly number[];
  /** The site index of the device of each entry of `assignment.unassigned`, in the same order. */
  readonly unassignedDevice: readonly number[];
}

interface SourceState {
  readonly src: PoeSource;
  /** Its place in the site's PoE sources. */
  readonly index: number;
  readonly ports: number;
  readonly taken: Uint8Array;
  nextFree: number;
  free: number;
  usedW: number;
  readonly budgetW: number;
  readonly limitW: number;
  readonly onBattery: boolean;
  /** Where it sits in the first-fit trees being used. */
  readonly leaves: { tree: MaxTree; index: number }[];
}

const EPS = 1e-9;

export function sourceBudgetW(src: PoeSource): number {
  if (src.kind === 'poe_switch') return src.budgetW;
  return src.budgetW ?? src.ports * POE_TYPES[src.poeType].psePowerW;
}

function newState(src: PoeSource, index: number, ceiling: number, onBattery: boolean): SourceState {
  const ports = src.kind === 'poe_switch' ? src.poePorts : src.ports;
  const budgetW = sourceBudgetW(src);
  return {
    src, index, ports, taken: new Uint8Array(ports + 1), nextFree: 1, free: ports, usedW: 0,
    budgetW, limitW: src.kind === 'poe_switch' ? budgetW * ceiling : budgetW, onBattery, leaves: [],
  };
}

/** A max segment tree with "first index whose value ≥ x". */
class MaxTree {
  private readonly size: number;
  private readonly tree: Float64Array;
  constructor(values: readonly number[]) {
    let size = 1;
    while (size < values.length) size <<= 1;
    this.size = size;
    this.tree = new Float64Array(2 * size).fill(-Infinity);
    for (let i = 0; i < values.length; i++) this.tree[size + i] = values[i];
    for (let i = size - 1; i >= 1; i--) this.tree[i] = Math.max(this.tree[2 * i], this.tree[2 * i + 1]);
  }
  update(index: number, value: number): void {
    const tree = this.tree;
    let i = this.size + index;
    tree[i] = value;
    // Walk up only while the subtree's maximum changes.
    for (i >>= 1; i >= 1; i >>= 1) {
      const m = Math.max(tree[2 * i], tree[2 * i + 1]);
      if (tree[i] === m) break;
      tree[i] = m;
    }
  }
  /** Lowest index whose value is ≥ x, or −1. */
  firstAtLeast(x: number): number {
    if (!(this.tree[1] >= x)) return -1;
    let i = 1;
    while (i < this.size) i = this.tree[2 * i] >= x ? 2 * i : 2 * i + 1;
    return i - this.size;
  }
}

function take(st: SourceState, port: number): void {
  st.taken[port] = 1;
  st.free--;
  while (st.nextFree <= st.ports && st.taken[st.nextFree] === 1) st.nextFree++;
}

/** Assign PoE devices to switch and injector ports. Plans the devices if their results are not given. */
export function assignPorts(site: Site, devices?: readonly DeviceEvaluation[]): PortAssignment {
  freezeSite(site); // the placements are listed from it when first read
  const plan = devices === undefined ? planSite(site.devices, site.settings) : planOfResults(site.devices, devices);
  const sourceById = new Map<string, PowerSource>();
  const poeSources: PoeSource[] = [];
  for (const s of site.powerSources) {
    sourceById.set(s.id, s);
    if (isPoeSource(s)) poeSources.push(s);
  }
  const batteryBySource = new Map<string, BatteryBackup>();
  for (const b of site.batteries) for (const id of b.feeds) batteryBySource.set(id, b);
  return assignPortsWith(site, plan, sourceById, poeSources, batteryBySource).assignment;
}

/** @internal Shared by assignPorts and the site evaluation (precomputed maps). */
export function assignPortsWith(
  site: Site,
  plan: SitePlan,
  sourceById: ReadonlyMap<string, PowerSource>,
  poeSources: readonly PoeSource[],
  batteryBySource: ReadonlyMap<string, BatteryBackup>,
): AssignmentWork {
  const settings = site.settings;
  const byClass = settings.budgetBasis === 'class';
  const ceiling = settings.planningCeiling;
  const states = new Map<string, SourceState>();
  const stateList: SourceState[] = [];
  poeSources.forEach((s, index) => {
    const st = newState(s, index, ceiling, batteryBySource.has(s.id) || s.onBattery);
    states.set(s.id, st);
    stateList.push(st);
  });
  const devices = site.devices;
  const n = devices.length;
  const poeClass = plan.poeClass;
  const poeType = plan.poeType;
  const demandW = byClass ? plan.reservedW : plan.expectedPseW;
  const sourceOf = new Int32Array(n).fill(-1);
  const portOf = new Int32Array(n);
  const pinned = new Uint8Array(n);
  const order: number[] = [];
  const pinProblems: UnassignedDevice[] = [];
  const unassignedDevice: number[] = [];
  const warnings: PlanWarning[] = [];

  const place = (i: number, st: SourceState, port: number, byHand: boolean): void => {
    take(st, port);
    st.usedW += demandW[i];
    sourceOf[i] = st.index;
    portOf[i] = port;
    if (byHand) pinned[i] = 1;
    order.push(i);
  };

  // Pass 1: pins. Collect the rest for automatic placement.
  const auto: number[] = [];
  const pinnedNoPort: number[] = [];
  for (let i = 0; i < n; i++) {
    const hasPoe = poeClass[i] >= 0;
    if (!plan.pinned(i)) {
      if (hasPoe) auto.push(i);
      continue;
    }
    const d = devices[i];
    const src = sourceById.get(d.sourceId!);
    const st = src === undefined ? undefined : states.get(src.id);
    if (!hasPoe) {
      if (st !== undefined) {
        const passive = d.input.type === 'passive_poe';
        warnings.push({
          code: passive ? 'passive_on_standard_port' : 'pin_not_poe',
          severity: passive ? 'error' : 'warning',
          deviceId: d.id, sourceId: st.src.id,
          message: passive
            ? `"${d.name}" is pinned to "${st.src.name}", but it uses passive PoE: a standard PoE port cannot power it. Use its own injector.`
            : `"${d.name}" is pinned to "${st.src.name}", but it is not powered by PoE in this plan; the pin is ignored.`,
        });
      }
      continue;
    }
    if (st === undefined) {
      if (src !== undefined) {
        warnings.push({
          code: 'pin_outlet_for_poe', severity: 'info', deviceId: d.id, sourceId: src.id,
          message: `"${d.name}" is pinned to the outlet "${src.name}", but it is powered by PoE; it is placed on a switch automatically.`,
        });
      }
      auto.push(i);
      continue;
    }
    if (st.src.poeType < poeType[i]) {
      pinProblems.push({
        deviceId: d.id, code: 'pinned_type_too_low',
        reason: `It is pinned to "${st.src.name}", whose ports are ${poeTypeName(st.src.poeType)}, but it needs ${poeTypeName(poeType[i] as PoeType)} (Class ${poeClass[i]}).`,
      });
      unassignedDevice.push(i);
      continue;
    }
    if (d.port !== undefined) place(i, st, d.port, true);
    else pinnedNoPort.push(i);
  }
  for (const i of pinnedNoPort) {
    const st = states.get(devices[i].sourceId!)!;
    if (st.free > 0) place(i, st, st.nextFree, true);
    else {
      pinProblems.push({
        deviceId: devices[i].id, code: 'pinned_source_full',
        reason: `It is pinned to "${st.src.name}", but all ${st.ports} of its PoE ports are taken.`,
      });
      unassignedDevice.push(i);
    }
  }

  // Pass 2: automatic placement, critical first, then largest demand first, then site order.
  sortForPlacement(auto, plan, demandW);
  const switchesBattery = stateList.filter((s) => s.src.kind === 'poe_switch' && s.onBattery);
  const switchesOther = stateList.filter((s) => s.src.kind === 'poe_switch' && !s.onBattery);
  const injBattery = stateList.filter((s) => s.src.kind === 'injector' && s.onBattery);
  const injOther = stateList.filter((s) => s.src.kind === 'injector' && !s.onBattery);
  const criticalOrder = [...switchesBattery, ...injBattery, ...switchesOther, ...injOther];
  const normalOrder = [...stateList.filter((s) => s.src.kind === 'poe_switch'), ...stateList.filter((s) => s.src.kind === 'injector')];

  // First fit in O(log sources): for each order and each required PoE type, a
  // max-tree over the eligible sources (in that order) of their remaining room
  // (−∞ once their ports are full). Finding "the first source with room ≥ need"
  // is a descent of the tree; placing a device updates the source's leaves.
  // Critical devices come first in `auto`, so the critical trees are done with
  // before the others are built from the sources as the critical devices left them.
  const room = (st: SourceState): number => (st.free > 0 ? st.limitW - st.usedW : -Infinity);
  const failed: number[] = [];
  let next = 0;
  for (const sources of [criticalOrder, normalOrder]) {
    const forCritical = sources === criticalOrder;
    const trees: MaxTree[] = [];
    const lists: SourceState[][] = [];
    for (const st of sources) st.leaves.length = 0;
    for (let t = 1; t <= 4; t++) {
      const list = sources.filter((st) => st.src.poeType >= t);
      const tree = new MaxTree(list.map(room));
      list.forEach((st, index) => st.leaves.push({ tree, index }));
      trees[t] = tree;
      lists[t] = list;
    }
    for (; next < auto.length; next++) {
      const i = auto[next];
      if (plan.mustStayUp(i) !== forCritical) break;
      const type = poeType[i];
      const k = trees[type].firstAtLeast(demandW[i] - EPS);
      if (k < 0) {
        failed.push(i);
        continue;
      }
      const st = lists[type][k];
      place(i, st, st.nextFree, false);
      const r = room(st);
      for (const leaf of st.leaves) leaf.tree.update(leaf.index, r);
    }
  }

  // Reasons are written against the final state, summarised once per PoE type.
  const summaries = new Map<number, TypeSummary>();
  for (const i of failed) {
    if (!summaries.has(poeType[i])) summaries.set(poeType[i], summarise(stateList, poeType[i]));
    unassignedDevice.push(i);
  }

  const placements = deferredList<PortPlacement>((into) => {
    for (const i of order) {
      into.push({
        deviceId: devices[i].id, sourceId: poeSources[sourceOf[i]].id, port: portOf[i], pinned: pinned[i] === 1,
        critical: plan.mustStayUp(i), reservedW: plan.reservedW[i], expectedPseW: plan.expectedPseW[i],
      });
    }
  });
  const unassigned = deferredList<UnassignedDevice>((into) => {
    for (const u of pinProblems) into.push(u);
    for (const i of failed) {
      into.push(unassignedReason(devices[i].id, poeType[i], poeClass[i], demandW[i], summaries.get(poeType[i])!, byClass, ceiling));
    }
  });
  return { assignment: { placements, unassigned, warnings }, sourceOf, portOf, pinned, placedOrder: order, unassignedDevice };
}

/**
 * Sort device indexes for automatic placement: critical (must stay up) first, then the larger
 * demand, then site order. With at most 32 distinct demands (always so on a class basis: the
 * class powers) the devices are dealt into one bucket per (critical, demand) in site order.
 * Otherwise, when every demand is a whole number of milliwatts (the rules round them so), the
 * three keys pack exactly into one number per device for a plain numeric sort. Anything else
 * compares the keys one by one. All three give the same order.
 *
 * @internal Exported for its tests.
 */
export function sortForPlacement(auto: number[], plan: SitePlan, demandW: Float64Array): void {
  if (sortByBuckets(auto, plan, demandW) || sortByPackedKeys(auto, plan, demandW)) return;
  const crit = new Uint8Array(plan.size);
  for (const i of auto) crit[i] = plan.mustStayUp(i) ? 1 : 0;
  auto.sort((a, b) => (crit[b] - crit[a]) || (demandW[b] - demandW[a]) || (a - b));
}

/** At most this many distinct demands are dealt into buckets. */
const MAX_BUCKETS = 32;

function sortByBuckets(auto: number[], plan: SitePlan, demandW: Float64Array): boolean {
  const values: number[] = [];
  const bucketOf = new Uint8Array(auto.length);
  for (let k = 0; k < auto.length; k++) {
    const w = demandW[auto[k]];
    let b = values.indexOf(w);
    if (b < 0) {
      if (values.length === MAX_BUCKETS) return false;
      b = values.push(w) - 1;
    }
    bucketOf[k] = b;
  }
  // Bucket order: critical first, then the larger demand.
  const byDemand = values.map((_, b) => b).sort((x, y) => values[y] - values[x]);
  const rank = new Uint8Array(values.length);
  byDemand.forEach((b, r) => { rank[b] = r; });
  const slots = 2 * values.length;
  const start = new Int32Array(slots + 1);
  const slotOf = (k: number) => (plan.mustStayUp(auto[k]) ? 0 : values.length) + rank[bucketOf[k]];
  for (let k = 0; k < auto.length; k++) start[slotOf(k) + 1]++;
  for (let t = 0; t < slots; t++) start[t + 1] += start[t];
  const sorted = new Int32Array(auto.length);
  for (let k = 0; k < auto.length; k++) sorted[start[slotOf(k)]++] = auto[k];
  for (let k = 0; k < auto.length; k++) auto[k] = sorted[k];
  return true;
}

function sortByPackedKeys(auto: number[], plan: SitePlan, demandW: Float64Array): boolean {
  const n = auto.length;
  if (plan.size >= INDEX_SPAN) return false;
  const keys = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const i = auto[k];
    const q = Math.round(demandW[i] * 1000);
    if (!(q >= 0 && q < DEMAND_SPAN && q / 1000 === demandW[i])) return false;
    keys[k] = ((plan.mustStayUp(i) ? 0 : DEMAND_SPAN) + (DEMAND_SPAN - 1 - q)) * INDEX_SPAN + i;
  }
  keys.sort();
  for (let k = 0; k < n; k++) auto[k] = keys[k] % INDEX_SPAN;
  return true;
}

/** Packed sort keys: up to 2^26 mW (67 kW) of demand and 2^22 devices, well within a double's 2^53. */
const DEMAND_SPAN = 2 ** 26;
const INDEX_SPAN = 2 ** 22;

interface TypeSummary {
  readonly eligible: number;
  readonly eligiblePorts: number;
  readonly withPorts: number;
  readonly best: SourceState | null;
  /** Free ports left on sources of a lower PoE type than needed. */
  readonly lowerTypeFree: number;
}

/** For one required type: how many sources could serve it, and the roomiest one with a free port. */
function summarise(states: readonly SourceState[], poeType: number): TypeSummary {
  let eligible = 0;
  let eligiblePorts = 0;
  let withPorts = 0;
  let best: SourceState | null = null;
  let lowerTypeFree = 0;
  for (const s of states) {
    if (s.src.poeType < poeType) {
      lowerTypeFree += s.free;
      continue;
    }
    eligible++;
    eligiblePorts += s.ports;
    if (s.free === 0) continue;
    withPorts++;
    if (best === null || s.limitW - s.usedW > best.limitW - best.usedW) best = s;
  }
  return { eligible, eligiblePorts, withPorts, best, lowerTypeFree };
}

/** Why a device fits nowhere; the reason's words are written when first read. */
function unassignedReason(
  deviceId: string, poeType: number, poeClass: number, need: number,
  sum: TypeSummary, byClass: boolean, ceiling: number,
): UnassignedDevice {
  if (sum.eligible === 0) {
    return deferredField<UnassignedDevice, 'reason'>({ deviceId, code: 'no_port_of_type', reason: '' }, 'reason', () =>
      `It needs an ${poeTypeName(poeType as PoeType)} port (Class ${poeClass}); no switch or injector in the plan has one. Add an ${poeTypeName(poeType as PoeType)} injector or switch.`);
  }
  if (sum.best === null) {
    const eligiblePorts = sum.eligiblePorts;
    const lowerTypeFree = sum.lowerTypeFree;
    return deferredField<UnassignedDevice, 'reason'>({ deviceId, code: 'ports_full', reason: '' }, 'reason', () => {
      const taken = eligiblePorts === 1
        ? `The only suitable PoE port (${poeTypeName(poeType as PoeType)} or better) is taken`
        : `All ${eligiblePorts} suitable PoE ports (${poeTypeName(poeType as PoeType)} or better) are taken`;
      const lower = lowerTypeFree === 0 ? '' : `; the ${lowerTypeFree === 1 ? 'free port left is' : `${lowerTypeFree} free ports left are`} of a lower PoE type than it needs`;
      return `${taken}${lower}. Add a switch or an injector.`;
    });
  }
  const best = sum.best;
  const left = Math.max(0, best.limitW - best.usedW);
  const name = best.src.name;
  const isSwitch = best.src.kind === 'poe_switch';
  const budgetW = best.budgetW;
  return deferredField<UnassignedDevice, 'reason'>({ deviceId, code: 'over_ceiling', reason: '' }, 'reason', () => {
    const what = byClass ? 'sets aside' : 'is expected to draw';
    const limitText = isSwitch
      ? `its ${formatPercent(ceiling)} planning ceiling (common practice, no standard) of ${formatWatts(budgetW)}`
      : `its ${formatWatts(budgetW)} budget`;
    return `It ${what} ${formatWatts(roundTo(need, 2))}, but the roomiest suitable source, "${name}", has only ${formatWatts(roundTo(left, 2))} left under ${limitText}. Move devices, use a bigger switch or add an injector.`;
  });
}
