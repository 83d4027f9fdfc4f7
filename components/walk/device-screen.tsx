import { router, useLocalSearchParams } from "expo-router";
import { useMemo, useState } from "react";
import { ActivityIndicator, StyleSheet, View } from "react-native";
import { Badge } from "@/components/ui/badge";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ChoiceChips } from "@/components/ui/choice-chips";
import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { Screen } from "@/components/ui/screen";
import { AppText } from "@/components/ui/text";
import { TextField } from "@/components/ui/text-field";
import { colors, space } from "@/constants/theme";
import { useDeviceForm, type SaveOutcome } from "@/hooks/use-device-form";
import { useBreakpoint } from "@/hooks/use-breakpoint";
import { useWalk, useWalkActions } from "@/hooks/use-walk";
import { CABLE_ACCESS_VALUES, DEVICE_KIND_VALUES, MOUNT_VALUES, POLARITY_VALUES, POWER_INPUT_TYPES } from "@/survey/model/device";
import { AWG_GAUGE_VALUES } from "@/survey/standards/awg";
import { BARREL_SIZES, findBarrelSize } from "@/survey/standards/barrel-sizes";
import { CABLE_CATEGORY_VALUES } from "@/survey/standards/cabling";
import { POE_CLASS_VALUES } from "@/survey/standards/poe-classes";
import { unitLabel, type UnitSystem } from "@/survey/units";
import { parseNumber, type DeviceForm } from "@/survey/walk/device-form";
import { heldNotice } from "@/survey/walk/describe";
import { focusFirstInvalid } from "@/components/ui/focus-first-invalid";
import { CABLE_ACCESS_WORDS, CATEGORY_WORDS, INPUT_WORDS, KIND_WORDS, MOUNT_WORDS, POLARITY_WORDS } from "@/survey/walk/words";
import type { SiteItem } from "@/survey/capture";
import type { SiteRecord } from "@/sync/protocol";
import type { LocalPhoto } from "@/sync/local-store";
import type { Walk } from "@/survey/walk/walk";
import { AdviceCard } from "./advice-card";
import { ConfirmDelete } from "./confirm-delete";
import { DesignerDecisionCard } from "./designer-decision-card";
import { PhotoStrip } from "./photo-strip";
import { ScopeStatusNotice } from "./scope-status-notice";
import { SyncPill } from "./sync-pill";

const choices = <T extends string>(values: readonly T[], words: Readonly<Record<T, string>>) => values.map((value) => ({ value, label: words[value] }));

export function DeviceScreen() {
  const { id: siteId, deviceId } = useLocalSearchParams<{ id: string; deviceId: string }>();
  const { site, walk, items, photos, isPending, error } = useWalk(siteId);
  const device = walk?.devices.get(deviceId);
  const roomId = device?.data.roomId as string | undefined;
  const room = roomId ? walk?.rooms.get(roomId) : undefined;
  const back = room ? { href: `/sites/${siteId}/rooms/${room.id}`, label: room.name } : { href: `/sites/${siteId}`, label: site?.name ?? "Rooms" };

  if (error) return <Screen title="Device" back={back}><Banner tone="danger">{error.message}</Banner></Screen>;
  if (isPending || !walk || !site) return <Screen title="Device" back={back}><ActivityIndicator color={colors.slate800} aria-label="Loading" /></Screen>;
  if (!device) {
    return (
      <Screen title="Device" back={back}>
        <EmptyState icon={<Icon name="device" size={40} color={colors.slate600} />} title="This device is not on the walk" body="It may have been deleted, here or by another surveyor." />
      </Screen>
    );
  }
  return <DeviceEditor key={device.id} siteId={siteId} deviceId={device.id} site={site} walk={walk} items={items} photos={photos.filter((p) => p.itemId === device.id)} back={back} />;
}

function DeviceEditor({ siteId, deviceId, site, walk, items, photos, back }: { siteId: string; deviceId: string; site: SiteRecord; walk: Walk; items: SiteItem[]; photos: LocalPhoto[]; back: { href: string; label: string } }) {
  const { wide } = useBreakpoint();
  const actions = useWalkActions(siteId);
  const device = walk.devices.get(deviceId)!;
  const units: UnitSystem = site.units;
  const lengthUnit = unitLabel(units).length;
  // Kept while the site's fields stay the same, so the live advice is not recomputed on every read.
  const { id, name, address, closetRoomId } = site;
  const meta = useMemo(() => ({ id, name, address, closetRoomId, units }), [id, name, address, closetRoomId, units]);
  const f = useDeviceForm({
    deviceId,
    stored: device.data,
    units,
    meta,
    items,
    save: async (patch) => {
      const result = await actions.updateDevice(deviceId, patch);
      if (!result.ok) throw new Error(Object.values(result.errors).flat().join(" "));
    },
  });
  const [outcome, setOutcome] = useState<SaveOutcome | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const { form, set, setMany, errors } = f;

  async function save() {
    setFailure(null);
    try {
      const result = await f.submit();
      setOutcome(result);
      if (result.held.length) focusFirstInvalid();
    } catch (err) {
      // Nothing was stored: what was typed stays in the form.
      setOutcome(null);
      setFailure(`Not saved: ${err instanceof Error ? err.message : String(err)}. What you typed is still here; try again.`);
    }
  }

  const barrelChoice = (() => {
    const outer = parseNumber(form.barrelOuter);
    const inner = parseNumber(form.barrelInner);
    const known = outer !== undefined && inner !== undefined ? findBarrelSize(outer, inner) : undefined;
    return known ? known.id : form.barrelOuter || form.barrelInner ? "other" : undefined;
  })();

  const advice = (
    <View style={{ gap: space.lg }}>
      <DesignerDecisionCard siteId={siteId} deviceId={deviceId} />
      <AdviceCard advice={f.advice.evaluation} gaps={f.advice.gaps} refused={f.advice.refused} waitsFor={f.advice.waitsFor} draft={f.dirty.length > 0} />
    </View>
  );

  const heldBack = outcome && outcome.held.length ? heldNotice(outcome.held, outcome.marked, outcome.saved.length > 0) : null;
  const saveBar = (
    <View style={{ gap: space.sm }}>
      {failure ? <Banner tone="danger">{failure}</Banner> : null}
      {heldBack ? (
        <Banner tone="danger" title={heldBack.title}>
          {heldBack.text}
        </Banner>
      ) : outcome && outcome.saved.length && f.dirty.length === 0 ? (
        <Banner tone="good">Saved on this phone.</Banner>
      ) : outcome && outcome.saved.length === 0 && outcome.held.length === 0 ? (
        <Banner tone="info">Nothing changed since the last save.</Banner>
      ) : null}
      <Button label="Save device" busy={f.saving} onPress={save} style={{ alignSelf: "flex-start" }} />
    </View>
  );

  const formColumn = (
    <View style={{ gap: space.lg }}>
      <Card role="region" aria-label="What and where">
        <AppText variant="subheading">What and where</AppText>
        <TextField label="Name" value={form.name} onChangeText={(t) => set("name", t)} errors={errors.name} />
        <ChoiceChips label="Kind" value={form.kind} choices={choices(DEVICE_KIND_VALUES, KIND_WORDS)} onChange={(v) => set("kind", v)} errors={errors.kind} />
        <ChoiceChips label="Room" value={form.roomId} choices={[...walk.floors.flatMap((fl) => fl.rooms), ...walk.strayRooms].map((r) => ({ value: r.id, label: r.name }))} onChange={(v) => set("roomId", v)} errors={errors.roomId} />
        <ChoiceChips label="Mount point" value={form.mount} choices={choices(MOUNT_VALUES, MOUNT_WORDS)} onChange={(v) => set("mount", v)} errors={errors.mount} />
        <ChoiceChips
          label="Indoor or outdoor"
          value={form.outdoor ? "outdoor" : "indoor"}
          choices={[
            { value: "indoor", label: "Indoor" },
            { value: "outdoor", label: "Outdoor" },
          ]}
          onChange={(v) => set("outdoor", v === "outdoor")}
          errors={errors.outdoor}
        />
      </Card>

      <Card role="region" aria-label="Power">
        <AppText variant="subheading">Power</AppText>
        <ChoiceChips
          label="Power need, as printed"
          value={form.powerBy}
          choices={[
            { value: "watts", label: "Watts" },
            { value: "adapter", label: "Volts × amps (adapter)" },
          ]}
          onChange={(v) => set("powerBy", v)}
        />
        {form.powerBy === "watts" ? (
          <TextField label="Power need" value={form.watts} onChangeText={(t) => set("watts", t)} errors={errors.watts} inputMode="decimal" suffix="W" />
        ) : (
          <View style={styles.pair}>
            <View style={{ flex: 1 }}>
              <TextField label="Adapter volts" value={form.volts} onChangeText={(t) => set("volts", t)} errors={errors.volts} inputMode="decimal" suffix="V" />
            </View>
            <View style={{ flex: 1 }}>
              <TextField label="Adapter amps" value={form.amps} onChangeText={(t) => set("amps", t)} errors={errors.amps} inputMode="decimal" suffix="A" />
            </View>
          </View>
        )}
        {form.powerTypical ? (
          <View style={styles.typical}>
            <Badge label="typical" tone="copper" />
            <AppText variant="caption" style={{ flex: 1 }}>
              A typical figure for its kind, not the device&apos;s own. Type the figure from its label or adapter.
            </AppText>
          </View>
        ) : null}

        <ChoiceChips label="How it takes power" value={form.inputType} choices={choices(POWER_INPUT_TYPES, INPUT_WORDS)} onChange={(v) => set("inputType", v)} errors={errors.inputType} />
        {form.inputType === "poe" ? (
          <>
            <ChoiceChips
              label="PoE class (if printed)"
              value={form.poeClass}
              choices={[{ value: "" as DeviceForm["poeClass"], label: "Not printed" }, ...POE_CLASS_VALUES.map((c) => ({ value: String(c) as DeviceForm["poeClass"], label: `Class ${c}` }))]}
              onChange={(v) => set("poeClass", v)}
              errors={errors.poeClass}
            />
            <ChoiceChips
              label="PoE standard (if printed)"
              value={form.poeStandard}
              choices={[
                { value: "", label: "Not printed" },
                { value: "af", label: "802.3af" },
                { value: "at", label: "802.3at" },
                { value: "bt", label: "802.3bt" },
              ]}
              onChange={(v) => set("poeStandard", v)}
              errors={errors.poeStandard}
            />
          </>
        ) : null}
        {form.inputType === "passive_poe" ? (
          <>
            <TextField label="Passive PoE volts" value={form.passiveVolts} onChangeText={(t) => set("passiveVolts", t)} errors={errors.passiveVolts} inputMode="decimal" suffix="V" hint="The voltage its own injector puts on the cable." />
            <Banner tone="warn" title="Passive PoE">
              It needs its own injector of exactly this voltage. Never connect it to a standard PoE port, and never put a passive injector on ordinary network gear.
            </Banner>
          </>
        ) : null}
        {form.inputType === "dc_barrel" ? (
          <>
            <ChoiceChips
              label="Plug size (outer × inner mm)"
              value={barrelChoice}
              choices={[...BARREL_SIZES.map((b) => ({ value: b.id, label: `${b.outerMm}×${b.innerMm}` })), { value: "other", label: "Other" }]}
              onChange={(id) => {
                const b = BARREL_SIZES.find((x) => x.id === id);
                if (b) setMany({ barrelOuter: String(b.outerMm), barrelInner: String(b.innerMm) });
                else setMany({ barrelOuter: "", barrelInner: "" });
              }}
            />
            <View style={styles.pair}>
              <View style={{ flex: 1 }}>
                <TextField label="Outer diameter" value={form.barrelOuter} onChangeText={(t) => set("barrelOuter", t)} errors={errors.barrelOuter} inputMode="decimal" suffix="mm" />
              </View>
              <View style={{ flex: 1 }}>
                <TextField label="Inner diameter" value={form.barrelInner} onChangeText={(t) => set("barrelInner", t)} errors={errors.barrelInner} inputMode="decimal" suffix="mm" />
              </View>
            </View>
            <ChoiceChips label="Polarity (the symbol on the label)" value={form.polarity} choices={choices(POLARITY_VALUES, POLARITY_WORDS)} onChange={(v) => set("polarity", v)} errors={errors.polarity} />
            <TextField label="Barrel volts" value={form.barrelVolts} onChangeText={(t) => set("barrelVolts", t)} errors={errors.barrelVolts} inputMode="decimal" suffix="V" />
          </>
        ) : null}
        {form.inputType === "terminal_block" ? (
          <>
            <TextField label="Terminal volts" value={form.terminalVolts} onChangeText={(t) => set("terminalVolts", t)} errors={errors.terminalVolts} inputMode="decimal" suffix="V" />
            <ChoiceChips
              label="Current at the terminals"
              value={form.terminalCurrent}
              choices={[
                { value: "dc", label: "DC" },
                { value: "ac", label: "AC (from a transformer)" },
              ]}
              onChange={(v) => set("terminalCurrent", v)}
              errors={errors.terminalCurrent}
            />
          </>
        ) : null}
        <ChoiceChips
          label="In a power cut"
          value={form.mustStayUp ? "up" : "down"}
          choices={[
            { value: "up", label: "Must stay up on battery" },
            { value: "down", label: "May go down" },
          ]}
          onChange={(v) => set("mustStayUp", v === "up")}
          errors={errors.mustStayUp}
        />
      </Card>

      <Card role="region" aria-label="Outlet and cable">
        <AppText variant="subheading">Outlet and cable</AppText>
        <TextField
          label="Nearest outlet distance"
          value={form.outletDistance}
          onChangeText={(t) => set("outletDistance", t)}
          errors={errors.outletDistance}
          inputMode="decimal"
          suffix={lengthUnit}
          hint="Leave empty when there is no usable outlet near it."
        />
        <ChoiceChips label="Cable access" value={form.cableAccess} choices={choices(CABLE_ACCESS_VALUES, CABLE_ACCESS_WORDS)} onChange={(v) => set("cableAccess", v)} errors={errors.cableAccess} />
        <TextField label="Cable run to the closet" value={form.runLength} onChangeText={(t) => set("runLength", t)} errors={errors.runLength} inputMode="decimal" suffix={lengthUnit} hint="Your estimate of the cable's length from the device to the closet." />
        <ChoiceChips label="Cable category" value={form.runCategory} choices={choices(CABLE_CATEGORY_VALUES, CATEGORY_WORDS)} onChange={(v) => set("runCategory", v)} errors={errors.runCategory} />
        <ChoiceChips
          label="Conductor gauge (if printed)"
          value={form.runGauge}
          choices={[{ value: "" as DeviceForm["runGauge"], label: "Not known" }, ...AWG_GAUGE_VALUES.map((g) => ({ value: String(g) as DeviceForm["runGauge"], label: `${g} AWG` }))]}
          onChange={(v) => set("runGauge", v)}
          errors={errors.runGauge}
        />
        <ChoiceChips
          label="Conductor"
          value={form.runCca ? "cca" : "copper"}
          choices={[
            { value: "copper", label: "Solid copper" },
            { value: "cca", label: "Copper-clad aluminium (CCA)" },
          ]}
          onChange={(v) => set("runCca", v === "cca")}
          errors={errors.runCca}
        />
        {form.runLength || form.runCategory ? (
          <Button tone="secondary" label="Clear the cable run" onPress={() => setMany({ runLength: "", runCategory: undefined, runGauge: "", runCca: false })} style={{ alignSelf: "flex-start" }} />
        ) : null}
      </Card>

      <Card role="region" aria-label="Notes">
        <TextField label="Notes" value={form.notes} onChangeText={(t) => set("notes", t)} errors={errors.notes} multiline numberOfLines={4} style={{ minHeight: 96, textAlignVertical: "top" }} placeholder="Where exactly, what is in the way…" />
      </Card>

      {saveBar}

      <Card role="region" aria-label="Photos of this device">
        <AppText variant="subheading">Photos</AppText>
        <PhotoStrip photos={photos} itemId={deviceId} addPhoto={actions.addPhoto} emptyText="No photos yet: the mount point, the ceiling access and the device's label help the designer." />
      </Card>

      <ConfirmDelete
        label="Delete device"
        question={`Delete ${device.name}?`}
        onConfirm={async () => {
          await actions.deleteDevice(deviceId);
          router.replace(back.href as never);
        }}
      />
    </View>
  );

  return (
    <Screen title={device.name} subtitle={`${KIND_WORDS[device.data.kind as keyof typeof KIND_WORDS] ?? "Device"}${back.label ? ` · ${back.label}` : ""}`} back={back}>
      <SyncPill />
      <ScopeStatusNotice status={site.status} />
      {wide ? (
        <View style={styles.columns}>
          <View style={{ flex: 3, minWidth: 0 }}>{formColumn}</View>
          <View style={{ flex: 2, minWidth: 0 }}>{advice}</View>
        </View>
      ) : (
        <>
          {advice}
          {formColumn}
        </>
      )}
    </Screen>
  );
}

const styles = StyleSheet.create({
  columns: { flexDirection: "row", gap: space.xl, alignItems: "flex-start" },
  pair: { flexDirection: "row", gap: space.md },
  typical: { flexDirection: "row", alignItems: "center", gap: space.sm },
});
