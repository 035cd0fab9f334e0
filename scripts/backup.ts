// Backup and restore of everything Sternpost keeps: the MariaDB database (mariadb-dump of one
// consistent snapshot) and the photo objects of the S3 store. Settings come from the same
// environment variables as the app (DATABASE_URL, S3_*).
//   npx tsx scripts/backup.ts backup  <folder>   writes <folder>/database.sql and <folder>/objects/
//   npx tsx scripts/backup.ts restore <folder>   into an empty database and store
// The database is dumped first, then the objects: photos are stored under their SHA-256 and never
// rewritten, so every photo the snapshot names is in the store by then (newer ones come too).
import { spawn } from "node:child_process";
import { createHash } from "node:crypto";
import { createReadStream, createWriteStream, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import { GetObjectCommand, ListObjectsV2Command } from "@aws-sdk/client-s3";
import { connect, createDatabase } from "../db/connect.ts";
import { env } from "../app/server/env.server.ts";
import { putObject, s3Client } from "../app/server/storage.server.ts";

interface ObjectEntry {
  key: string;
  sha256: string;
  bytes: number;
  contentType: string;
}

/** The mariadb client programs' connection arguments; the password goes by environment. */
function clientArgs(databaseUrl: string) {
  const url = new URL(databaseUrl);
  return {
    database: decodeURIComponent(url.pathname.slice(1)),
    args: [
      "--no-defaults",
      `--host=${url.hostname}`,
      `--port=${url.port || "3306"}`,
      `--user=${decodeURIComponent(url.username || "root")}`,
      "--default-character-set=utf8mb4",
    ],
    env: { ...process.env, MYSQL_PWD: decodeURIComponent(url.password) },
  };
}

function run(
  command: string,
  args: string[],
  options: { env: NodeJS.ProcessEnv; stdin?: string; stdout?: string },
) {
  return new Promise<void>((resolve, reject) => {
    const child = spawn(command, args, { env: options.env, stdio: ["pipe", "pipe", "inherit"] });
    const done = Promise.all([
      options.stdout ? pipeline(child.stdout, createWriteStream(options.stdout)) : child.stdout.resume(),
      options.stdin ? pipeline(createReadStream(options.stdin), child.stdin) : child.stdin.end(),
    ]);
    child.on("error", reject);
    child.on("exit", (code) =>
      done.then(() => (code === 0 ? resolve() : reject(new Error(`${command} exited with ${code}`))), reject),
    );
  });
}

const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

async function listKeys(): Promise<string[]> {
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const page = await s3Client().send(
      new ListObjectsV2Command({ Bucket: env().S3_BUCKET, ContinuationToken: token }),
    );
    keys.push(...(page.Contents ?? []).map((o) => o.Key!).filter(Boolean));
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
  return keys;
}

export async function backup(folder: string) {
  mkdirSync(path.join(folder, "objects"), { recursive: true });
  const db = clientArgs(env().DATABASE_URL);
  // --single-transaction: one consistent InnoDB snapshot without locking the app out.
  await run(
    "mariadb-dump",
    [...db.args, "--single-transaction", "--quick", "--triggers", "--routines", "--hex-blob", db.database],
    { env: db.env, stdout: path.join(folder, "database.sql") },
  );
  const objects: ObjectEntry[] = [];
  for (const key of await listKeys()) {
    const object = await s3Client().send(new GetObjectCommand({ Bucket: env().S3_BUCKET, Key: key }));
    const bytes = await object.Body!.transformToByteArray();
    const file = path.join(folder, "objects", key);
    mkdirSync(path.dirname(file), { recursive: true });
    writeFileSync(file, bytes);
    objects.push({
      key,
      sha256: sha256(bytes),
      bytes: bytes.byteLength,
      contentType: object.ContentType ?? "application/octet-stream",
    });
  }
  writeFileSync(path.join(folder, "objects.json"), JSON.stringify(objects, null, 2));
  return { objects: objects.length };
}

export async function restore(folder: string) {
  const url = env().DATABASE_URL;
  await createDatabase(url);
  const knex = connect(url);
  try {
    const [tables] = await knex.raw("SHOW TABLES");
    if ((tables as unknown[]).length)
      throw new Error(`The database of ${url} is not empty; restore into a new one.`);
  } finally {
    await knex.destroy();
  }
  const db = clientArgs(url);
  await run("mariadb", [...db.args, db.database], { env: db.env, stdin: path.join(folder, "database.sql") });
  const objects = JSON.parse(readFileSync(path.join(folder, "objects.json"), "utf8")) as ObjectEntry[];
  for (const o of objects) {
    const bytes = readFileSync(path.join(folder, "objects", o.key));
    if (sha256(bytes) !== o.sha256) throw new Error(`The backup's copy of ${o.key} is damaged.`);
    await putObject(o.key, bytes, o.contentType);
  }
  return { objects: objects.length };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const [mode, folder] = process.argv.slice(2);
  if ((mode !== "backup" && mode !== "restore") || !folder) {
    console.error("usage: tsx scripts/backup.ts backup|restore <folder>");
    process.exit(2);
  }
  const result = await (mode === "backup" ? backup(folder) : restore(folder));
  console.log(
    `[sternpost] ${mode} done: database and ${result.objects} photo objects (${path.resolve(folder)})`,
  );
  process.exit(0);
}
