import type { PullRequest, PullResponse, PushRequest, PushResponse } from "../../sync/protocol";
import type { SyncTransport } from "../../sync/local-store";
import type { Agent } from "./auth-client";

export class HttpStatusError extends Error {
  constructor(
    readonly status: number,
    readonly body: unknown,
  ) {
    super(`HTTP ${status}: ${JSON.stringify(body)}`);
  }
}

/** The sync protocol over a signed-in supertest agent (the same requests the app sends). */
export function agentTransport(getAgent: () => Agent): SyncTransport {
  return {
    async push(request: PushRequest) {
      const res = await getAgent().post("/api/sync/push").send(request);
      if (res.status !== 200) throw new HttpStatusError(res.status, res.body);
      return res.body as PushResponse;
    },
    async pull(request: PullRequest) {
      const res = await getAgent().post("/api/sync/pull").send(request);
      if (res.status !== 200) throw new HttpStatusError(res.status, res.body);
      return res.body as PullResponse;
    },
  };
}
