import { useState } from "react";
import { Pressable, StyleSheet, View } from "react-native";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { AppText } from "@/components/ui/text";
import { TextField } from "@/components/ui/text-field";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import type { ActionResult } from "@/hooks/use-walk";
import { ROOM_TYPES, type RoomType } from "@/survey/walk/words";

/** One tap adds a common room; anything else is typed by name. */
export function AddRoomPanel({ floorName, onAdd, onClose }: { floorName: string; onAdd: (type: RoomType) => Promise<ActionResult>; onClose: () => void }) {
  const [name, setName] = useState("");
  const [errors, setErrors] = useState<string[] | undefined>();
  const [busy, setBusy] = useState<string | null>(null);

  async function add(type: RoomType) {
    // One room per press: Enter in the name field and a click on the button do not both add one.
    if (busy !== null) return;
    setBusy(type.name);
    try {
      const result = await onAdd(type);
      if (!result.ok) setErrors(result.errors.name ?? Object.values(result.errors).flat());
    } finally {
      setBusy(null);
    }
  }

  return (
    <Card role="group" aria-label={`Add a room to ${floorName}`} style={{ backgroundColor: colors.slate50 }}>
      <AppText variant="subheading">{`Add a room to ${floorName}`}</AppText>
      <View style={styles.grid}>
        {ROOM_TYPES.map((t) => (
          <Pressable key={t.name} role="button" aria-label={t.name} disabled={busy !== null} onPress={() => add(t)} style={StyleSheet.flatten([styles.chip, busy === t.name && styles.chipBusy])}>
            <AppText style={styles.chipText}>{t.name}</AppText>
          </Pressable>
        ))}
      </View>
      <TextField
        label="Or a room by name"
        value={name}
        onChangeText={(t) => {
          setName(t);
          setErrors(undefined);
        }}
        placeholder="e.g. Mud room"
        errors={errors}
        onSubmitEditing={() => add({ name })}
      />
      <View style={styles.actions}>
        <Button label="Add this room" tone="secondary" busy={busy === name} onPress={() => add({ name })} />
        <Button label="Close" tone="quiet" onPress={onClose} />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: "row", flexWrap: "wrap", gap: space.sm },
  chip: { minHeight: minTouch, justifyContent: "center", paddingHorizontal: space.lg, borderRadius: radius.md, borderWidth: 1.5, borderColor: colors.slate600, backgroundColor: colors.card },
  chipBusy: { opacity: 0.55 },
  chipText: { fontFamily: fonts.semibold, color: colors.slate800 },
  actions: { flexDirection: "row", flexWrap: "wrap", gap: space.sm },
});
