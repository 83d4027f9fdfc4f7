import { StyleSheet, View } from "react-native";
import { colors, radius, space } from "@/constants/theme";
import { AppText } from "./text";

type Tone = "info" | "good" | "warn" | "danger";

const TONES: Record<Tone, { bg: string; fg: string }> = {
  info: { bg: colors.slate50, fg: colors.slate800 },
  good: { bg: colors.goodBg, fg: colors.good },
  warn: { bg: colors.warnBg, fg: colors.warn },
  danger: { bg: colors.dangerBg, fg: colors.danger },
};

export function Banner({ tone = "info", title, children }: { tone?: Tone; title?: string; children?: string }) {
  const t = TONES[tone];
  return (
    <View role={tone === "danger" ? "alert" : "status"} style={[styles.box, { backgroundColor: t.bg, borderLeftColor: t.fg }]}>
      {title ? <AppText style={{ color: t.fg, fontWeight: "700" }}>{title}</AppText> : null}
      {children ? <AppText style={{ color: colors.ink }}>{children}</AppText> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { borderRadius: radius.md, borderLeftWidth: 4, padding: space.md, gap: 2 },
});
