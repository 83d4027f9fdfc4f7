// Runs sync rounds for one local store: when something changes, when the connection returns,
// on demand, and with backoff while the server cannot be reached. Nothing here ever drops data:
// a failed round leaves the outbox and the photos where they were.
import { ApiError, OfflineError } from "./http";
import type { LocalPhoto, LocalStore, SyncTransport } from "./local-store";

export type SyncPhase = "saved-on-phone" | "sending" | "up-to-date" | "needs-you";

export interface SyncSnapshot {
  phase: SyncPhase;
  pending: number;
  photosWaiting: number;
  uploading: { id: string; progress: number } | null;
  lastSyncedAt: number | null;
  /** Why the phase is "needs-you" (signed out, a refused photo…), in words for the surveyor. */
  problem: string | null;
  /** How many rounds in a row could not reach the server. */
  failures: number;
}

export interface SyncRunnerDeps {
  store: LocalStore;
  transport: SyncTransport;
  upload: (photo: LocalPhoto, onProgress: (fraction: number) => void) => Promise<void>;
  isOnline: () => boolean;
  onSynced?: () => void;
  now?: () => number;
  setTimer?: (fn: () => void, ms: number) => unknown;
  clearTimer?: (t: unknown) => void;
}

export const BACKOFF_MS = [2_000, 5_000, 15_000, 30_000, 60_000];

export class SyncRunner {
  private snapshot: SyncSnapshot = { phase: "up-to-date", pending: 0, photosWaiting: 0, uploading: null, lastSyncedAt: null, problem: null, failures: 0 };
  private listeners = new Set<(s: SyncSnapshot) => void>();
  private running: Promise<void> | null = null;
  private again = false;
  private timer: unknown = null;

  constructor(private readonly deps: SyncRunnerDeps) {}

  get state(): SyncSnapshot {
    return this.snapshot;
  }

  subscribe(listener: (s: SyncSnapshot) => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  private set(patch: Partial<SyncSnapshot>) {
    this.snapshot = { ...this.snapshot, ...patch };
    for (const l of this.listeners) l(this.snapshot);
  }

  /** Refreshes the counts without syncing (after a local change, while offline). */
  async refresh() {
    const [pending, photos] = await Promise.all([this.deps.store.pendingCount(), this.deps.store.photosToUpload()]);
    const waiting = pending + photos.length;
    this.set({ pending, photosWaiting: photos.length, phase: this.snapshot.phase === "needs-you" ? "needs-you" : this.running ? "sending" : waiting ? "saved-on-phone" : this.snapshot.phase });
  }

  /** Asks for a round now; rounds never overlap (a request during a round runs one more after it). */
  syncNow(): Promise<void> {
    if (this.running) {
      this.again = true;
      return this.running;
    }
    this.running = this.round().finally(() => {
      this.running = null;
      if (this.again) {
        this.again = false;
        void this.syncNow();
      }
    });
    return this.running;
  }

  private schedule(ms: number) {
    const { setTimer = setTimeout, clearTimer = clearTimeout } = this.deps;
    if (this.timer) clearTimer(this.timer as never);
    this.timer = setTimer(() => {
      this.timer = null;
      void this.syncNow();
    }, ms);
  }

  private async round() {
    const { store, transport, upload, isOnline, now = Date.now } = this.deps;
    await this.refresh();
    if (!isOnline()) {
      this.set({ phase: this.snapshot.pending || this.snapshot.photosWaiting ? "saved-on-phone" : this.snapshot.phase });
      return;
    }
    this.set({ phase: "sending", problem: null });
    try {
      await store.sync(transport);
      for (const photo of await store.photosToUpload()) {
        this.set({ uploading: { id: photo.id, progress: 0 } });
        try {
          await upload(photo, (progress) => this.set({ uploading: { id: photo.id, progress } }));
          await store.markPhotoUploaded(photo.id);
        } catch (err) {
          // A photo the server refuses (too big, not an image) must not block the others or the queue.
          if (err instanceof ApiError && err.status < 500 && err.status !== 401) {
            await store.markPhotoUploaded(photo.id);
            this.set({ problem: `A photo was refused: ${err.message}` });
          } else throw err;
        }
      }
      this.set({ uploading: null });
      if (this.snapshot.photosWaiting) await store.sync(transport); // bring the uploaded photos' records back
      await this.refresh();
      this.set({ phase: this.snapshot.problem ? "needs-you" : this.snapshot.pending ? "saved-on-phone" : "up-to-date", lastSyncedAt: now(), failures: 0 });
      this.deps.onSynced?.();
    } catch (err) {
      this.set({ uploading: null });
      await this.refresh();
      if (err instanceof ApiError && err.status === 401) {
        this.set({ phase: "needs-you", problem: "Sign in again to send your changes. They are kept on this phone until then." });
        return;
      }
      if (err instanceof ApiError && err.status === 403) {
        this.set({ phase: "needs-you", problem: err.message });
        return;
      }
      const failures = this.snapshot.failures + 1;
      this.set({ phase: "saved-on-phone", failures, problem: err instanceof OfflineError ? null : `Sending failed (${err instanceof Error ? err.message : String(err)}); retrying.` });
      this.schedule(BACKOFF_MS[Math.min(failures - 1, BACKOFF_MS.length - 1)]);
    }
  }

  dispose() {
    const { clearTimer = clearTimeout } = this.deps;
    if (this.timer) clearTimer(this.timer as never);
    this.listeners.clear();
  }
}
