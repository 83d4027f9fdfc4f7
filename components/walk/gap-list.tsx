import { StyleSheet, View } from "react-native";
import { Icon } from "@/components/ui/icons";
import { AppText } from "@/components/ui/text";
import { colors, space } from "@/constants/theme";

/** A checklist of gaps, each on its own line; or the reassurance that nothing is missing. */
export function GapList({ lines, label, done = "No gaps: everything the rules need is captured." }: { lines: readonly string[]; label: string; done?: string }) {
  if (lines.length === 0) {
    return (
      <View style={styles.row} role="status" aria-label={label}>
        <Icon name="check" size={20} color={colors.good} />
        <AppText style={{ color: colors.good, flex: 1 }}>{done}</AppText>
      </View>
    );
  }
  return (
    <View role="list" aria-label={label} style={styles.list}>
      {lines.map((line) => (
        <View key={line} role="listitem" style={styles.row}>
          <Icon name="gap" size={20} color={colors.copper600} />
          <AppText style={styles.text}>{capitalise(line)}</AppText>
        </View>
      ))}
    </View>
  );
}

export function capitalise(s: string): string {
  return s ? s[0].toUpperCase() + s.slice(1) : s;
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: { flexDirection: "row", alignItems: "flex-start", gap: space.sm },
  text: { flex: 1 },
});
