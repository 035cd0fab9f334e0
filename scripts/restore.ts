// npm run restore -- DIR: puts a backup (scripts/backup.ts) into an EMPTY database and store, then
// checks it: every record's verification recomputed ("genuine"), every photo's bytes against the
// SHA-256 its row records. Exits non-zero, saying why, when anything does not hold.
import { readFileSync } from "node:fs";
import path from "node:path";
import { connect, createDatabase } from "../db/connect.ts";
import type { BackupManifest } from "./backup.ts";
import { loadDatabase } from "./backup/mariadb-cli.ts";
import { getBytes, listObjects, putBytes, sha256, storeFromEnv } from "./backup/objects.ts";

export async function restore(dir: string, databaseUrl: string, store = storeFromEnv()) {
  const manifest = JSON.parse(readFileSync(path.join(dir, "manifest.json"), "utf8")) as BackupManifest;
  // Refuse to mix a backup into live data.
  await createDatabase(databaseUrl);
  const knex = connect(databaseUrl);
  try {
    const tables = await knex.raw("SHOW TABLES");
    if (tables[0].length) throw new Error("The target database is not empty; restore into a new one.");
  } finally {
    await knex.destroy();
  }
  for await (const key of listObjects(store, "photos/"))
    throw new Error(`The target store already holds ${key}; restore into an empty bucket.`);

  for (const o of manifest.objects) {
    const bytes = readFileSync(path.join(dir, "objects", o.key));
    if (sha256(bytes) !== o.sha256) throw new Error(`The backup's copy of ${o.key} is damaged.`);
  }
  await loadDatabase(databaseUrl, path.join(dir, "database.sql"));
  for (const o of manifest.objects)
    await putBytes(store, o.key, readFileSync(path.join(dir, "objects", o.key)));
}

/** Every record verifies and every photo's bytes are the ones its row records. */
export async function checkRestored(databaseUrl: string, store = storeFromEnv()) {
  process.env.DATABASE_URL = databaseUrl;
  const { verifyRecord } = await import("../app/server/records.server.ts");
  const { db } = await import("../app/server/db.server.ts");
  const problems: string[] = [];
  try {
    const records = await db()("records").select("id");
    for (const { id } of records) {
      const v = await verifyRecord(id);
      if (!v?.genuine) problems.push(`record ${id}: ${v?.problems.join("; ") ?? "missing"}`);
    }
    const photos = await db()("photos").select("id", "sha256", "storage_key");
    for (const p of photos) {
      const bytes = await getBytes(store, p.storage_key).catch(() => undefined);
      if (!bytes) problems.push(`photo ${p.id}: no object ${p.storage_key}`);
      else if (sha256(bytes) !== p.sha256) problems.push(`photo ${p.id}: bytes differ from its SHA-256`);
    }
    return { records: records.length, photos: photos.length, problems };
  } finally {
    await db().destroy();
  }
}

if (process.argv[1] && import.meta.url === `file://${path.resolve(process.argv[1])}`) {
  const dir = process.argv[2];
  if (!dir) {
    console.error(
      "usage: npm run restore -- <backup folder>   (DATABASE_URL and S3_* name the empty target)",
    );
    process.exit(2);
  }
  const url = process.env.DATABASE_URL ?? "mysql://root@127.0.0.1:3307/sternpost";
  await restore(dir, url);
  const check = await checkRestored(url);
  console.log(
    `[sternpost] restored ${check.records} records and ${check.photos} photos from ${dir}` +
      (check.problems.length ? "" : ": every record genuine, every photo intact"),
  );
  if (check.problems.length) {
    console.error(check.problems.join("\n"));
    process.exit(1);
  }
}
