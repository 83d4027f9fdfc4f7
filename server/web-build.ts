// Builds the web app with `expo export` when its sources changed since the last build.
import { createHash } from "node:crypto";
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { projectRoot } from "./config";

const SOURCE_ENTRIES = ["app", "components", "hooks", "constants", "survey", "sync", "assets", "app.json", "metro.config.js", "package-lock.json", "tsconfig.json"];
const SKIP = new Set(["node_modules", ".DS_Store"]);

function hashTree(hash: ReturnType<typeof createHash>, entry: string) {
  const full = path.join(projectRoot, entry);
  if (!fs.existsSync(full)) return;
  const stat = fs.statSync(full);
  if (stat.isDirectory()) {
    for (const name of fs.readdirSync(full).sort()) if (!SKIP.has(name)) hashTree(hash, path.join(entry, name));
  } else {
    hash.update(entry).update("\0").update(fs.readFileSync(full)).update("\0");
  }
}

export function webSourceHash(): string {
  const hash = createHash("sha256");
  for (const entry of SOURCE_ENTRIES) hashTree(hash, entry);
  return hash.digest("hex");
}

/** Returns true when it built, false when the existing build was current. Throws with expo's output on failure. */
export function buildWebIfChanged(distDir: string, log: (line: string) => void = console.log): boolean {
  const stamp = path.join(distDir, ".source-hash");
  const current = webSourceHash();
  if (fs.existsSync(stamp) && fs.readFileSync(stamp, "utf8") === current && fs.existsSync(path.join(distDir, "index.html"))) {
    return false;
  }
  log("building the web app (expo export; the first build takes about a minute)…");
  const expo = path.join(projectRoot, "node_modules", ".bin", "expo");
  const result = spawnSync(expo, ["export", "--platform", "web", "--output-dir", distDir], {
    cwd: projectRoot,
    encoding: "utf8",
    env: { ...process.env, CI: "1", EXPO_NO_TELEMETRY: "1" },
    maxBuffer: 64 * 1024 * 1024,
  });
  if (result.status !== 0) {
    throw new Error(`The web build failed:\n${(result.stderr || result.stdout).split("\n").slice(-30).join("\n")}`);
  }
  fs.writeFileSync(stamp, current);
  return true;
}
