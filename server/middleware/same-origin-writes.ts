import type { RequestHandler } from "express";
import { HttpError } from "../errors";

const WRITES = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/**
 * CSRF defence for the JSON API (Auth.js guards its own routes with its CSRF token): a write must be
 * JSON or an upload (a cross-site form can send neither without a preflight), and a browser's
 * Origin, when sent, must be ours.
 */
export function sameOriginWrites(publicOrigin: string): RequestHandler {
  const ours = new URL(publicOrigin).origin;
  return (req, _res, next) => {
    if (!WRITES.has(req.method)) return next();
    const origin = req.headers.origin;
    if (origin && origin !== ours) throw new HttpError(403, "cross_origin", "Requests from other sites are refused.");
    const type = req.headers["content-type"] ?? "";
    const hasBody = Number(req.headers["content-length"] ?? 0) > 0 || req.headers["transfer-encoding"];
    if (hasBody && !/^application\/json\b/i.test(type) && !/^multipart\/form-data\b/i.test(type)) {
      throw new HttpError(415, "unsupported_type", "Send the request body as JSON (Content-Type: application/json).");
    }
    next();
  };
}
