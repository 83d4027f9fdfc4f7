import type { RequestHandler } from "express";

/** expo-sqlite's synchronous web API needs SharedArrayBuffer, which needs cross-origin isolation. */
export const crossOriginIsolation: RequestHandler = (_req, res, next) => {
  res.setHeader("Cross-Origin-Opener-Policy", "same-origin");
  res.setHeader("Cross-Origin-Embedder-Policy", "require-corp");
  res.setHeader("Cross-Origin-Resource-Policy", "same-origin");
  next();
};
