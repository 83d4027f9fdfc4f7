import type { ReactNode } from "react";
import { useLocalSearchParams } from "expo-router";
import { ActivityIndicator, View } from "react-native";
import { SiteStatusBadge } from "@/components/sites/site-status-badge";
import { Banner } from "@/components/ui/banner";
import { Screen } from "@/components/ui/screen";
import { colors, space } from "@/constants/theme";
import { useSite, type SiteSummary } from "@/hooks/queries/sites";
import { SiteTabs } from "./site-tabs";

/** One site's page: its name, address and status, the section tabs, then the section itself. */
export function SiteSectionScreen({ children }: { children: (site: SiteSummary) => ReactNode }) {
  const { id } = useLocalSearchParams<{ id: string }>();
  const site = useSite(id);
  if (site.isPending) return <Screen title="Site"><ActivityIndicator color={colors.slate800} /></Screen>;
  if (site.isError) {
    return (
      <Screen title="Site">
        <Banner tone="danger">{site.error.message}</Banner>
      </Screen>
    );
  }
  return (
    <Screen title={site.data.name} subtitle={site.data.address || undefined} actions={<SiteStatusBadge status={site.data.status} />}>
      <SiteTabs siteId={id} />
      <View style={{ gap: space.lg }}>{children(site.data)}</View>
    </Screen>
  );
}
