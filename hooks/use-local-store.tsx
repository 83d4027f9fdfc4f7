// The phone's offline store and its sync runner, for the signed-in team member, and the hooks that
// read and change it. Queries read the local store, so they run with network mode "always".
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { isOnlineNow } from "./use-online";
import { createContext, useContext, useEffect, useMemo, useState, useSyncExternalStore, type ReactNode } from "react";
import type { ItemKind } from "@/survey/capture";
import { openUserDatabase } from "@/sync/expo-sqlite-db";
import { httpTransport } from "@/sync/http-transport";
import { LocalStore } from "@/sync/local-store";
import { uploadPhoto } from "@/sync/photo-upload";
import type { MutationArgs } from "@/sync/protocol";
import { SyncRunner, type SyncSnapshot } from "@/sync/sync-runner";

interface LocalContext {
  /** The store, once open: screens render while it opens, and their reads and writes wait on it. */
  store: Promise<LocalStore>;
  /** The sync runner, once the store is open. */
  runner: Promise<SyncRunner>;
  /** The same runner for what renders its state; null while the store opens. */
  current: SyncRunner | null;
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

export type LocalStoreState = { status: "opening" } | { status: "ready" } | { status: "failed"; message: string; inAnotherTab: boolean };

/**
 * The browser keeps a walk's store open in one tab at a time. The tab that opened it holds this lock
 * for as long as it lives, so a tab that cannot open the store can tell whether another tab has it.
 */
const STORE_LOCK = "dropwise-walk-store";

function holdStoreLock(): void {
  if (typeof navigator === "undefined" || !navigator.locks) return;
  void navigator.locks.request(STORE_LOCK, () => new Promise<never>(() => {})).catch(() => undefined);
}

async function storeHeldElsewhere(): Promise<boolean> {
  if (typeof navigator === "undefined" || !navigator.locks) return false;
  const { held = [] } = await navigator.locks.query().catch(() => ({ held: [] as LockInfo[] }));
  return held.some((l) => l.name === STORE_LOCK);
}

function openStore(userId: string): Promise<LocalStore> {
  return openUserDatabase(userId).then((db) => LocalStore.open(db));
}

let early: { userId: string; store: Promise<LocalStore> } | undefined;

/**
 * Starts opening a user's store before the app has rendered (the SQLite engine, its file and the
 * schema check take a few hundred milliseconds), so that it is ready when the signed-in layout asks.
 * The provider for that user takes it over once; any other user's store opens as usual.
 */
export function openLocalStoreEarly(userId: string) {
  if (early?.userId === userId) return;
  const store = openStore(userId);
  store.catch(() => undefined); // the provider opens again, and reports the failure
  early = { userId, store };
}

function takeStore(userId: string): Promise<LocalStore> {
  const ahead = early?.userId === userId ? early.store : undefined;
  early = undefined;
  return ahead ? ahead.catch(() => openStore(userId)) : openStore(userId);
}

/**
 * Opens the user's store and starts syncing. Children render at once (their routes load and lay out
 * while SQLite opens); what they read from the store waits for it. If it cannot open, `fallback`
 * says so in their place.
 */
export function LocalStoreProvider({ userId, children, fallback }: { userId: string; children: ReactNode; fallback: (state: LocalStoreState) => ReactNode }) {
  const qc = useQueryClient();
  const [state, setState] = useState<LocalStoreState>({ status: "opening" });
  const [current, setCurrent] = useState<SyncRunner | null>(null);
  // Started during the first render, so that the screens' first reads (their effects run before
  // ours) already have something to wait on.
  const opening = useMemo(() => {
    let started!: (runner: SyncRunner) => void;
    const runner = new Promise<SyncRunner>((resolve) => (started = resolve));
    return { store: takeStore(userId), runner, started };
  }, [userId]);

  useEffect(() => {
    let disposed = false;
    let runner: SyncRunner | undefined;
    const onOnline = () => void runner?.syncNow();
    setState({ status: "opening" });
    setCurrent(null);
    opening.store.then(
      (store) => {
        if (disposed) return;
        runner = new SyncRunner({
          store,
          transport: httpTransport,
          upload: uploadPhoto,
          isOnline: isOnlineNow,
          onSynced: () => void qc.invalidateQueries({ queryKey: localKeys.root }),
        });
        opening.started(runner);
        holdStoreLock();
        setCurrent(runner);
        setState({ status: "ready" });
        window.addEventListener("online", onOnline);
        void runner.syncNow();
      },
      (err: unknown) => {
        const message = err instanceof Error ? err.message : String(err);
        void storeHeldElsewhere().then((inAnotherTab) => {
          if (!disposed) setState({ status: "failed", message, inAnotherTab });
        });
      },
    );
    return () => {
      disposed = true;
      window.removeEventListener("online", onOnline);
      runner?.dispose();
    };
  }, [opening, qc]);

  const value = useMemo<LocalContext>(() => ({ store: opening.store, runner: opening.runner, current }), [opening, current]);
  if (state.status === "failed") return <>{fallback(state)}</>;
  return <Ctx.Provider value={value}>{children}</Ctx.Provider>;
}

export function useLocal(): LocalContext {
  const ctx = useContext(Ctx);
  if (!ctx) throw new Error("useLocal() needs a LocalStoreProvider above it");
  return ctx;
}

export function useLocalSites() {
  const { store } = useLocal();
  return useQuery({ queryKey: localKeys.sites(), queryFn: async () => (await store).sites(), networkMode: "always" });
}

export function useLocalSite(siteId: string) {
  const { store } = useLocal();
  return useQuery({ queryKey: localKeys.site(siteId), queryFn: async () => (await (await store).site(siteId)) ?? null, networkMode: "always" });
}

export function useSiteItems(siteId: string) {
  const { store } = useLocal();
  return useQuery({ queryKey: localKeys.items(siteId), queryFn: async () => (await store).items(siteId), networkMode: "always" });
}

export function useSitePhotos(siteId: string) {
  const { store } = useLocal();
  return useQuery({ queryKey: localKeys.photos(siteId), queryFn: async () => (await store).photos(siteId), networkMode: "always" });
}

/** Refused changes and lost same-field values that the surveyor has not seen yet. */
export function useSyncNotices() {
  const { store } = useLocal();
  const qc = useQueryClient();
  const query = useQuery({
    queryKey: localKeys.notices(),
    queryFn: async () => {
      const open = await store;
      return { rejections: await open.unseenRejections(), conflicts: await open.unseenConflicts() };
    },
    networkMode: "always",
  });
  const dismiss = useMutation({
    mutationFn: async (what: { rejections?: number[]; conflicts?: string[] }) => (await store).markSeen(what),
    networkMode: "always",
    onSettled: () => qc.invalidateQueries({ queryKey: localKeys.notices() }),
  });
  return { ...query, dismiss: dismiss.mutate };
}

/** Capture actions for one site: each writes the local store and its outbox at once, then syncs. */
export function useCapture(siteId: string) {
  const local = useLocal();
  const qc = useQueryClient();
  const after = async () => {
    await qc.invalidateQueries({ queryKey: localKeys.root });
    const runner = await local.runner;
    await runner.refresh();
    void runner.syncNow();
  };
  return {
    putItem: async (kind: ItemKind, itemId: string, fields: Record<string, unknown>) => {
      await (await local.store).putItem(siteId, kind, itemId, fields);
      await after();
    },
    deleteItem: async (itemId: string) => {
      await (await local.store).deleteItem(siteId, itemId);
      await after();
    },
    updateSite: async (fields: MutationArgs<"site.update">["fields"]) => {
      await (await local.store).updateSite(siteId, fields);
      await after();
    },
    addPhoto: async (photo: { itemId: string | null; label: string; mime: string; bytes: Uint8Array }) => {
      const id = await (await local.store).addPhoto({ siteId, ...photo });
      await after();
      return id;
    },
  };
}

// What the sync pill shows while the store opens: nothing confirmed yet, nothing known to be waiting.
const OPENING: SyncSnapshot = { phase: "up-to-date", pending: 0, photosWaiting: 0, uploading: null, lastSyncedAt: null, problem: null, failures: 0 };
const noSubscription = () => () => undefined;

export function useSyncState(): SyncSnapshot & { syncNow: () => Promise<void> } {
  const { current, runner } = useLocal();
  const snapshot = useSyncExternalStore(
    current ? (cb) => current.subscribe(cb) : noSubscription,
    () => (current ? current.state : OPENING),
  );
  return { ...snapshot, syncNow: async () => (await runner).syncNow() };
}
