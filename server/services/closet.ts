// The closet as the designer edits it: PoE switches, injectors, outlets and the battery backup,
// stored as the site's items (so phones pull them) and validated with the shared survey/ schemas.
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import * as v from "valibot";
import type { Db } from "../../db/client";
import { decisionHistory, deviceDecisions } from "../../db/schema";
import { checkItemDraft, mergeFields } from "../../survey/capture";
import { BatteryBackupSchema } from "../../survey/model/battery";
import { PowerSourceSchema, portCount, type PowerSource } from "../../survey/model/power-source";
import { fieldErrors, type FieldErrors } from "../../survey/validation";
import type { SignedInActor } from "../auth/actor";
import { HttpError, notFound } from "../errors";
import { applyItemChanges, type ItemChange } from "./sync-push";
import type { SiteWithAccess } from "./site-access";
import { loadPlanData, lockTeam } from "./plan";

export type ClosetKind = "source" | "battery";

function fail(errors: FieldErrors, what: string): never {
  // The fields are named by their own messages ("PoE ports must be at least 1"), not by their keys.
  const [, messages] = Object.entries(errors)[0];
  throw new HttpError(400, "invalid_input", `The ${what} is not valid: ${messages[0]}`, errors);
}

function bodyObject(body: unknown, what: string): Record<string, unknown> {
  if (typeof body !== "object" || body === null || Array.isArray(body)) {
    throw new HttpError(400, "invalid_input", `Send the ${what}'s fields as a JSON object.`);
  }
  return body as Record<string, unknown>;
}

/**
 * Every field a draft has must pass the shared item schema (unknown fields are refused), and a
 * closet item must then be complete: the desk never leaves a half-made switch or battery.
 */
function validate(kind: ClosetKind, data: Record<string, unknown>) {
  const what = kind === "source" ? "power source" : "battery";
  const draft = checkItemDraft(kind, data);
  const errors: FieldErrors = draft.ok ? {} : { ...draft.errors };
  const full = v.safeParse(kind === "source" ? PowerSourceSchema : BatteryBackupSchema, data);
  if (!full.success) {
    for (const [path, messages] of Object.entries(fieldErrors(full.issues))) if (!errors[path]) errors[path] = messages;
  }
  if (Object.keys(errors).length) fail(errors, what);
  return full.success ? full.output : null;
}

export async function saveClosetItem(db: Db, actor: SignedInActor, site: SiteWithAccess, kind: ClosetKind, itemId: string | null, body: unknown) {
  const what = kind === "source" ? "power source" : "battery";
  const fields = bodyObject(body, what);
  if ("id" in fields && itemId !== null && fields.id !== itemId) fail({ id: ["The id cannot be changed."] }, what);
  return db.transaction(async (tx) => {
    await lockTeam(tx, actor.teamId);
    const data = await loadPlanData(tx, site);
    const live = data.items.filter((i) => !i.deleted);
    const existing = itemId === null ? undefined : live.find((i) => i.id === itemId && i.kind === kind);
    if (itemId !== null && !existing) throw notFound(kind === "source" ? "That power source" : "That battery");
    if (existing && kind === "source" && "kind" in fields && fields.kind !== existing.data.kind) {
      fail({ kind: ["A switch, injector or outlet keeps its kind: remove it and add the other kind instead."] }, what);
    }
    const id = itemId ?? randomUUID();
    const merged = mergeFields(existing?.data ?? {}, { ...fields, id });
    if (!existing && merged.roomId === undefined && site.closetRoomId && live.some((i) => i.id === site.closetRoomId && i.kind === "room")) merged.roomId = site.closetRoomId;
    const value = validate(kind, merged);

    // Cross-references: rooms, fed sources, ports already pinned.
    const errors: FieldErrors = {};
    const rooms = new Set(live.filter((i) => i.kind === "room").map((i) => i.id));
    if (typeof merged.roomId === "string" && !rooms.has(merged.roomId)) errors.roomId = [`There is no room "${merged.roomId}" in this site.`];
    if (kind === "source") {
      const src = value as PowerSource;
      const n = portCount(src);
      const pinned = live.filter((i) => i.kind === "device" && i.data.sourceId === id && typeof i.data.port === "number" && (i.data.port as number) > n);
      if (pinned.length) {
        const field = src.kind === "poe_switch" ? "poePorts" : src.kind === "injector" ? "ports" : "kind";
        errors[field] = [`${pinned.map((d) => `Port ${String(d.data.port)} is used by "${String(d.data.name)}"`).join("; ")}: move ${pinned.length === 1 ? "it" : "them"} first.`];
      }
    } else {
      const sources = new Map(live.filter((i) => i.kind === "source").map((i) => [i.id, i]));
      const fedElsewhere = new Map<string, string>();
      for (const b of live) if (b.kind === "battery" && b.id !== id) for (const f of (b.data.feeds as string[] | undefined) ?? []) fedElsewhere.set(f, String(b.data.name));
      ((merged.feeds as string[] | undefined) ?? []).forEach((f, i) => {
        if (!sources.has(f)) errors[`feeds.${i}`] = [`There is no power source "${f}" in this closet.`];
        else if (fedElsewhere.has(f)) errors[`feeds.${i}`] = [`"${String(sources.get(f)!.data.name)}" is already on "${fedElsewhere.get(f)}".`];
      });
    }
    if (Object.keys(errors).length) fail(errors, what);

    await applyItemChanges(tx, actor, [{ op: "put", itemId: id, siteId: site.id, kind, fields: existing ? { ...fields, id } : merged }]);
    return id;
  });
}

/** Removes a closet item; pins to a removed source, its battery feed and decisions pointing at it go with it. */
export async function removeClosetItem(db: Db, actor: SignedInActor, site: SiteWithAccess, kind: ClosetKind, itemId: string) {
  return db.transaction(async (tx) => {
    await lockTeam(tx, actor.teamId);
    const data = await loadPlanData(tx, site);
    const live = data.items.filter((i) => !i.deleted);
    const existing = live.find((i) => i.id === itemId && i.kind === kind);
    if (!existing) throw notFound(kind === "source" ? "That power source" : "That battery");
    const changes: ItemChange[] = [{ op: "delete", itemId, siteId: site.id }];
    if (kind === "source") {
      const name = String(existing.data.name ?? itemId);
      for (const d of live) {
        if (d.kind === "device" && d.data.sourceId === itemId) changes.push({ op: "put", itemId: d.id, siteId: site.id, kind: "device", fields: { sourceId: null, port: null } });
        if (d.kind === "battery" && Array.isArray(d.data.feeds) && d.data.feeds.includes(itemId)) {
          changes.push({ op: "put", itemId: d.id, siteId: site.id, kind: "battery", fields: { feeds: (d.data.feeds as string[]).filter((f) => f !== itemId) } });
        }
      }
      for (const dec of data.decisions.filter((x) => x.sourceId === itemId)) {
        await tx.update(deviceDecisions).set({ sourceId: null, port: null }).where(and(eq(deviceDecisions.siteId, site.id), eq(deviceDecisions.deviceId, dec.deviceId)));
        await tx.insert(decisionHistory).values({
          id: randomUUID(),
          siteId: site.id,
          teamId: actor.teamId,
          deviceId: dec.deviceId,
          action: "source_removed",
          after: null,
          before: { sourceId: dec.sourceId, port: dec.port, sourceName: name },
          reason: `"${name}" was removed from the closet, so the device is no longer pinned to it.`,
          actorId: actor.userId,
        });
      }
    }
    await applyItemChanges(tx, actor, changes);
  });
}
