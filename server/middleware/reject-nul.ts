import type { RequestHandler } from "express";
import { HttpError } from "../errors";

function hasNul(value: unknown, depth = 0): boolean {
  if (typeof value === "string") return value.includes("\u0000");
  if (depth > 64 || value === null || typeof value !== "object") return false;
  for (const [k, v] of Object.entries(value)) if (k.includes("\u0000") || hasNul(v, depth + 1)) return true;
  return false;
}

/** PostgreSQL text cannot hold NUL characters: refuse them at the door with a clear 400. */
export const rejectNulCharacters: RequestHandler = (req, _res, next) => {
  if (hasNul(req.body) || hasNul(req.query) || req.path.includes("\u0000") || req.path.includes("%00")) {
    throw new HttpError(400, "invalid_text", "Text cannot contain NUL (\\u0000) characters. Remove them and send again.");
  }
  next();
};
