// A sync request that is accepted and never answered ends as "no connection", so the round is
// retried with backoff instead of the phone saying "sending" for ever.
import { afterEach, describe, expect, it, vi } from "vitest";
import { OfflineError } from "../../sync/http";
import { timedTransport } from "../../sync/http-transport";

afterEach(() => vi.unstubAllGlobals());

describe("sync requests", () => {
  it("give up after their time and count as offline; the request was aborted", async () => {
    let aborted = false;
    vi.stubGlobal("fetch", (_url: string, init: RequestInit) =>
      new Promise((_resolve, reject) => {
        init.signal?.addEventListener("abort", () => {
          aborted = true;
          reject(init.signal!.reason);
        });
      }));
    await expect(timedTransport(50).push({ clientId: "00000000-0000-4000-8000-000000000000", mutations: [] })).rejects.toBeInstanceOf(OfflineError);
    expect(aborted).toBe(true);
  });

  it("a quick answer is read as usual", async () => {
    vi.stubGlobal("fetch", async () => new Response(JSON.stringify({ lastMutationId: 3 }), { status: 200, headers: { "Content-Type": "application/json" } }));
    await expect(timedTransport(50).push({ clientId: "00000000-0000-4000-8000-000000000000", mutations: [] })).resolves.toEqual({ lastMutationId: 3 });
  });
});
