// Memberships remembered between requests (server/auth/member-directory.ts): remembered only while the
// database's change notices arrive, forgotten by a notice, and never kept when a notice overtook the read.
import { afterEach, describe, expect, it, vi } from "vitest";
import { MemberCache, type Member } from "../../server/auth/member-directory";

const priya: Member = { userId: "user_priya", name: "Priya", email: "priya@lanternfield.test", teamId: "team_1", role: "surveyor" };

function counted(answer: () => Member | undefined = () => priya) {
  const lookup = vi.fn(async (_userId: string) => answer());
  return { lookup, cache: new MemberCache(lookup, { maxAgeMs: 60_000, maxEntries: 3 }) };
}

afterEach(() => vi.useRealTimers());

describe("member cache", () => {
  it("reads every request while it is not listening", async () => {
    const { lookup, cache } = counted();
    await cache.find("user_priya");
    await cache.find("user_priya");
    expect(lookup).toHaveBeenCalledTimes(2);
  });

  it("reads a member once while listening, and again after a notice names them or everyone", async () => {
    const { lookup, cache } = counted();
    cache.setListening(true);
    expect(await cache.find("user_priya")).toEqual(priya);
    await cache.find("user_priya");
    expect(lookup).toHaveBeenCalledTimes(1);
    cache.changed("user_other");
    await cache.find("user_priya");
    expect(lookup).toHaveBeenCalledTimes(1);
    cache.changed("user_priya");
    await cache.find("user_priya");
    expect(lookup).toHaveBeenCalledTimes(2);
    cache.changed("*");
    await cache.find("user_priya");
    expect(lookup).toHaveBeenCalledTimes(3);
  });

  it("does not keep a read that a notice overtook: it may predate the change", async () => {
    let release!: (m: Member) => void;
    const lookup = vi.fn((_userId: string) => new Promise<Member | undefined>((resolve) => (release = resolve)));
    const cache = new MemberCache(lookup, { maxAgeMs: 60_000, maxEntries: 10 });
    cache.setListening(true);
    const inFlight = cache.find("user_priya");
    cache.changed("user_priya"); // the role changed while the old row was on its way
    release(priya);
    expect(await inFlight).toEqual(priya);
    const next = cache.find("user_priya");
    release({ ...priya, role: "designer" });
    expect((await next)?.role).toBe("designer");
    expect(lookup).toHaveBeenCalledTimes(2);
  });

  it("does not keep a read that began before listening started, or that this server forgot on the way", async () => {
    const releases: ((m: Member) => void)[] = [];
    const lookup = vi.fn((_userId: string) => new Promise<Member | undefined>((resolve) => releases.push(resolve)));
    const cache = new MemberCache(lookup, { maxAgeMs: 60_000, maxEntries: 10 });
    const early = cache.find("user_priya"); // notices not yet arriving: a change now would go unseen
    cache.setListening(true);
    releases.shift()!(priya);
    await early;
    const again = cache.find("user_priya");
    cache.forget("user_priya"); // this server changed Priya's role meanwhile
    releases.shift()!(priya);
    await again;
    const third = cache.find("user_priya");
    releases.shift()!({ ...priya, role: "designer" });
    expect((await third)?.role).toBe("designer");
    expect(lookup).toHaveBeenCalledTimes(3);
  });

  it("ignores its own heartbeats", async () => {
    const { lookup, cache } = counted();
    cache.setListening(true);
    await cache.find("user_priya");
    cache.changed("heartbeat:0f8e");
    await cache.find("user_priya");
    expect(lookup).toHaveBeenCalledTimes(1);
  });

  it("forgets everything and reads fresh once notices stop", async () => {
    const { lookup, cache } = counted();
    cache.setListening(true);
    await cache.find("user_priya");
    cache.setListening(false);
    await cache.find("user_priya");
    await cache.find("user_priya");
    expect(lookup).toHaveBeenCalledTimes(3);
  });

  it("never remembers someone who belongs to no team, and lets entries expire", async () => {
    vi.useFakeTimers({ toFake: ["Date"] });
    vi.setSystemTime(new Date("2026-12-02T10:00:00Z"));
    const nobody = counted(() => undefined);
    nobody.cache.setListening(true);
    await nobody.cache.find("user_gone");
    await nobody.cache.find("user_gone");
    expect(nobody.lookup).toHaveBeenCalledTimes(2);

    const { lookup, cache } = counted();
    cache.setListening(true);
    await cache.find("user_priya");
    vi.setSystemTime(new Date("2026-12-02T10:01:01Z"));
    await cache.find("user_priya");
    expect(lookup).toHaveBeenCalledTimes(2);
  });

  it("holds at most maxEntries members, dropping the oldest read", async () => {
    const lookup = vi.fn(async (userId: string) => ({ ...priya, userId }));
    const cache = new MemberCache(lookup, { maxAgeMs: 60_000, maxEntries: 2 });
    cache.setListening(true);
    for (const id of ["a", "b", "c"]) await cache.find(id);
    await cache.find("c");
    await cache.find("b");
    expect(lookup).toHaveBeenCalledTimes(3);
    await cache.find("a");
    expect(lookup).toHaveBeenCalledTimes(4);
  });
});
