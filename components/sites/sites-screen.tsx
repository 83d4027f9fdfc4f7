import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { Screen } from "@/components/ui/screen";
import { colors } from "@/constants/theme";

export function SitesScreen() {
  return (
    <Screen title="Sites" subtitle="Every house your team is walking, planning or waiting on for sign-off.">
      <EmptyState
        icon={<Icon name="sites" size={40} color={colors.slate600} />}
        title="No sites yet"
        body="A designer creates a site for each house and assigns a surveyor. Assigned sites appear here, with their walk progress and gaps."
      />
    </Screen>
  );
}
