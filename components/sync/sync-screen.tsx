import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { Screen } from "@/components/ui/screen";
import { colors } from "@/constants/theme";

export function SyncScreen() {
  return (
    <Screen title="Sync" subtitle="What this phone holds and what has reached the office.">
      <EmptyState
        icon={<Icon name="sync" size={40} color={colors.slate600} />}
        title="Nothing waiting to send"
        body="Rooms, devices and photos captured on a walk are saved on this phone first. Changes still to send, photos uploading and anything that needs you show up here."
      />
    </Screen>
  );
}
