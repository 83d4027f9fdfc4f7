import type { IncomingMessage, ServerResponse } from "node:http";
import pino from "pino";

export function createLogger(level = process.env.LOG_LEVEL ?? "info") {
  return pino({ level, base: { service: "dropwise" }, redact: ["req.headers.cookie", "req.headers.authorization"] });
}

export type Logger = ReturnType<typeof createLogger>;

/**
 * What a request log line keeps of a request and its response. pino-http binds the request to a
 * child logger on every request, whether or not anything is logged, so this stays small: no
 * headers (no cookies to redact), no parsed query.
 */
export const httpLogSerializers = {
  req: (req: IncomingMessage & { id?: unknown; originalUrl?: string }) => ({
    id: req.id,
    method: req.method,
    url: req.originalUrl ?? req.url,
    remoteAddress: req.socket?.remoteAddress,
  }),
  res: (res: ServerResponse) => ({ statusCode: res.headersSent ? res.statusCode : null }),
  err: pino.stdSerializers.err,
};
