// Forms for the closet's power sources and battery backup. Percentages are typed as percent and
// stored as fractions; a field that cannot be read as typed is marked before anything is sent, and
// every field the server refuses is marked with its message.
import { useState } from "react";
import { StyleSheet, View } from "react-native";
import { CheckPress } from "@/components/ui/check-press";
import { Button } from "@/components/ui/button";
import { ChoiceChips } from "@/components/ui/choice-chips";
import { TextField } from "@/components/ui/text-field";
import { AppText } from "@/components/ui/text";
import { colors, fonts, radius, space } from "@/constants/theme";
import { useSaveClosetItem } from "@/hooks/queries/closet";
import type { Plan } from "@/hooks/queries/plan";
import { checkItemDraft } from "@/survey/capture";
import { TypedFields } from "@/survey/typed-numbers";
import type { FieldErrors } from "@/survey/validation";
import { ApiError } from "@/sync/http";

type SourceKind = "poe_switch" | "injector" | "outlet";
const str = (x: unknown) => (x === undefined || x === null ? "" : String(x));
const asPct = (x: unknown) => (typeof x === "number" ? String(Math.round(x * 1000) / 10) : "");

const TYPE_CHOICES = [
  { value: "1", label: "Type 1 (802.3af)" },
  { value: "2", label: "Type 2 (802.3at)" },
  { value: "3", label: "Type 3 (802.3bt)" },
  { value: "4", label: "Type 4 (802.3bt)" },
];

function useClosetSave(siteId: string, kind: "sources" | "batteries", onDone: () => void) {
  const save = useSaveClosetItem(siteId, kind);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [message, setMessage] = useState<string | null>(null);
  const submit = (id: string | undefined, fields: Record<string, unknown>) => {
    save.mutate(
      { id, fields },
      {
        onSuccess: () => {
          setErrors({});
          setMessage(null);
          onDone();
        },
        onError: (err) => {
          const fields = err instanceof ApiError ? err.fields : {};
          setErrors(fields);
          // Each refused field carries its own message beside it; the banner only points at them.
          setMessage(Object.keys(fields).length ? "Check the marked fields: nothing was saved." : err.message);
        },
      },
    );
  };
  /** Mark the fields that could not be read as typed; nothing is sent. */
  const refuse = (fieldErrors: FieldErrors) => {
    setErrors(fieldErrors);
    setMessage("Check the marked fields: nothing was saved.");
  };
  return { submit, refuse, errors, message, busy: save.isPending };
}

export function SourceForm({ siteId, item, kind: newKind, onDone }: { siteId: string; item?: Plan["closet"]["sources"][number]; kind?: SourceKind; onDone: () => void }) {
  const data = item?.data ?? {};
  const kind = (data.kind as SourceKind | undefined) ?? newKind ?? "poe_switch";
  const [name, setName] = useState(str(data.name));
  const [poeType, setPoeType] = useState(str(data.poeType ?? (kind === "outlet" ? "" : 2)));
  const [budget, setBudget] = useState(str(data.budgetW));
  const [ports, setPorts] = useState(str(kind === "poe_switch" ? data.poePorts : data.ports ?? (kind === "injector" ? 1 : "")));
  const [own, setOwn] = useState(str(data.ownDrawW));
  const [eff, setEff] = useState(asPct(kind === "poe_switch" ? data.supplyEfficiency : data.efficiency));
  const { submit, refuse, errors, message, busy } = useClosetSave(siteId, "sources", onDone);
  const e = (k: string) => errors[k];

  const save = () => {
    const typed = new TypedFields();
    const fields: Record<string, unknown> = { kind, name: name.trim() };
    if (kind !== "outlet") fields.poeType = typed.number("poeType", poeType, "PoE type", "2") ?? null;
    if (kind === "poe_switch") {
      Object.assign(fields, {
        budgetW: typed.number("budgetW", budget, "PoE budget", "120") ?? null,
        poePorts: typed.number("poePorts", ports, "PoE ports", "8") ?? null,
        ownDrawW: typed.number("ownDrawW", own, "Own draw", "15") ?? null,
        supplyEfficiency: typed.percent("supplyEfficiency", eff, "Supply efficiency") ?? null,
      });
    }
    if (kind === "injector") {
      Object.assign(fields, {
        budgetW: typed.number("budgetW", budget, "Budget", "30") ?? null,
        ports: typed.number("ports", ports, "PoE ports", "1") ?? null,
        efficiency: typed.percent("efficiency", eff, "Efficiency") ?? null,
      });
    }
    // Every field is checked with the same schema the server uses, so all that is wrong is marked at once.
    const filled = Object.fromEntries(Object.entries(fields).filter(([, x]) => x !== null));
    const draft = checkItemDraft("source", filled);
    const refused = { ...(draft.ok ? {} : draft.errors), ...typed.errors };
    if (Object.keys(refused).length) return refuse(refused);
    // A new item sends only what was filled in; an edit clears what was emptied.
    if (!item) for (const k of Object.keys(fields)) if (fields[k] === null) delete fields[k];
    submit(item?.id, fields);
  };
  const title = item ? `Edit ${str(data.name)}` : kind === "poe_switch" ? "New PoE switch" : kind === "injector" ? "New PoE injector" : "New outlet";
  return (
    <View style={styles.form} aria-label={title}>
      <AppText variant="subheading">{title}</AppText>
      <TextField label="Name" value={name} onChangeText={setName} errors={e("name")} onSubmitEditing={save} />
      {kind !== "outlet" ? <ChoiceChips label="PoE type of its ports" value={poeType} choices={TYPE_CHOICES} onChange={setPoeType} errors={e("poeType")} /> : null}
      {kind !== "outlet" ? (
        <View style={styles.row}>
          <View style={styles.cell}><TextField label={kind === "poe_switch" ? "PoE budget" : "Budget (blank: ports × type power)"} suffix="W" value={budget} onChangeText={setBudget} inputMode="decimal" errors={e("budgetW")} onSubmitEditing={save} /></View>
          <View style={styles.cell}><TextField label="PoE ports" value={ports} onChangeText={setPorts} inputMode="numeric" errors={e(kind === "poe_switch" ? "poePorts" : "ports")} onSubmitEditing={save} /></View>
          {kind === "poe_switch" ? <View style={styles.cell}><TextField label="Own draw" suffix="W" value={own} onChangeText={setOwn} inputMode="decimal" errors={e("ownDrawW")} onSubmitEditing={save} /></View> : null}
          <View style={styles.cell}><TextField label={kind === "poe_switch" ? "Supply efficiency" : "Efficiency"} suffix="%" value={eff} onChangeText={setEff} inputMode="decimal" errors={e(kind === "poe_switch" ? "supplyEfficiency" : "efficiency")} hint="blank: 88 %" onSubmitEditing={save} /></View>
        </View>
      ) : null}
      {message ? <AppText role="alert" style={styles.error}>{message}</AppText> : null}
      <View style={styles.actions}>
        <Button label={item ? "Save" : "Add to the closet"} onPress={save} busy={busy} />
        <Button label="Cancel" tone="quiet" onPress={onDone} />
      </View>
    </View>
  );
}

interface LoadRow {
  name: string;
  watts: string;
}

export function BatteryForm({ siteId, plan, item, onDone }: { siteId: string; plan: Plan; item?: Plan["closet"]["batteries"][number]; onDone: () => void }) {
  const data = item?.data ?? {};
  const cap = (data.capacity ?? { by: "wh" }) as { by: "wh" | "v_ah"; wh?: number; volts?: number; ah?: number };
  const [name, setName] = useState(str(data.name));
  const [by, setBy] = useState<"wh" | "v_ah">(cap.by);
  const [wh, setWh] = useState(str(cap.wh));
  const [volts, setVolts] = useState(str(cap.volts));
  const [ah, setAh] = useState(str(cap.ah));
  const [inv, setInv] = useState(asPct(data.inverterEfficiency));
  const [dod, setDod] = useState(asPct(data.depthOfDischarge));
  const [age, setAge] = useState(asPct(data.ageFactor));
  const [feeds, setFeeds] = useState<string[]>((data.feeds as string[] | undefined) ?? []);
  const [loads, setLoads] = useState<LoadRow[]>(((data.otherLoads as { name: string; watts: number }[] | undefined) ?? []).map((l) => ({ name: l.name, watts: String(l.watts) })));
  const { submit, refuse, errors, message, busy } = useClosetSave(siteId, "batteries", onDone);
  const e = (k: string) => errors[k] ?? (k === "capacity" ? undefined : undefined);
  const sources = plan.closet.sources.filter((s) => s.valid);

  const save = () => {
    const typed = new TypedFields();
    const fields: Record<string, unknown> = {
      name: name.trim(),
      capacity: by === "wh"
        ? { by, wh: typed.number("capacity.wh", wh, "Capacity", "1500") }
        : { by, volts: typed.number("capacity.volts", volts, "Battery voltage", "12"), ah: typed.number("capacity.ah", ah, "Capacity", "9") },
      inverterEfficiency: typed.percent("inverterEfficiency", inv, "Inverter efficiency") ?? null,
      depthOfDischarge: typed.percent("depthOfDischarge", dod, "Depth of discharge") ?? null,
      ageFactor: typed.percent("ageFactor", age, "Age derate") ?? null,
      feeds,
      otherLoads: loads
        .map((l, i) => ({ l, i }))
        .filter(({ l }) => l.name.trim() || l.watts.trim())
        .map(({ l, i }) => ({ name: l.name.trim(), watts: typed.number(`otherLoads.${i}.watts`, l.watts, "Draw", "10") })),
    };
    if (!typed.ok) return refuse(typed.errors);
    if (!item) for (const k of Object.keys(fields)) if (fields[k] === null) delete fields[k];
    submit(item?.id, fields);
  };
  const capErr = (k: string) => errors[`capacity.${k}`] ?? (errors.capacity && k === (by === "wh" ? "wh" : "volts") ? errors.capacity : undefined);
  return (
    <View style={styles.form} aria-label={item ? `Edit ${str(data.name)}` : "New battery backup"}>
      <AppText variant="subheading">{item ? `Edit ${str(data.name)}` : "New battery backup"}</AppText>
      <TextField label="Name" value={name} onChangeText={setName} errors={e("name")} />
      <ChoiceChips label="Capacity from its label" value={by} choices={[{ value: "wh", label: "watt-hours" }, { value: "v_ah", label: "volts × amp-hours" }]} onChange={setBy} />
      <View style={styles.row}>
        {by === "wh" ? (
          <View style={styles.cell}><TextField label="Capacity" suffix="Wh" value={wh} onChangeText={setWh} inputMode="decimal" errors={capErr("wh")} /></View>
        ) : (
          <>
            <View style={styles.cell}><TextField label="Battery voltage" suffix="V" value={volts} onChangeText={setVolts} inputMode="decimal" errors={capErr("volts")} /></View>
            <View style={styles.cell}><TextField label="Capacity" suffix="Ah" value={ah} onChangeText={setAh} inputMode="decimal" errors={capErr("ah")} /></View>
          </>
        )}
        <View style={styles.cell}><TextField label="Inverter efficiency" suffix="%" value={inv} onChangeText={setInv} inputMode="decimal" errors={e("inverterEfficiency")} hint="blank: 90 %" /></View>
        <View style={styles.cell}><TextField label="Depth of discharge" suffix="%" value={dod} onChangeText={setDod} inputMode="decimal" errors={e("depthOfDischarge")} hint="blank: 80 %" /></View>
        <View style={styles.cell}><TextField label="Age derate" suffix="%" value={age} onChangeText={setAge} inputMode="decimal" errors={e("ageFactor")} hint="100 % new; 70–80 % at 3 years or more" /></View>
      </View>
      <View style={{ gap: space.xs }}>
        <AppText variant="label" style={{ color: colors.slate800 }}>Plugged into it</AppText>
        <View style={styles.chips} role="group" aria-label="Plugged into it">
          {sources.map((s) => {
            const on = feeds.includes(s.id);
            return (
              <CheckPress key={s.id} checked={on} label={String(s.data.name)} onToggle={() => setFeeds(on ? feeds.filter((f) => f !== s.id) : [...feeds, s.id])} style={[styles.chip, on && styles.chipOn]}>
                <AppText style={[styles.chipText, on && { color: colors.onDark }]}>{String(s.data.name)}</AppText>
              </CheckPress>
            );
          })}
        </View>
        {Object.entries(errors).filter(([k]) => k.startsWith("feeds")).map(([k, m]) => <AppText key={k} role="alert" style={styles.error}>{m.join(" ")}</AppText>)}
      </View>
      <View style={{ gap: space.xs }}>
        <AppText variant="label" style={{ color: colors.slate800 }}>Other loads on it (modem, router…)</AppText>
        {loads.map((l, i) => (
          <View key={i} style={styles.row}>
            <View style={[styles.cell, { flex: 2 }]}><TextField label={`Load ${i + 1}`} value={l.name} onChangeText={(t) => setLoads(loads.map((x, j) => (j === i ? { ...x, name: t } : x)))} errors={errors[`otherLoads.${i}.name`]} /></View>
            <View style={styles.cell}><TextField label="Draw" suffix="W" value={l.watts} onChangeText={(t) => setLoads(loads.map((x, j) => (j === i ? { ...x, watts: t } : x)))} inputMode="decimal" errors={errors[`otherLoads.${i}.watts`]} /></View>
            <Button label="Remove" tone="quiet" onPress={() => setLoads(loads.filter((_, j) => j !== i))} aria-label={`Remove load ${i + 1}`} style={{ alignSelf: "flex-end" }} />
          </View>
        ))}
        <Button label="Add a load" tone="quiet" onPress={() => setLoads([...loads, { name: "", watts: "" }])} style={{ alignSelf: "flex-start" }} />
      </View>
      {message ? <AppText role="alert" style={styles.error}>{message}</AppText> : null}
      <View style={styles.actions}>
        <Button label={item ? "Save" : "Add the battery"} onPress={save} busy={busy} />
        <Button label="Cancel" tone="quiet" onPress={onDone} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md, padding: space.lg, borderRadius: radius.md, backgroundColor: colors.slate50, borderWidth: 1, borderColor: colors.slate100 },
  row: { flexDirection: "row", gap: space.md, flexWrap: "wrap" },
  cell: { flex: 1, minWidth: 130 },
  chips: { flexDirection: "row", flexWrap: "wrap", gap: space.sm },
  chip: { minHeight: 44, paddingHorizontal: space.lg, justifyContent: "center", borderRadius: radius.pill, borderWidth: 1.5, borderColor: colors.slate100, backgroundColor: colors.card },
  chipOn: { backgroundColor: colors.slate800, borderColor: colors.slate800 },
  chipText: { fontFamily: fonts.semibold, color: colors.slate700 },
  error: { color: colors.danger, fontFamily: fonts.semibold, fontSize: 14 },
  actions: { flexDirection: "row", gap: space.sm, alignItems: "center" },
});
