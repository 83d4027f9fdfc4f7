import { StyleSheet, View } from "react-native";
import { colors, radius } from "@/constants/theme";

/** A thin bar for a share done (0–1), readable by screen readers as a percentage. */
export function ProgressBar({ value, label, color = colors.copper500 }: { value: number; label: string; color?: string }) {
  const pct = Math.round(Math.max(0, Math.min(1, Number.isFinite(value) ? value : 0)) * 100);
  return (
    <View role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} style={styles.track}>
      <View style={[styles.fill, { width: `${pct}%`, backgroundColor: color }]} />
    </View>
  );
}

const styles = StyleSheet.create({
  track: { height: 8, borderRadius: radius.pill, backgroundColor: colors.slate100, overflow: "hidden" },
  fill: { height: "100%", borderRadius: radius.pill },
});
