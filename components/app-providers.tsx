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
import { SafeAreaProvider } from "react-native-safe-area-context";
import { cachedMe } from "@/hooks/queries/me";
import { openLocalStoreEarly } from "@/hooks/use-local-store";

// TanStack Query assumes "online" at start: tell it the truth, or work restored offline is lost.
if (typeof navigator !== "undefined") onlineManager.setOnline(navigator.onLine);

// Keep the app itself on the phone so it opens with no signal (the server generates /sw.js).
if (typeof navigator !== "undefined" && "serviceWorker" in navigator && process.env.NODE_ENV === "production") {
  navigator.serviceWorker.register("/sw.js").catch(() => undefined);
}

// A team member works from the phone's own store: start opening it for the person this device last
// saw while the rest of the app loads (offline, nothing else stands between a reload and the walk).
const lastSeen = cachedMe();
if (typeof window !== "undefined" && lastSeen && lastSeen.role !== "client") openLocalStoreEarly(lastSeen.user.id);

const persister = createSyncStoragePersister({ storage: typeof window !== "undefined" ? window.localStorage : undefined, key: "dropwise.queries.v1" });

export function AppProviders({ children }: { children: ReactNode }) {
  // The font files are bundled with the app and load from our own origin. Nothing waits for them:
  // the screens (and the routes and the phone's store behind them) get going at once, and the
  // text takes its face as soon as the files are in, a moment later (the phone keeps its own copy).
  useFonts({
    NunitoSans_400Regular,
    NunitoSans_600SemiBold,
    NunitoSans_700Bold,
    NunitoSans_800ExtraBold,
  });
  const [queryClient] = useState(() => new QueryClient({ defaultOptions: { queries: { staleTime: 30_000, retry: 1, gcTime: 24 * 3600_000 } } }));

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
