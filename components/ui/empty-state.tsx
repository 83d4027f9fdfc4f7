import type { ReactNode } from "react";
import { StyleSheet, View } from "react-native";
import { colors, radius, space } from "@/constants/theme";
import { AppText } from "./text";

/** A section with nothing in it yet: says what will appear here and how it gets there. */
export function EmptyState({ title, body, icon, action }: { title: string; body: string; icon?: ReactNode; action?: ReactNode }) {
  return (
    <View style={styles.box} aria-label={title}>
      {icon ? <View style={styles.icon}>{icon}</View> : null}
      <AppText variant="subheading" style={styles.center}>
        {title}
      </AppText>
      <AppText muted style={[styles.center, styles.body]}>
        {body}
      </AppText>
      {action}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    alignItems: "center",
    gap: space.sm,
    paddingVertical: space.xxl,
    paddingHorizontal: space.xl,
    borderRadius: radius.lg,
    borderWidth: 1.5,
    borderStyle: "dashed",
    borderColor: colors.slate100,
    backgroundColor: colors.slate50,
  },
  icon: { marginBottom: space.sm },
  center: { textAlign: "center" },
  body: { maxWidth: 440 },
});
