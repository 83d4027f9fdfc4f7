// The plan's devices, by floor and room: the recommendation, the reasons and the warnings side by
// side, the run against its length limits, the designer's decision and its history.
import { useState } from "react";
import { Pressable, StyleSheet, View } from "react-native";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { AppText } from "@/components/ui/text";
import { colors, fonts, radius, space } from "@/constants/theme";
import type { Plan, PlanDevice, PlanHistoryEntry } from "@/hooks/queries/plan";
import { POWER_METHOD_WORDS, type PowerMethod } from "@/survey/decisions";
import { formatLength } from "@/survey/units";
import { RunGauge } from "./budget-chart";
import { DecisionForm } from "./decision-form";
import { when } from "@/components/ui/format";
import { KIND_WORDS, RECOMMENDATION_TONE, RUN_LENGTH_CODES, SEVERITY_COLOR } from "./plan-words";

export function DeviceList({ siteId, plan, wide, editable }: { siteId: string; plan: Plan; wide: boolean; editable: boolean }) {
  const byId = new Map(plan.devices.map((d) => [d.deviceId, d]));
  const [open, setOpen] = useState<string | null>(null);
  return (
    <View style={{ gap: space.lg }}>
      {plan.floors.map((f) => {
        const rooms = f.rooms.filter((r) => r.deviceIds.length > 0);
        if (!rooms.length) return null;
        return (
          <View key={f.id} style={{ gap: space.sm }}>
            <AppText variant="heading">{f.name}</AppText>
            {rooms.map((r) => (
              <View key={r.id} style={styles.room} role="list" aria-label={`${f.name}, ${r.name}`}>
                <View style={styles.roomHead}>
                  <AppText variant="subheading">{r.name}</AppText>
                  {r.outdoor ? <Badge label="outdoors" /> : null}
                </View>
                {r.deviceIds.map((id) => {
                  const d = byId.get(id);
                  if (!d) return null;
                  return (
                    <DeviceRow key={id} siteId={siteId} plan={plan} device={d} wide={wide} editable={editable} open={open === id} onToggle={() => setOpen(open === id ? null : id)} />
                  );
                })}
              </View>
            ))}
          </View>
        );
      })}
      {plan.completeness.leftOut > 0 ? (
        <View style={styles.room}>
          <AppText variant="subheading">Not in the plan yet</AppText>
          <AppText muted>
            {plan.completeness.leftOutDevices.map((d) => d.name).join(", ")} — the walk has gaps for {plan.completeness.leftOut === 1 ? "it" : "them"}; the plan takes {plan.completeness.leftOut === 1 ? "it" : "them"} in once captured.
          </AppText>
        </View>
      ) : null}
    </View>
  );
}

function DeviceRow({ siteId, plan, device: d, wide, editable, open, onToggle }: { siteId: string; plan: Plan; device: PlanDevice; wide: boolean; editable: boolean; open: boolean; onToggle: () => void }) {
  const [showHistory, setShowHistory] = useState(false);
  const history = plan.history[d.deviceId] ?? [];
  const runWarnings = d.warnings.filter((w) => RUN_LENGTH_CODES.has(w.code));
  const otherWarnings = d.warnings.filter((w) => !RUN_LENGTH_CODES.has(w.code) && w.code !== "designer_decision");
  const placement = d.placement ? `${d.placement.sourceName} · port ${d.placement.port}${d.placement.pinned ? (d.placement.auto ? " (assigned)" : " (placed by hand)") : ""}` : d.unassigned ? "no port yet" : null;
  return (
    <View role="listitem" aria-label={d.name} style={styles.device} testID={`device-${d.deviceId}`}>
      <View style={[styles.cols, !wide && styles.colsPhone]}>
        <View style={[styles.colName, !wide && styles.full]}>
          <AppText style={styles.name}>{d.name}</AppText>
          <AppText variant="caption" muted>
            {KIND_WORDS[d.kind] ?? d.kind} · needs {d.needW} W{d.typicalFigure ? " (typical)" : ""}
          </AppText>
          <View style={styles.badges}>
            {d.mustStayUp ? <Badge label="must stay up" tone="copper" /> : null}
            {d.decision ? <Badge label={d.decision.forced ? "designer decision · forced" : "designer decision"} tone="warn" /> : null}
            {d.homeowner ? <Badge label={d.homeowner.changesAsked ? `homeowner asked for changes` : `homeowner commented`} tone={d.homeowner.changesAsked ? "danger" : "neutral"} /> : null}
          </View>
          {d.homeowner ? (
            <AppText variant="caption" aria-label={`What the homeowner wrote about ${d.name}`}>
              {`${d.homeowner.comments === 1 ? "1 comment" : `${d.homeowner.comments} comments`}${d.homeowner.changesAsked ? ` (${d.homeowner.changesAsked} asking for changes)` : ""}; the latest, on version ${d.homeowner.latest.version}, ${when(d.homeowner.latest.at)}: “${d.homeowner.latest.body}”`}
            </AppText>
          ) : null}
          <View style={styles.rowActions}>
            {editable ? <Button label={open ? "Close" : d.decision ? "Change" : "Override"} tone="secondary" onPress={onToggle} aria-label={`${open ? "Close" : "Override"} ${d.name}`} style={styles.smallButton} /> : null}
            {history.length ? (
              <Pressable role="button" aria-expanded={showHistory} aria-label={`History of ${d.name}`} onPress={() => setShowHistory(!showHistory)} style={styles.link}>
                <AppText style={styles.linkText}>{showHistory ? "Hide history" : `History (${history.length})`}</AppText>
              </Pressable>
            ) : null}
          </View>
        </View>
        <View style={[styles.colRec, !wide && styles.full]}>
          <View style={[styles.rec, { backgroundColor: REC_COLORS[RECOMMENDATION_TONE[d.recommendation]].bg }]}>
            <AppText style={[styles.recText, { color: REC_COLORS[RECOMMENDATION_TONE[d.recommendation]].fg }]}>{d.label}</AppText>
          </View>
          {placement ? <AppText variant="caption" style={{ color: d.unassigned ? colors.danger : colors.slate700, fontFamily: fonts.semibold }}>{placement}</AppText> : null}
          {d.unassigned ? <AppText variant="caption" style={{ color: colors.danger }}>{d.unassigned.reason}</AppText> : null}
          {d.decision ? <AppText variant="caption" muted>The rules advised: {d.rule.label}</AppText> : null}
          {d.cable ? (
            <View style={{ gap: 2 }}>
              <RunGauge lengthM={d.cable.lengthM} channelM={d.cable.channelM} units={plan.site.units} />
              <AppText variant="caption" muted>
                run {formatLength(d.cable.lengthM, plan.site.units)} · channel {formatLength(d.cable.channelM, plan.site.units)}
              </AppText>
            </View>
          ) : d.recommendation === "poe" || d.recommendation === "poe_splitter" ? <AppText variant="caption" muted>run not captured yet</AppText> : null}
          {runWarnings.map((w, i) => (
            <AppText key={i} variant="caption" style={{ color: SEVERITY_COLOR[w.severity].fg, fontFamily: fonts.semibold }}>
              {w.message}
            </AppText>
          ))}
        </View>
        <View style={[styles.colWhy, !wide && styles.full]}>
          {d.reasons.map((r, i) => (
            <AppText key={i} variant="caption" style={i === 0 && d.decision ? { fontFamily: fonts.bold, color: colors.warn } : undefined}>
              {r}
            </AppText>
          ))}
        </View>
        <View style={[styles.colWarn, !wide && styles.full]}>
          {otherWarnings.length === 0 ? (
            <AppText variant="caption" muted>
              {runWarnings.length || d.unassigned ? "No other warnings." : "No warnings."}
            </AppText>
          ) : null}
          {otherWarnings.map((w, i) => (
            <View key={i} style={[styles.warning, { backgroundColor: SEVERITY_COLOR[w.severity].bg }]}>
              <AppText variant="caption" style={{ color: SEVERITY_COLOR[w.severity].fg, fontFamily: fonts.bold }}>{SEVERITY_COLOR[w.severity].word}</AppText>
              <AppText variant="caption">{w.message}</AppText>
            </View>
          ))}
          {d.cautions.length ? (
            <View role="group" aria-label={`Safety for ${d.name}`} style={[styles.warning, { backgroundColor: colors.dangerBg }]}>
              <AppText variant="caption" style={{ color: colors.danger, fontFamily: fonts.bold }}>Safety</AppText>
              {d.cautions.map((c) => (
                <AppText key={c.id} variant="caption">{`⚠ ${c.text}`}</AppText>
              ))}
            </View>
          ) : null}
        </View>
      </View>
      {showHistory ? <History entries={history} /> : null}
      {open && editable ? <DecisionForm siteId={siteId} plan={plan} device={d} onDone={onToggle} /> : null}
    </View>
  );
}

function historyWords(h: PlanHistoryEntry): string {
  const a = h.after as Record<string, unknown> | null;
  const b = h.before as Record<string, unknown> | null;
  switch (h.action) {
    case "decided": {
      const method = POWER_METHOD_WORDS[(a?.method as PowerMethod) ?? "poe"];
      const extra = [a?.poeClass != null ? `Class ${String(a.poeClass)}` : null, a?.sourceId ? `on ${String(a.sourceId)}${a.port ? ` port ${String(a.port)}` : ""}` : null].filter(Boolean).join(", ");
      return `Decided: ${method}${extra ? ` (${extra})` : ""}${h.forced ? " — saved despite the plan's warning, on purpose" : ""}`;
    }
    case "cleared":
      return `Back to the rules' advice (was ${POWER_METHOD_WORDS[(b?.method as PowerMethod) ?? "poe"]})`;
    case "auto_placed":
      return a ? `Assigned to ${String(a.sourceName)} port ${String(a.port)}` : `Taken off ${String(b?.sourceName ?? "its port")}`;
    case "source_removed":
      return `Unpinned: ${String(b?.sourceName ?? "its source")} was removed`;
    default:
      return h.action;
  }
}

function History({ entries }: { entries: PlanHistoryEntry[] }) {
  return (
    <View style={styles.history} role="list" aria-label="Decision history">
      {entries.map((h) => (
        <View key={h.id} role="listitem" style={styles.historyRow}>
          <AppText variant="caption" style={{ fontFamily: fonts.semibold, minWidth: 120 }}>{when(h.at)}</AppText>
          <View style={{ flex: 1 }}>
            <AppText variant="caption" style={{ fontFamily: fonts.semibold }}>{historyWords(h)}{h.by ? ` · ${h.by}` : ""}</AppText>
            <AppText variant="caption" muted>“{h.reason}”</AppText>
          </View>
        </View>
      ))}
    </View>
  );
}

const REC_COLORS = {
  neutral: { bg: colors.slate50, fg: colors.slate800 },
  copper: { bg: colors.copper100, fg: colors.copper700 },
  good: { bg: colors.goodBg, fg: colors.good },
  warn: { bg: colors.warnBg, fg: colors.warn },
  danger: { bg: colors.dangerBg, fg: colors.danger },
} as const;

const styles = StyleSheet.create({
  rec: { alignSelf: "flex-start", borderRadius: radius.sm, paddingHorizontal: space.sm, paddingVertical: 3 },
  recText: { fontFamily: fonts.bold, fontSize: 13, lineHeight: 18 },
  room: { gap: space.sm, padding: space.md, borderRadius: radius.lg, backgroundColor: colors.card, borderWidth: 1, borderColor: colors.line },
  roomHead: { flexDirection: "row", alignItems: "center", gap: space.sm },
  device: { gap: space.sm, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.slate100 },
  cols: { flexDirection: "row", gap: space.md, alignItems: "flex-start" },
  colsPhone: { flexDirection: "column", gap: space.xs },
  full: { width: "100%", flexBasis: "auto" },
  colName: { flexBasis: 150, flexGrow: 0, flexShrink: 0, gap: 2 },
  colRec: { flexBasis: 190, flexGrow: 0, flexShrink: 0, gap: space.xs },
  colWhy: { flex: 1.3, gap: 2, minWidth: 0 },
  colWarn: { flex: 1, gap: space.xs, minWidth: 0 },
  name: { fontFamily: fonts.bold },
  badges: { flexDirection: "row", flexWrap: "wrap", gap: space.xs, marginTop: 2 },
  warning: { borderRadius: radius.sm, padding: space.xs + 2, gap: 1 },
  rowActions: { flexDirection: "row", gap: space.xs, alignItems: "center", flexWrap: "wrap", marginTop: space.xs },
  smallButton: { minHeight: 36, paddingHorizontal: space.md },
  link: { minHeight: 36, justifyContent: "center", paddingHorizontal: space.sm },
  linkText: { color: colors.copper700, fontFamily: fonts.semibold, textDecorationLine: "underline" },
  history: { gap: space.xs, padding: space.md, borderRadius: radius.md, backgroundColor: colors.paper },
  historyRow: { flexDirection: "row", gap: space.md },
});
