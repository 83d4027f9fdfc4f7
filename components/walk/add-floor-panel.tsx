import { useState } from "react";
import { StyleSheet, View } from "react-native";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { AppText } from "@/components/ui/text";
import { TextField } from "@/components/ui/text-field";
import { colors, space } from "@/constants/theme";
import type { ActionResult } from "@/hooks/use-walk";
import { parseNumber } from "@/survey/walk/device-form";
import { nextFreeName } from "@/survey/walk/words";

interface Existing {
  name: string;
  level: number | null;
}

/** Quick floors that fit the house so far (a basement below the lowest, an upper floor above the highest). */
function presets(floors: readonly Existing[]): { name: string; level: number }[] {
  const levels = floors.map((f) => f.level ?? 0);
  const names = floors.map((f) => f.name);
  const top = levels.length ? Math.max(...levels) : 0;
  const bottom = levels.length ? Math.min(...levels) : 0;
  const out: { name: string; level: number }[] = [];
  if (!levels.includes(0)) out.push({ name: nextFreeName("Ground floor", names), level: 0 });
  out.push({ name: nextFreeName("Upper floor", names), level: Math.max(top, 0) + 1 });
  if (bottom > -5) out.push({ name: nextFreeName("Basement", names), level: Math.min(bottom, 0) - 1 });
  out.push({ name: nextFreeName("Attic", names), level: Math.max(top, 0) + 1 });
  return out;
}

export function AddFloorPanel({ floors, onAdd, onClose }: { floors: readonly Existing[]; onAdd: (name: string, level: number) => Promise<ActionResult>; onClose: () => void }) {
  const [name, setName] = useState("");
  const [level, setLevel] = useState("");
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [busy, setBusy] = useState(false);

  async function add(n: string, l: number) {
    setBusy(true);
    try {
      const result = await onAdd(n, l);
      if (!result.ok) setErrors(result.errors);
      else onClose();
    } finally {
      setBusy(false);
    }
  }

  function addTyped() {
    const l = parseNumber(level);
    // An empty level is a typing slip, not a floor at ground level: say so on the field.
    if (l === undefined) return setErrors({ level: ["Give the floor's level: 0 for the ground floor, −1 for a basement, 1 for the floor above."] });
    void add(name, l);
  }

  return (
    <Card role="group" aria-label="Add a floor" style={{ backgroundColor: colors.slate50 }}>
      <AppText variant="subheading">Add a floor</AppText>
      <View style={styles.row}>
        {presets(floors).map((p) => (
          <Button key={p.name} tone="secondary" label={p.name} disabled={busy} onPress={() => add(p.name, p.level)} />
        ))}
      </View>
      <TextField label="Floor name" value={name} onChangeText={(t) => (setName(t), setErrors({}))} errors={errors.name} placeholder="e.g. Mezzanine" />
      <TextField
        label="Level"
        value={level}
        onChangeText={(t) => (setLevel(t), setErrors({}))}
        errors={errors.level}
        inputMode="numeric"
        hint="0 = ground floor, −1 = basement, 1 = the floor above"
      />
      <View style={styles.row}>
        <Button label="Add this floor" busy={busy} onPress={addTyped} />
        <Button label="Close" tone="quiet" onPress={onClose} />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: "row", flexWrap: "wrap", gap: space.sm },
});
