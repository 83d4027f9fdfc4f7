import { Redirect, Slot } from "expo-router";
import { ActivityIndicator, View } from "react-native";
import { AppShell } from "@/components/shell/app-shell";
import { navItemsFor } from "@/components/shell/nav-items";
import { OfflineBadge } from "@/components/shell/session-badge";
import { StoreUnavailable } from "@/components/shell/store-unavailable";
import { colors, space } from "@/constants/theme";
import { useSession } from "@/hooks/queries/me";
import { LocalStoreProvider } from "@/hooks/use-local-store";

function Centered({ children }: { children: React.ReactNode }) {
  return <View style={{ flex: 1, alignItems: "center", justifyContent: "center", backgroundColor: colors.paper, padding: space.xl }}>{children}</View>;
}

export default function SignedInLayout() {
  const session = useSession();
  if (session.isPending) {
    return (
      <Centered>
        <ActivityIndicator color={colors.slate800} aria-label="Loading" />
      </Centered>
    );
  }
  if (!session.data || session.data.status === "signed-out") return <Redirect href="/sign-in" />;
  const { me, offline } = session.data;
  const shell = (
    <AppShell items={navItemsFor(me.role)} footer={offline ? <OfflineBadge /> : undefined}>
      <Slot />
    </AppShell>
  );
  if (me.role === "client") return shell;
  // The team works from the phone's own store, online or not.
  return (
    <LocalStoreProvider
      userId={me.user.id}
      fallback={(state) => (
        <Centered>
          {state.status === "failed" ? <StoreUnavailable inAnotherTab={state.inAnotherTab} message={state.message} /> : <ActivityIndicator color={colors.slate800} aria-label="Loading" />}
        </Centered>
      )}
    >
      {shell}
    </LocalStoreProvider>
  );
}
