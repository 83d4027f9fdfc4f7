import { Link } from "expo-router";
import { useMemo } from "react";
import { ActivityIndicator, Pressable, StyleSheet, View } from "react-native";
import { Badge } from "@/components/ui/badge";
import { Banner } from "@/components/ui/banner";
import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { ProgressBar } from "@/components/ui/progress-bar";
import { AppText } from "@/components/ui/text";
import { SyncPill } from "@/components/walk/sync-pill";
import { colors, space } from "@/constants/theme";
import type { SiteStatus } from "@/hooks/queries/sites";
import { useLocalSites, useSiteItems, useSyncState } from "@/hooks/use-local-store";
import { gapsLabel, walkProgress } from "@/survey/walk/gaps";
import type { SiteRecord } from "@/sync/protocol";
import { SiteStatusBadge } from "./site-status-badge";
import { siteRowStyles } from "./site-row-styles";

function LocalSiteRow({ site }: { site: SiteRecord }) {
  const items = useSiteItems(site.id);
  const progress = useMemo(() => (items.data ? walkProgress({ closetRoomId: site.closetRoomId }, items.data) : null), [items.data, site.closetRoomId]);
  const devices = progress ? (progress.devices === 1 ? "1 device" : `${progress.devices} devices`) : "";
  const summary = progress ? `${devices} captured · ${gapsLabel(progress.gapCount)}` : "Reading the walk…";
  return (
    <Link href={`/sites/${site.id}` as never} asChild>
      <Pressable role="link" aria-label={`${site.name}, ${site.address || "no address"}: ${summary}`} style={styles.row}>
        <View style={styles.rowIcon}>
          <Icon name="sites" color={colors.slate700} />
        </View>
        <View style={{ flex: 1, gap: 4 }}>
          <AppText variant="subheading">{site.name}</AppText>
          <AppText muted variant="caption">
            {site.address || "No address yet"}
          </AppText>
          {progress ? (
            <>
              <View style={styles.progressLine}>
                <AppText variant="caption">{`${devices} captured`}</AppText>
                <Badge label={gapsLabel(progress.gapCount)} tone={progress.gapCount ? "copper" : "good"} />
              </View>
              <ProgressBar value={progress.devices ? progress.devicesComplete / progress.devices : 0} label={`Walk progress of ${site.name}`} />
            </>
          ) : null}
        </View>
        <SiteStatusBadge status={site.status as SiteStatus} />
      </Pressable>
    </Link>
  );
}

/** A surveyor's walks, from the phone's own store: they open in a basement with no signal. */
export function LocalSitesList() {
  const sites = useLocalSites();
  const sync = useSyncState();
  const firstSync = sync.lastSyncedAt === null && sync.phase === "sending";
  return (
    <>
      <SyncPill />
      {sites.isPending || (firstSync && !sites.data?.length) ? <ActivityIndicator color={colors.slate800} aria-label="Loading" /> : null}
      {sites.isError ? <Banner tone="danger">{sites.error.message}</Banner> : null}
      {sites.data?.length === 0 && !firstSync ? (
        <EmptyState
          icon={<Icon name="sites" size={40} color={colors.slate600} />}
          title="No walks on this phone yet"
          body={
            sync.lastSyncedAt === null
              ? "Your assigned houses arrive with the first sync. Connect once, and they stay on this phone for offline walks."
              : "When a designer assigns you a house, it appears here with its walk progress and gaps."
          }
        />
      ) : null}
      <View style={styles.list} role="list">
        {sites.data?.map((site) => (
          <View key={site.id} role="listitem">
            <LocalSiteRow site={site} />
          </View>
        ))}
      </View>
    </>
  );
}

const styles = StyleSheet.create({
  ...siteRowStyles,
  progressLine: { flexDirection: "row", alignItems: "center", gap: space.sm, flexWrap: "wrap" },
});
