import { useState } from "react";
import { StyleSheet, View } from "react-native";
import { when } from "@/components/ui/format";
import { Badge } from "@/components/ui/badge";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { AppText } from "@/components/ui/text";
import { colors, space } from "@/constants/theme";
import type { ReportView } from "@/hooks/queries/reports";
import { lineAmount, unpricedNote } from "@/survey/report";
import { CommentBox } from "./comment-box";
import { DeviceWords } from "./device-words";
import { SignOffCard } from "./sign-off-card";

const TONE = { poe: "good", poe_splitter: "copper", existing_outlet: "neutral", new_outlet: "warn", cannot_power: "danger" } as const;

/** The published scope as the homeowner reads it: summary, what changed, room by room, cautions, sign-off. */
export function ScopeView({ view, isClient }: { view: ReportView; isClient: boolean }) {
  const { content, report } = view;
  const s = content.summary;
  const [commenting, setCommenting] = useState<string | null>(null);
  const commentsFor = (ref: string) => view.comments.filter((c) => c.itemRef === ref);

  return (
    <View style={{ gap: space.lg }}>
      <Card>
        <AppText variant="label" color={colors.copper700}>{`Version ${report.version} · published ${when(report.publishedAt)}`}</AppText>
        <AppText variant="heading">What this plan does</AppText>
        <AppText>{`${s.devices} devices: ${s.onPoe} on PoE (power and data over one cable), ${s.onSplitters} on PoE with a splitter, ${s.onExistingOutlets} on an existing outlet or transformer, ${s.newOutlets} on a new outlet or transformer put in by a licensed electrician${s.cannotPower ? `, ${s.cannotPower} that cannot be powered as captured` : ""}.`}</AppText>
        <AppText>
          {s.mustStayUp
            ? `In a power cut, ${s.staysUpOnBattery} of the ${s.mustStayUp} devices that must keep working stay up on the battery${s.shortestRuntimeMin !== null ? `, the shortest for about ${s.shortestRuntimeMin} minutes` : ""}.`
            : "No device was marked as having to keep working in a power cut."}
        </AppText>
        <AppText muted variant="caption">{`Fingerprint ${report.contentHash.slice(0, 16)}…`}</AppText>
        <Button tone="secondary" label="Open as PDF" onPress={() => globalThis.open?.(`/api/reports/${report.id}/pdf`, "_blank")} />
      </Card>

      {view.changes ? (
        <Card>
          <AppText variant="subheading">{`What changed since version ${view.changes.sinceVersion}`}</AppText>
          {view.changes.added.length + view.changes.removed.length + view.changes.methodChanged.length === 0 && view.changes.totalBefore === view.changes.totalAfter ? <AppText muted>Nothing in the devices or the total.</AppText> : null}
          {view.changes.added.map((d) => <AppText key={`a${d.id}`}>{`Added: ${d.name}`}</AppText>)}
          {view.changes.removed.map((d) => <AppText key={`r${d.id}`}>{`Removed: ${d.name}`}</AppText>)}
          {view.changes.methodChanged.map((d) => <AppText key={`m${d.id}`}>{`${d.name}: ${d.before} → ${d.after}`}</AppText>)}
          {view.changes.totalBefore !== view.changes.totalAfter ? <AppText>{`Total: ${view.changes.totalBefore.toFixed(2)} → ${view.changes.totalAfter.toFixed(2)} ${content.materials.currency}`}</AppText> : null}
        </Card>
      ) : null}

      {content.rooms.map((room) => (
        <View key={room.id} style={{ gap: space.sm }}>
          <AppText variant="heading">{room.name}</AppText>
          {room.floor ? <AppText muted variant="caption">{room.floor}</AppText> : null}
          {room.devices.map((d) => (
            <Card key={d.id}>
              <View style={styles.deviceHead}>
                <AppText variant="subheading" style={{ flex: 1 }}>
                  {d.name}
                </AppText>
                <Badge label={d.label} tone={TONE[d.recommendation as keyof typeof TONE] ?? "neutral"} />
              </View>
              {d.decision ? <Banner tone="info" title="Designer decision">{d.decision.reason}</Banner> : null}
              <DeviceWords device={d} />
              {d.warnings.map((w, i) => (
                <AppText key={`w${i}`} color={colors.warn}>{`! ${w}`}</AppText>
              ))}
              {commentsFor(d.id).map((c) => (
                <View key={c.id} style={[styles.comment, c.changeRequest && styles.change]}>
                  <AppText variant="caption" muted>{`${c.changeRequest ? "Change asked" : "Comment"} · ${c.author ?? ""}`}</AppText>
                  <AppText>{c.body}</AppText>
                </View>
              ))}
              {commenting === d.id ? (
                <CommentBox reportId={report.id} itemRef={d.id} itemName={d.name} canAskChange={isClient} onDone={() => setCommenting(null)} />
              ) : (
                <Button tone="quiet" label={`Comment on ${d.name}`} onPress={() => setCommenting(d.id)} />
              )}
            </Card>
          ))}
        </View>
      ))}

      {content.materials.lines.length ? (
        <Card>
          <AppText variant="subheading">Materials</AppText>
          {content.materials.lines.map((l) => (
            <View key={l.key} style={styles.line}>
              <AppText style={{ flex: 1 }}>{`${l.quantity} ${l.unit} · ${l.description}`}</AppText>
              <AppText>{lineAmount(l, content.materials.currency)}</AppText>
            </View>
          ))}
          <View style={styles.line}>
            <AppText variant="subheading" style={{ flex: 1 }}>
              Total
            </AppText>
            <AppText variant="subheading">{`${content.materials.total.toFixed(2)} ${content.materials.currency}`}</AppText>
          </View>
          {unpricedNote(content.materials) ? <AppText muted>{unpricedNote(content.materials)}</AppText> : null}
        </Card>
      ) : null}

      <Card>
        <AppText variant="subheading">Cautions</AppText>
        {content.cautions.map((c) => (
          <AppText key={c.id}>{`• ${c.text}`}</AppText>
        ))}
        <AppText variant="caption" muted>
          Mains wiring is work for a licensed electrician; local codes and the authority having jurisdiction decide.
        </AppText>
      </Card>

      <View style={{ gap: space.sm }}>
        {commentsFor("general").map((c) => (
          <View key={c.id} style={[styles.comment, c.changeRequest && styles.change]}>
            <AppText variant="caption" muted>{`${c.changeRequest ? "Change asked" : "Comment"} · ${c.author ?? ""}`}</AppText>
            <AppText>{c.body}</AppText>
          </View>
        ))}
        {commenting === "general" ? (
          <CommentBox reportId={report.id} itemRef="general" itemName="the whole scope" canAskChange={isClient} onDone={() => setCommenting(null)} />
        ) : (
          <Button tone="secondary" label="Comment on the whole scope" onPress={() => setCommenting("general")} />
        )}
      </View>

      <SignOffCard view={view} isClient={isClient} />
    </View>
  );
}

const styles = StyleSheet.create({
  deviceHead: { flexDirection: "row", alignItems: "center", gap: space.sm, flexWrap: "wrap" },
  comment: { backgroundColor: colors.slate50, borderRadius: 8, padding: space.sm, gap: 2 },
  change: { backgroundColor: colors.warnBg },
  line: { flexDirection: "row", gap: space.md, alignItems: "center" },
});
