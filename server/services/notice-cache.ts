import { randomUUID } from "node:crypto";
import pg from "pg";
import type { Logger } from "../logger";

/** Answers remembered between requests, for as long as the database says when they change. */
export interface NoticeDirectory<V> {
  /** The answer for `key` as it is now (undefined when there is none). */
  find(key: string): Promise<V | undefined>;
  /** Read `key` again on its next request (this server changed it). */
  forget(key: string): void;
  /** Answers are being remembered (the database's change notices are arriving). */
  readonly isListening: boolean;
  close(): Promise<void>;
}

export type NoticeLookup<V> = (key: string) => Promise<V | undefined>;

/** Every request reads the database: for apps built without a running server (tests, scripts). */
export function uncached<V>(lookup: NoticeLookup<V>): NoticeDirectory<V> {
  return { find: lookup, forget: () => {}, isListening: false, close: async () => {} };
}

/** Payloads a server sends itself to prove its notices still arrive (keys never start so). */
const HEARTBEAT_PREFIX = "heartbeat:";

/**
 * Answers remembered by key, for as long as the database can tell us when they change.
 *
 * Every change the answers depend on sends a notice naming the key (or "*" for every key) when it
 * commits, through triggers in the migrations. While this server is listening it remembers each answer
 * it has read, and forgets one the moment a notice names its key; a read that was already on its way
 * when a notice arrived is not kept, since it may predate the change. While it is not listening
 * (starting, or the listening connection was lost) it remembers nothing and reads every request fresh,
 * exactly as without a cache. Entries also expire after `maxAgeMs` whatever happens, and the oldest
 * read is dropped first once `maxEntries` are kept.
 */
export class NoticeCache<V> implements NoticeDirectory<V> {
  private readonly entries = new Map<string, { value: V; readAt: number }>();
  /** Counts every forgetting; a read remembers the count it started at. */
  private tick = 0;
  /** When each key was last forgotten, and when every key was (a "*" notice, a lost connection). */
  private readonly forgottenAt = new Map<string, number>();
  private allForgottenAt = 0;
  /** Reads on their way; once none are, no forgetting can overtake one and `forgottenAt` is emptied. */
  private inFlight = 0;
  private listening = false;

  constructor(
    private readonly lookup: NoticeLookup<V>,
    private readonly options: { maxAgeMs: number; maxEntries: number },
  ) {}

  async find(key: string): Promise<V | undefined> {
    if (this.listening) {
      const hit = this.entries.get(key);
      if (hit !== undefined && Date.now() - hit.readAt < this.options.maxAgeMs) return hit.value;
    }
    const startedAt = this.tick;
    const readAt = Date.now();
    this.inFlight++;
    let value: V | undefined;
    try {
      value = await this.lookup(key);
    } finally {
      this.inFlight--;
    }
    // Kept only if nothing forgot this key (or every key) while it was on its way.
    const overtaken = this.allForgottenAt > startedAt || (this.forgottenAt.get(key) ?? 0) > startedAt;
    if (value !== undefined && this.listening && !overtaken) {
      this.entries.delete(key);
      if (this.entries.size >= this.options.maxEntries) this.entries.delete(this.entries.keys().next().value!);
      this.entries.set(key, { value, readAt });
    }
    if (this.inFlight === 0) this.forgottenAt.clear();
    return value;
  }

  forget(key: string): void {
    this.entries.delete(key);
    if (this.inFlight === 0) return; // no read on its way to overtake
    if (this.forgottenAt.size >= this.options.maxEntries) this.forgetAll();
    else this.forgottenAt.set(key, ++this.tick);
  }

  /** A notice from the database: one key, or "*" (or nothing) for every key; heartbeats are not notices of change. */
  changed(payload: string): void {
    if (payload.startsWith(HEARTBEAT_PREFIX)) return;
    if (payload === "*" || payload === "") this.forgetAll();
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
    this.allForgottenAt = ++this.tick;
    this.forgottenAt.clear();
    this.entries.clear();
  }

  async close(): Promise<void> {
    this.setListening(false);
  }
}

/** What starting a cache fed by change notices takes: the listener's connection and heartbeat, and the cache's bounds. */
export interface NoticeCacheStart extends Pick<NoticeListenerOptions, "connectionString" | "logger" | "pool" | "heartbeatMs" | "heartbeatTimeoutMs"> {
  maxAgeMs?: number;
  maxEntries?: number;
}

export interface NoticeListenerOptions {
  connectionString: string;
  /** The channel the triggers send on; its notices name the keys that changed. */
  channel: string;
  /** How the listening connection shows in pg_stat_activity. */
  applicationName: string;
  /** What the log calls these answers ("member", "site list"). */
  what: string;
  logger: Logger;
  /** The app's pool: heartbeats go out through it, the way any change would arrive. */
  pool: pg.Pool;
  /** How often a heartbeat is sent, and how long it may take to come back before the connection counts as lost. */
  heartbeatMs?: number;
  heartbeatTimeoutMs?: number;
}

/**
 * Feed `cache` from a dedicated connection that LISTENs on `channel`. When that connection drops, the
 * cache empties and stops remembering, then the connection is retried (1 s, doubling to 30 s) and
 * remembering resumes once listening again. A connection can also die without saying so (a dropped
 * network path, a proxy that swallows notices), so every `heartbeatMs` the server sends itself a
 * heartbeat notice; one that has not come back within `heartbeatTimeoutMs` counts as a lost connection.
 */
export async function listenForChanges<V>(cache: NoticeCache<V>, options: NoticeListenerOptions): Promise<NoticeDirectory<V>> {
  const { channel, logger, what } = options;
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
    const c = new pg.Client({ connectionString: options.connectionString, application_name: options.applicationName, keepAlive: true });
    const lost = (err?: Error) => {
      if (client !== c) return;
      client = undefined;
      stopHeartbeat();
      cache.setListening(false);
      c.removeAllListeners("notification");
      c.end().catch(() => {});
      if (closed) return;
      wasLost = true;
      logger.warn({ err: err?.message }, `${what} change notices lost; reading every ${what} fresh until they resume`);
      retryTimer = setTimeout(reconnect, retryMs);
      retryMs = Math.min(retryMs * 2, 30_000);
    };
    const heartbeat = () => {
      if (awaited) return;
      const payload = `${HEARTBEAT_PREFIX}${randomUUID()}`;
      awaited = { payload, timer: setTimeout(() => lost(new Error(`no heartbeat notice back within ${heartbeatTimeoutMs} ms`)), heartbeatTimeoutMs) };
      awaited.timer.unref();
      // A database that cannot be reached shows up as the heartbeat not coming back.
      options.pool.query("select pg_notify($1, $2)", [channel, payload]).catch(() => {});
    };
    c.on("error", lost);
    c.on("end", () => lost());
    c.on("notification", (n) => {
      if (n.channel !== channel) return;
      if (awaited && n.payload === awaited.payload) {
        clearTimeout(awaited.timer);
        awaited = undefined;
      }
      cache.changed(n.payload ?? "*");
    });
    client = c;
    try {
      await c.connect();
      await c.query(`LISTEN ${pg.escapeIdentifier(channel)}`);
    } catch (err) {
      lost(err as Error);
      return;
    }
    if (client !== c || closed) return;
    retryMs = 1000;
    cache.setListening(true);
    heartbeatTimer = setInterval(heartbeat, heartbeatMs);
    heartbeatTimer.unref();
    if (wasLost) logger.info(`${what} change notices resumed`);
    wasLost = false;
  };
  const reconnect = () => {
    retryTimer = undefined;
    if (!closed) void connect();
  };

  await connect();
  return {
    find: (key) => cache.find(key),
    forget: (key) => cache.forget(key),
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
