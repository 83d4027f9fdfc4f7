import type { PoeSource } from '../model/power-source';
import type { BudgetBasis, Site } from '../model/site';
import { poeTypeName, POE_TYPES, type PoeType } from '../standards/poe-types';
import { formatPercent, formatWatts, roundTo } from '../units';
import { sourceBudgetW } from './assign-ports';
import { deferredField, deferredList } from './deferred-text';
import { buildPlanContext, poeSourceIndex, sourceOnBattery, type PlanContext } from './plan-context';
import type { PlanWarning } from './result-types';

/**
 * Switch (and injector) budget check.
 *
 * - Class reservation: Σ class power at the PSE of the devices on its ports (static /
 *   class allocation, facts §3, S43v, S44v).
 * - Expected draw: Σ (PD load + cable loss) at the PSE's minimum voltage.
 * - Both against the budget and against budget × planning ceiling (80 % by default —
 *   common practice, no standard). The site's budget basis (class by default) decides
 *   which of the two drives "over budget", shedding and assignment.
 * - Shedding when over budget: the lowest-priority port goes first; critical
 *   (must-stay-up) devices are high priority; ties shed the higher port number first
 *   ([CONFIRMED] S43v, switch manuals).
 * - Wall draw = expected PoE draw ÷ supply efficiency + the switch's own draw (its
 *   own draw is taken as measured at the wall, so it is not divided again).
 */

export interface PortRow {
  readonly port: number;
  readonly deviceId: string;
  readonly deviceName: string;
  readonly poeClass: number;
  readonly poeType: PoeType;
  readonly reservedW: number;
  readonly expectedPseW: number;
  readonly critical: boolean;
  readonly pinned: boolean;
}

export interface SwitchEvaluation {
  readonly sourceId: string;
  readonly name: string;
  readonly kind: 'poe_switch' | 'injector';
  readonly poeType: PoeType;
  readonly standard: string;
  readonly ports: number;
  readonly portsUsed: number;
  readonly portsFree: number;
  readonly budgetW: number;
  /** Planning ceiling fraction applied (switches only; null for injectors). */
  readonly planningCeiling: number | null;
  readonly ceilingW: number;
  readonly reservedW: number;
  readonly expectedW: number;
  readonly basis: BudgetBasis;
  readonly basisW: number;
  /** Ceiling minus load, for each basis (negative = over the ceiling). */
  readonly headroomReservedW: number;
  readonly headroomExpectedW: number;
  /** Load on the basis ÷ budget. */
  readonly utilisation: number;
  readonly overBudget: boolean;
  readonly overCeiling: boolean;
  readonly rows: readonly PortRow[];
  /** Ports in the order they would be shed, first to go first. */
  readonly shedOrder: readonly number[];
  /** Ports that would actually be shed to get back within budget (empty when within). */
  readonly wouldShed: readonly number[];
  readonly wallDrawW: number;
  readonly onBattery: boolean;
  readonly suggestions: readonly string[];
  readonly reasons: readonly string[];
  readonly warnings: readonly PlanWarning[];
}

const EPS = 1e-9;

/** @internal Evaluate one PoE source with a precomputed plan context. */
export function evaluateSwitchWith(ctx: PlanContext, src: PoeSource): SwitchEvaluation {
  const settings = ctx.site.settings;
  const basis = settings.budgetBasis;
  const plan = ctx.plan;
  const s = poeSourceIndex(ctx, src);
  const first = ctx.sourceStart[s];
  const end = ctx.sourceStart[s + 1];
  const onSource = ctx.onSource;
  const ports = src.kind === 'poe_switch' ? src.poePorts : src.ports;
  const budgetW = sourceBudgetW(src);
  const planningCeiling = src.kind === 'poe_switch' ? settings.planningCeiling : null;
  const ceilingW = budgetW * (planningCeiling ?? 1);

  let reservedW = 0;
  let expectedW = 0;
  for (let k = first; k < end; k++) {
    reservedW += plan.reservedW[onSource[k]];
    expectedW += plan.expectedPseW[onSource[k]];
  }
  const portsUsed = end - first;
  const devices = ctx.site.devices;
  const rows = deferredList<PortRow>((into) => {
    for (let k = first; k < end; k++) {
      const i = onSource[k];
      into.push({
        port: ctx.portOf[i], deviceId: devices[i].id, deviceName: devices[i].name, poeClass: plan.poeClass[i], poeType: plan.poeType[i] as PoeType,
        reservedW: plan.reservedW[i], expectedPseW: plan.expectedPseW[i], critical: plan.mustStayUp(i), pinned: ctx.pinned[i] === 1,
      });
    }
  });
  const basisW = basis === 'class' ? reservedW : expectedW;
  const overBudget = basisW > budgetW + EPS;
  const overCeiling = basisW > ceilingW + EPS;

  // Shed order: non-critical before critical; within a priority, higher port first (site indexes, worked out when needed).
  let shedCache: number[] | null = null;
  const shed = (): number[] => {
    if (shedCache === null) {
      shedCache = Array.from(onSource.subarray(first, end));
      const crit = (i: number) => plan.mustStayUp(i);
      shedCache.sort((a, b) => (crit(a) === crit(b) ? ctx.portOf[b] - ctx.portOf[a] : crit(a) ? 1 : -1));
    }
    return shedCache;
  };
  const shedOrder = deferredList<number>((into) => {
    for (const i of shed()) into.push(ctx.portOf[i]);
  });
  const wouldShed: number[] = [];
  if (overBudget) {
    let load = basisW;
    for (const i of shed()) {
      if (load <= budgetW + EPS) break;
      wouldShed.push(ctx.portOf[i]);
      load -= basis === 'class' ? plan.reservedW[i] : plan.expectedPseW[i];
    }
  }

  const efficiency = src.kind === 'poe_switch' ? src.supplyEfficiency : src.efficiency;
  const ownDrawW = src.kind === 'poe_switch' ? src.ownDrawW : 0;
  const wallDrawW = expectedW / efficiency + ownDrawW;

  // The words are written when first read; the figures they quote are fixed by now.
  const warnings: PlanWarning[] = [];
  const what = basis === 'class' ? 'sets aside' : 'is expected to draw';
  const srcName = src.name;
  const srcType = src.poeType;
  const reasons = deferredList<string>((into) => {
    into.push(`${portsUsed} of ${ports} PoE ports used; the devices on it reserve ${formatWatts(roundTo(reservedW, 2))} by class and are expected to draw ${formatWatts(roundTo(expectedW, 2))} including cable loss, against a ${formatWatts(budgetW)} budget.`);
    if (planningCeiling !== null) {
      into.push(`We plan to keep it at or below ${formatPercent(planningCeiling)} of its budget (${formatWatts(roundTo(ceilingW, 2))}) — common practice, not a standard.`);
    }
  });
  for (let k = first; k < end; k++) {
    const i = onSource[k];
    const needType = plan.poeType[i] as PoeType;
    if (needType > src.poeType) {
      const deviceName = devices[i].name;
      warnings.push(deferredField<PlanWarning, 'message'>(
        { code: 'port_type_too_low', severity: 'error', sourceId: src.id, deviceId: devices[i].id, message: '' }, 'message', () =>
          `"${deviceName}" needs an ${poeTypeName(needType)} port, but "${srcName}" has ${poeTypeName(srcType)} ports.`));
    }
  }
  if (overBudget) {
    warnings.push(deferredField<PlanWarning, 'message'>({ code: 'over_budget', severity: 'error', sourceId: src.id, message: '' }, 'message', () => {
      const names = wouldShed.map((p) => `port ${p} (${rows.find((r) => r.port === p)!.deviceName})`).join(', ');
      return `"${srcName}" ${what} ${formatWatts(roundTo(basisW, 2))}, over its ${formatWatts(budgetW)} budget: it would cut power to ${names} first.`;
    }));
  } else if (overCeiling) {
    warnings.push(deferredField<PlanWarning, 'message'>({ code: 'over_ceiling', severity: 'warning', sourceId: src.id, message: '' }, 'message', () =>
      `"${srcName}" ${what} ${formatWatts(roundTo(basisW, 2))}, above the ${formatPercent(planningCeiling ?? 1)} planning ceiling (${formatWatts(roundTo(ceilingW, 2))}) of its budget.`));
  }
  // Planned by expected draw, yet the classes add up to more than the budget: a switch that sets
  // power aside by class would refuse the last ports. [MEMORY] Many switches allocate by class
  // unless the devices negotiate their power over LLDP; which one this switch does is in its manual.
  if (basis !== 'class' && reservedW > budgetW + EPS) {
    warnings.push(deferredField<PlanWarning, 'message'>({ code: 'class_reservation_over_budget', severity: 'warning', sourceId: src.id, message: '' }, 'message', () =>
      `"${srcName}" is planned by expected draw, but its devices' classes add up to ${formatWatts(roundTo(reservedW, 2))}, over its ${formatWatts(budgetW)} budget: if it sets power aside by class, as many switches do, it would refuse the last devices. Check how it allocates power, or plan this site by class.`));
  }
  const suggestions = deferredList<string>((into) => {
    if (!overCeiling) return;
    const excess = basisW - ceilingW;
    into.push(`Move about ${formatWatts(roundTo(excess, 1))} of devices to another switch (the first to move: ${shed().slice(0, 2).map((i) => devices[i].name).join(', ')}).`);
    if (planningCeiling !== null) {
      into.push(`Or use a switch with a PoE budget of at least ${formatWatts(Math.ceil(basisW / planningCeiling))}.`);
    }
    const biggest = rows.reduce<PortRow | null>((m, r) => (m === null || r.reservedW > m.reservedW ? r : m), null);
    if (biggest !== null) {
      into.push(`Or power "${biggest.deviceName}" (Class ${biggest.poeClass}) from its own ${poeTypeName(biggest.poeType)} injector.`);
    }
  });

  return {
    sourceId: src.id,
    name: src.name,
    kind: src.kind,
    poeType: src.poeType,
    standard: POE_TYPES[src.poeType].standardName,
    ports,
    portsUsed,
    portsFree: ports - portsUsed,
    budgetW,
    planningCeiling,
    ceilingW: roundTo(ceilingW, 3),
    reservedW: roundTo(reservedW, 3),
    expectedW: roundTo(expectedW, 3),
    basis,
    basisW: roundTo(basisW, 3),
    headroomReservedW: roundTo(ceilingW - reservedW, 3),
    headroomExpectedW: roundTo(ceilingW - expectedW, 3),
    utilisation: roundTo(basisW / budgetW, 4),
    overBudget,
    overCeiling,
    rows,
    shedOrder,
    wouldShed,
    wallDrawW: roundTo(wallDrawW, 3),
    onBattery: sourceOnBattery(ctx, src),
    suggestions,
    reasons,
    warnings,
  };
}

/**
 * Budget check of one PoE switch or injector. Pass a plan context (from
 * `buildPlanContext`) to avoid re-evaluating the site for every switch.
 */
export function evaluateSwitch(site: Site, sourceId: string, ctx?: PlanContext): SwitchEvaluation {
  const c = ctx ?? buildPlanContext(site);
  const src = c.sourceById.get(sourceId);
  if (src === undefined || src.kind === 'outlet') {
    throw new Error(`"${sourceId}" is not a PoE switch or injector in this site`);
  }
  return evaluateSwitchWith(c, src);
}
