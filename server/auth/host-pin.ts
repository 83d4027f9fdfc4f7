import type { RequestHandler } from "express";

/**
 * Auth.js (with trustHost) builds its URLs, the e-mailed sign-in links among them, from the request's
 * Host and X-Forwarded-* headers. Pin them to the configured public origin so a spoofed Host can
 * never send a link to another site.
 */
export function pinHost(publicOrigin: string): RequestHandler {
  const url = new URL(publicOrigin);
  const proto = url.protocol.replace(":", "");
  return (req, _res, next) => {
    req.headers.host = url.host;
    req.headers["x-forwarded-host"] = url.host;
    req.headers["x-forwarded-proto"] = proto;
    next();
  };
}
