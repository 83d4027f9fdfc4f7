// Backup and restore of a Dropwise install: the database (pg_dump, custom format) and every photo in
// the object store. `npm run backup -- <folder>` and `npm run restore -- <folder>`; see README.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { Readable } from "node:stream";
import type { ObjectStore } from "../server/storage/object-store";
import { PG_BIN } from "./cluster";

function run(bin: string, args: string[]) {
  const result = spawnSync(path.join(PG_BIN, bin), args, { encoding: "utf8", cwd: "/" });
  if (result.status !== 0) throw new Error(`${bin} failed: ${(result.stderr || result.stdout).trim().split("\n").slice(-4).join("\n")}`);
}

async function readAll(body: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of body) chunks.push(Buffer.from(c as Buffer));
  return Buffer.concat(chunks);
}

export interface BackupSummary {
  databaseBytes: number;
  objects: number;
}

export async function backupTo(folder: string, databaseUrl: string, objects: ObjectStore): Promise<BackupSummary> {
  fs.mkdirSync(path.join(folder, "objects"), { recursive: true });
  const dump = path.join(folder, "database.dump");
  run("pg_dump", ["--format=custom", "--no-owner", "--file", dump, databaseUrl]);
  let count = 0;
  const index: { key: string; contentType: string }[] = [];
  for await (const key of objects.list()) {
    const object = await objects.get(key);
    if (!object) continue;
    const file = path.join(folder, "objects", encodeURIComponent(key));
    fs.writeFileSync(file, await readAll(object.body));
    index.push({ key, contentType: object.contentType });
    count++;
  }
  fs.writeFileSync(path.join(folder, "objects.json"), JSON.stringify(index, null, 1));
  fs.writeFileSync(path.join(folder, "backup.json"), JSON.stringify({ takenAt: new Date().toISOString(), format: 1, objects: count }, null, 1));
  return { databaseBytes: fs.statSync(dump).size, objects: count };
}

/** Restores into an empty database (a fresh private cluster's) and an object store. */
export async function restoreFrom(folder: string, databaseUrl: string, objects: ObjectStore): Promise<BackupSummary> {
  const dump = path.join(folder, "database.dump");
  if (!fs.existsSync(dump)) throw new Error(`${folder} holds no database.dump: is it a Dropwise backup folder?`);
  run("pg_restore", ["--no-owner", "--exit-on-error", "--dbname", databaseUrl, dump]);
  await objects.ensureBucket();
  const index = JSON.parse(fs.readFileSync(path.join(folder, "objects.json"), "utf8")) as { key: string; contentType: string }[];
  for (const { key, contentType } of index) {
    await objects.put(key, fs.readFileSync(path.join(folder, "objects", encodeURIComponent(key))), contentType);
  }
  return { databaseBytes: fs.statSync(dump).size, objects: index.length };
}
