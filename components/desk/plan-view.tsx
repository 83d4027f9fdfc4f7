// A site's plan at the desk: a summary, then the devices, the closet or the materials. Designers and
// admins change it on a wide screen; on a phone, and for surveyors, it is read-only.
import { useState } from "react";
import { ActivityIndicator, Pressable, StyleSheet, View } from "react-native";
import { ScopeDriftNotice } from "@/components/report/scope-drift-notice";
import { Banner } from "@/components/ui/banner";
import { AppText } from "@/components/ui/text";
import { colors, fonts, radius, space } from "@/constants/theme";
import { useMe } from "@/hooks/queries/me";
import { usePlan, type Plan } from "@/hooks/queries/plan";
import { useBreakpoint } from "@/hooks/use-breakpoint";
import { BudgetChart } from "./budget-chart";
import { ClosetPanel } from "./closet-panel";
import { DeviceList } from "./device-list";
import { MaterialsPanel } from "./materials-panel";
import { money, when } from "@/components/ui/format";
import { materialsTotalWords } from "@/survey/report";
import { MATERIALS_CURRENCY } from "@/survey/materials";

type Part = "devices" | "closet" | "materials";
const PARTS: { id: Part; label: string }[] = [
  { id: "devices", label: "Devices" },
  { id: "closet", label: "Closet" },
  { id: "materials", label: "Materials" },
];

export function PlanView({ siteId }: { siteId: string }) {
  const me = useMe();
  const { wide } = useBreakpoint();
  const plan = usePlan(siteId);
  const [part, setPart] = useState<Part>("devices");
  if (plan.isPending) return <ActivityIndicator color={colors.slate800} aria-label="Loading" />;
  if (plan.isError) return <Banner tone="danger" title="The plan could not be worked out">{plan.error.message}</Banner>;
  const p = plan.data;
  const mayEdit = me.role === "admin" || me.role === "designer";
  const editable = mayEdit && wide;
  return (
    <View style={{ gap: space.lg }}>
      {mayEdit ? <ScopeDriftNotice scope={p.scope} /> : null}
      <Summary plan={p} wide={wide} />
      {mayEdit && !wide ? <Banner tone="info">On a phone the plan is read-only: open it on a wide screen to change decisions, the closet or prices.</Banner> : null}
      <View style={styles.parts} role="tablist" aria-label="Plan parts">
        {PARTS.map((x) => (
          <Pressable key={x.id} role="tab" aria-selected={part === x.id} onPress={() => setPart(x.id)} style={[styles.part, part === x.id && styles.partOn]}>
            <AppText style={[styles.partText, part === x.id && { color: colors.copper700 }]}>{x.label}</AppText>
          </Pressable>
        ))}
        {wide ? (
          <AppText variant="caption" muted style={{ marginLeft: "auto", alignSelf: "center" }}>
            Last change from the walk {when(p.lastSyncAt)} · refreshes by itself
          </AppText>
        ) : null}
      </View>
      {!wide ? <AppText variant="caption" muted>Last change from the walk {when(p.lastSyncAt)} · refreshes by itself</AppText> : null}
      {part === "devices" ? <DeviceList siteId={siteId} plan={p} wide={wide} editable={editable} /> : null}
      {part === "closet" ? <ClosetPanel siteId={siteId} plan={p} wide={wide} editable={editable} /> : null}
      {part === "materials" ? <MaterialsPanel siteId={siteId} plan={p} wide={wide} editable={editable} /> : null}
      <Cautions plan={p} />
    </View>
  );
}

function Stat({ label, value, tone }: { label: string; value: string; tone?: "warn" | "danger" }) {
  return (
    <View style={styles.stat}>
      <AppText style={[styles.statValue, tone ? { color: tone === "danger" ? colors.danger : colors.warn } : null]}>{value}</AppText>
      <AppText variant="caption" muted>{label}</AppText>
    </View>
  );
}

function Summary({ plan: p, wide }: { plan: Plan; wide: boolean }) {
  const s = p.summary;
  const decided = p.devices.filter((d) => d.decision).length;
  return (
    <View style={[styles.summary, !wide && { flexDirection: "column" }]}>
      <View style={styles.stats}>
        <Stat
          label={p.completeness.leftOut ? `devices complete · ${p.completeness.leftOut} not in the plan yet` : "devices complete"}
          value={`${p.completeness.complete} of ${p.completeness.total}`}
          tone={p.completeness.complete < p.completeness.total ? "warn" : undefined}
        />
        <Stat label="on PoE" value={String(s.byRecommendation.poe + s.byRecommendation.poe_splitter)} />
        <Stat label="on mains: existing + new (outlet or transformer)" value={`${s.byRecommendation.existing_outlet} + ${s.byRecommendation.new_outlet} new`} />
        <Stat label="designer decisions" value={String(decided)} />
        <Stat label="problems · checks" value={`${s.warningCounts.error} · ${s.warningCounts.warning}`} tone={s.warningCounts.error ? "danger" : s.warningCounts.warning ? "warn" : undefined} />
        <Stat label="must stay up, stays up" value={`${s.mustStayUp.staysUp} of ${s.mustStayUp.total}`} tone={s.mustStayUp.goesDown ? "warn" : undefined} />
        <Stat label={`materials, ${MATERIALS_CURRENCY}${p.materials.unpricedCount ? ` · ${p.materials.unpricedCount} unpriced` : ""}`} value={materialsTotalWords(p.materials, money)} />
      </View>
      {wide ? (
        <View style={styles.charts}>
          {p.switches.filter((sw) => sw.kind === "poe_switch").slice(0, 2).map((sw) => (
            <View key={sw.sourceId} style={{ gap: 2 }}>
              <AppText variant="caption" style={{ fontFamily: fonts.bold }}>{sw.name} · {sw.portsUsed} of {sw.ports} ports</AppText>
              <BudgetChart sw={sw} />
            </View>
          ))}
        </View>
      ) : null}
    </View>
  );
}

function Cautions({ plan }: { plan: Plan }) {
  const [open, setOpen] = useState(false);
  return (
    <View style={styles.cautions}>
      <Pressable role="button" aria-expanded={open} onPress={() => setOpen(!open)} style={{ minHeight: 40, justifyContent: "center" }}>
        <AppText style={{ fontFamily: fonts.bold, color: colors.slate800 }}>{open ? "Hide" : "Show"} the safety cautions for this plan ({plan.cautions.length})</AppText>
      </Pressable>
      {open ? plan.cautions.map((c) => <AppText key={c.id} variant="caption">• {c.text}</AppText>) : (
        <AppText variant="caption" muted>Local code and the inspector have the final say; mains work is for a licensed electrician.</AppText>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  summary: { flexDirection: "row", gap: space.lg, padding: space.lg, borderRadius: radius.lg, backgroundColor: colors.card, borderWidth: 1, borderColor: colors.line },
  stats: { flexDirection: "row", flexWrap: "wrap", gap: space.lg, flex: 1, alignContent: "flex-start" },
  stat: { minWidth: 104, gap: 0 },
  statValue: { fontFamily: fonts.heavy, fontSize: 20, lineHeight: 26, color: colors.slate800 },
  charts: { width: 380, gap: space.sm },
  parts: { flexDirection: "row", gap: space.xs, borderBottomWidth: 2, borderBottomColor: colors.slate100 },
  part: { paddingHorizontal: space.lg, minHeight: 44, justifyContent: "center", borderBottomWidth: 3, borderBottomColor: "transparent", marginBottom: -2 },
  partOn: { borderBottomColor: colors.copper500 },
  partText: { fontFamily: fonts.bold, color: colors.slate700 },
  cautions: { gap: space.xs, padding: space.md, borderRadius: radius.md, backgroundColor: colors.warnBg },
});
