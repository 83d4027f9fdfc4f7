import type { Role } from "../../survey/policy";
import { listenForChanges, NoticeCache, uncached, type NoticeCacheStart, type NoticeDirectory, type NoticeLookup } from "../services/notice-cache";

export interface Member {
  userId: string;
  name: string | null;
  email: string;
  teamId: string;
  role: Role;
}

/** Memberships by user id: `find` gives the user's membership as it is now, or undefined when they belong to no team. */
export type MemberDirectory = NoticeDirectory<Member>;
export type MemberLookup = NoticeLookup<Member>;

/** Every request reads the database: for apps built without a running server (tests, scripts). */
export const uncachedMembers: (lookup: MemberLookup) => MemberDirectory = uncached;

export const MEMBER_CHANNEL = "member_changed";

/**
 * Memberships remembered between requests (see `NoticeCache`). Every change to a membership, or to a
 * member's name or e-mail, sends a notice on `member_changed` naming the user when it commits
 * (migration 0007); a truncate names everyone ("*").
 */
export class MemberCache extends NoticeCache<Member> {}

export interface MemberDirectoryOptions extends NoticeCacheStart {
  lookup: MemberLookup;
}

/** A member cache fed by a dedicated connection that LISTENs on `member_changed` (see `listenForChanges`). */
export function startMemberDirectory(options: MemberDirectoryOptions): Promise<MemberDirectory> {
  const cache = new MemberCache(options.lookup, { maxAgeMs: options.maxAgeMs ?? 60_000, maxEntries: options.maxEntries ?? 10_000 });
  return listenForChanges(cache, {
    ...options,
    channel: MEMBER_CHANNEL,
    applicationName: "dropwise-member-changes",
    what: "member",
  });
}
