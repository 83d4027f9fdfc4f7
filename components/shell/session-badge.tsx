import { StyleSheet, View } from "react-native";
import { AppText } from "@/components/ui/text";
import { colors, fonts, radius, space } from "@/constants/theme";

/** Shown in the shell when the app runs on the session saved on this device, without the server. */
export function OfflineBadge() {
  return (
    <View style={styles.badge} role="status" aria-label="Offline: saved on this phone">
      <View style={styles.dot} />
      <AppText style={styles.text}>Offline</AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  badge: { flexDirection: "row", alignItems: "center", gap: space.xs, backgroundColor: colors.copper100, borderRadius: radius.pill, paddingHorizontal: space.sm, paddingVertical: 3 },
  dot: { width: 8, height: 8, borderRadius: 4, backgroundColor: colors.copper600 },
  text: { color: colors.copper700, fontFamily: fonts.bold, fontSize: 13 },
});
