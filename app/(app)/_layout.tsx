import { Redirect, Slot } from "expo-router";
import { ActivityIndicator, View } from "react-native";
import { AppShell } from "@/components/shell/app-shell";
import { navItemsFor } from "@/components/shell/nav-items";
import { OfflineBadge } from "@/components/shell/session-badge";
import { colors } from "@/constants/theme";
import { useSession } from "@/hooks/queries/me";

export default function SignedInLayout() {
  const session = useSession();
  if (session.isPending) {
    return (
      <View style={{ flex: 1, alignItems: "center", justifyContent: "center", backgroundColor: colors.paper }}>
        <ActivityIndicator color={colors.slate800} />
      </View>
    );
  }
  if (!session.data || session.data.status === "signed-out") return <Redirect href="/sign-in" />;
  return (
    <AppShell items={navItemsFor(session.data.me.role)} footer={session.data.offline ? <OfflineBadge /> : undefined}>
      <Slot />
    </AppShell>
  );
}
