// The plan's materials with editable unit prices, the total, and the CSV export.
import { useState } from "react";
import { Platform, StyleSheet, TextInput, View } from "react-native";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { AppText } from "@/components/ui/text";
import { colors, fonts, radius, space } from "@/constants/theme";
import { materialsCsvUrl, useSetPrices } from "@/hooks/queries/materials";
import type { Plan } from "@/hooks/queries/plan";
import { MATERIAL_GROUP_NAMES, MATERIAL_GROUPS, MATERIALS_CURRENCY } from "@/survey/materials";
import { ApiError } from "@/sync/http";
import { money } from "@/components/ui/format";
import { materialsTotalWords } from "@/survey/report";
import { parseTypedNumber } from "@/survey/typed-numbers";

function download(url: string) {
  if (Platform.OS !== "web") return;
  const a = document.createElement("a");
  a.href = url;
  a.download = "";
  document.body.appendChild(a);
  a.click();
  a.remove();
}

export function MaterialsPanel({ siteId, plan, wide, editable }: { siteId: string; plan: Plan; wide: boolean; editable: boolean }) {
  const setPrices = useSetPrices(siteId);
  const [drafts, setDrafts] = useState<Record<string, string>>({});
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const m = plan.materials;

  const commit = (key: string) => {
    const text = drafts[key];
    if (text === undefined) return;
    const current = plan.prices[key];
    const value = parseTypedNumber(text) ?? null;
    if (value !== null && (current === value)) return;
    if (value === null && current === undefined) return;
    if (value !== null && !Number.isFinite(value)) {
      setErrors({ ...errors, [key]: ["Type the unit price as a number, e.g. 12.50."] });
      return;
    }
    setPrices.mutate(
      { [key]: value },
      {
        onSuccess: () => {
          setErrors(({ [key]: _gone, ...rest }) => rest);
          setDrafts(({ [key]: _d, ...rest }) => rest);
          setMessage(null);
        },
        onError: (err) => {
          setErrors({ ...errors, ...(err instanceof ApiError ? err.fields : { [key]: [err.message] }) });
          setMessage(err.message);
        },
      },
    );
  };

  return (
    <View style={{ gap: space.md }}>
      <View style={styles.head}>
        <View style={{ flex: 1, gap: 2 }}>
          <AppText variant="subheading">Materials</AppText>
          <AppText variant="caption" muted>
            Counted from the plan as it stands; a unit price you set carries over to the same item on this site. Mains work (new outlets, transformers) is for a licensed electrician, to local code.
          </AppText>
        </View>
        <Button label="Export CSV" tone="secondary" onPress={() => download(materialsCsvUrl(siteId))} />
      </View>
      {message ? <Banner tone="danger">{message}</Banner> : null}
      <View style={styles.table} role="table" aria-label="Materials">
        {/* On a phone each line stacks: the item across the width, its figures in a row below. */}
        <View style={[styles.tr, styles.th, styles.sticky, !wide && styles.trStacked]} role="row">
          <AppText style={[styles.thText, wide ? { flex: 3 } : null]}>Item</AppText>
          {wide ? <AppText style={[styles.thText, { flex: 2 }]}>For</AppText> : null}
          <View style={wide ? styles.figures : styles.figuresStacked}>
            <AppText style={[styles.thText, styles.qty]}>Qty</AppText>
            <AppText style={[styles.thText, wide ? styles.price : styles.priceStacked]}>{`Unit price, ${MATERIALS_CURRENCY}`}</AppText>
            <AppText style={[styles.thText, styles.total]}>Line total</AppText>
          </View>
        </View>
        {MATERIAL_GROUPS.map((g) => {
          const lines = m.lines.filter((l) => l.group === g);
          if (!lines.length) return null;
          return (
            <View key={g}>
              <View style={[styles.tr, styles.group]}><AppText style={styles.groupText}>{MATERIAL_GROUP_NAMES[g]}</AppText></View>
              {lines.map((l) => {
                const err = errors[l.key];
                const shown = drafts[l.key] ?? (l.unitPrice === null ? "" : money(l.unitPrice).replace(/,/g, ""));
                return (
                  <View key={l.key} style={[styles.tr, !wide && styles.trStacked]} role="row" aria-label={l.item}>
                    <View style={wide ? { flex: 3, gap: 2 } : { gap: 2 }}>
                      <AppText style={{ fontFamily: fonts.semibold }}>{l.item}</AppText>
                      {l.note ? <AppText variant="caption" muted>{l.note}</AppText> : null}
                      {!wide ? <AppText variant="caption" muted>{l.detail}</AppText> : null}
                    </View>
                    {wide ? <AppText variant="caption" style={{ flex: 2 }}>{l.detail}</AppText> : null}
                    <View style={wide ? styles.figures : styles.figuresStacked}>
                    <AppText style={styles.qty}>{l.quantity} {l.unit === "each" ? "" : l.unit}</AppText>
                    <View style={wide ? styles.price : styles.priceStacked}>
                      {editable ? (
                        <TextInput
                          aria-label={`Unit price of ${l.item}`}
                          aria-invalid={err ? true : undefined}
                          value={shown}
                          placeholder="price"
                          placeholderTextColor={colors.inkMuted}
                          inputMode="decimal"
                          onChangeText={(t) => setDrafts({ ...drafts, [l.key]: t })}
                          onBlur={() => commit(l.key)}
                          onSubmitEditing={() => commit(l.key)}
                          style={[styles.input, err ? styles.inputBad : null]}
                        />
                      ) : (
                        <AppText>{l.unitPrice === null ? "—" : money(l.unitPrice)}</AppText>
                      )}
                      {err ? <AppText role="alert" variant="caption" style={{ color: colors.danger }}>{err.join(" ")}</AppText> : null}
                    </View>
                    <AppText style={[styles.total, { fontFamily: fonts.semibold }]}>{l.lineTotal === null ? "—" : money(l.lineTotal)}</AppText>
                    </View>
                  </View>
                );
              })}
            </View>
          );
        })}
        <View style={[styles.tr, styles.foot]} role="row">
          <AppText style={[styles.thText, styles.footText, { flex: 1 }]}>
            {`Total, ${MATERIALS_CURRENCY}`}{m.unpricedCount ? ` (${m.unpricedCount} line${m.unpricedCount === 1 ? "" : "s"} without a price)` : ""}
          </AppText>
          <AppText testID="materials-total" style={[styles.total, { fontFamily: fonts.heavy, fontSize: 18 }]}>{materialsTotalWords(m, money)}</AppText>
        </View>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: "row", gap: space.md, alignItems: "flex-end", flexWrap: "wrap" },
  table: { borderWidth: 1, borderColor: colors.line, borderRadius: radius.md, backgroundColor: colors.card },
  tr: { flexDirection: "row", alignItems: "center", gap: space.md, paddingHorizontal: space.md, paddingVertical: space.sm, borderBottomWidth: 1, borderBottomColor: colors.slate50 },
  th: { backgroundColor: colors.slate800, borderTopLeftRadius: radius.md, borderTopRightRadius: radius.md },
  sticky: Platform.OS === "web" ? ({ position: "sticky", top: 0, zIndex: 2 } as object) : {},
  thText: { fontFamily: fonts.bold, color: colors.onDark, fontSize: 14 },
  group: { backgroundColor: colors.slate50 },
  groupText: { fontFamily: fonts.bold, color: colors.slate800 },
  qty: { width: 70, textAlign: "right" },
  price: { width: 110 },
  priceStacked: { flex: 1 },
  trStacked: { flexDirection: "column", alignItems: "stretch", gap: space.xs },
  figures: { flexDirection: "row", alignItems: "center", gap: space.md },
  figuresStacked: { flexDirection: "row", alignItems: "center", gap: space.md, alignSelf: "stretch" },
  total: { width: 100, textAlign: "right" },
  input: { borderWidth: 1.5, borderColor: colors.line, borderRadius: radius.sm, paddingHorizontal: space.sm, minHeight: 36, fontFamily: fonts.regular, fontSize: 15, color: colors.ink, textAlign: "right", backgroundColor: colors.card },
  inputBad: { borderColor: colors.danger, backgroundColor: colors.dangerBg },
  foot: { backgroundColor: colors.copper100, borderBottomWidth: 0 },
  footText: { color: colors.ink },
});
