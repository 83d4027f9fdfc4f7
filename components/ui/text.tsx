import { Text as RNText, StyleSheet, type TextProps } from "react-native";
import { colors, fonts } from "@/constants/theme";

type Variant = "title" | "heading" | "subheading" | "body" | "label" | "caption";

export interface AppTextProps extends TextProps {
  variant?: Variant;
  muted?: boolean;
  color?: string;
}

export function AppText({ variant = "body", muted, color, style, ...rest }: AppTextProps) {
  return (
    <RNText
      {...rest}
      role={variant === "title" || variant === "heading" ? "heading" : rest.role}
      style={[styles.base, styles[variant], muted && styles.muted, color ? { color } : null, style]}
    />
  );
}

const styles = StyleSheet.create({
  base: { fontFamily: fonts.regular, color: colors.ink, fontSize: 16, lineHeight: 23 },
  title: { fontFamily: fonts.heavy, fontSize: 28, lineHeight: 34, letterSpacing: -0.3 },
  heading: { fontFamily: fonts.bold, fontSize: 21, lineHeight: 27 },
  subheading: { fontFamily: fonts.semibold, fontSize: 17, lineHeight: 24 },
  body: {},
  label: { fontFamily: fonts.semibold, fontSize: 14, lineHeight: 19, letterSpacing: 0.2 },
  caption: { fontSize: 13, lineHeight: 18 },
  muted: { color: colors.inkMuted },
});
