import { randomUUID } from "node:crypto";
import pg from "pg";
import type { Role } from "../../survey/policy";
import type { Logger } from "../logger";

export interface Member {
  userId: string;
  name: string | null;
  email: string;
  teamId: string;
  role: Role;
}

export interface MemberDirectory {
  /** The user's membership as it is now, or undefined when they belong to no team. */
  find(userId: string): Promise<Member | undefined>;
  /** Read this user again on their next request (this server changed their membership). */
  forget(userId: string): void;
  /** Members are being remembered (the database's change notices are arriving). */
  readonly isListening: boolean;
  close(): Promise<void>;
}

export type MemberLookup = (userId: string) => Promise<Member | undefined>;

/** Every request reads the database: for apps built without a running server (tests, scripts). */
export function uncachedMembers(lookup: MemberLookup): MemberDirectory {
  return { find: lookup, forget: () => {}, isListening: false, close: async () => {} };
}

export const MEMBER_CHANNEL = "member_changed";
/** Payloads a server sends itself to prove its notices still arrive (user ids never start so). */
const HEARTBEAT_PREFIX = "heartbeat:";

/**
 * Memberships remembered between requests, for as long as the database can tell us when they change.
 *
 * Every change to a membership, or to a member's name or e-mail, sends a notice on `member_changed`
 * when it commits (migration 0007). While this server is listening it remembers each member it has
 * read, and forgets one the moment a notice names them; a read that was already on its way when a
 * notice arrived is not kept, since it may predate the change. While it is not listening (starting,
 * or the listening connection was lost) it remembers nothing and reads every request fresh, exactly
 * as without a cache. Entries also expire after `maxAgeMs` whatever happens.
 */
export class MemberCache implements MemberDirectory {
  private readonly entries = new Map<string, { member: Member; readAt: number }>();
  /** Bumped by every notice and by every loss of the listening connection. */
  private generation = 0;
  private listening = false;

  constructor(
    private readonly lookup: MemberLookup,
    private readonly options: { maxAgeMs: number; maxEntries: number },
  ) {}

  async find(userId: string): Promise<Member | undefined> {
    if (this.listening) {
      const hit = this.entries.get(userId);
      if (hit !== undefined && Date.now() - hit.readAt < this.options.maxAgeMs) return hit.member;
    }
    const generation = this.generation;
    const readAt = Date.now();
    const member = await this.lookup(userId);
    if (member !== undefined && this.listening && generation === this.generation) {
      this.entries.delete(userId);
      if (this.entries.size >= this.options.maxEntries) this.entries.delete(this.entries.keys().next().value!);
      this.entries.set(userId, { member, readAt });
    }
    return member;
  }

  forget(userId: string): void {
    this.generation++;
    this.entries.delete(userId);
  }

  /** A notice from the database: one user id, or "*" for everyone (heartbeats are not notices of change). */
  changed(payload: string): void {
    if (payload.startsWith(HEARTBEAT_PREFIX)) return;
    if (payload === "*") this.forgetAll();
    else this.forget(payload);
  }

  /** Whether notices are arriving; remembering is only safe while they are. */
  setListening(listening: boolean): void {
    this.forgetAll();
    this.listening = listening;
  }

  get isListening(): boolean {
    return this.listening;
  }

  private forgetAll(): void {
    this.generation++;
    this.entries.clear();
  }

  async close(): Promise<void> {
    this.setListening(false);
  }
}

export interface MemberDirectoryOptions {
  connectionString: string;
  lookup: MemberLookup;
  logger: Logger;
  /** The app's pool: heartbeats go out through it, the way any change would arrive. */
  pool: pg.Pool;
  maxAgeMs?: number;
  maxEntries?: number;
  /** How often a heartbeat is sent, and how long it may take to come back before the connection counts as lost. */
  heartbeatMs?: number;
  heartbeatTimeoutMs?: number;
}

/**
 * A member cache fed by a dedicated connection that LISTENs on `member_changed`. When that
 * connection drops, the cache empties and stops remembering, then the connection is retried
 * (1 s, doubling to 30 s) and remembering resumes once listening again. A connection can also die
 * without saying so (a dropped network path, a proxy that swallows notices), so every
 * `heartbeatMs` the server sends itself a heartbeat notice; one that has not come back within
 * `heartbeatTimeoutMs` counts as a lost connection.
 */
export async function startMemberDirectory(options: MemberDirectoryOptions): Promise<MemberDirectory> {
  const cache = new MemberCache(options.lookup, { maxAgeMs: options.maxAgeMs ?? 60_000, maxEntries: options.maxEntries ?? 10_000 });
  let client: pg.Client | undefined;
  let closed = false;
  let retryMs = 1000;
  let retryTimer: NodeJS.Timeout | undefined;

  const heartbeatMs = options.heartbeatMs ?? 10_000;
  const heartbeatTimeoutMs = options.heartbeatTimeoutMs ?? 5_000;
  let heartbeatTimer: NodeJS.Timeout | undefined;
  /** The heartbeat on its way back, and the timer that declares the connection lost if it is not. */
  let awaited: { payload: string; timer: NodeJS.Timeout } | undefined;
  let wasLost = false;
  const stopHeartbeat = () => {
    if (heartbeatTimer) clearInterval(heartbeatTimer);
    heartbeatTimer = undefined;
    if (awaited) clearTimeout(awaited.timer);
    awaited = undefined;
  };

  const connect = async () => {
    const c = new pg.Client({ connectionString: options.connectionString, application_name: "dropwise-member-changes", keepAlive: true });
    const lost = (err?: Error) => {
      if (client !== c) return;
      client = undefined;
      stopHeartbeat();
      cache.setListening(false);
      c.removeAllListeners("notification");
      c.end().catch(() => {});
      if (closed) return;
      wasLost = true;
      options.logger.warn({ err: err?.message }, "member change notices lost; reading members fresh until they resume");
      retryTimer = setTimeout(reconnect, retryMs);
      retryMs = Math.min(retryMs * 2, 30_000);
    };
    const heartbeat = () => {
      if (awaited) return;
      const payload = `${HEARTBEAT_PREFIX}${randomUUID()}`;
      awaited = { payload, timer: setTimeout(() => lost(new Error(`no heartbeat notice back within ${heartbeatTimeoutMs} ms`)), heartbeatTimeoutMs) };
      awaited.timer.unref();
      // A database that cannot be reached shows up as the heartbeat not coming back.
      options.pool.query("select pg_notify($1, $2)", [MEMBER_CHANNEL, payload]).catch(() => {});
    };
    c.on("error", lost);
    c.on("end", () => lost());
    c.on("notification", (n) => {
      if (n.channel !== MEMBER_CHANNEL) return;
      if (awaited && n.payload === awaited.payload) {
        clearTimeout(awaited.timer);
        awaited = undefined;
      }
      cache.changed(n.payload ?? "*");
    });
    client = c;
    try {
      await c.connect();
      await c.query(`LISTEN ${MEMBER_CHANNEL}`);
    } catch (err) {
      lost(err as Error);
      return;
    }
    if (client !== c || closed) return;
    retryMs = 1000;
    cache.setListening(true);
    heartbeatTimer = setInterval(heartbeat, heartbeatMs);
    heartbeatTimer.unref();
    if (wasLost) options.logger.info("member change notices resumed");
    wasLost = false;
  };
  const reconnect = () => {
    retryTimer = undefined;
    if (!closed) void connect();
  };

  await connect();
  return {
    find: (userId) => cache.find(userId),
    forget: (userId) => cache.forget(userId),
    get isListening() {
      return cache.isListening;
    },
    async close() {
      closed = true;
      if (retryTimer) clearTimeout(retryTimer);
      stopHeartbeat();
      await cache.close();
      const c = client;
      client = undefined;
      await c?.end().catch(() => {});
    },
  };
}
