import { StyleSheet, View } from "react-native";
import { Banner } from "@/components/ui/banner";
import { Card } from "@/components/ui/card";
import { when } from "@/components/ui/format";
import { AppText } from "@/components/ui/text";
import { colors, radius, space } from "@/constants/theme";
import { useDeviceDecision } from "@/hooks/queries/plan";
import { capitalise } from "./gap-list";

/**
 * What the designer decided for this device at the desk, shown on the walk so the surveyor knows
 * the plan the house is being wired to. It comes from the plan the phone last fetched; with no
 * decision (or no plan on this phone yet) it shows nothing.
 */
export function DesignerDecisionCard({ siteId, deviceId }: { siteId: string; deviceId: string }) {
  const note = useDeviceDecision(siteId, deviceId).data;
  if (!note) return null;
  const { decision } = note;
  const byline = `${decision.decidedBy ?? "The designer"}, ${when(decision.decidedAt)}`;
  return (
    <Card role="region" aria-label="Designer's decision" style={styles.card}>
      <AppText variant="label" muted>
        Designer's decision
      </AppText>
      {note.stale ? (
        <Banner tone="warn" title="No longer fits what was captured">
          {note.stale}
        </Banner>
      ) : (
        <View style={styles.label}>
          <AppText variant="subheading">{capitalise(note.label)}</AppText>
          {note.ruleLabel !== note.label ? <AppText muted variant="caption">{`The rules advised: ${note.ruleLabel}`}</AppText> : null}
        </View>
      )}
      {decision.reason ? <AppText>{`“${decision.reason}”`}</AppText> : null}
      <AppText muted variant="caption">{byline}</AppText>
      {note.stale ? null : (
        <AppText muted variant="caption">
          The advice below is the rules' own for what is captured here; the plan follows the designer.
        </AppText>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.sm, backgroundColor: colors.slate50 },
  label: { borderLeftWidth: 5, borderLeftColor: colors.slate700, paddingLeft: space.md, gap: 2, borderRadius: radius.sm },
});
