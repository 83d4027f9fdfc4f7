// A walk on the phone: the site's items from the local store grouped into floors, rooms and
// devices with their gaps and instant advice (memoized), and the capture actions the screens use.
import { useMemo } from "react";
import { checkItemDraft, type SiteItem } from "@/survey/capture";
import type { DeviceKind } from "@/survey/model/device";
import type { UnitSystem } from "@/survey/units";
import { buildWalk, type Walk, type WalkRoom } from "@/survey/walk/walk";
import { newDeviceFields, nextFreeName, type RoomType } from "@/survey/walk/words";
import type { FieldErrors } from "@/survey/validation";
import type { SiteRecord } from "@/sync/protocol";
import { useCapture, useLocalSite, useSiteItems, useSitePhotos } from "./use-local-store";

export function walkMeta(site: SiteRecord) {
  return { id: site.id, name: site.name, address: site.address, closetRoomId: site.closetRoomId, units: site.units };
}

/** The walk of one site, read from the phone's store. `walk` is null until the store has answered. */
export function useWalk(siteId: string) {
  const site = useLocalSite(siteId);
  const items = useSiteItems(siteId);
  const photos = useSitePhotos(siteId);
  const walk: Walk | null = useMemo(() => (site.data && items.data ? buildWalk(walkMeta(site.data), items.data as SiteItem[]) : null), [site.data, items.data]);
  return {
    site: site.data ?? null,
    items: (items.data ?? []) as SiteItem[],
    photos: photos.data ?? [],
    walk,
    isPending: site.isPending || items.isPending,
    error: site.error ?? items.error ?? null,
  };
}

export type ActionResult = { ok: true; id: string; fields: Record<string, unknown> } | { ok: false; errors: FieldErrors };

const newId = () => globalThis.crypto.randomUUID();

/** Capture actions for one site, each checked with the shared schemas before it is stored. */
export function useWalkActions(siteId: string) {
  const capture = useCapture(siteId);

  async function put(kind: "floor" | "room" | "device", id: string, fields: Record<string, unknown>): Promise<ActionResult> {
    const check = checkItemDraft(kind, fields);
    if (!check.ok) return { ok: false, errors: check.errors };
    await capture.putItem(kind, id, fields);
    return { ok: true, id, fields };
  }

  return {
    addFloor: (name: string, level: number) => put("floor", newId(), { name: name.trim(), level }),
    addRoom: (floorId: string, type: RoomType, takenNames: readonly string[]) =>
      put("room", newId(), { name: nextFreeName(type.name, takenNames), floorId, outdoor: type.outdoor === true }),
    updateRoom: (roomId: string, fields: Record<string, unknown>) => put("room", roomId, fields),
    addDevice: (kind: DeviceKind, room: WalkRoom, takenNames: readonly string[]) =>
      put("device", newId(), newDeviceFields(kind, { id: room.id, name: room.name, outdoor: room.data.outdoor === true }, takenNames)),
    updateDevice: (deviceId: string, patch: Record<string, unknown>) => put("device", deviceId, patch),
    /** Deletes the room and every device in it. */
    deleteRoom: async (room: WalkRoom) => {
      for (const d of room.devices) await capture.deleteItem(d.id);
      await capture.deleteItem(room.id);
    },
    deleteDevice: (deviceId: string) => capture.deleteItem(deviceId),
    setCloset: (roomId: string | null) => capture.updateSite({ closetRoomId: roomId }),
    setUnits: (units: UnitSystem) => capture.updateSite({ units }),
    addPhoto: capture.addPhoto,
  };
}
