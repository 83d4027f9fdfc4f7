// Backup and restore round-trip the demo site: database and photos, into a fresh private cluster.
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { backupTo, restoreFrom } from "../../db/backup";
import { createDb } from "../../db/client";
import { ensureDatabase, findFreePort, startCluster, type Cluster } from "../../db/cluster";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID } from "../../db/seed";
import { startLocalObjectStore, type LocalObjectStore } from "../../server/storage/local-object-store";
import { createObjectStore } from "../../server/storage/object-store";
import { signInWithPassword } from "../support/auth-client";
import { startTestServer, type TestServer } from "../support/test-server";

let server: TestServer;
let fresh: Cluster;
let freshObjects: LocalObjectStore;
const work = fs.mkdtempSync(path.join(os.tmpdir(), "dropwise-backup-"));
fs.chmodSync(work, 0o755);

beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server?.stop();
  await freshObjects?.close();
  fresh?.stop();
  fs.rmSync(work, { recursive: true, force: true });
});

describe("backup and restore", () => {
  it("round-trips the demo site's items, a captured change and a photo into a fresh cluster", async () => {
    const priya = await signInWithPassword(server.url, "priya@lanternfield.test", DEMO_PASSWORD);
    const roomId = randomUUID();
    await priya
      .post("/api/sync/push")
      .send({ clientId: randomUUID(), mutations: [{ id: 1, name: "item.put", args: { itemId: roomId, siteId: DEMO_SITE_ID, kind: "room", fields: { id: roomId, name: "Workshop", floorId: "fl-basement" }, baseVersion: 0 } }] })
      .expect(200);
    const photoId = randomUUID();
    const jpeg = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.alloc(700, 9)]);
    await priya.post("/api/photos").field("id", photoId).field("siteId", DEMO_SITE_ID).attach("file", jpeg, "p.jpg").expect(201);
    const before = await priya.post("/api/sync/pull").send({ clientId: randomUUID(), cursor: 0, knownSiteIds: [] }).expect(200);

    const folder = path.join(work, "backup");
    const summary = await backupTo(folder, server.testDb.url, server.ctx.objects);
    expect(summary.objects).toBe(1);
    expect(summary.databaseBytes).toBeGreaterThan(1000);

    fresh = await startCluster({ dataDir: path.join(work, "fresh-pg"), port: await findFreePort(57_000), throwaway: true });
    await ensureDatabase(fresh, "dropwise");
    freshObjects = await startLocalObjectStore(path.join(work, "fresh-objects"));
    const objects = createObjectStore({ bucket: "dropwise-photos", region: "us-east-1", ...freshObjects.credentials, endpoint: freshObjects.endpoint });
    await restoreFrom(folder, fresh.url("dropwise"), objects);

    const restoredDb = createDb(fresh.url("dropwise"));
    const restored = await startTestServer({
      reuse: { db: restoredDb, url: fresh.url("dropwise"), name: "dropwise", drop: async () => {} },
      seed: false,
      config: { s3: { bucket: "dropwise-photos", region: "us-east-1", ...freshObjects.credentials, endpoint: freshObjects.endpoint } },
    });
    try {
      const again = await signInWithPassword(restored.url, "priya@lanternfield.test", DEMO_PASSWORD);
      const after = await again.post("/api/sync/pull").send({ clientId: randomUUID(), cursor: 0, knownSiteIds: [] }).expect(200);
      const byId = (r: { items: { id: string; data: unknown }[] }) => Object.fromEntries(r.items.map((i) => [i.id, i.data]));
      expect(byId(after.body)).toEqual(byId(before.body));
      expect(after.body.items.find((i: { id: string }) => i.id === roomId).data.name).toBe("Workshop");
      const photo = await again.get(`/api/photos/${photoId}`).expect(200);
      expect(photo.headers["content-length"]).toBe(String(jpeg.byteLength));
    } finally {
      await restored.close();
      await restoredDb.$client.end().catch(() => undefined);
    }
  }, 60_000);
});
