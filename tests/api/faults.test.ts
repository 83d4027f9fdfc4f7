// Faults: the server killed (-9) during a push and during an upload, Postgres stopped and started
// under load, SIGTERM during a request. The phone keeps its queue, the server recovers by itself,
// and afterwards every change is applied exactly once.
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { eq, sql } from "drizzle-orm";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb, type Db } from "../../db/client";
import { ensureDatabase, findFreePort, startCluster, type Cluster } from "../../db/cluster";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { runMigrations } from "../../db/migrate";
import { DEMO_SITE_ID, seedDemoOnce } from "../../db/seed";
import { photos, syncClients } from "../../db/schema";
import { LocalStore, type SyncTransport } from "../../sync/local-store";
import type { PullRequest, PullResponse, PushRequest, PushResponse } from "../../sync/protocol";
import { csrfToken } from "../support/auth-client";
import { spawnServer, type ServerProcess } from "../support/server-process";
import { memoryDb } from "../support/sqljs-db";

const work = fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-faults-"));
fs.chmodSync(work, 0o755);
const objectsDir = path.join(work, "data");
const secret = randomUUID() + randomUUID();
let cluster: Cluster;
let db: Db;
let port: number;
let server: ServerProcess | undefined;
let cookie = "";

async function start() {
  server = await spawnServer({ databaseUrl: cluster.url("dropwise"), port, authSecret: secret, objectsDir });
  return server;
}

async function signIn(url: string) {
  const agent = request.agent(url);
  const token = await csrfToken(agent);
  const res = await agent.post("/auth/callback/credentials").set("X-Auth-Return-Redirect", "1").type("form").send({ email: "priya@lanternfield.test", password: DEMO_PASSWORD, csrfToken: token });
  return ([] as string[]).concat(res.headers["set-cookie"]).find((c) => c.startsWith("authjs.session-token="))!.split(";")[0];
}

const transport: SyncTransport = {
  async push(req: PushRequest) {
    const res = await fetch(`http://127.0.0.1:${port}/api/sync/push`, { method: "POST", headers: { "Content-Type": "application/json", Cookie: cookie }, body: JSON.stringify(req) });
    if (!res.ok) throw new Error(`push ${res.status}`);
    return (await res.json()) as PushResponse;
  },
  async pull(req: PullRequest) {
    const res = await fetch(`http://127.0.0.1:${port}/api/sync/pull`, { method: "POST", headers: { "Content-Type": "application/json", Cookie: cookie }, body: JSON.stringify(req) });
    if (!res.ok) throw new Error(`pull ${res.status}`);
    return (await res.json()) as PullResponse;
  },
};

/** Sync until the outbox is empty, retrying through failures (as the phone's runner does). */
async function drain(phone: LocalStore, attempts = 60) {
  for (let i = 0; i < attempts; i++) {
    try {
      await phone.sync(transport);
      if ((await phone.pendingCount()) === 0) return;
    } catch {
      await new Promise((r) => setTimeout(r, 250));
    }
  }
  throw new Error("the queue did not drain");
}

async function roomsOnServer(prefix: string) {
  const rows = await db.execute(sql`select count(*)::int as n, count(distinct id)::int as d from items where site_id = ${DEMO_SITE_ID} and data->>'name' like ${prefix + "%"}`);
  return rows.rows[0] as { n: number; d: number };
}

beforeAll(async () => {
  cluster = await startCluster({ dataDir: path.join(work, "pg"), port: await findFreePort(58_000), throwaway: true });
  await ensureDatabase(cluster, "dropwise");
  db = createDb(cluster.url("dropwise"));
  await runMigrations(db);
  await seedDemoOnce(db);
  port = await findFreePort(43_000, 5000);
  await start();
  cookie = await signIn(server!.url);
}, 90_000);

afterAll(async () => {
  server?.child.kill("SIGKILL");
  await db?.$client.end().catch(() => undefined);
  cluster?.stop();
  fs.rmSync(work, { recursive: true, force: true });
});

describe("server killed with -9", () => {
  it("during a push: the phone keeps its queue, and after a restart every change is applied once", async () => {
    const phone = await LocalStore.open(await memoryDb());
    for (let i = 0; i < 1200; i++) {
      const id = randomUUID();
      await phone.putItem(DEMO_SITE_ID, "room", id, { id, name: `Killed-push room ${i}`, floorId: "fl-ground" });
    }
    // The second batch's request is on the wire when the server dies.
    let batches = 0;
    const killing: SyncTransport = {
      push: (req) => {
        batches++;
        const sent = transport.push(req);
        if (batches === 2) setTimeout(() => server!.child.kill("SIGKILL"), 5);
        return sent;
      },
      pull: (req) => transport.pull(req),
    };
    const failed = await phone.sync(killing).then(() => null, (e: Error) => e);
    expect(failed).toBeInstanceOf(Error);
    await server!.exited;
    expect(await phone.pendingCount()).toBeGreaterThan(0); // nothing was dropped on the phone
    await start();
    await drain(phone);
    expect(await roomsOnServer("Killed-push room")).toEqual({ n: 1200, d: 1200 });
    const [client] = await db.select().from(syncClients).where(eq(syncClients.clientId, phone.clientId));
    expect(client.lastMutationId).toBe(1200);
    expect((await phone.items(DEMO_SITE_ID)).filter((i) => String(i.data.name).startsWith("Killed-push room"))).toHaveLength(1200);
  });

  it("during an upload: the photo stays on the phone and uploads once after the restart", async () => {
    const phone = await LocalStore.open(await memoryDb());
    const bytes = new Uint8Array(Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.alloc(3 * 1024 * 1024, 5)]));
    const photoId = await phone.addPhoto({ siteId: DEMO_SITE_ID, itemId: null, label: "ceiling access", mime: "image/jpeg", bytes });
    const upload = async (photo: { id: string; siteId: string; bytes: Uint8Array | null; mime: string; label: string }) => {
      const form = new FormData();
      form.append("id", photo.id);
      form.append("siteId", photo.siteId);
      form.append("label", photo.label);
      form.append("file", new Blob([photo.bytes as BlobPart], { type: photo.mime }), "photo.jpg");
      const res = await fetch(`http://127.0.0.1:${port}/api/photos`, { method: "POST", headers: { Cookie: cookie }, body: form });
      if (!res.ok) throw new Error(`upload ${res.status}`);
      await phone.markPhotoUploaded(photo.id);
    };
    const [pending] = await phone.photosToUpload();
    const attempt = upload(pending).catch((e: Error) => e);
    await new Promise((r) => setTimeout(r, 15));
    server!.child.kill("SIGKILL");
    await server!.exited;
    await attempt;
    const stillThere = await phone.photosToUpload();
    // Either the kill came first (still waiting) or the upload finished just before it (then the server has it).
    const onServerBefore = await db.select().from(photos).where(eq(photos.id, photoId));
    expect(stillThere.length + onServerBefore.length).toBeGreaterThanOrEqual(1);
    await start();
    for (const photo of await phone.photosToUpload()) await upload(photo);
    expect(await phone.photosToUpload()).toEqual([]);
    const rows = await db.select().from(photos).where(eq(photos.id, photoId));
    expect(rows).toHaveLength(1);
    const served = await fetch(`http://127.0.0.1:${port}/api/photos/${photoId}`, { headers: { Cookie: cookie } });
    expect(served.status).toBe(200);
    expect(Number(served.headers.get("content-length"))).toBe(bytes.byteLength);
  });
});

describe("Postgres stopped and started under load", () => {
  it("pushes fail while it is down, the server recovers by itself, nothing is lost or doubled", async () => {
    const phone = await LocalStore.open(await memoryDb());
    let made = 0;
    const writer = (async () => {
      for (let i = 0; i < 120; i++) {
        const id = randomUUID();
        await phone.putItem(DEMO_SITE_ID, "room", id, { id, name: `Db-restart room ${i}`, floorId: "fl-ground" });
        made++;
        await phone.sync(transport).catch(() => undefined);
        await new Promise((r) => setTimeout(r, 10));
      }
    })();
    await new Promise((r) => setTimeout(r, 300));
    cluster.stop();
    await new Promise((r) => setTimeout(r, 800));
    const health = await fetch(`http://127.0.0.1:${port}/api/health`);
    expect(health.status).toBe(503);
    cluster = await startCluster({ dataDir: path.join(work, "pg"), port: cluster.port, throwaway: true });
    await writer;
    await drain(phone);
    expect(made).toBe(120);
    expect(await roomsOnServer("Db-restart room")).toEqual({ n: 120, d: 120 });
    expect((await fetch(`http://127.0.0.1:${port}/api/health`)).status).toBe(200);
  });
});

describe("SIGTERM", () => {
  it("finishes the request in flight, refuses new ones, closes the pool and exits 0", async () => {
    const id = randomUUID();
    const mutations = Array.from({ length: 500 }, (_, i) => {
      const itemId = randomUUID();
      return { id: i + 1, name: "item.put", args: { itemId, siteId: DEMO_SITE_ID, kind: "room", fields: { id: itemId, name: `Sigterm room ${i}`, floorId: "fl-ground" }, baseVersion: 0 } };
    });
    const inFlight = fetch(`http://127.0.0.1:${port}/api/sync/push`, { method: "POST", headers: { "Content-Type": "application/json", Cookie: cookie }, body: JSON.stringify({ clientId: id, mutations }) });
    await new Promise((r) => setTimeout(r, 30));
    server!.child.kill("SIGTERM");
    const res = await inFlight;
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ lastMutationId: 500 });
    expect(await server!.exited).toBe(0);
    await expect(fetch(`http://127.0.0.1:${port}/api/health`)).rejects.toThrow();
    expect(await roomsOnServer("Sigterm room")).toEqual({ n: 500, d: 500 });
    await start();
  });
});
