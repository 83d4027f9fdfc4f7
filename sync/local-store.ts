// The phone's offline store: what the server last said (server_* tables), what the surveyor sees
// (the server state with the pending changes applied on top), and the outbox of pending changes.
//
// Every user action writes its rows and its outbox entry in one exclusive transaction. A sync round
// pushes the outbox, then pulls; the pull replaces the server state, drops the outbox entries the
// server has applied, and re-applies the rest on top (rebase). Works over any SQLite: expo-sqlite
// on the web, sql.js in the tests.
import { mergeFields, type ItemKind } from "../survey/capture";
import { MAX_BATCH, type ConflictNote, type Mutation, type MutationArgs, type MutationName, type PullResponse, type PushRequest, type PushResponse, type PullRequest, type Rejection, type SiteRecord } from "./protocol";

export interface SqlDb {
  run(sql: string, params?: SqlValue[]): Promise<void>;
  all<T>(sql: string, params?: SqlValue[]): Promise<T[]>;
  /** Runs `fn` alone: no other statement interleaves, and it all commits or none of it. */
  exclusive<T>(fn: (tx: SqlDb) => Promise<T>): Promise<T>;
}
export type SqlValue = string | number | null | Uint8Array;

export interface SyncTransport {
  push(request: PushRequest): Promise<PushResponse>;
  pull(request: PullRequest): Promise<PullResponse>;
}

export interface LocalItem {
  id: string;
  siteId: string;
  kind: ItemKind;
  data: Record<string, unknown>;
  deleted: boolean;
  version: number;
}

export interface LocalPhoto {
  id: string;
  siteId: string;
  itemId: string | null;
  label: string;
  mime: string;
  size: number;
  /** The bytes while they are only on this phone (or were taken here); null for others' photos. */
  bytes: Uint8Array | null;
  uploaded: boolean;
}

export interface PendingChange {
  id: number;
  name: MutationName;
  args: Mutation["args"];
  createdAt: number;
}

const SCHEMA_VERSION = 1;

const SCHEMA_V1 = [
  "create table if not exists meta (key text primary key, value text not null)",
  "create table if not exists server_sites (id text primary key, name text not null, address text not null, status text not null, units text not null, closet_room_id text, version integer not null)",
  "create table if not exists sites (id text primary key, name text not null, address text not null, status text not null, units text not null, closet_room_id text, version integer not null)",
  "create table if not exists server_items (id text primary key, site_id text not null, kind text not null, data text not null, deleted integer not null, version integer not null)",
  "create table if not exists items (id text primary key, site_id text not null, kind text not null, data text not null, deleted integer not null, version integer not null)",
  "create index if not exists items_site on items (site_id)",
  "create table if not exists outbox (id integer primary key, name text not null, args text not null, created_at integer not null)",
  "create table if not exists rejections (mutation_id integer primary key, code text not null, message text not null, seen integer not null default 0)",
  "create table if not exists conflicts (id text primary key, site_id text not null, item_id text not null, field text not null, lost text, kept text, lost_by text, kept_by text, seen integer not null default 0)",
  "create table if not exists photos (id text primary key, site_id text not null, item_id text, label text not null, mime text not null, size integer not null, bytes blob, uploaded integer not null, created_at integer not null)",
];

function uuid(): string {
  return globalThis.crypto.randomUUID();
}

interface ItemRow {
  id: string;
  site_id: string;
  kind: string;
  data: string;
  deleted: number;
  version: number;
}
const toItem = (r: ItemRow): LocalItem => ({ id: r.id, siteId: r.site_id, kind: r.kind as ItemKind, data: JSON.parse(r.data), deleted: r.deleted === 1, version: r.version });

interface SiteRow {
  id: string;
  name: string;
  address: string;
  status: string;
  units: string;
  closet_room_id: string | null;
  version: number;
}
const toSite = (r: SiteRow): SiteRecord => ({ id: r.id, name: r.name, address: r.address, status: r.status, units: r.units as SiteRecord["units"], closetRoomId: r.closet_room_id, version: r.version });

interface PhotoRow {
  id: string;
  site_id: string;
  item_id: string | null;
  label: string;
  mime: string;
  size: number;
  bytes: Uint8Array | null;
  uploaded: number;
}
const toPhoto = (r: PhotoRow): LocalPhoto => ({ id: r.id, siteId: r.site_id, itemId: r.item_id, label: r.label, mime: r.mime, size: r.size, bytes: r.bytes, uploaded: r.uploaded === 1 });

export interface SyncResult {
  pushed: number;
  pulled: number;
  rejections: Rejection[];
}

export class LocalStore {
  private constructor(
    private readonly db: SqlDb,
    readonly clientId: string,
  ) {}

  /** Opens (and migrates) the store. A new store gets a fresh random client id. */
  static async open(db: SqlDb): Promise<LocalStore> {
    const clientId = await db.exclusive(async (tx) => {
      const [{ user_version }] = await tx.all<{ user_version: number }>("pragma user_version");
      if (user_version < SCHEMA_VERSION) {
        for (const statement of SCHEMA_V1) await tx.run(statement);
        await tx.run(`pragma user_version = ${SCHEMA_VERSION}`);
      }
      const [row] = await tx.all<{ value: string }>("select value from meta where key = 'clientId'");
      if (row) return row.value;
      const id = uuid();
      await tx.run("insert into meta (key, value) values ('clientId', ?), ('nextMutationId', '1'), ('cursor', '0')", [id]);
      return id;
    });
    return new LocalStore(db, clientId);
  }

  // ---- reading --------------------------------------------------------------------------------

  async sites(): Promise<SiteRecord[]> {
    return (await this.db.all<SiteRow>("select * from sites order by name")).map(toSite);
  }

  async site(siteId: string): Promise<SiteRecord | undefined> {
    const [row] = await this.db.all<SiteRow>("select * from sites where id = ?", [siteId]);
    return row ? toSite(row) : undefined;
  }

  async items(siteId: string): Promise<LocalItem[]> {
    return (await this.db.all<ItemRow>("select * from items where site_id = ? and deleted = 0 order by id", [siteId])).map(toItem);
  }

  async item(itemId: string): Promise<LocalItem | undefined> {
    const [row] = await this.db.all<ItemRow>("select * from items where id = ?", [itemId]);
    return row ? toItem(row) : undefined;
  }

  async pending(): Promise<PendingChange[]> {
    const rows = await this.db.all<{ id: number; name: string; args: string; created_at: number }>("select * from outbox order by id");
    return rows.map((r) => ({ id: r.id, name: r.name as MutationName, args: JSON.parse(r.args), createdAt: r.created_at }));
  }

  async pendingCount(): Promise<number> {
    const [row] = await this.db.all<{ n: number }>("select count(*) as n from outbox");
    return row.n;
  }

  async meta(key: string): Promise<string | undefined> {
    const [row] = await this.db.all<{ value: string }>("select value from meta where key = ?", [key]);
    return row?.value;
  }

  async unseenRejections(): Promise<Rejection[]> {
    return this.db.all<Rejection>("select mutation_id as mutationId, code, message from rejections where seen = 0 order by mutation_id");
  }

  async unseenConflicts(): Promise<ConflictNote[]> {
    const rows = await this.db.all<{ id: string; site_id: string; item_id: string; field: string; lost: string | null; kept: string | null; lost_by: string | null; kept_by: string | null }>(
      "select * from conflicts where seen = 0",
    );
    return rows.map((r) => ({ id: r.id, siteId: r.site_id, itemId: r.item_id, field: r.field, lostValue: r.lost && JSON.parse(r.lost), keptValue: r.kept && JSON.parse(r.kept), lostBy: r.lost_by, keptBy: r.kept_by, version: 0 }));
  }

  async markSeen(what: { rejections?: number[]; conflicts?: string[] }) {
    await this.db.exclusive(async (tx) => {
      for (const id of what.rejections ?? []) await tx.run("update rejections set seen = 1 where mutation_id = ?", [id]);
      for (const id of what.conflicts ?? []) await tx.run("update conflicts set seen = 1 where id = ?", [id]);
    });
  }

  async photos(siteId: string): Promise<LocalPhoto[]> {
    return (await this.db.all<PhotoRow>("select * from photos where site_id = ? order by created_at", [siteId])).map(toPhoto);
  }

  async photosToUpload(): Promise<LocalPhoto[]> {
    return (await this.db.all<PhotoRow>("select * from photos where uploaded = 0 order by created_at")).map(toPhoto);
  }

  // ---- changing -------------------------------------------------------------------------------

  /** Records a change: applied to what the surveyor sees and queued, in one exclusive transaction. */
  async change<N extends MutationName>(name: N, args: MutationArgs<N>): Promise<number> {
    return this.db.exclusive(async (tx) => {
      const [{ value }] = await tx.all<{ value: string }>("select value from meta where key = 'nextMutationId'");
      const id = Number(value);
      const mutation = { id, name, args } as Mutation;
      await applyLocally(tx, mutation);
      await tx.run("insert into outbox (id, name, args, created_at) values (?, ?, ?, ?)", [id, name, JSON.stringify(args), Date.now()]);
      await tx.run("update meta set value = ? where key = 'nextMutationId'", [String(id + 1)]);
      return id;
    });
  }

  /** Creates or changes an item; only `fields` are sent, so edits to other fields merge on the server. */
  async putItem(siteId: string, kind: ItemKind, itemId: string, fields: Record<string, unknown>) {
    const [server] = await this.db.all<{ version: number }>("select version from server_items where id = ?", [itemId]);
    return this.change("item.put", { siteId, kind, itemId, fields, baseVersion: server?.version ?? 0 });
  }

  async deleteItem(siteId: string, itemId: string) {
    return this.change("item.delete", { siteId, itemId });
  }

  async updateSite(siteId: string, fields: MutationArgs<"site.update">["fields"]) {
    return this.change("site.update", { siteId, fields });
  }

  /** Keeps a photo on the phone until it can upload. */
  async addPhoto(photo: { siteId: string; itemId: string | null; label: string; mime: string; bytes: Uint8Array }): Promise<string> {
    const id = uuid();
    await this.db.exclusive((tx) =>
      tx.run("insert into photos (id, site_id, item_id, label, mime, size, bytes, uploaded, created_at) values (?, ?, ?, ?, ?, ?, ?, 0, ?)", [
        id,
        photo.siteId,
        photo.itemId,
        photo.label,
        photo.mime,
        photo.bytes.byteLength,
        photo.bytes,
        Date.now(),
      ]),
    );
    return id;
  }

  async markPhotoUploaded(id: string) {
    await this.db.exclusive((tx) => tx.run("update photos set uploaded = 1 where id = ?", [id]));
  }

  // ---- syncing --------------------------------------------------------------------------------

  /** One round: push everything pending (in batches), then pull and rebase. */
  async sync(transport: SyncTransport): Promise<SyncResult> {
    const pending = await this.pending();
    for (let i = 0; i < pending.length; i += MAX_BATCH) {
      const batch = pending.slice(i, i + MAX_BATCH).map((p) => ({ id: p.id, name: p.name, args: p.args }) as Mutation);
      await transport.push({ clientId: this.clientId, mutations: batch });
    }
    const cursor = Number((await this.meta("cursor")) ?? 0);
    const knownSiteIds = (await this.db.all<{ id: string }>("select id from server_sites")).map((r) => r.id);
    const response = await transport.pull({ clientId: this.clientId, cursor, knownSiteIds });
    await this.applyPull(response);
    return { pushed: pending.length, pulled: response.items.length + response.sites.length, rejections: response.rejections };
  }

  async applyPull(response: PullResponse): Promise<void> {
    await this.db.exclusive(async (tx) => {
      for (const siteId of response.removedSiteIds) {
        await tx.run("delete from server_sites where id = ?", [siteId]);
        await tx.run("delete from server_items where site_id = ?", [siteId]);
        await tx.run("delete from photos where site_id = ? and uploaded = 1", [siteId]);
      }
      for (const s of response.sites) {
        await tx.run("insert or replace into server_sites (id, name, address, status, units, closet_room_id, version) values (?, ?, ?, ?, ?, ?, ?)", [
          s.id,
          s.name,
          s.address,
          s.status,
          s.units,
          s.closetRoomId,
          s.version,
        ]);
      }
      for (const i of response.items) {
        await tx.run("insert or replace into server_items (id, site_id, kind, data, deleted, version) values (?, ?, ?, ?, ?, ?)", [
          i.id,
          i.siteId,
          i.kind,
          JSON.stringify(i.data),
          i.deleted ? 1 : 0,
          i.version,
        ]);
      }
      for (const p of response.photos) {
        await tx.run("insert or ignore into photos (id, site_id, item_id, label, mime, size, bytes, uploaded, created_at) values (?, ?, ?, ?, ?, ?, null, 1, ?)", [
          p.id,
          p.siteId,
          p.itemId,
          p.label,
          p.mime,
          p.size,
          Date.now(),
        ]);
      }
      for (const r of response.rejections) {
        await tx.run("insert or ignore into rejections (mutation_id, code, message) values (?, ?, ?)", [r.mutationId, r.code, r.message]);
      }
      for (const c of response.conflicts) {
        await tx.run("insert or ignore into conflicts (id, site_id, item_id, field, lost, kept, lost_by, kept_by) values (?, ?, ?, ?, ?, ?, ?, ?)", [
          c.id,
          c.siteId,
          c.itemId,
          c.field,
          JSON.stringify(c.lostValue),
          JSON.stringify(c.keptValue),
          c.lostBy,
          c.keptBy,
        ]);
      }
      await tx.run("delete from outbox where id <= ?", [response.lastMutationId]);
      await tx.run("update meta set value = ? where key = 'cursor'", [String(response.cursor)]);
      await rebase(tx);
    });
  }
}

/** Rebuilds what the surveyor sees: the server's state, then every change still pending on top. */
async function rebase(tx: SqlDb) {
  await tx.run("delete from items");
  await tx.run("insert into items select * from server_items");
  await tx.run("delete from sites");
  await tx.run("insert into sites select * from server_sites");
  const pending = await tx.all<{ id: number; name: string; args: string }>("select id, name, args from outbox order by id");
  for (const p of pending) await applyLocally(tx, { id: p.id, name: p.name, args: JSON.parse(p.args) } as Mutation);
}

/** The phone's own copy of the server's rules for one change (the server stays the authority). */
async function applyLocally(tx: SqlDb, m: Mutation) {
  switch (m.name) {
    case "item.put": {
      const { itemId, siteId, kind, fields } = m.args;
      const [row] = await tx.all<ItemRow>("select * from items where id = ?", [itemId]);
      if (row?.deleted) return; // delete beats update
      const data = mergeFields(row ? JSON.parse(row.data) : {}, fields);
      await tx.run("insert or replace into items (id, site_id, kind, data, deleted, version) values (?, ?, ?, ?, 0, ?)", [itemId, siteId, kind, JSON.stringify(data), row?.version ?? 0]);
      return;
    }
    case "item.delete":
      await tx.run("update items set deleted = 1 where id = ?", [m.args.itemId]);
      return;
    case "site.update": {
      const { closetRoomId, units } = m.args.fields;
      if (closetRoomId !== undefined) await tx.run("update sites set closet_room_id = ? where id = ?", [closetRoomId, m.args.siteId]);
      if (units !== undefined) await tx.run("update sites set units = ? where id = ?", [units, m.args.siteId]);
      return;
    }
  }
}
