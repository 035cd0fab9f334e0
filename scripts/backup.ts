// npm run backup [-- DIR]: a consistent copy of the database (mariadb-dump in one transaction)
// and of every photo object, with a manifest of their SHA-256, in DIR (default .data/backups/<time>).
// The database is dumped first: photos are written to the store before their rows, and never
// deleted, so every photo row in the dump has its object by the time the objects are copied.
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { dumpDatabase } from "./backup/mariadb-cli.ts";
import { getBytes, listObjects, sha256, storeFromEnv } from "./backup/objects.ts";

export interface BackupManifest {
  createdAt: string;
  database: string;
  objects: { key: string; bytes: number; sha256: string }[];
}

export async function backup(
  dir: string,
  databaseUrl: string,
  store = storeFromEnv(),
): Promise<BackupManifest> {
  mkdirSync(path.join(dir, "objects"), { recursive: true });
  const createdAt = new Date().toISOString();
  await dumpDatabase(databaseUrl, path.join(dir, "database.sql"));
  const objects: BackupManifest["objects"] = [];
  for await (const key of listObjects(store, "photos/")) {
    const bytes = await getBytes(store, key);
    const file = path.join(dir, "objects", key);
    mkdirSync(path.dirname(file), { recursive: true });
    writeFileSync(file, bytes);
    objects.push({ key, bytes: bytes.byteLength, sha256: sha256(bytes) });
  }
  const manifest = { createdAt, database: new URL(databaseUrl).pathname.slice(1), objects };
  writeFileSync(path.join(dir, "manifest.json"), JSON.stringify(manifest, null, 2));
  return manifest;
}

if (process.argv[1] && import.meta.url === `file://${path.resolve(process.argv[1])}`) {
  const dir =
    process.argv[2] ?? path.join(".data", "backups", new Date().toISOString().replace(/[:.]/g, "-"));
  const url = process.env.DATABASE_URL ?? "mysql://root@127.0.0.1:3307/sternpost";
  const manifest = await backup(dir, url);
  console.log(`[sternpost] backup in ${dir}: the database and ${manifest.objects.length} photo objects`);
}
