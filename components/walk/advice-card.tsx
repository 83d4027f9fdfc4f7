import { StyleSheet, View } from "react-native";
import { Badge } from "@/components/ui/badge";
import { Banner } from "@/components/ui/banner";
import { Card } from "@/components/ui/card";
import { AppText } from "@/components/ui/text";
import { colors, radius, space } from "@/constants/theme";
import type { DeviceEvaluation, Recommendation, Severity } from "@/survey/rules/result-types";
import { capitalise, GapList } from "./gap-list";

export const RECOMMENDATION_TONES: Record<Recommendation, "good" | "neutral" | "warn" | "danger" | "copper"> = {
  poe: "good",
  poe_splitter: "copper",
  existing_outlet: "neutral",
  new_outlet: "warn",
  cannot_power: "danger",
};

const SEVERITY: Record<Severity, { tone: "info" | "warn" | "danger"; word: string }> = {
  info: { tone: "info", word: "Note" },
  warning: { tone: "warn", word: "Warning" },
  error: { tone: "danger", word: "Problem" },
};

/** The recommendation label as a badge, or the gap count when there is none yet. */
export function AdviceBadge({ advice, gaps }: { advice: DeviceEvaluation | null; gaps: number }) {
  if (advice) return <Badge label={advice.label} tone={RECOMMENDATION_TONES[advice.recommendation]} />;
  return <Badge label={gaps === 1 ? "1 gap" : `${gaps} gaps`} tone="copper" />;
}

/** The instant advice for one device: what powers it and why, with its warnings and safety cautions. */
export function AdviceCard({ advice, gaps, refused, waitsFor = [], draft }: { advice: DeviceEvaluation | null; gaps: readonly string[]; refused: string | null; waitsFor?: readonly string[]; draft?: boolean }) {
  return (
    <Card role="region" aria-label="Advice" style={styles.card}>
      <View style={styles.head}>
        <AppText variant="label" muted>
          {draft ? "Advice for what is on screen (not saved yet)" : "Advice"}
        </AppText>
      </View>
      {waitsFor.length > 0 ? (
        <View style={{ gap: space.sm }}>
          <AppText>The advice waits until these fields are right:</AppText>
          <GapList lines={waitsFor} label="Fields the advice waits for" />
        </View>
      ) : advice ? (
        <>
          <View style={[styles.label, { borderLeftColor: toneColor(advice.recommendation) }]}>
            <AppText variant="heading" aria-label={`Recommendation: ${advice.label}`}>
              {capitalise(advice.label)}
            </AppText>
            <AppText muted variant="caption">{`Needs ${formatW(advice.needW)}${advice.poe ? ` · port reserves ${formatW(advice.poe.reservedW)}` : ""}`}</AppText>
          </View>
          {advice.typicalFigure ? (
            <Banner tone="warn" title="Typical figure">
              This advice uses a typical power figure for its kind. Read the real one on the device or its adapter label.
            </Banner>
          ) : null}
          <View style={styles.list}>
            {advice.reasons.map((r) => (
              <AppText key={r} style={styles.bullet}>{`• ${r}`}</AppText>
            ))}
          </View>
          {advice.warnings.map((w) => (
            <Banner key={`${w.code}-${w.message}`} tone={SEVERITY[w.severity].tone} title={SEVERITY[w.severity].word}>
              {w.message}
            </Banner>
          ))}
          {advice.cautions.length ? (
            <View style={styles.safety} role="group" aria-label="Safety">
              <AppText variant="label" style={{ color: colors.danger }}>
                Safety
              </AppText>
              {advice.cautions.map((c) => (
                <AppText key={c.id} style={styles.bullet}>{`⚠ ${c.text}`}</AppText>
              ))}
              <AppText variant="caption" muted>
                Local code and the local inspector have the final say; mains work is for a licensed electrician.
              </AppText>
            </View>
          ) : null}
        </>
      ) : refused ? (
        <Banner tone="warn" title="No advice for this device">
          {refused}
        </Banner>
      ) : (
        <View style={{ gap: space.sm }}>
          <AppText>The advice appears as soon as these are filled:</AppText>
          <GapList lines={gaps} label="Gaps of this device" />
        </View>
      )}
    </Card>
  );
}

function toneColor(r: Recommendation): string {
  switch (RECOMMENDATION_TONES[r]) {
    case "good":
      return colors.good;
    case "copper":
      return colors.copper500;
    case "warn":
      return colors.warn;
    case "danger":
      return colors.danger;
    default:
      return colors.slate600;
  }
}

function formatW(w: number): string {
  return `${Math.round(w * 100) / 100} W`;
}

const styles = StyleSheet.create({
  card: { borderColor: colors.slate100, gap: space.md },
  head: { flexDirection: "row", justifyContent: "space-between" },
  label: { borderLeftWidth: 5, paddingLeft: space.md, gap: 2, borderRadius: radius.sm },
  list: { gap: space.xs },
  bullet: { lineHeight: 22 },
  safety: { gap: space.xs, padding: space.md, backgroundColor: colors.dangerBg, borderRadius: radius.md },
});
