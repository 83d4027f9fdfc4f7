// The phone's offline store and its sync runner, for the signed-in team member, and the hooks that
// read and change it. Queries read the local store, so they run with network mode "always".
import { onlineManager, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { createContext, useContext, useEffect, useState, useSyncExternalStore, type ReactNode } from "react";
import type { ItemKind } from "@/survey/capture";
import { openUserDatabase } from "@/sync/expo-sqlite-db";
import { httpTransport } from "@/sync/http-transport";
import { LocalStore } from "@/sync/local-store";
import { uploadPhoto } from "@/sync/photo-upload";
import type { MutationArgs } from "@/sync/protocol";
import { SyncRunner, type SyncSnapshot } from "@/sync/sync-runner";

interface LocalContext {
  store: LocalStore;
  runner: SyncRunner;
}

const Ctx = createContext<LocalContext | null>(null);

export const localKeys = {
  root: ["local"] as const,
  sites: () => [...localKeys.root, "sites"] as const,
  site: (id: string) => [...localKeys.root, "site", id] as const,
  items: (siteId: string) => [...localKeys.root, "items", siteId] as const,
  photos: (siteId: string) => [...localKeys.root, "photos", siteId] as const,
  notices: () => [...localKeys.root, "notices"] as const,
};

export type LocalStoreState = { status: "opening" } | { status: "ready" } | { status: "failed"; message: string };

/** Opens the user's store and starts syncing; children render once it is open. */
export function LocalStoreProvider({ userId, children, fallback }: { userId: string; children: ReactNode; fallback: (state: LocalStoreState) => ReactNode }) {
  const qc = useQueryClient();
  const [ctx, setCtx] = useState<LocalContext | null>(null);
  const [state, setState] = useState<LocalStoreState>({ status: "opening" });

  useEffect(() => {
    let disposed = false;
    let runner: SyncRunner | undefined;
    const onOnline = () => void runner?.syncNow();
    (async () => {
      const store = await LocalStore.open(await openUserDatabase(userId));
      if (disposed) return;
      runner = new SyncRunner({
        store,
        transport: httpTransport,
        upload: uploadPhoto,
        isOnline: () => onlineManager.isOnline(),
        onSynced: () => void qc.invalidateQueries({ queryKey: localKeys.root }),
      });
      setCtx({ store, runner });
      setState({ status: "ready" });
      window.addEventListener("online", onOnline);
      void runner.syncNow();
    })().catch((err: unknown) => {
      if (!disposed) setState({ status: "failed", message: err instanceof Error ? err.message : String(err) });
    });
    return () => {
      disposed = true;
      window.removeEventListener("online", onOnline);
      runner?.dispose();
    };
  }, [userId, qc]);

  if (!ctx) return <>{fallback(state)}</>;
  return <Ctx.Provider value={ctx}>{children}</Ctx.Provider>;
}

export function useLocal(): LocalContext {
  const ctx = useContext(Ctx);
  if (!ctx) throw new Error("useLocal() needs a LocalStoreProvider above it");
  return ctx;
}

export function useLocalSites() {
  const { store } = useLocal();
  return useQuery({ queryKey: localKeys.sites(), queryFn: () => store.sites(), networkMode: "always" });
}

export function useLocalSite(siteId: string) {
  const { store } = useLocal();
  return useQuery({ queryKey: localKeys.site(siteId), queryFn: async () => (await store.site(siteId)) ?? null, networkMode: "always" });
}

export function useSiteItems(siteId: string) {
  const { store } = useLocal();
  return useQuery({ queryKey: localKeys.items(siteId), queryFn: () => store.items(siteId), networkMode: "always" });
}

export function useSitePhotos(siteId: string) {
  const { store } = useLocal();
  return useQuery({ queryKey: localKeys.photos(siteId), queryFn: () => store.photos(siteId), networkMode: "always" });
}

/** Refused changes and lost same-field values that the surveyor has not seen yet. */
export function useSyncNotices() {
  const { store } = useLocal();
  const qc = useQueryClient();
  const query = useQuery({
    queryKey: localKeys.notices(),
    queryFn: async () => ({ rejections: await store.unseenRejections(), conflicts: await store.unseenConflicts() }),
    networkMode: "always",
  });
  const dismiss = useMutation({
    mutationFn: (what: { rejections?: number[]; conflicts?: string[] }) => store.markSeen(what),
    networkMode: "always",
    onSettled: () => qc.invalidateQueries({ queryKey: localKeys.notices() }),
  });
  return { ...query, dismiss: dismiss.mutate };
}

/** Capture actions for one site: each writes the local store and its outbox at once, then syncs. */
export function useCapture(siteId: string) {
  const { store, runner } = useLocal();
  const qc = useQueryClient();
  const after = async () => {
    await qc.invalidateQueries({ queryKey: localKeys.root });
    await runner.refresh();
    void runner.syncNow();
  };
  return {
    putItem: async (kind: ItemKind, itemId: string, fields: Record<string, unknown>) => {
      await store.putItem(siteId, kind, itemId, fields);
      await after();
    },
    deleteItem: async (itemId: string) => {
      await store.deleteItem(siteId, itemId);
      await after();
    },
    updateSite: async (fields: MutationArgs<"site.update">["fields"]) => {
      await store.updateSite(siteId, fields);
      await after();
    },
    addPhoto: async (photo: { itemId: string | null; label: string; mime: string; bytes: Uint8Array }) => {
      const id = await store.addPhoto({ siteId, ...photo });
      await after();
      return id;
    },
  };
}

export function useSyncState(): SyncSnapshot & { syncNow: () => Promise<void> } {
  const { runner } = useLocal();
  const snapshot = useSyncExternalStore(
    (cb) => runner.subscribe(cb),
    () => runner.state,
  );
  return { ...snapshot, syncNow: () => runner.syncNow() };
}
