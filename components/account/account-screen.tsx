import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { Screen } from "@/components/ui/screen";
import { colors } from "@/constants/theme";

export function AccountScreen() {
  return (
    <Screen title="Account" subtitle="Your name, your team and how you sign in.">
      <EmptyState
        icon={<Icon name="account" size={40} color={colors.slate600} />}
        title="Not signed in"
        body="Once you sign in, your name, your team and your role appear here, with a way to sign out."
      />
    </Screen>
  );
}
