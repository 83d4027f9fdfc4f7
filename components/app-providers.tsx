import type { ReactNode } from "react";
import {
  NunitoSans_400Regular,
  NunitoSans_600SemiBold,
  NunitoSans_700Bold,
  NunitoSans_800ExtraBold,
  useFonts,
} from "@expo-google-fonts/nunito-sans";
import { createSyncStoragePersister } from "@tanstack/query-sync-storage-persister";
import { QueryClient, onlineManager } from "@tanstack/react-query";
import { PersistQueryClientProvider } from "@tanstack/react-query-persist-client";
import { useState } from "react";
import { ActivityIndicator, View } from "react-native";
import { SafeAreaProvider } from "react-native-safe-area-context";
import { colors } from "@/constants/theme";

// TanStack Query assumes "online" at start: tell it the truth, or work restored offline is lost.
if (typeof navigator !== "undefined") onlineManager.setOnline(navigator.onLine);

// Keep the app itself on the phone so it opens with no signal (the server generates /sw.js).
if (typeof navigator !== "undefined" && "serviceWorker" in navigator && process.env.NODE_ENV === "production") {
  navigator.serviceWorker.register("/sw.js").catch(() => undefined);
}

const persister = createSyncStoragePersister({ storage: typeof window !== "undefined" ? window.localStorage : undefined, key: "dropwise.queries.v1" });

export function AppProviders({ children }: { children: ReactNode }) {
  // The font files are bundled with the app and load from our own origin.
  const [fontsLoaded, fontError] = useFonts({
    NunitoSans_400Regular,
    NunitoSans_600SemiBold,
    NunitoSans_700Bold,
    NunitoSans_800ExtraBold,
  });
  const [queryClient] = useState(() => new QueryClient({ defaultOptions: { queries: { staleTime: 30_000, retry: 1, gcTime: 24 * 3600_000 } } }));

  if (!fontsLoaded && !fontError) {
    return (
      <View style={{ flex: 1, alignItems: "center", justifyContent: "center", backgroundColor: colors.paper }}>
        <ActivityIndicator color={colors.slate800} />
      </View>
    );
  }
  return (
    <SafeAreaProvider>
      <PersistQueryClientProvider
        client={queryClient}
        persistOptions={{
          persister,
          maxAge: 7 * 24 * 3600_000,
          buster: "1",
          // The local store's queries read SQLite on the phone already; only server reads are kept.
          // A remembered "signed out" would bounce a fresh sign-in link back to the sign-in screen.
          dehydrateOptions: {
            shouldDehydrateQuery: (q) =>
              q.state.status === "success" && q.queryKey[0] !== "local" && !(q.queryKey[0] === "me" && (q.state.data as { status?: string } | undefined)?.status === "signed-out"),
          },
        }}
      >
        {children}
      </PersistQueryClientProvider>
    </SafeAreaProvider>
  );
}
