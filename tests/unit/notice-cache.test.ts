// What a notice cache (server/services/notice-cache.ts) keeps when forgetting and reading overlap: a read is
// dropped only when its own key, or every key, was forgotten while it was on its way.
import { describe, expect, it, vi } from "vitest";
import { NoticeCache } from "../../server/services/notice-cache";

/** A lookup whose answers are released by hand, in the order the reads were made. */
function held() {
  const pending: { key: string; resolve: (v: string) => void }[] = [];
  const lookup = vi.fn((key: string) => new Promise<string | undefined>((resolve) => pending.push({ key, resolve })));
  const release = (key: string, value: string) => {
    const k = pending.findIndex((p) => p.key === key);
    pending.splice(k, 1)[0].resolve(value);
  };
  return { lookup, release, cache: new NoticeCache<string>(lookup, { maxAgeMs: 60_000, maxEntries: 4 }) };
}

describe("notice cache", () => {
  it("keeps a read when another key is forgotten on its way, and drops it when its own key is", async () => {
    const { lookup, release, cache } = held();
    cache.setListening(true);
    const teamA = cache.find("team_a");
    const teamB = cache.find("team_b");
    cache.forget("team_b");
    release("team_a", "A1");
    release("team_b", "B1");
    await Promise.all([teamA, teamB]);
    expect(await cache.find("team_a")).toBe("A1"); // remembered: nothing forgot it
    expect(lookup).toHaveBeenCalledTimes(2);
    const again = cache.find("team_b"); // dropped: it may predate the change
    expect(lookup).toHaveBeenCalledTimes(3);
    release("team_b", "B2");
    expect(await again).toBe("B2");
  });

  it("drops every read on its way when every key is forgotten, including by an empty notice", async () => {
    for (const notice of ["*", ""]) {
      const { lookup, release, cache } = held();
      cache.setListening(true);
      const teamA = cache.find("team_a");
      cache.changed(notice);
      release("team_a", "A1");
      await teamA;
      void cache.find("team_a");
      expect(lookup).toHaveBeenCalledTimes(2);
    }
  });

  it("keeps reads that start after a forgetting, and stays bounded when many keys are forgotten during a slow read", async () => {
    const { lookup, release, cache } = held();
    cache.setListening(true);
    const slow = cache.find("team_slow");
    for (const k of ["k1", "k2", "k3", "k4", "k5"]) cache.forget(k); // more than maxEntries: counts as forgetting all
    const later = cache.find("team_a");
    release("team_a", "A1");
    await later;
    release("team_slow", "S1");
    await slow;
    expect(await cache.find("team_a")).toBe("A1");
    void cache.find("team_slow"); // overtaken by the forgetting of every key
    expect(lookup).toHaveBeenCalledTimes(3);
  });
});
