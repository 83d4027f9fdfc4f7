// The designer's writes to a plan: a decision for a device (method, class, splitter, power source
// and port), clearing it, and the automatic port assignment. Pins go into the device items through
// the same item writes a push uses (team version bump), so phones pull them; every change is kept
// in the decision history with who, when, what and why.
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import type { Db } from "../../db/client";
import { decisionHistory, deviceDecisions, sitePlans } from "../../db/schema";
import { applyDecision, type DecisionInput } from "../../survey/decisions";
import { portCount, type PowerSource } from "../../survey/model/power-source";
import type { Site } from "../../survey/model/site";
import { evaluateDevice } from "../../survey/rules/recommend-device";
import type { SiteEvaluation } from "../../survey/rules/evaluate-site";
import type { SwitchEvaluation } from "../../survey/rules/switch-budget";
import { formatPercent, formatWatts, roundTo } from "../../survey/units";
import type { SignedInActor } from "../auth/actor";
import { HttpError, notFound } from "../errors";
import { applyItemChanges, type ItemChange } from "./sync-push";
import type { SiteWithAccess } from "./site-access";
import { decisionMap, evaluatePlan, loadPlanData, lockTeam, plannableSite, withPins, type DecisionRow, type Tx } from "./plan";

const POE_METHODS = new Set(["poe", "poe_splitter"]);

function pinsOf(site: Site, deviceId: string) {
  const d = site.devices.find((x) => x.id === deviceId);
  return { sourceId: d?.sourceId ?? null, port: d?.port ?? null };
}

function samePins(a: { sourceId: string | null; port: number | null }, b: { sourceId: string | null; port: number | null }) {
  return a.sourceId === b.sourceId && a.port === b.port;
}

function pinChange(siteId: string, deviceId: string, pins: { sourceId: string | null; port: number | null }): ItemChange {
  return { op: "put", itemId: deviceId, siteId, kind: "device", fields: { sourceId: pins.sourceId, port: pins.sourceId ? pins.port : null } };
}

async function setAutoPlaced(tx: Tx, actor: SignedInActor, siteId: string, update: (current: string[]) => string[]) {
  const [row] = await tx.select().from(sitePlans).where(eq(sitePlans.siteId, siteId)).for("update");
  const next = update(row?.autoPlaced ?? []);
  if (row) await tx.update(sitePlans).set({ autoPlaced: next, updatedBy: actor.userId, updatedAt: new Date() }).where(eq(sitePlans.siteId, siteId));
  else await tx.insert(sitePlans).values({ siteId, teamId: actor.teamId, autoPlaced: next, updatedBy: actor.userId });
}

function history(actor: SignedInActor, siteId: string, deviceId: string, action: string, after: Record<string, unknown> | null, before: Record<string, unknown> | null, reason: string, forced = false) {
  return { id: randomUUID(), siteId, teamId: actor.teamId, deviceId, action, after, before, reason, forced, actorId: actor.userId };
}

function decisionRecord(r: DecisionRow | undefined | null): Record<string, unknown> | null {
  if (!r) return null;
  return { method: r.method, poeClass: r.poeClass, sourceId: r.sourceId, port: r.port, splitter: r.splitter, reason: r.reason, forced: r.forced };
}

/** What got worse on a switch: over its budget or its planning ceiling where it was not before, or further over. */
function newlyOver(before: readonly SwitchEvaluation[], after: readonly SwitchEvaluation[]): SwitchEvaluation[] {
  return after.filter((sw) => {
    if (!sw.overBudget && !sw.overCeiling) return false;
    const was = before.find((b) => b.sourceId === sw.sourceId);
    return !was || sw.basisW > was.basisW + 1e-9 || (sw.overBudget && !was.overBudget);
  });
}

function overMessage(sw: SwitchEvaluation): string {
  const what = sw.basis === "class" ? "set aside" : "draw";
  if (sw.overBudget) return `"${sw.name}" would ${what} ${formatWatts(roundTo(sw.basisW, 2))}, over its ${formatWatts(sw.budgetW)} budget: it would cut power to a port.`;
  return `"${sw.name}" would ${what} ${formatWatts(roundTo(sw.basisW, 2))}, above its planning ceiling of ${formatWatts(roundTo(sw.ceilingW, 2))}${sw.planningCeiling !== null ? ` (${formatPercent(sw.planningCeiling)} of ${formatWatts(sw.budgetW)})` : ""}.`;
}

export async function decideDevice(db: Db, actor: SignedInActor, site: SiteWithAccess, deviceId: string, input: DecisionInput) {
  return db.transaction(async (tx) => {
    await lockTeam(tx, actor.teamId);
    const data = await loadPlanData(tx, site);
    const item = data.items.find((i) => i.id === deviceId && i.kind === "device" && !i.deleted);
    if (!item) throw notFound("That device");
    const planned = plannableSite(site, data.items).site;
    const device = planned.devices.find((d) => d.id === deviceId);
    if (!device) {
      throw new HttpError(409, "device_incomplete", `"${String(item.data.name ?? deviceId)}" still has gaps from the walk: complete it before deciding how it is powered.`);
    }
    const outcome = applyDecision(device, evaluateDevice(device, planned), input, planned.settings);
    if (!outcome.ok) {
      const [field, messages] = Object.entries(outcome.errors)[0];
      throw new HttpError(400, "invalid_input", `The decision cannot power it: ${field}: ${messages[0]}`, outcome.errors);
    }

    // Where it is pinned after the decision.
    const poeMethod = POE_METHODS.has(input.method);
    const current = pinsOf(planned, deviceId);
    let pins = current;
    // The devices whose pins the automatic assignment wrote (they give way to a hand placement).
    const autoPlaced = new Set(data.autoPlaced);
    // A device the automatic assignment left on the port taken by hand: the rules place it again.
    let bumped: string | null = null;
    if (input.sourceId !== undefined) {
      const src = planned.powerSources.find((s) => s.id === input.sourceId);
      if (!src) throw new HttpError(400, "invalid_input", "That power source is not in the closet.", { sourceId: [`There is no power source "${input.sourceId}" in this site's closet.`] });
      if (poeMethod && src.kind === "outlet") throw new HttpError(400, "invalid_input", "A PoE device needs a switch or injector port.", { sourceId: [`"${src.name}" is an outlet: a PoE device needs a switch or injector port.`] });
      if (!poeMethod && src.kind !== "outlet") {
        throw new HttpError(400, "invalid_input", "Powered from an outlet, it takes no PoE port.", { sourceId: [`"${src.name}" is a PoE ${src.kind === "injector" ? "injector" : "switch"}: choose one of the closet's outlets, or none.`] });
      }
      if (input.port !== undefined) bumped = checkPort(planned, src, deviceId, input.port, autoPlaced);
      pins = { sourceId: src.id, port: input.port ?? null };
    } else if (current.sourceId) {
      const src = planned.powerSources.find((s) => s.id === current.sourceId);
      if (src && (poeMethod ? src.kind === "outlet" : src.kind !== "outlet")) pins = { sourceId: null, port: null };
    }

    // The plan before and after, to refuse what would overload a switch.
    const decisions = decisionMap(data.decisions);
    const before = evaluatePlan(planned, decisions).evaluation;
    decisions.set(deviceId, input);
    // A device moved by hand takes its port and nothing else moves: every other device the rules
    // placed keeps the port it has now (installers label patch ports), except one on the very port
    // taken, which the rules place again. Those holds are the automatic assignment's pins, so
    // "Assign ports" may still move them later.
    const held = input.sourceId !== undefined && poeMethod && pins.sourceId
      ? before.assignment.placements.filter((p) =>
          (!p.pinned || autoPlaced.has(p.deviceId)) && p.deviceId !== deviceId && p.deviceId !== bumped && !(p.sourceId === pins.sourceId && p.port === pins.port))
      : [];
    let moved = withPins(planned, deviceId, pins);
    if (bumped) moved = withPins(moved, bumped, { sourceId: null, port: null });
    for (const p of held) moved = withPins(moved, p.deviceId, { sourceId: p.sourceId, port: p.port });
    const after = evaluatePlan(moved, decisions).evaluation;
    const unassigned = after.assignment.unassigned.find((u) => u.deviceId === deviceId);
    if (unassigned && input.sourceId !== undefined && poeMethod) {
      throw new HttpError(409, unassigned.code, `It cannot go there: ${unassigned.reason}`, { sourceId: [unassigned.reason] });
    }
    let forced = false;
    if (outcome.poeProblem) {
      if (!input.force) throw new HttpError(409, "poe_path_fails", `PoE cannot power it over this run: ${outcome.poeProblem}. Choose another method, or confirm with "force" and say why in the reason.`, { method: [`PoE does not work here: ${outcome.poeProblem}.`] });
      forced = true;
    }
    // A device that had a port before and none after: the decision took it. Say so, by name.
    const displaced = displacedBy(before, after, deviceId);
    if (displaced.length) {
      if (!input.force) {
        const message = displaced.map((d) => `"${d.name}" would lose its port: ${d.reason}`).join(" ");
        throw new HttpError(409, "displaces_device", `${message} Choose another method, port or source, or confirm with "force" and say why in the reason.`, { sourceId: [message] });
      }
      forced = true;
    }
    const over = newlyOver(before.switches, after.switches);
    if (over.length) {
      if (!input.force) {
        const message = over.map(overMessage).join(" ");
        throw new HttpError(409, over.some((s) => s.overBudget) ? "over_budget" : "over_ceiling", `${message} Choose another port or source, or confirm with "force" and say why in the reason.`, { sourceId: [message] });
      }
      forced = true;
    }

    const previous = data.decisions.find((d) => d.deviceId === deviceId);
    const row = {
      siteId: site.id,
      deviceId,
      teamId: actor.teamId,
      method: input.method,
      poeClass: input.poeClass ?? null,
      sourceId: pins.sourceId && input.sourceId !== undefined ? pins.sourceId : null,
      port: input.sourceId !== undefined ? (input.port ?? null) : null,
      splitter: input.splitter ?? null,
      reason: input.reason,
      forced,
      decidedBy: actor.userId,
      decidedAt: new Date(),
    };
    await tx.insert(deviceDecisions).values(row).onConflictDoUpdate({ target: [deviceDecisions.siteId, deviceDecisions.deviceId], set: { ...row } });
    await tx.insert(decisionHistory).values(history(actor, site.id, deviceId, "decided", decisionRecord(row as DecisionRow), decisionRecord(previous), input.reason, forced));
    const changes: ItemChange[] = [];
    if (!samePins(pins, current)) changes.push(pinChange(site.id, deviceId, pins));
    if (bumped) changes.push(pinChange(site.id, bumped, { sourceId: null, port: null }));
    for (const p of held) if (!samePins(pinsOf(planned, p.deviceId), p)) changes.push(pinChange(site.id, p.deviceId, { sourceId: p.sourceId, port: p.port }));
    if (changes.length) await applyItemChanges(tx, actor, changes);
    // A pin the designer chose (or cleared) is not the automatic assignment's any more; the held ones are.
    if (input.sourceId !== undefined || !samePins(pins, current) || held.length) {
      await setAutoPlaced(tx, actor, site.id, (ids) => [...new Set([...ids.filter((id) => id !== deviceId && id !== bumped), ...held.map((p) => p.deviceId)])]);
    }
  });
}

/** The devices that had a port in `before` and have none in `after`, other than the one decided. */
function displacedBy(before: SiteEvaluation, after: SiteEvaluation, deviceId: string): { id: string; name: string; reason: string }[] {
  const placed = new Set(before.assignment.placements.map((p) => p.deviceId));
  const names = new Map(after.devices.map((d) => [d.deviceId, d.name]));
  return after.assignment.unassigned
    .filter((u) => u.deviceId !== deviceId && placed.has(u.deviceId))
    .map((u) => ({ id: u.deviceId, name: names.get(u.deviceId) ?? u.deviceId, reason: u.reason }));
}

/**
 * Refuses a port that does not exist or that a device was put on by hand. A device the automatic
 * assignment holds there gives way: its id is returned, and the rules place it again.
 */
function checkPort(site: Site, src: PowerSource, deviceId: string, port: number, autoPlaced: ReadonlySet<string>): string | null {
  const n = portCount(src);
  if (port > n) throw new HttpError(400, "invalid_input", `Port ${port} does not exist on "${src.name}".`, { port: [`"${src.name}" has ${n} PoE port${n === 1 ? "" : "s"}.`] });
  const other = site.devices.find((d) => d.id !== deviceId && d.sourceId === src.id && d.port === port);
  if (other && autoPlaced.has(other.id)) return other.id;
  if (other) {
    throw new HttpError(409, "port_taken", `Port ${port} of "${src.name}" is used by "${other.name}". Choose a free port, or move "${other.name}" first.`, { port: [`Port ${port} is used by "${other.name}".`] });
  }
  return null;
}

export async function clearDecision(db: Db, actor: SignedInActor, site: SiteWithAccess, deviceId: string, reason: string) {
  return db.transaction(async (tx) => {
    await lockTeam(tx, actor.teamId);
    const [row] = await tx.select().from(deviceDecisions).where(and(eq(deviceDecisions.siteId, site.id), eq(deviceDecisions.deviceId, deviceId)));
    if (!row) throw new HttpError(404, "not_found", "That device has no designer decision to remove.");
    const data = await loadPlanData(tx, site);
    await tx.delete(deviceDecisions).where(and(eq(deviceDecisions.siteId, site.id), eq(deviceDecisions.deviceId, deviceId)));
    await tx.insert(decisionHistory).values(history(actor, site.id, deviceId, "cleared", null, decisionRecord(row), reason));
    // The pin the decision set goes with it (unless someone moved the device since).
    const item = data.items.find((i) => i.id === deviceId && !i.deleted);
    if (row.sourceId && item && item.data.sourceId === row.sourceId && (item.data.port ?? null) === row.port) {
      await applyItemChanges(tx, actor, [pinChange(site.id, deviceId, { sourceId: null, port: null })]);
    }
  });
}

const AUTO_REASON = "Automatic port assignment: critical devices first, largest first, within each switch's budget and planning ceiling.";

/**
 * The rules' automatic assignment, written as pins. Pins the designer or a surveyor chose stay where
 * they are; pins a previous automatic run wrote are placed again.
 */
export async function assignPortsAutomatically(db: Db, actor: SignedInActor, site: SiteWithAccess, reason?: string) {
  return db.transaction(async (tx) => {
    await lockTeam(tx, actor.teamId);
    const data = await loadPlanData(tx, site);
    const planned = plannableSite(site, data.items).site;
    const decisionPinned = new Set(data.decisions.filter((d) => d.sourceId).map((d) => d.deviceId));
    const previousAuto = new Set(data.autoPlaced.filter((id) => !decisionPinned.has(id)));
    let free = planned;
    for (const id of previousAuto) free = withPins(free, id, { sourceId: null, port: null });
    const { evaluation } = evaluatePlan(free, decisionMap(data.decisions));
    const placed = evaluation.assignment.placements.filter((p) => !p.pinned);
    const sourceName = new Map(planned.powerSources.map((s) => [s.id, s.name]));
    const changes: ItemChange[] = [];
    const rows: ReturnType<typeof history>[] = [];
    const why = reason?.trim() || AUTO_REASON;
    for (const p of placed) {
      const before = pinsOf(planned, p.deviceId);
      const next = { sourceId: p.sourceId, port: p.port };
      if (samePins(before, next)) continue;
      changes.push(pinChange(site.id, p.deviceId, next));
      rows.push(history(actor, site.id, p.deviceId, "auto_placed", { ...next, sourceName: sourceName.get(p.sourceId) ?? p.sourceId }, before.sourceId ? { ...before, sourceName: sourceName.get(before.sourceId) ?? before.sourceId } : null, why));
    }
    const placedIds = new Set(placed.map((p) => p.deviceId));
    for (const id of previousAuto) {
      if (placedIds.has(id)) continue;
      const before = pinsOf(planned, id);
      if (!before.sourceId) continue;
      changes.push(pinChange(site.id, id, { sourceId: null, port: null }));
      rows.push(history(actor, site.id, id, "auto_placed", null, { ...before, sourceName: sourceName.get(before.sourceId) ?? before.sourceId }, `${why} No port fits it any more.`));
    }
    await applyItemChanges(tx, actor, changes);
    if (rows.length) await tx.insert(decisionHistory).values(rows);
    await setAutoPlaced(tx, actor, site.id, () => [...placedIds]);
    return { placed: placed.length, moved: rows.length, unassigned: evaluation.assignment.unassigned };
  });
}
