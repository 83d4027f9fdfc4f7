import { Link, router } from "expo-router";
import { useState, type ReactNode } from "react";
import { ActivityIndicator, Pressable, StyleSheet, View } from "react-native";
import { Badge } from "@/components/ui/badge";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ChoiceChips } from "@/components/ui/choice-chips";
import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { ProgressBar } from "@/components/ui/progress-bar";
import { AppText } from "@/components/ui/text";
import { colors, minTouch, radius, space } from "@/constants/theme";
import { useBreakpoint } from "@/hooks/use-breakpoint";
import { useWalk, useWalkActions, type ActionResult } from "@/hooks/use-walk";
import { devicesProgressLabel, gapsLabel } from "@/survey/walk/gaps";
import type { WalkFloor, WalkRoom } from "@/survey/walk/walk";
import type { RoomType } from "@/survey/walk/words";
import { AddFloorPanel } from "./add-floor-panel";
import { AddRoomPanel } from "./add-room-panel";
import { GapList } from "./gap-list";
import { ScopeStatusNotice } from "./scope-status-notice";
import { SyncPill } from "./sync-pill";

const devicesWord = (n: number) => (n === 1 ? "1 device" : `${n} devices`);

function RoomRow({ siteId, room }: { siteId: string; room: WalkRoom }) {
  const label = `${room.name}: ${devicesWord(room.devices.length)}, ${gapsLabel(room.gapCount)}${room.isCloset ? ", network closet" : ""}`;
  return (
    <Link href={`/sites/${siteId}/rooms/${room.id}` as never} asChild>
      <Pressable role="link" aria-label={label} style={styles.roomRow}>
        <View style={{ flex: 1, gap: 2 }}>
          <View style={styles.roomTitle}>
            <AppText variant="subheading" numberOfLines={1} style={{ flexShrink: 1 }}>
              {room.name}
            </AppText>
            {room.isCloset ? <Badge label="closet" tone="neutral" /> : null}
            {room.data.outdoor === true ? <Badge label="outdoor" tone="neutral" /> : null}
          </View>
          <AppText muted variant="caption">
            {devicesWord(room.devices.length)}
          </AppText>
        </View>
        <Badge label={gapsLabel(room.gapCount)} tone={room.gapCount ? "copper" : "good"} />
      </Pressable>
    </Link>
  );
}

function FloorCard({ siteId, floor, takenRoomNames, onAddRoom }: { siteId: string; floor: WalkFloor; takenRoomNames: string[]; onAddRoom: (floorId: string, type: RoomType, taken: string[]) => Promise<ActionResult> }) {
  const [adding, setAdding] = useState(false);
  const levelWord = floor.level === null ? "" : floor.level === 0 ? "ground level" : floor.level < 0 ? `level ${floor.level}` : `level +${floor.level}`;
  return (
    <Card role="region" aria-label={floor.name}>
      <View style={styles.floorHead}>
        <AppText variant="heading" style={{ flexShrink: 1 }}>
          {floor.name}
        </AppText>
        <AppText muted variant="caption">
          {levelWord}
        </AppText>
      </View>
      {floor.rooms.length === 0 ? <AppText muted>No rooms on this floor yet.</AppText> : null}
      <View style={{ gap: space.sm }}>
        {floor.rooms.map((r) => (
          <RoomRow key={r.id} siteId={siteId} room={r} />
        ))}
      </View>
      {adding ? (
        <AddRoomPanel
          floorName={floor.name}
          onClose={() => setAdding(false)}
          onAdd={async (type) => {
            const result = await onAddRoom(floor.id, type, takenRoomNames);
            if (result.ok) {
              // A name already on the walk got a number: the room screen says so once, where it can be renamed.
              const given = String(result.fields.name);
              const asked = type.name.trim();
              router.push(`/sites/${siteId}/rooms/${result.id}${given !== asked ? `?renamedFrom=${encodeURIComponent(asked)}` : ""}` as never);
            }
            return result;
          }}
        />
      ) : (
        <Button tone="secondary" label={`Add room to ${floor.name}`} onPress={() => setAdding(true)} style={{ alignSelf: "flex-start" }} />
      )}
    </Card>
  );
}

/** The walk of one site: floors and rooms with their gaps, the checklist, the closet. */
export function WalkPanel({ siteId, after }: { siteId: string; after?: ReactNode }) {
  const { wide } = useBreakpoint();
  const { site, walk, isPending, error } = useWalk(siteId);
  const actions = useWalkActions(siteId);
  const [addingFloor, setAddingFloor] = useState(false);

  if (error) return <Banner tone="danger">{error.message}</Banner>;
  if (isPending) return <ActivityIndicator color={colors.slate800} aria-label="Loading" />;
  if (!site || !walk) {
    return (
      <>
        <SyncPill />
        <EmptyState
          icon={<Icon name="rooms" size={40} color={colors.slate600} />}
          title="This site is not on this phone yet"
          body="It arrives with the next sync. Once it is here, the walk works without a connection."
        />
        {after}
      </>
    );
  }

  const allRooms = [...walk.floors.flatMap((f) => f.rooms), ...walk.strayRooms];
  const takenRoomNames = allRooms.map((r) => r.name);
  const { progress } = walk;
  const done = progress.devices ? progress.devicesComplete / progress.devices : 0;

  const floorsColumn = (
    <View style={{ gap: space.lg }}>
      {walk.floors.length === 0 ? (
        <EmptyState
          icon={<Icon name="rooms" size={40} color={colors.slate600} />}
          title="No floors yet"
          body="Start the walk with the floors of the house, then add each room as you enter it."
        />
      ) : null}
      {walk.floors.map((f) => (
        <FloorCard key={f.id} siteId={siteId} floor={f} takenRoomNames={takenRoomNames} onAddRoom={actions.addRoom} />
      ))}
      {walk.strayRooms.length ? (
        <Card role="region" aria-label="Rooms without a floor">
          <AppText variant="heading">Rooms without a floor</AppText>
          <AppText muted>Their floor was deleted. Open a room to put it on a floor.</AppText>
          {walk.strayRooms.map((r) => (
            <RoomRow key={r.id} siteId={siteId} room={r} />
          ))}
        </Card>
      ) : null}
      {walk.strayDevices.length ? (
        <Card role="region" aria-label="Devices without a room">
          <AppText variant="heading">Devices without a room</AppText>
          <AppText muted>Their room was deleted. Open a device to move it to a room.</AppText>
          {walk.strayDevices.map((d) => (
            <Link key={d.id} href={`/sites/${siteId}/devices/${d.id}` as never} asChild>
              <Pressable role="link" aria-label={d.name} style={styles.roomRow}>
                <AppText variant="subheading" style={{ flex: 1 }}>
                  {d.name}
                </AppText>
              </Pressable>
            </Link>
          ))}
        </Card>
      ) : null}
      {addingFloor ? (
        <AddFloorPanel floors={walk.floors} onAdd={actions.addFloor} onClose={() => setAddingFloor(false)} />
      ) : (
        <Button label="Add floor" tone="secondary" onPress={() => setAddingFloor(true)} style={{ alignSelf: "flex-start" }} />
      )}
    </View>
  );

  const summary = (
    <>
      <Card role="region" aria-label="Walk progress">
        <AppText variant="label" muted>
          Walk progress
        </AppText>
        <AppText variant="subheading">{`${progress.rooms === 1 ? "1 room" : `${progress.rooms} rooms`} · ${devicesWord(progress.devices)} · ${gapsLabel(progress.gapCount)}`}</AppText>
        <ProgressBar value={done} label="Devices complete" />
        <AppText muted variant="caption">{devicesProgressLabel(progress)}</AppText>
      </Card>
      <Card role="region" aria-label="Checklist">
        <AppText variant="subheading">Before you leave</AppText>
        <GapList lines={progress.lines} label="Site checklist" />
      </Card>
    </>
  );

  const settings = (
    <>
      {allRooms.length ? (
        <Card>
          <ChoiceChips
            label="Network closet (where every cable run ends)"
            value={site.closetRoomId && walk.rooms.has(site.closetRoomId) ? site.closetRoomId : undefined}
            choices={allRooms.map((r) => ({ value: r.id, label: r.name }))}
            onChange={(id) => void actions.setCloset(id)}
          />
        </Card>
      ) : null}
      <Card>
        <ChoiceChips
          label="Lengths on this site"
          value={site.units}
          choices={[
            { value: "metric", label: "Metres" },
            { value: "imperial", label: "Feet" },
          ]}
          onChange={(u) => void actions.setUnits(u)}
        />
      </Card>
      {walk.cautions.length ? (
        <Card role="region" aria-label="Safety on this site">
          <AppText variant="subheading">Safety on this site</AppText>
          {walk.cautions.map((c) => (
            <AppText key={c.id} variant="caption" style={{ lineHeight: 19 }}>{`⚠ ${c.text}`}</AppText>
          ))}
        </Card>
      ) : null}
    </>
  );

  return (
    <>
      <SyncPill />
      <ScopeStatusNotice status={site.status} />
      {wide ? (
        <View style={styles.columns}>
          <View style={{ flex: 3, minWidth: 0 }}>{floorsColumn}</View>
          <View style={{ flex: 2, minWidth: 0, gap: space.lg }}>
            {summary}
            {settings}
            {after}
          </View>
        </View>
      ) : (
        <>
          {summary}
          {floorsColumn}
          {settings}
          {after}
        </>
      )}
    </>
  );
}

const styles = StyleSheet.create({
  columns: { flexDirection: "row", gap: space.xl, alignItems: "flex-start" },
  floorHead: { flexDirection: "row", alignItems: "baseline", justifyContent: "space-between", gap: space.sm },
  roomRow: {
    flexDirection: "row",
    alignItems: "center",
    gap: space.md,
    minHeight: minTouch + 8,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.line,
    backgroundColor: colors.paper,
  },
  roomTitle: { flexDirection: "row", alignItems: "center", gap: space.sm, flexWrap: "wrap" },
});
