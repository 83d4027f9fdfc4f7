import { Link } from "expo-router";
import { useState } from "react";
import { ActivityIndicator, Pressable, View } from "react-native";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { Screen } from "@/components/ui/screen";
import { AppText } from "@/components/ui/text";
import { colors } from "@/constants/theme";
import { useMe } from "@/hooks/queries/me";
import { useSites } from "@/hooks/queries/sites";
import { DeskSitesTable } from "@/components/desk/desk-sites-table";
import { LocalSitesList } from "./local-sites-list";
import { NewSiteForm } from "./new-site-form";
import { siteRowStyles } from "./site-row-styles";
import { SiteStatusBadge } from "./site-status-badge";

const SUBTITLES = {
  admin: "Every house your team is walking, planning or waiting on for sign-off.",
  designer: "Every house of the team, from the walk to the signed scope.",
  surveyor: "The houses you are assigned to walk.",
  client: "Your home's plan, from the installer who walked it.",
} as const;

export function SitesScreen() {
  const me = useMe();
  // A surveyor's walks come from the phone's own store, so the list opens without a connection.
  if (me.role === "surveyor") {
    return (
      <Screen title="Walks" subtitle={SUBTITLES.surveyor}>
        <LocalSitesList />
      </Screen>
    );
  }
  return <ServerSites />;
}

/** Designers, admins and homeowners: the server's list. */
function ServerSites() {
  const me = useMe();
  const sites = useSites();
  const [creating, setCreating] = useState(false);
  const title = me.role === "designer" ? "Desk" : me.role === "client" ? "Your scope" : "Sites";
  if (me.role === "designer" || me.role === "admin") return <Screen title={title} subtitle={SUBTITLES[me.role]} actions={me.permissions["site:create"] && !creating ? <Button label="New site" onPress={() => setCreating(true)} /> : undefined}>{creating ? <NewSiteForm onDone={() => setCreating(false)} /> : null}<DeskSitesTable /></Screen>;

  return (
    <Screen
      title={title}
      subtitle={SUBTITLES[me.role]}
      actions={me.permissions["site:create"] && !creating ? <Button label="New site" onPress={() => setCreating(true)} /> : undefined}
    >
      {creating ? <NewSiteForm onDone={() => setCreating(false)} /> : null}
      {sites.isPending ? <ActivityIndicator color={colors.slate800} aria-label="Loading" /> : null}
      {sites.isError ? <Banner tone="danger">{sites.error.message}</Banner> : null}
      {sites.data?.length === 0 ? (
        <EmptyState
          icon={<Icon name="sites" size={40} color={colors.slate600} />}
          title="No sites yet"
          body={me.role === "client" ? "When your installer invites you to a site, its scope appears here." : "Create a site for each house and assign a surveyor to walk it."}
        />
      ) : null}
      <View style={styles.list}>
        {sites.data?.map((site) => (
          <Link key={site.id} href={`/sites/${site.id}`} asChild>
            <Pressable role="link" aria-label={`${site.name}, ${site.address}`} style={styles.row}>
              <View style={styles.rowIcon}>
                <Icon name="sites" color={colors.slate700} />
              </View>
              <View style={{ flex: 1, gap: 2 }}>
                <AppText variant="subheading">{site.name}</AppText>
                <AppText muted variant="caption">
                  {site.address || "No address yet"}
                </AppText>
              </View>
              <SiteStatusBadge status={site.status} />
            </Pressable>
          </Link>
        ))}
      </View>
    </Screen>
  );
}

const styles = siteRowStyles;
