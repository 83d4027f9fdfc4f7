// The desk's table of every site of the team: sortable, filterable by status and text, with a
// sticky header on wide screens and a compact list on a phone. A row opens the site's plan.
import { useRouter } from "expo-router";
import { useMemo, useState } from "react";
import { ActivityIndicator, Platform, Pressable, StyleSheet, TextInput, View } from "react-native";
import { SiteStatusBadge } from "@/components/sites/site-status-badge";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { AppText } from "@/components/ui/text";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { useDeskSites, type DeskSite } from "@/hooks/queries/desk";
import type { SiteStatus } from "@/hooks/queries/sites";
import { useBreakpoint } from "@/hooks/use-breakpoint";
import { SITE_STATUS_LABELS } from "@/survey/team";
import { devicesProgressLabel } from "@/survey/walk/gaps";
import { when } from "@/components/ui/format";

type SortKey = "name" | "client" | "surveyors" | "status" | "checklist" | "lastSync";
const STATUS_ORDER: SiteStatus[] = ["surveying", "planning", "out_for_sign_off", "changes_asked", "signed"];

const COLUMNS: { key: SortKey; label: string; flex: number }[] = [
  { key: "name", label: "Site", flex: 2.2 },
  { key: "client", label: "Client", flex: 1.4 },
  { key: "surveyors", label: "Surveyors", flex: 1.4 },
  { key: "status", label: "Status", flex: 1.2 },
  { key: "checklist", label: "Checklist", flex: 1.3 },
  { key: "lastSync", label: "Last sync", flex: 1.1 },
];

function sortValue(s: DeskSite, key: SortKey): string | number {
  switch (key) {
    case "name":
      return s.name.toLowerCase();
    case "client":
      return (s.clientName ?? "").toLowerCase();
    case "surveyors":
      return s.surveyors.map((p) => p.name).join(", ").toLowerCase();
    case "status":
      return STATUS_ORDER.indexOf(s.status);
    case "checklist":
      return s.devices.total ? s.devices.complete / s.devices.total : -1;
    case "lastSync":
      return s.lastSyncAt ? Date.parse(s.lastSyncAt) : 0;
  }
}

function Checklist({ s }: { s: DeskSite }) {
  const share = s.devices.total ? s.devices.complete / s.devices.total : 0;
  return (
    <View style={{ gap: 3 }}>
      <AppText variant="caption">
        {devicesProgressLabel({ devices: s.devices.total, devicesComplete: s.devices.complete, devicesLeftOut: s.devices.leftOut })}
      </AppText>
      <View style={styles.track} role="progressbar" aria-label={`Checklist of ${s.name}`} aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(share * 100)}>
        <View style={[styles.fill, { width: `${Math.round(share * 100)}%`, backgroundColor: s.devices.complete < s.devices.total ? colors.copper500 : colors.good }]} />
      </View>
    </View>
  );
}

export function DeskSitesTable() {
  const sites = useDeskSites();
  const router = useRouter();
  const { wide } = useBreakpoint();
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: "lastSync", dir: -1 });
  const [status, setStatus] = useState<SiteStatus | "all">("all");
  const [text, setText] = useState("");

  const rows = useMemo(() => {
    const q = text.trim().toLowerCase();
    return (sites.data ?? [])
      .filter((s) => status === "all" || s.status === status)
      .filter((s) => !q || [s.name, s.address, s.clientName ?? "", ...s.surveyors.map((p) => p.name)].some((t) => t.toLowerCase().includes(q)))
      .sort((a, b) => {
        const x = sortValue(a, sort.key);
        const y = sortValue(b, sort.key);
        return (x < y ? -1 : x > y ? 1 : 0) * sort.dir || a.name.localeCompare(b.name);
      });
  }, [sites.data, status, text, sort]);

  const open = (s: DeskSite) => router.push(`/sites/${s.id}` as never);
  const openPlan = (s: DeskSite) => router.push(`/sites/${s.id}/plan` as never);
  const counts = new Map<SiteStatus, number>();
  for (const s of sites.data ?? []) counts.set(s.status, (counts.get(s.status) ?? 0) + 1);

  if (sites.isPending) return <ActivityIndicator color={colors.slate800} aria-label="Loading" />;
  if (sites.isError) return <Banner tone="danger">{sites.error.message}</Banner>;

  return (
    <View style={{ gap: space.md }} aria-label="Sites of the team">
      <View style={styles.filters}>
        <TextInput
          aria-label="Filter sites"
          placeholder="Filter by site, address, client or surveyor"
          placeholderTextColor={colors.inkMuted}
          value={text}
          onChangeText={setText}
          style={[styles.search, wide && { maxWidth: 360 }]}
        />
        <View role="radiogroup" aria-label="Status" style={styles.chips}>
          {(["all", ...STATUS_ORDER] as const).map((st) => {
            const on = status === st;
            const n = st === "all" ? (sites.data?.length ?? 0) : (counts.get(st) ?? 0);
            return (
              <Pressable key={st} role="radio" aria-checked={on} aria-label={`${st === "all" ? "all" : SITE_STATUS_LABELS[st]} (${n})`} onPress={() => setStatus(st)} style={[styles.chip, on && styles.chipOn]}>
                <AppText style={[styles.chipText, on && { color: colors.onDark }]}>{st === "all" ? "all" : SITE_STATUS_LABELS[st]} · {n}</AppText>
              </Pressable>
            );
          })}
        </View>
      </View>

      {wide ? (
        <View style={styles.table} role="table" aria-label="Sites">
          <View style={[styles.tr, styles.th, Platform.OS === "web" ? ({ position: "sticky", top: 0, zIndex: 2 } as object) : null]} role="row">
            {COLUMNS.map((c) => {
              const active = sort.key === c.key;
              return (
                <Pressable
                  key={c.key}
                  role="columnheader"
                  aria-sort={active ? (sort.dir === 1 ? "ascending" : "descending") : "none"}
                  aria-label={`Sort by ${c.label}`}
                  onPress={() => setSort(active ? { key: c.key, dir: sort.dir === 1 ? -1 : 1 } : { key: c.key, dir: 1 })}
                  style={[styles.thCell, { flex: c.flex }]}
                >
                  <AppText style={styles.thText}>
                    {c.label} {active ? (sort.dir === 1 ? "▲" : "▼") : ""}
                  </AppText>
                </Pressable>
              );
            })}
            <View role="columnheader" aria-label="Plan" style={styles.planCol} />
          </View>
          {rows.map((s) => (
            <Pressable key={s.id} role="row" aria-label={`Open ${s.name}`} onPress={() => open(s)} style={(state) => [styles.tr, styles.row, (state as { hovered?: boolean }).hovered && { backgroundColor: colors.slate50 }]}>
              <View role="cell" style={{ flex: 2.2, gap: 2 }}>
                <AppText style={{ fontFamily: fonts.bold }}>{s.name}</AppText>
                <AppText variant="caption" muted>{s.address || "no address yet"}</AppText>
              </View>
              <View role="cell" style={{ flex: 1.4 }}><AppText>{s.clientName ?? "—"}</AppText></View>
              <View role="cell" style={{ flex: 1.4 }}><AppText>{s.surveyors.map((p) => p.name).join(", ") || "—"}</AppText></View>
              <View role="cell" style={{ flex: 1.2 }}><SiteStatusBadge status={s.status} /></View>
              <View role="cell" style={{ flex: 1.3, paddingRight: space.md }}><Checklist s={s} /></View>
              <View role="cell" style={{ flex: 1.1 }}><AppText variant="caption">{when(s.lastSyncAt)}</AppText></View>
              <View role="cell" style={styles.planCol}>
                <Button label="Plan" tone="secondary" aria-label={`Open the plan of ${s.name}`} onPress={() => openPlan(s)} style={styles.planButton} />
              </View>
            </Pressable>
          ))}
          {rows.length === 0 ? (
            <View role="row">
              <View role="cell">
                <AppText muted style={{ padding: space.lg }}>No site matches the filter.</AppText>
              </View>
            </View>
          ) : null}
        </View>
      ) : (
        <View style={{ gap: space.sm }}>
          {rows.map((s) => (
            <Pressable key={s.id} role="link" aria-label={`Open ${s.name}`} onPress={() => open(s)} style={styles.card}>
              <View style={{ flexDirection: "row", alignItems: "center", gap: space.sm }}>
                <AppText style={{ fontFamily: fonts.bold, flex: 1 }}>{s.name}</AppText>
                <SiteStatusBadge status={s.status} />
              </View>
              <AppText variant="caption" muted>{[s.clientName, s.surveyors.map((p) => p.name).join(", ")].filter(Boolean).join(" · ") || s.address}</AppText>
              <Checklist s={s} />
              <View style={{ flexDirection: "row", alignItems: "center", justifyContent: "space-between" }}>
                <AppText variant="caption" muted>Last sync {when(s.lastSyncAt)}</AppText>
                <Button label="Plan" tone="secondary" aria-label={`Open the plan of ${s.name}`} onPress={() => openPlan(s)} style={styles.planButton} />
              </View>
            </Pressable>
          ))}
          {rows.length === 0 ? <AppText muted>No site matches the filter.</AppText> : null}
        </View>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  filters: { gap: space.sm },
  search: { minHeight: minTouch, borderWidth: 1.5, borderColor: colors.line, borderRadius: radius.md, paddingHorizontal: space.md, fontFamily: fonts.regular, fontSize: 16, color: colors.ink, backgroundColor: colors.card },
  chips: { flexDirection: "row", flexWrap: "wrap", gap: space.xs },
  chip: { minHeight: 40, paddingHorizontal: space.md, justifyContent: "center", borderRadius: radius.pill, borderWidth: 1.5, borderColor: colors.slate100, backgroundColor: colors.card },
  chipOn: { backgroundColor: colors.slate800, borderColor: colors.slate800 },
  chipText: { fontFamily: fonts.semibold, color: colors.slate700, fontSize: 14 },
  table: { borderWidth: 1, borderColor: colors.line, borderRadius: radius.lg, backgroundColor: colors.card },
  tr: { flexDirection: "row", alignItems: "center", paddingHorizontal: space.md },
  th: { backgroundColor: colors.slate800, borderTopLeftRadius: radius.lg, borderTopRightRadius: radius.lg },
  thCell: { minHeight: 44, justifyContent: "center" },
  thText: { fontFamily: fonts.bold, color: colors.onDark, fontSize: 14 },
  row: { minHeight: 60, borderTopWidth: 1, borderTopColor: colors.slate50, paddingVertical: space.sm },
  card: { gap: space.xs, padding: space.lg, backgroundColor: colors.card, borderRadius: radius.lg, borderWidth: 1, borderColor: colors.line },
  planCol: { width: 80, alignItems: "flex-end" },
  planButton: { minHeight: 36, paddingHorizontal: space.md },
  track: { height: 6, borderRadius: radius.pill, backgroundColor: colors.slate100, overflow: "hidden" },
  fill: { height: "100%", borderRadius: radius.pill },
});
