import type { ReactNode } from "react";
import { useLocalSearchParams } from "expo-router";
import { ActivityIndicator, View } from "react-native";
import { SiteStatusBadge } from "@/components/sites/site-status-badge";
import { Banner } from "@/components/ui/banner";
import { Screen } from "@/components/ui/screen";
import { colors, space } from "@/constants/theme";
import { useMe } from "@/hooks/queries/me";
import { useSite, type SiteStatus, type SiteSummary } from "@/hooks/queries/sites";
import { useLocalSite } from "@/hooks/use-local-store";
import { SiteTabs } from "./site-tabs";

/** What the section gets: the site's id, and the server's summary when it could be read. */
export interface SiteSection {
  id: string;
  /** From the server (people, client); null while offline for the team. */
  summary: SiteSummary | null;
}

type Children = (site: SiteSection) => ReactNode;

/** One site's page: its name, address and status, the section tabs, then the section itself. */
export function SiteSectionScreen({ children }: { children: Children }) {
  const me = useMe();
  // The team has the phone's own store (it works offline); a homeowner reads the server only.
  return me.role === "client" ? <ClientSection>{children}</ClientSection> : <TeamSection>{children}</TeamSection>;
}

function ClientSection({ children }: { children: Children }) {
  const { id } = useLocalSearchParams<{ id: string }>();
  const site = useSite(id);
  if (site.isPending) return <Screen title="Site"><ActivityIndicator color={colors.slate800} aria-label="Loading" /></Screen>;
  if (site.isError) {
    return (
      <Screen title="Site">
        <Banner tone="danger">{site.error.message}</Banner>
      </Screen>
    );
  }
  return (
    <Frame id={id} name={site.data.name} address={site.data.address} status={site.data.status}>
      {children({ id, summary: site.data })}
    </Frame>
  );
}

/** The header comes from the server when it answers, else from the site kept on this phone. */
function TeamSection({ children }: { children: Children }) {
  const { id } = useLocalSearchParams<{ id: string }>();
  const server = useSite(id);
  const local = useLocalSite(id);
  const header = server.data ?? local.data ?? null;
  if (!header) {
    if (local.isPending || (server.isPending && !server.isPaused)) return <Screen title="Site"><ActivityIndicator color={colors.slate800} aria-label="Loading" /></Screen>;
    return (
      <Screen title="Site">
        <Banner tone="danger">{server.error?.message ?? "This site is not on this phone yet. Open it once with a connection to keep it for offline walks."}</Banner>
      </Screen>
    );
  }
  return (
    <Frame id={id} name={header.name} address={header.address} status={header.status as SiteStatus}>
      {children({ id, summary: server.data ?? null })}
    </Frame>
  );
}

function Frame({ id, name, address, status, children }: { id: string; name: string; address: string; status: SiteStatus; children: ReactNode }) {
  return (
    <Screen title={name} subtitle={address || undefined} actions={<SiteStatusBadge status={status} />}>
      <SiteTabs siteId={id} />
      <View style={{ gap: space.lg }}>{children}</View>
    </Screen>
  );
}
