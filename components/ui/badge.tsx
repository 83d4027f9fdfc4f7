import { StyleSheet, View } from "react-native";
import { colors, fonts, radius, space } from "@/constants/theme";
import { AppText } from "./text";

type Tone = "neutral" | "copper" | "good" | "warn" | "danger";

const TONES: Record<Tone, { bg: string; fg: string }> = {
  neutral: { bg: colors.slate50, fg: colors.slate800 },
  copper: { bg: colors.copper100, fg: colors.copper700 },
  good: { bg: colors.goodBg, fg: colors.good },
  warn: { bg: colors.warnBg, fg: colors.warn },
  danger: { bg: colors.dangerBg, fg: colors.danger },
};

export function Badge({ label, tone = "neutral" }: { label: string; tone?: Tone }) {
  const t = TONES[tone];
  return (
    <View style={[styles.badge, { backgroundColor: t.bg }]}>
      <AppText style={[styles.text, { color: t.fg }]}>{label}</AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  badge: { alignSelf: "flex-start", borderRadius: radius.pill, paddingHorizontal: space.sm + 2, paddingVertical: 2 },
  text: { fontFamily: fonts.bold, fontSize: 13, lineHeight: 18 },
});
