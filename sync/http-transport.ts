import type { SyncTransport } from "./local-store";
import { apiFetch } from "./http";
import type { PullRequest, PullResponse, PushRequest, PushResponse } from "./protocol";

/**
 * How long one push or pull may take before the round counts as "no connection" and is tried again
 * with backoff. A connection that accepts requests and never answers (a weak signal in a basement)
 * would otherwise leave the phone saying "sending" for ever. Retrying is safe: the server applies
 * each mutation once, by its id.
 */
export const SYNC_REQUEST_TIMEOUT_MS = 30_000;

export function timedTransport(timeoutMs = SYNC_REQUEST_TIMEOUT_MS): SyncTransport {
  return {
    push: (request: PushRequest) => apiFetch<PushResponse>("/api/sync/push", { body: request, signal: AbortSignal.timeout(timeoutMs) }),
    pull: (request: PullRequest) => apiFetch<PullResponse>("/api/sync/pull", { body: request, signal: AbortSignal.timeout(timeoutMs) }),
  };
}

export const httpTransport: SyncTransport = timedTransport();
