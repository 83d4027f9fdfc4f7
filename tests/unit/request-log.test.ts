// One log line per API request (server/middleware/request-log.ts): its id, method, address, status and
// time; never the cookies; failures logged with the same id by the error handler.
import { Writable } from "node:stream";
import express from "express";
import pino from "pino";
import request from "supertest";
import { describe, expect, it } from "vitest";
import { errorHandler, HttpError } from "../../server/errors";
import { requestLog } from "../../server/middleware/request-log";

function appWithLog() {
  const lines: Record<string, unknown>[] = [];
  const sink = new Writable({
    write(chunk, _enc, done) {
      for (const l of String(chunk).split("\n").filter(Boolean)) lines.push(JSON.parse(l));
      done();
    },
  });
  const logger = pino({ level: "info" }, sink);
  const app = express();
  app.locals.logger = logger;
  app.use(requestLog(logger, (url) => url.startsWith("/api")));
  app.get("/api/ok", (_req, res) => void res.json({ ok: true }));
  app.get("/api/signed", (_req, res) => {
    res.locals.actor = { userId: "user_priya", teamId: "team_1", role: "surveyor", name: "Priya", email: "priya@lanternfield.test" };
    res.json({ ok: true });
  });
  app.get("/api/invites/:token", (_req, res) => void res.json({ ok: true }));
  app.get("/api/hangs", () => {}); // never answers: the caller gives up
  app.get("/api/refused", () => {
    throw new HttpError(403, "forbidden", "No.");
  });
  app.get("/api/broken", () => {
    throw new Error("database on fire");
  });
  app.get("/page", (_req, res) => void res.send("hi"));
  app.use(errorHandler);
  return { app, lines };
}

const settle = () => new Promise((r) => setTimeout(r, 20));

describe("request log", () => {
  it("writes one line per API request with its id, status and time, and no cookies", async () => {
    const { app, lines } = appWithLog();
    const res = await request(app).get("/api/ok?x=1").set("Cookie", "authjs.session-token=secret-value").set("X-Request-Id", "trace-abcdef12").expect(200);
    expect(res.headers["x-request-id"]).toBe("trace-abcdef12");
    await settle();
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatchObject({ level: 30, reqId: "trace-abcdef12", method: "GET", url: "/api/ok?x=1", status: 200, msg: "request completed" });
    expect(typeof lines[0].ms).toBe("number");
    expect(JSON.stringify(lines)).not.toContain("secret-value");
  });

  it("names who was signed in, and never writes an invitation token", async () => {
    const { app, lines } = appWithLog();
    await request(app).get("/api/signed").expect(200);
    await request(app).get("/api/invites/7f3c9a1b2d4e5f60718293a4b5c6d7e8").expect(200);
    await settle();
    expect(lines[0]).toMatchObject({ url: "/api/signed", userId: "user_priya" });
    expect(typeof lines[0].ip).toBe("string");
    expect(lines[1]).toMatchObject({ url: "/api/invites/…" });
    expect(lines[1].userId).toBeUndefined();
    expect(JSON.stringify(lines)).not.toContain("7f3c9a1b2d4e5f60718293a4b5c6d7e8");
  });

  it("writes a warning when the caller goes away before the answer", async () => {
    const { app, lines } = appWithLog();
    const server = app.listen(0, "127.0.0.1");
    await new Promise((r) => server.once("listening", r));
    const { port } = server.address() as { port: number };
    const controller = new AbortController();
    const pending = fetch(`http://127.0.0.1:${port}/api/hangs`, { signal: controller.signal }).catch(() => null);
    await new Promise((r) => setTimeout(r, 50));
    controller.abort();
    await pending;
    await new Promise((r) => setTimeout(r, 50));
    server.close();
    expect(lines).toEqual([expect.objectContaining({ level: 40, url: "/api/hangs", status: null, msg: "request closed before its response was sent" })]);
  });

  it("makes up an id when the caller's is missing or not a sane one, and leaves pages out of the log", async () => {
    const { app, lines } = appWithLog();
    const res = await request(app).get("/api/ok").set("X-Request-Id", "bad id with spaces").expect(200);
    expect(res.headers["x-request-id"]).toMatch(/^[0-9a-f-]{36}$/);
    await request(app).get("/page").expect(200);
    await settle();
    expect(lines.map((l) => l.url)).toEqual(["/api/ok"]);
  });

  it("logs a server failure at error level with its stack under the request's id; a refusal stays info", async () => {
    const { app, lines } = appWithLog();
    const broken = await request(app).get("/api/broken").expect(500);
    expect(broken.body.error.message).not.toContain("fire"); // nothing of the failure reaches the client
    await request(app).get("/api/refused").expect(403);
    await settle();
    const id = broken.headers["x-request-id"];
    const failure = lines.find((l) => l.msg === "request failed")!;
    expect(failure).toMatchObject({ level: 50, reqId: id });
    expect((failure.err as { stack: string }).stack).toContain("database on fire");
    expect(lines.find((l) => l.url === "/api/broken" && l.msg === "request completed")).toMatchObject({ level: 50, status: 500 });
    expect(lines.find((l) => l.url === "/api/refused")).toMatchObject({ level: 30, status: 403 });
  });
});
