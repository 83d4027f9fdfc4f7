// The designer's override for one device: method, PoE class, power source and port, splitter, and
// the reason (required). Checked with the same schema as the server; the server's answer marks the
// same fields. A placement over a budget or the ceiling asks for a confirmation with the reason.
import { useMemo, useState } from "react";
import { Pressable, StyleSheet, View } from "react-native";
import { CheckPress } from "@/components/ui/check-press";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { ChoiceChips } from "@/components/ui/choice-chips";
import { TextField } from "@/components/ui/text-field";
import { AppText } from "@/components/ui/text";
import { colors, fonts, radius, space } from "@/constants/theme";
import { useClearDecision, useSaveDecision } from "@/hooks/queries/decisions";
import type { Plan, PlanDevice } from "@/hooks/queries/plan";
import { DecisionInputSchema, POWER_METHOD_WORDS, type PowerMethod } from "@/survey/decisions";
import { check, type FieldErrors } from "@/survey/validation";
import { ApiError } from "@/sync/http";

const FORCEABLE = new Set(["over_budget", "over_ceiling", "poe_path_fails", "displaces_device"]);
const POE = new Set<PowerMethod>(["poe", "poe_splitter"]);

export function DecisionForm({ siteId, plan, device, onDone }: { siteId: string; plan: Plan; device: PlanDevice; onDone: () => void }) {
  const save = useSaveDecision(siteId);
  const clear = useClearDecision(siteId);
  const d = device.decision;
  const current = (device.methods as PowerMethod[]).includes(device.recommendation as PowerMethod) ? (device.recommendation as PowerMethod) : device.methods[0];
  const [method, setMethod] = useState<PowerMethod | undefined>(d?.method ?? current);
  const [poeClass, setPoeClass] = useState<string>(d?.poeClass != null ? String(d.poeClass) : "rules");
  const [sourceId, setSourceId] = useState<string>(d?.sourceId ?? device.pins.sourceId ?? "auto");
  const [port, setPort] = useState<string>(d?.port != null ? String(d.port) : device.pins.port != null ? String(device.pins.port) : "any");
  const start = d?.splitter ?? device.splitterDefault;
  const [volts, setVolts] = useState(start ? String(start.volts) : "");
  const [amps, setAmps] = useState(start ? String(start.amps) : "");
  const [plug, setPlug] = useState(start?.plug ?? "");
  const [reason, setReason] = useState("");
  const [errors, setErrors] = useState<FieldErrors>({});
  const [refusal, setRefusal] = useState<{ code: string; message: string } | null>(null);
  const [force, setForce] = useState(false);

  const poeMethod = method !== undefined && POE.has(method);
  const sources = plan.closet.sources.filter((s) => s.valid && s.value && (poeMethod ? s.value.kind !== "outlet" : s.value.kind === "outlet"));
  const chosen = sources.find((s) => s.id === sourceId);
  const portCount = chosen?.value ? (chosen.value.kind === "poe_switch" ? chosen.value.poePorts : chosen.value.kind === "injector" ? chosen.value.ports : 0) : 0;
  const occupant = useMemo(() => {
    const m = new Map<number, string>();
    const sw = plan.switches.find((s) => s.sourceId === sourceId);
    for (const r of sw?.rows ?? []) if (r.deviceId !== device.deviceId) m.set(r.port, r.deviceName);
    return m;
  }, [plan.switches, sourceId, device.deviceId]);

  const body = () => ({
    method,
    ...(poeMethod && poeClass !== "rules" ? { poeClass: Number(poeClass) } : {}),
    ...(sourceId !== "auto" && chosen ? { sourceId } : {}),
    ...(sourceId !== "auto" && chosen && portCount > 0 && port !== "any" ? { port: Number(port) } : {}),
    ...(method === "poe_splitter" ? { splitter: { volts: Number(volts), amps: Number(amps), ...(plug.trim() ? { plug: plug.trim() } : {}) } } : {}),
    reason,
    ...(force ? { force: true } : {}),
  });

  const submit = () => {
    const input = body();
    const checked = check(DecisionInputSchema, input);
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    save.mutate(
      { deviceId: device.deviceId, ...checked.value },
      {
        onSuccess: onDone,
        onError: (err) => {
          if (err instanceof ApiError) {
            setErrors(err.fields);
            if (err.status === 409) setRefusal({ code: err.body.code, message: err.message });
            else setRefusal(null);
          } else setRefusal({ code: "offline", message: err.message });
        },
      },
    );
  };

  const backToRules = () => {
    if (!reason.trim()) {
      setErrors({ reason: ["Give a reason for going back to the rules' advice: it is kept in the device's history."] });
      return;
    }
    clear.mutate({ deviceId: device.deviceId, reason }, { onSuccess: onDone, onError: (err) => setErrors(err instanceof ApiError ? err.fields : { reason: [err.message] }) });
  };

  const methodChoices = (device.methods as PowerMethod[]).map((m) => ({ value: m, label: POWER_METHOD_WORDS[m] }));
  const classChoices = [{ value: "rules", label: "as the rules say" }, ...Array.from({ length: 9 }, (_, c) => ({ value: String(c), label: `Class ${c}` }))];
  const err = (k: string) => errors[k];

  return (
    <View style={styles.form} aria-label={`Decision for ${device.name}`}>
      <ChoiceChips label="How it is powered" value={method} choices={methodChoices} onChange={(m) => { setMethod(m); setSourceId("auto"); setPort("any"); }} errors={err("method")} />
      {poeMethod ? <ChoiceChips label="PoE class of its port" value={poeClass} choices={classChoices} onChange={setPoeClass} errors={err("poeClass")} /> : null}
      {method === "poe_splitter" ? (
        <View style={styles.row}>
          <View style={styles.cell}><TextField label="Splitter output" suffix="V" value={volts} onChangeText={setVolts} inputMode="decimal" errors={err("splitter.volts")} /></View>
          <View style={styles.cell}><TextField label="Splitter rating" suffix="A" value={amps} onChangeText={setAmps} inputMode="decimal" errors={err("splitter.amps")} /></View>
          <View style={[styles.cell, { flex: 2 }]}><TextField label="Plug" value={plug} onChangeText={setPlug} errors={err("splitter.plug")} hint="The device's own plug unless you change it." /></View>
        </View>
      ) : null}
      <ChoiceChips
        label={poeMethod ? "Switch or injector" : "Outlet"}
        value={sourceId}
        choices={[{ value: "auto", label: poeMethod ? "placed by the rules" : "the outlet near it" }, ...sources.map((s) => ({ value: s.id, label: String(s.data.name) }))]}
        onChange={(v) => { setSourceId(v); setPort("any"); }}
        errors={err("sourceId")}
      />
      {portCount > 0 ? (
        <View style={{ gap: space.xs }}>
          <AppText variant="label" style={{ color: colors.slate800 }}>Port</AppText>
          <View role="radiogroup" aria-label="Port" style={styles.ports}>
            {[{ value: "any", label: "lowest free" }, ...Array.from({ length: portCount }, (_, i) => ({ value: String(i + 1), label: `${i + 1}` }))].map((p) => {
              const taken = p.value !== "any" ? occupant.get(Number(p.value)) : undefined;
              const own = p.value !== "any" && device.placement?.sourceId === sourceId && device.placement.port === Number(p.value);
              const on = p.value === port;
              return (
                <Pressable key={p.value} role="radio" aria-checked={on} aria-label={p.value === "any" ? "lowest free port" : `Port ${p.value}${taken ? `, used by ${taken}` : own ? ", its port now" : ", free"}`} onPress={() => setPort(p.value)} style={[styles.port, on && styles.portOn, taken ? styles.portTaken : null, err("port") && on ? styles.portBad : null]}>
                  <AppText style={[styles.portText, on && { color: colors.onDark }]}>{p.label}</AppText>
                  {taken ? <AppText numberOfLines={1} style={[styles.portWho, on && { color: colors.onDarkMuted }]}>{taken}</AppText> : own ? <AppText numberOfLines={1} style={[styles.portWho, on && { color: colors.onDarkMuted }]}>now</AppText> : null}
                </Pressable>
              );
            })}
          </View>
          {err("port") ? <AppText role="alert" style={styles.error}>{err("port")!.join(" ")}</AppText> : null}
        </View>
      ) : null}
      <TextField
        label="Reason (required)"
        value={reason}
        onChangeText={setReason}
        multiline
        numberOfLines={2}
        errors={err("reason")}
        hint="Kept in the device's history and shown on the report as a designer decision."
        onKeyPress={(e) => {
          const ne = e.nativeEvent as unknown as { key: string; ctrlKey?: boolean; metaKey?: boolean };
          if (ne.key === "Enter" && (ne.ctrlKey || ne.metaKey)) submit();
        }}
      />
      {refusal ? (
        <View style={{ gap: space.sm }}>
          <Banner tone={FORCEABLE.has(refusal.code) ? "warn" : "danger"} title="Not saved">{refusal.message}</Banner>
          {FORCEABLE.has(refusal.code) ? (
            <CheckPress checked={force} label="Place it anyway; the reason says why" onToggle={() => setForce(!force)} style={styles.check}>
              <View style={[styles.box, force && styles.boxOn]}>{force ? <AppText style={{ color: colors.onDark, fontFamily: fonts.bold, lineHeight: 18 }}>✓</AppText> : null}</View>
              <AppText>Place it anyway — the reason above says why.</AppText>
            </CheckPress>
          ) : null}
        </View>
      ) : null}
      <View style={styles.actions}>
        <Button label="Save decision" onPress={submit} busy={save.isPending} />
        {d ? <Button label="Back to the rules' advice" tone="secondary" onPress={backToRules} busy={clear.isPending} /> : null}
        <Button label="Cancel" tone="quiet" onPress={onDone} />
        <AppText variant="caption" muted>Ctrl + Enter in the reason saves.</AppText>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md, padding: space.lg, borderRadius: radius.md, backgroundColor: colors.slate50, borderWidth: 1, borderColor: colors.slate100 },
  row: { flexDirection: "row", gap: space.md, flexWrap: "wrap" },
  cell: { flex: 1, minWidth: 120 },
  ports: { flexDirection: "row", flexWrap: "wrap", gap: space.xs },
  port: { minWidth: 44, minHeight: 44, paddingHorizontal: space.sm, borderRadius: radius.sm, borderWidth: 1.5, borderColor: colors.slate100, backgroundColor: colors.card, alignItems: "center", justifyContent: "center", maxWidth: 120 },
  portOn: { backgroundColor: colors.slate800, borderColor: colors.slate800 },
  portTaken: { borderStyle: "dashed" },
  portBad: { borderColor: colors.danger },
  portText: { fontFamily: fonts.bold, color: colors.slate800 },
  portWho: { fontSize: 11, lineHeight: 14, color: colors.inkMuted },
  error: { color: colors.danger, fontFamily: fonts.semibold, fontSize: 14 },
  check: { flexDirection: "row", alignItems: "center", gap: space.sm, minHeight: 44 },
  box: { width: 22, height: 22, borderRadius: 4, borderWidth: 2, borderColor: colors.slate700, alignItems: "center", justifyContent: "center" },
  boxOn: { backgroundColor: colors.slate800 },
  actions: { flexDirection: "row", gap: space.sm, alignItems: "center", flexWrap: "wrap" },
});
