import type { Ref } from "react";
import { ActivityIndicator, Pressable, StyleSheet, type PressableProps, type View, type ViewStyle } from "react-native";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { AppText } from "./text";

type Tone = "primary" | "secondary" | "quiet" | "danger";

export interface ButtonProps extends Omit<PressableProps, "style" | "children"> {
  label: string;
  tone?: Tone;
  busy?: boolean;
  style?: ViewStyle;
  /** To move the focus to it (a confirmation that opens in place). */
  ref?: Ref<View>;
}

export function Button({ label, tone = "primary", busy, disabled, style, ref, ...rest }: ButtonProps) {
  const inactive = disabled || busy;
  return (
    <Pressable
      ref={ref}
      role="button"
      aria-label={label}
      aria-disabled={inactive || undefined}
      disabled={inactive}
      {...rest}
      style={({ pressed, hovered, focused }: { pressed: boolean; hovered?: boolean; focused?: boolean }) => [
        styles.base,
        styles[tone],
        (pressed || hovered) && !inactive && styles[`${tone}Active`],
        focused && styles.focused,
        inactive && styles.inactive,
        style,
      ]}
    >
      {busy ? <ActivityIndicator color={tone === "primary" || tone === "danger" ? colors.onDark : colors.slate800} aria-label="Working" /> : null}
      <AppText style={[styles.label, { color: labelColor[tone] }]}>{label}</AppText>
    </Pressable>
  );
}

const labelColor: Record<Tone, string> = {
  primary: colors.onDark,
  secondary: colors.slate800,
  quiet: colors.slate700,
  danger: colors.onDark,
};

const styles = StyleSheet.create({
  base: {
    minHeight: minTouch,
    paddingHorizontal: space.xl,
    borderRadius: radius.md,
    alignItems: "center",
    justifyContent: "center",
    flexDirection: "row",
    gap: space.sm,
  },
  label: { fontFamily: fonts.bold, fontSize: 16 },
  primary: { backgroundColor: colors.slate800 },
  primaryActive: { backgroundColor: colors.slate700 },
  secondary: { backgroundColor: colors.card, borderWidth: 1.5, borderColor: colors.slate600 },
  secondaryActive: { backgroundColor: colors.slate50 },
  quiet: { backgroundColor: "transparent", paddingHorizontal: space.md },
  quietActive: { backgroundColor: colors.slate50 },
  danger: { backgroundColor: colors.danger },
  dangerActive: { backgroundColor: "#8B2424" },
  focused: { outlineColor: colors.copper500, outlineWidth: 3, outlineStyle: "solid" } as ViewStyle,
  inactive: { opacity: 0.55 },
});
