import { randomUUID } from "node:crypto";
import type { IncomingMessage } from "node:http";
import type { Request, RequestHandler, Response } from "express";
import type { Logger } from "../logger";

declare module "node:http" {
  interface IncomingMessage {
    /** This request's id: the caller's X-Request-Id when it is a sane one, otherwise a new UUID. */
    id?: string;
  }
}

const CALLER_ID = /^[\w-]{8,64}$/;

function requestId(req: IncomingMessage): string {
  const incoming = req.headers["x-request-id"];
  return typeof incoming === "string" && CALLER_ID.test(incoming) ? incoming : randomUUID();
}

/**
 * Gives every request an id (echoed in X-Request-Id) and writes one log line per API request when
 * its response is finished: method, address, status, time taken, the client's address and who
 * was signed in. No cookies or other headers are logged, and invitation tokens are masked. No per-request child logger is made (that was the largest single cost of an API read,
 * measured with `npm run bench`): a line about a request carries its `reqId` instead.
 */
export function requestLog(logger: Logger, shouldLog: (url: string) => boolean): RequestHandler {
  return (req, res, next) => {
    const id = requestId(req);
    req.id = id;
    res.setHeader("X-Request-Id", id);
    const url = req.originalUrl ?? req.url ?? "";
    if (shouldLog(url)) {
      const started = performance.now();
      const done = () => logFinished(logger, req, res, id, url, performance.now() - started);
      res.once("finish", done);
      res.once("close", () => {
        if (!res.writableFinished) done();
      });
    }
    next();
  };
}

/** Invitation tokens are secrets (stored only hashed): the log keeps where they were used, not them. */
function withoutSecrets(url: string): string {
  return url.replace(/(\/invites\/)[^/?#]+/, "$1…");
}

function logFinished(logger: Logger, req: Request, res: Response, id: string, url: string, ms: number) {
  const finished = res.writableFinished;
  const line = {
    reqId: id,
    method: req.method,
    url: withoutSecrets(url),
    status: res.headersSent ? res.statusCode : null,
    ms: Math.round(ms * 10) / 10,
    // The client's address as the trusted proxy reports it (Express's req.ip), and who was signed in.
    ip: req.ip,
    userId: res.locals.actor?.userId,
  };
  if (!finished) logger.warn(line, "request closed before its response was sent");
  else if (res.statusCode >= 500) logger.error(line, "request completed");
  else logger.info(line, "request completed");
}
