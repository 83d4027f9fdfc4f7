import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import express, { Router } from "express";
import { serviceWorkerScript } from "./service-worker";

/** Serves the exported web build, with the single-page fallback for client-side routes. */
export function webRouter(distDir: string) {
  const router = Router();
  const indexFile = path.join(distDir, "index.html");
  router.get("/sw.js", (_req, res) => {
    const script = serviceWorkerScript(distDir);
    res.setHeader("Content-Type", "text/javascript; charset=utf-8");
    res.setHeader("Cache-Control", "no-cache");
    res.setHeader("Service-Worker-Allowed", "/");
    // The app makes no ETags of its own (its API answers are no-store), so the script carries one:
    // a browser checking for a new service worker gets a 304 while the build is the same.
    res.setHeader("ETag", `"${createHash("sha256").update(script).digest("base64url").slice(0, 27)}"`);
    res.send(script);
  });
  router.use(
    express.static(distDir, {
      index: false,
      setHeaders(res, file) {
        // Hashed bundles never change; the shell page must always be fresh.
        if (/[\\/]_expo[\\/]/.test(file) || /[\\/]assets[\\/]/.test(file)) {
          res.setHeader("Cache-Control", "public, max-age=31536000, immutable");
        }
      },
    }),
  );
  router.get("/{*splat}", (req, res, next) => {
    if (req.path.startsWith("/api/") || req.path.startsWith("/auth/")) return next();
    if (!fs.existsSync(indexFile)) {
      res.status(503).type("text").send("The web app has not been built yet. Run `npm start`, which builds it.");
      return;
    }
    res.setHeader("Cache-Control", "no-cache");
    // Revalidated by its Last-Modified (sendFile follows the app's ETag setting, which is off).
    res.sendFile(indexFile);
  });
  return router;
}
