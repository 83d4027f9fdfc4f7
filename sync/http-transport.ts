import type { SyncTransport } from "./local-store";
import { apiFetch } from "./http";
import type { PullRequest, PullResponse, PushRequest, PushResponse } from "./protocol";

export const httpTransport: SyncTransport = {
  push: (request: PushRequest) => apiFetch<PushResponse>("/api/sync/push", { body: request }),
  pull: (request: PullRequest) => apiFetch<PullResponse>("/api/sync/pull", { body: request }),
};
