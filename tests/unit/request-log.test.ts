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
