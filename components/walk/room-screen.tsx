import { Link, router, useLocalSearchParams } from "expo-router";
import { useEffect, useMemo, useRef, useState } from "react";
import { ActivityIndicator, Pressable, StyleSheet, View } from "react-native";
import { Badge } from "@/components/ui/badge";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ChoiceChips } from "@/components/ui/choice-chips";
import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { Screen } from "@/components/ui/screen";
import { AppText } from "@/components/ui/text";
import { TextField } from "@/components/ui/text-field";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { useWalk, useWalkActions } from "@/hooks/use-walk";
import type { FieldErrors } from "@/survey/validation";
import { DEVICE_KIND_VALUES, type DeviceKind } from "@/survey/model/device";
import { gapsLabel } from "@/survey/walk/gaps";
import type { WalkDevice, WalkRoom } from "@/survey/walk/walk";
import { KIND_WORDS, TYPICAL_WATTS } from "@/survey/walk/words";
import { AdviceBadge } from "./advice-card";
import { ConfirmDelete } from "./confirm-delete";
import { GapList } from "./gap-list";
import { PhotoStrip } from "./photo-strip";
import { ScopeStatusNotice } from "./scope-status-notice";
import { SyncPill } from "./sync-pill";

function DeviceRow({ siteId, device }: { siteId: string; device: WalkDevice }) {
  const kind = KIND_WORDS[device.data.kind as DeviceKind] ?? "Device";
  const label = `${device.name}: ${device.advice ? device.advice.label : gapsLabel(device.gaps.length)}`;
  return (
    <Link href={`/sites/${siteId}/devices/${device.id}` as never} asChild>
      <Pressable role="link" aria-label={label} style={styles.deviceRow}>
        <View style={styles.deviceIcon}>
          <Icon name="device" color={colors.slate700} />
        </View>
        <View style={{ flex: 1, gap: 4 }}>
          <AppText variant="subheading">{device.name}</AppText>
          <AppText muted variant="caption">
            {kind}
          </AppText>
          <AdviceBadge advice={device.advice} gaps={device.gaps.length} />
          {device.advice && device.gaps.length ? (
            <AppText variant="caption" style={{ color: colors.copper700 }}>{`Still: ${device.gaps.join("; ")}`}</AppText>
          ) : null}
          {!device.advice && device.gaps.length ? (
            <AppText variant="caption" muted>
              {device.gaps.join("; ")}
            </AppText>
          ) : null}
          {device.refused ? (
            <AppText variant="caption" style={{ color: colors.warn }}>
              {device.refused}
            </AppText>
          ) : null}
        </View>
      </Pressable>
    </Link>
  );
}

function RoomDetails({ room, floors, onSave }: { room: WalkRoom; floors: { id: string; name: string }[]; onSave: (fields: Record<string, unknown>) => Promise<{ ok: boolean; errors?: FieldErrors }> }) {
  const initial = useMemo(
    () => ({ name: typeof room.data.name === "string" ? room.data.name : "", notes: typeof room.data.notes === "string" ? room.data.notes : "", outdoor: room.data.outdoor === true, floorId: room.floorId }),
    [room.data, room.floorId],
  );
  const [form, setForm] = useState(initial);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [saved, setSaved] = useState(false);
  const previous = useRef(initial);
  // Fields the surveyor has not touched follow the store (a save, a sync, another surveyor).
  useEffect(() => {
    const before = previous.current;
    previous.current = initial;
    setForm((f) => ({
      name: f.name === before.name ? initial.name : f.name,
      notes: f.notes === before.notes ? initial.notes : f.notes,
      outdoor: f.outdoor === before.outdoor ? initial.outdoor : f.outdoor,
      floorId: f.floorId === before.floorId ? initial.floorId : f.floorId,
    }));
  }, [initial]);

  const changed: Record<string, unknown> = {};
  if (form.name.trim() !== initial.name) changed.name = form.name.trim();
  if (form.notes !== initial.notes) changed.notes = form.notes.trim() === "" ? null : form.notes;
  if (form.outdoor !== initial.outdoor) changed.outdoor = form.outdoor;
  if (form.floorId !== initial.floorId && form.floorId) changed.floorId = form.floorId;
  const dirty = Object.keys(changed).length > 0;

  async function save() {
    const result = await onSave(changed);
    setErrors(result.ok ? {} : (result.errors ?? {}));
    setSaved(result.ok);
  }

  return (
    <Card role="region" aria-label="Room details">
      <AppText variant="subheading">Room details</AppText>
      <TextField label="Room name" value={form.name} onChangeText={(name) => (setForm({ ...form, name }), setSaved(false))} errors={errors.name} />
      <ChoiceChips
        label="Floor"
        value={form.floorId ?? undefined}
        choices={floors.map((f) => ({ value: f.id, label: f.name }))}
        onChange={(floorId) => (setForm({ ...form, floorId }), setSaved(false))}
        errors={errors.floorId}
      />
      <ChoiceChips
        label="Indoor or outdoor"
        value={form.outdoor ? "outdoor" : "indoor"}
        choices={[
          { value: "indoor", label: "Indoor" },
          { value: "outdoor", label: "Outdoor" },
        ]}
        onChange={(v) => (setForm({ ...form, outdoor: v === "outdoor" }), setSaved(false))}
      />
      <TextField label="Room notes" value={form.notes} onChangeText={(notes) => (setForm({ ...form, notes }), setSaved(false))} errors={errors.notes} multiline numberOfLines={3} style={{ minHeight: 80, textAlignVertical: "top" }} placeholder="Access hatch, where the cable can come in…" />
      {saved && !dirty ? <Banner tone="good">Saved on this phone.</Banner> : null}
      <Button label="Save room" disabled={!dirty} onPress={save} style={{ alignSelf: "flex-start" }} />
    </Card>
  );
}

export function RoomScreen() {
  const { id: siteId, roomId, renamedFrom } = useLocalSearchParams<{ id: string; roomId: string; renamedFrom?: string }>();
  const { site, walk, photos, isPending, error } = useWalk(siteId);
  const actions = useWalkActions(siteId);
  const [added, setAdded] = useState<string | null>(null);
  const [addError, setAddError] = useState<string | null>(null);
  const back = { href: `/sites/${siteId}`, label: site?.name ?? "Rooms" };

  if (error) return <Screen title="Room" back={back}><Banner tone="danger">{error.message}</Banner></Screen>;
  if (isPending || !walk) return <Screen title="Room" back={back}><ActivityIndicator color={colors.slate800} aria-label="Loading" /></Screen>;
  const room = walk.rooms.get(roomId);
  if (!room || !site) {
    return (
      <Screen title="Room" back={back}>
        <EmptyState icon={<Icon name="rooms" size={40} color={colors.slate600} />} title="This room is not on the walk" body="It may have been deleted, here or by another surveyor. Go back to the rooms of the site." />
      </Screen>
    );
  }

  const floor = walk.floors.find((f) => f.id === room.floorId);
  const deviceIds = new Set(room.devices.map((d) => d.id));
  const roomPhotos = photos.filter((p) => p.itemId === room.id || (p.itemId !== null && deviceIds.has(p.itemId)));
  const takenDeviceNames = [...walk.devices.values()].map((d) => d.name);

  async function addDevice(kind: DeviceKind) {
    setAddError(null);
    const result = await actions.addDevice(kind, room!, takenDeviceNames);
    if (result.ok) setAdded(`Added “${String(result.fields.name)}”. Open it to fill in its power and run.`);
    else setAddError(Object.values(result.errors).flat().join(" "));
  }

  return (
    <Screen title={room.name} subtitle={`${floor?.name ?? "No floor"} · ${room.devices.length === 1 ? "1 device" : `${room.devices.length} devices`} · ${gapsLabel(room.gapCount)}`} back={back} actions={room.isCloset ? <Badge label="network closet" /> : undefined}>
      <SyncPill />
      {site ? <ScopeStatusNotice status={site.status} /> : null}
      {renamedFrom ? <Banner tone="info">{`The walk already has a room called "${renamedFrom}", so this one was given a number. Change its room name below if it has a better one.`}</Banner> : null}
      {room.gapLines.length ? (
        <Card role="region" aria-label="Gaps in this room">
          <AppText variant="subheading">Gaps in this room</AppText>
          <GapList lines={room.gapLines} label="Room checklist" />
        </Card>
      ) : null}
      <View style={{ gap: space.sm }} role="list" aria-label="Devices">
        {room.devices.length === 0 ? <AppText muted>No devices in this room yet. Add each one you find below.</AppText> : null}
        {room.devices.map((d) => (
          <View key={d.id} role="listitem">
            <DeviceRow siteId={siteId} device={d} />
          </View>
        ))}
      </View>
      <Card role="region" aria-label="Add device">
        <AppText variant="subheading">Add device</AppText>
        <AppText muted variant="caption">
          It starts with a typical power figure for its kind, marked “typical” until you read the real one.
        </AppText>
        <View style={styles.kinds}>
          {DEVICE_KIND_VALUES.map((k) => (
            <Pressable key={k} role="button" aria-label={`Add ${KIND_WORDS[k].toLowerCase()}`} onPress={() => addDevice(k)} style={styles.kind}>
              <Icon name="plus" size={18} color={colors.slate700} />
              <View>
                <AppText style={styles.kindText}>{KIND_WORDS[k]}</AppText>
                <AppText variant="caption" muted>
                  {TYPICAL_WATTS[k] === null ? "no typical figure" : `typical ${TYPICAL_WATTS[k]} W`}
                </AppText>
              </View>
            </Pressable>
          ))}
        </View>
        {added ? <Banner tone="good">{added}</Banner> : null}
        {addError ? <Banner tone="danger">{addError}</Banner> : null}
      </Card>
      <Card role="region" aria-label="Photos of this room">
        <AppText variant="subheading">Photos</AppText>
        <PhotoStrip photos={roomPhotos} itemId={room.id} addPhoto={actions.addPhoto} emptyText="No photos of this room or its devices yet." />
      </Card>
      <RoomDetails room={room} floors={walk.floors.map((f) => ({ id: f.id, name: f.name }))} onSave={(fields) => actions.updateRoom(room.id, fields)} />
      {!room.isCloset ? <Button tone="secondary" label="Make this the network closet" onPress={() => void actions.setCloset(room.id)} style={{ alignSelf: "flex-start" }} /> : null}
      <ConfirmDelete
        label="Delete room"
        question={room.devices.length ? `Delete ${room.name} and its ${room.devices.length === 1 ? "device" : `${room.devices.length} devices`}?` : `Delete ${room.name}?`}
        onConfirm={async () => {
          await actions.deleteRoom(room);
          router.replace(`/sites/${siteId}` as never);
        }}
      />
    </Screen>
  );
}

const styles = StyleSheet.create({
  deviceRow: { flexDirection: "row", gap: space.md, padding: space.lg, backgroundColor: colors.card, borderRadius: radius.lg, borderWidth: 1, borderColor: colors.line },
  deviceIcon: { width: 44, height: 44, borderRadius: radius.md, backgroundColor: colors.slate50, alignItems: "center", justifyContent: "center" },
  kinds: { flexDirection: "row", flexWrap: "wrap", gap: space.sm },
  kind: { flexDirection: "row", alignItems: "center", gap: space.sm, minHeight: minTouch + 8, paddingHorizontal: space.md, borderRadius: radius.md, borderWidth: 1.5, borderColor: colors.slate600, backgroundColor: colors.card },
  kindText: { fontFamily: fonts.semibold, color: colors.slate800 },
});
