import fs from "node:fs";
import path from "node:path";

/**
 * The checkout's root: the nearest folder upwards holding package.json. Works the same for the
 * sources run through tsx (server/, db/) and for the production build (build/server.mjs).
 */
function findProjectRoot(from: string): string {
  for (let dir = from; ; dir = path.dirname(dir)) {
    if (fs.existsSync(path.join(dir, "package.json"))) return dir;
    if (path.dirname(dir) === dir) throw new Error(`No package.json above ${from}: run Dropwise from its checkout.`);
  }
}

export const projectRoot = findProjectRoot(import.meta.dirname);
