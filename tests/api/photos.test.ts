import { randomUUID } from "node:crypto";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "../../db/demo-accounts";
import { DEMO_SITE_ID } from "../../db/seed";
import { signInWithPassword, type Agent } from "../support/auth-client";
import { startTestServer, type TestServer } from "../support/test-server";

// A real (tiny) JPEG header followed by filler; the server only reads the first bytes to know the type.
const jpeg = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01]), Buffer.alloc(2048, 7)]);
// An executable renamed to look like a photo.
const renamedExecutable = Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 0x02, 0x01, 0x01, 0x00]), Buffer.alloc(512, 1)]);

let server: TestServer;
let priya: Agent;
beforeAll(async () => {
  server = await startTestServer({ config: { maxPhotoBytes: 64 * 1024 } });
  priya = await signInWithPassword(server.url, "priya@lanternfield.test", DEMO_PASSWORD);
});
afterAll(() => server.stop());

const send = (agent: Agent, id: string, bytes: Buffer, filename = "ceiling.jpg", contentType = "image/jpeg") =>
  agent.post("/api/photos").field("id", id).field("siteId", DEMO_SITE_ID).field("itemId", "ap-living").field("label", "ceiling access").attach("file", bytes, { filename, contentType });

describe("photos go through the API into the object store", () => {
  it("stores a photo, answers a retried upload with the same photo, and serves the bytes back", async () => {
    const id = randomUUID();
    const first = await send(priya, id, jpeg).expect(201);
    expect(first.body.photo).toMatchObject({ id, mime: "image/jpeg", size: jpeg.byteLength });
    await send(priya, id, jpeg).expect(200);
    const back = await priya.get(`/api/photos/${id}`).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on("data", (c: Buffer) => chunks.push(c));
      res.on("end", () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    expect(back.headers["content-type"]).toBe("image/jpeg");
    expect(Buffer.compare(back.body as Buffer, jpeg)).toBe(0);
    const pulled = await priya.post("/api/sync/pull").send({ clientId: randomUUID(), cursor: 0, knownSiteIds: [] }).expect(200);
    expect(pulled.body.photos.filter((p: { id: string }) => p.id === id)).toEqual([expect.objectContaining({ itemId: "ap-living", label: "ceiling access", mime: "image/jpeg" })]);
  });

  it("refuses a renamed executable by its bytes, whatever it claims to be", async () => {
    const res = await send(priya, randomUUID(), renamedExecutable, "photo.jpg", "image/jpeg").expect(415);
    expect(res.body.error).toMatchObject({ code: "not_an_image", fields: { file: ["Not a JPEG, PNG, WebP or HEIC image."] } });
  });

  it("refuses a photo over the size limit with 413 and what to do", async () => {
    const big = Buffer.concat([jpeg, Buffer.alloc(80 * 1024)]);
    const res = await send(priya, randomUUID(), big).expect(413);
    expect(res.body.error.code).toBe("photo_too_large");
  });

  it("needs the file, a valid id and a site the caller may capture", async () => {
    const noFile = await priya.post("/api/photos").field("id", randomUUID()).field("siteId", DEMO_SITE_ID).expect(400);
    expect(noFile.body.error.fields.file).toEqual(["No photo was attached."]);
    const badId = await send(priya, "x", jpeg).expect(400);
    expect(badId.body.error.fields.id).toEqual(["The photo id must be a UUID."]);
    const client = request.agent(server.url);
    await client.post("/api/photos").field("id", randomUUID()).field("siteId", DEMO_SITE_ID).attach("file", jpeg, "a.jpg").expect(401);
  });
});
