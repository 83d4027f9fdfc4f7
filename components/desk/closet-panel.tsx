// The closet: PoE switches and injectors with their budget charts and ports, the outlets, and the
// battery backup with its "on battery" chart. Ports are assigned by the rules or moved by hand.
import { useState } from "react";
import { StyleSheet, View } from "react-native";
import { Badge } from "@/components/ui/badge";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ConfirmBox } from "@/components/ui/confirm-box";
import { AppText } from "@/components/ui/text";
import { colors, fonts, radius, space } from "@/constants/theme";
import { useRemoveClosetItem } from "@/hooks/queries/closet";
import { useAssignPorts } from "@/hooks/queries/decisions";
import type { Plan, PlanSwitch } from "@/hooks/queries/plan";
import { formatNumber } from "@/survey/units";
import { BudgetChart } from "./budget-chart";
import { BatteryForm, SourceForm } from "./closet-forms";
import { DecisionForm } from "./decision-form";
import { OutageChart } from "./outage-chart";

type Editing = { what: "source"; id?: string; kind?: "poe_switch" | "injector" | "outlet" } | { what: "battery"; id?: string } | null;

export function ClosetPanel({ siteId, plan, wide, editable }: { siteId: string; plan: Plan; wide: boolean; editable: boolean }) {
  const byHand = new Set(plan.devices.filter((d) => d.placement?.pinned && !d.placement.auto).map((d) => d.deviceId));
  const [editing, setEditing] = useState<Editing>(null);
  const [moving, setMoving] = useState<string | null>(null);
  const assign = useAssignPorts(siteId);
  const removeSource = useRemoveClosetItem(siteId, "sources");
  const removeBattery = useRemoveClosetItem(siteId, "batteries");
  const [notice, setNotice] = useState<string | null>(null);
  // The closet item whose Remove was pressed: it asks once more before anything goes.
  const [removing, setRemoving] = useState<string | null>(null);
  const remove = (id: string, mutation: typeof removeSource) => mutation.mutateAsync(id).catch((e: Error) => setNotice(e.message));
  const switchBy = new Map(plan.switches.map((s) => [s.sourceId, s]));
  const batteryOf = new Map<string, string>();
  for (const b of plan.closet.batteries) for (const f of (b.data.feeds as string[] | undefined) ?? []) batteryOf.set(f, String(b.data.name));
  const outletDevices = (id: string) => plan.devices.filter((d) => d.pins.sourceId === id && d.outlet);
  const done = () => setEditing(null);
  const movingDevice = moving ? plan.devices.find((d) => d.deviceId === moving) : undefined;

  const runAssign = () =>
    assign.mutate({}, {
      onSuccess: (r) => setNotice(`Placed ${r.placed} device${r.placed === 1 ? "" : "s"} by the rules (${r.moved} moved)${r.plan.assignment.unassigned.length ? `; ${r.plan.assignment.unassigned.length} without a port` : ""}.`),
      onError: (err) => setNotice(err.message),
    });

  return (
    <View style={{ gap: space.lg }}>
      {editable ? (
        <View style={styles.toolbar}>
          <Button label="Assign ports automatically" onPress={runAssign} busy={assign.isPending} />
          <Button label="Add switch" tone="secondary" onPress={() => setEditing({ what: "source", kind: "poe_switch" })} />
          <Button label="Add injector" tone="secondary" onPress={() => setEditing({ what: "source", kind: "injector" })} />
          <Button label="Add outlet" tone="secondary" onPress={() => setEditing({ what: "source", kind: "outlet" })} />
          {plan.closet.batteries.length === 0 ? <Button label="Add battery" tone="secondary" onPress={() => setEditing({ what: "battery" })} /> : null}
        </View>
      ) : null}
      <AppText variant="caption" muted>
        Automatic assignment puts devices that must stay up first, on battery-backed switches, largest first, and keeps each switch within its budget and the {formatNumber((plan.site.settings.planningCeiling ?? 0.8) * 100)} % planning ceiling (common practice, not a standard). Pins chosen by hand stay where they are.
      </AppText>
      {notice ? <Banner tone="info">{notice}</Banner> : null}
      {movingDevice ? (
        // One place for the form, whatever port the device is on, so it stays open while the plan moves under it.
        <View ref={(el: unknown) => void (el as { scrollIntoView?: (o: object) => void } | null)?.scrollIntoView?.({ block: "nearest" })}>
        <Card style={{ gap: space.sm }}>
          <AppText variant="subheading">Move {movingDevice.name}</AppText>
          <AppText variant="caption" muted>
            Now on {movingDevice.placement ? `${movingDevice.placement.sourceName}, port ${movingDevice.placement.port}` : "no port"}. Choose a switch or injector and a port; the reason goes into its history.
          </AppText>
          <DecisionForm key={movingDevice.deviceId} siteId={siteId} plan={plan} device={movingDevice} onDone={() => setMoving(null)} />
        </Card>
        </View>
      ) : null}
      {editing && editing.what === "source" && !editing.id ? <SourceForm siteId={siteId} kind={editing.kind} onDone={done} /> : null}
      {editing && editing.what === "battery" && !editing.id ? <BatteryForm siteId={siteId} plan={plan} onDone={done} /> : null}

      {plan.closet.sources.filter((s) => !s.valid).map((s) => (
        <Banner key={s.id} tone="warn" title={`${String(s.data.name ?? "A power source")} is not complete`}>
          It was started on a phone and is left out of the plan until its fields are filled in. Edit it here to finish it.
        </Banner>
      ))}

      {plan.closet.sources.map((s) => {
        const sw = switchBy.get(s.id);
        const isEditing = editing?.what === "source" && editing.id === s.id;
        const data = s.data;
        const spec =
          data.kind === "poe_switch"
            ? `PoE switch · ${sw?.standard ?? ""} · ${String(data.poePorts)} PoE ports · ${String(data.budgetW)} W budget · own draw ${String(data.ownDrawW ?? 0)} W`
            : data.kind === "injector"
              ? `PoE injector · ${sw?.standard ?? ""} · ${String(data.ports ?? 1)} port${Number(data.ports ?? 1) === 1 ? "" : "s"}${sw ? ` · ${formatNumber(sw.budgetW)} W` : ""}`
              : "Outlet";
        return (
          <Card key={s.id} style={styles.card} aria-label={String(data.name)}>
            <View style={styles.head}>
              <View style={{ flex: 1, gap: 2 }}>
                <AppText variant="subheading">{String(data.name)}</AppText>
                <AppText variant="caption" muted>{spec}</AppText>
              </View>
              {batteryOf.has(s.id) ? <Badge label={`on battery · ${batteryOf.get(s.id)}`} tone="good" /> : data.kind !== "outlet" ? <Badge label="not on battery" /> : null}
              {sw?.overBudget ? <Badge label="over budget" tone="danger" /> : sw?.overCeiling ? <Badge label="over the ceiling" tone="warn" /> : null}
              {editable ? (
                <>
                  <Button label="Edit" tone="quiet" aria-label={`Edit ${String(data.name)}`} onPress={() => setEditing(isEditing ? null : { what: "source", id: s.id })} />
                  <Button label="Remove" tone="quiet" aria-label={`Remove ${String(data.name)}`} onPress={() => setRemoving(removing === s.id ? null : s.id)} />
                </>
              ) : null}
            </View>
            {editable && removing === s.id ? (
              <ConfirmBox
                question={`Remove ${String(data.name)} from the closet?`}
                detail={removalConsequence(data.kind, sw, outletDevices(s.id).length)}
                confirmLabel="Yes, remove it"
                onConfirm={() => remove(s.id, removeSource)}
                onClose={() => setRemoving(null)}
              />
            ) : null}
            {isEditing ? <SourceForm siteId={siteId} item={s} onDone={done} /> : null}
            {sw ? (
              <View style={[styles.split, !wide && { flexDirection: "column", alignItems: "stretch" }]}>
                <View style={wide ? { flex: 1, gap: space.xs } : styles.stacked}>
                  <BudgetChart sw={sw} />
                  {sw.warnings.map((w, i) => <AppText key={i} variant="caption" style={{ color: w.severity === "error" ? colors.danger : colors.warn, fontFamily: fonts.semibold }}>{w.message}</AppText>)}
                  {sw.suggestions.map((t, i) => <AppText key={i} variant="caption" muted>{t}</AppText>)}
                  <AppText variant="caption" muted>Wall draw about {formatNumber(sw.wallDrawW, 1)} W.</AppText>
                </View>
                <PortTable sw={sw} byHand={byHand} editable={editable} onMove={(id) => setMoving(moving === id ? null : id)} moving={moving} narrow={!wide} />
              </View>
            ) : data.kind === "outlet" ? (
              <AppText variant="caption">{outletDevices(s.id).map((d) => d.name).join(", ") || "Nothing is pinned to it."}</AppText>
            ) : null}
          </Card>
        );
      })}

      {plan.assignment.unassigned.length ? (
        <Card>
          <AppText variant="subheading">Without a port</AppText>
          {plan.assignment.unassigned.map((u) => {
            const d = plan.devices.find((x) => x.deviceId === u.deviceId);
            return (
              <View key={u.deviceId} style={styles.unassigned}>
                <AppText style={{ fontFamily: fonts.semibold, flex: 1 }}>{d?.name ?? u.deviceId}</AppText>
                <AppText variant="caption" style={{ flex: 2, color: colors.danger }}>{u.reason}</AppText>
                {editable ? <Button label="Place" tone="secondary" aria-label={`Place ${d?.name ?? u.deviceId}`} onPress={() => setMoving(moving === u.deviceId ? null : u.deviceId)} style={styles.small} /> : null}
              </View>
            );
          })}
        </Card>
      ) : null}

      {plan.closet.batteries.map((b) => {
        const ev = plan.batteries.find((x) => x.batteryId === b.id);
        const isEditing = editing?.what === "battery" && editing.id === b.id;
        return (
          <Card key={b.id} style={styles.card} aria-label={String(b.data.name)}>
            <View style={styles.head}>
              <View style={{ flex: 1, gap: 2 }}>
                <AppText variant="subheading">{String(b.data.name)}</AppText>
                {ev ? (
                  <AppText variant="caption" muted>
                    {formatNumber(ev.capacityWh, 1)} Wh · {formatNumber(ev.usableWh, 1)} Wh usable · carries {formatNumber(ev.totalLoadW, 1)} W · about {ev.runtimeText} on battery
                  </AppText>
                ) : (
                  <AppText variant="caption" style={{ color: colors.warn }}>Not complete: left out of the plan until it is.</AppText>
                )}
              </View>
              {editable ? (
                <>
                  <Button label="Edit" tone="quiet" aria-label={`Edit ${String(b.data.name)}`} onPress={() => setEditing(isEditing ? null : { what: "battery", id: b.id })} />
                  <Button label="Remove" tone="quiet" aria-label={`Remove ${String(b.data.name)}`} onPress={() => setRemoving(removing === b.id ? null : b.id)} />
                </>
              ) : null}
            </View>
            {editable && removing === b.id ? (
              <ConfirmBox
                question={`Remove ${String(b.data.name)} from the closet?`}
                detail="What it feeds is no longer counted as on battery: devices that must stay up in a power cut may then go down."
                confirmLabel="Yes, remove it"
                onConfirm={() => remove(b.id, removeBattery)}
                onClose={() => setRemoving(null)}
              />
            ) : null}
            {isEditing ? <BatteryForm siteId={siteId} plan={plan} item={b} onDone={done} /> : null}
            {ev?.warnings.map((w, i) => <AppText key={i} variant="caption" style={{ color: colors.warn, fontFamily: fonts.semibold }}>{w.message}</AppText>)}
          </Card>
        );
      })}
      <Card>
        <AppText variant="subheading">On battery</AppText>
        <OutageChart plan={plan} />
      </Card>
    </View>
  );
}

/** `byHand`: the devices placed on their port by hand (the rules may still move the others, including those they hold). */
function PortTable({ sw, byHand, editable, onMove, moving, narrow }: { sw: PlanSwitch; byHand: ReadonlySet<string>; editable: boolean; onMove: (deviceId: string) => void; moving: string | null; narrow: boolean }) {
  const byPort = new Map(sw.rows.map((r) => [r.port, r]));
  // On a phone the figures take narrower columns and the device's name gives way (it is cut with "…").
  const num = [styles.num, narrow && styles.numNarrow];
  const port = [styles.port, narrow && styles.portNarrow];
  return (
    <View style={[styles.table, narrow && styles.stacked]} role="table" aria-label={`Ports of ${sw.name}`}>
      <View style={[styles.tr, styles.th]} role="row">
        <AppText style={[styles.td, port, styles.thText]}>Port</AppText>
        <AppText style={[styles.td, styles.device, styles.thText]}>Device</AppText>
        <AppText style={[styles.td, num, styles.thText]}>Class</AppText>
        <AppText style={[styles.td, num, styles.thText]}>Set aside</AppText>
        <AppText style={[styles.td, num, styles.thText]}>Expected</AppText>
        {editable ? <View style={styles.move} /> : null}
      </View>
      {Array.from({ length: sw.ports }, (_, i) => i + 1).map((p) => {
        const r = byPort.get(p);
        return (
          <View key={p} style={styles.tr} role="row" aria-label={`Port ${p}${r ? `: ${r.deviceName}` : ": free"}`}>
            <AppText style={[styles.td, port]}>{p}</AppText>
            <AppText style={[styles.td, styles.device, { fontFamily: r?.critical ? fonts.bold : fonts.regular }]} numberOfLines={2}>{r ? `${byHand.has(r.deviceId) ? "• " : ""}${r.deviceName}` : "free"}</AppText>
            <AppText style={[styles.td, num]}>{r ? r.poeClass : ""}</AppText>
            <AppText style={[styles.td, num]}>{r ? `${formatNumber(r.reservedW, 1)} W` : ""}</AppText>
            <AppText style={[styles.td, num]}>{r ? `${formatNumber(r.expectedPseW, 1)} W` : ""}</AppText>
            {editable ? (
              <View style={styles.move}>
                {r ? <Button label={moving === r.deviceId ? "Close" : "Move"} tone="quiet" aria-label={`Move ${r.deviceName}`} onPress={() => onMove(r.deviceId)} style={styles.small} /> : null}
              </View>
            ) : null}
          </View>
        );
      })}
      <AppText variant="caption" muted style={{ padding: space.xs }}>Bold: must stay up (shed last). • before a name: placed on that port by hand (the rules leave it there).</AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  toolbar: { flexDirection: "row", gap: space.sm, flexWrap: "wrap" },
  card: { gap: space.md },
  head: { flexDirection: "row", alignItems: "center", gap: space.sm, flexWrap: "wrap" },
  split: { flexDirection: "row", gap: space.lg, alignItems: "flex-start" },
  table: { flex: 1.1, borderWidth: 1, borderColor: colors.line, borderRadius: radius.md, overflow: "hidden" },
  tr: { flexDirection: "row", alignItems: "center", borderBottomWidth: 1, borderBottomColor: colors.slate50, minHeight: 34 },
  th: { backgroundColor: colors.slate50 },
  thText: { fontFamily: fonts.bold, fontSize: 13 },
  td: { paddingHorizontal: space.sm, fontSize: 14 },
  port: { width: 44 },
  /** Stacked on a phone: each part as tall as its content (side by side they share the width). */
  stacked: { flexGrow: 0, flexShrink: 0, flexBasis: "auto", gap: space.xs },
  portNarrow: { width: 40, paddingHorizontal: space.xs },
  device: { flex: 1, minWidth: 0 },
  num: { width: 78, textAlign: "right" },
  numNarrow: { width: 66, paddingHorizontal: space.xs },
  move: { width: 72, alignItems: "flex-end" },
  small: { minHeight: 32, paddingHorizontal: space.sm },
  unassigned: { flexDirection: "row", gap: space.md, alignItems: "center" },
});

/** What removing a power source does to the plan, in a sentence. */
function removalConsequence(kind: unknown, sw: PlanSwitch | undefined, onOutlet: number): string {
  if (kind === "outlet") {
    if (onOutlet === 0) return "Nothing is pinned to it.";
    return onOutlet === 1 ? "The device pinned to it goes back to the rules' choice of outlet." : `The ${onOutlet} devices pinned to it go back to the rules' choice of outlet.`;
  }
  const used = sw?.portsUsed ?? 0;
  if (used === 0) return "No device is on its ports.";
  return used === 1
    ? "The device on its ports loses its port: the plan moves it to another source with room, or lists it without a port."
    : `The ${used} devices on its ports lose their ports: the plan moves them to other sources with room, or lists them without a port.`;
}
