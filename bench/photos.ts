// Throughput of photo uploads (1 MB each) through PUT /api/photos/:id — the route's action,
// in-process: sign-in check, body read with its limit, role check, type sniffing, SHA-256, the S3
// put and the row — against a plain S3 SDK PutObject of the same bytes to the same store.
// Prints both throughputs and their ratio.
//   npx tsx bench/photos.ts      (MariaDB from DATABASE_URL, default the private one on :3307;
//                                 starts its own S3 stand-in on a free port)
import { PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { randomBytes, randomUUID } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { connect, createDatabase, dropDatabase } from "../db/connect.ts";
import { seedLibrary } from "../db/seeds/library.ts";
import { startS3Fake } from "../scripts/s3-fake.ts";

const PHOTOS = 20;
const BYTES = 1024 * 1024;
const ROUNDS = 3;
const BUCKET = "sternpost-bench-photos";

const base = new URL(process.env.DATABASE_URL ?? "mysql://root@127.0.0.1:3307/sternpost");
base.pathname = "/sternpost_bench_photos";
const url = base.toString();
const s3Dir = mkdtempSync(path.join(tmpdir(), "sternpost-bench-s3-"));
const fake = await startS3Fake({ port: 0, directory: s3Dir, bucket: BUCKET });
Object.assign(process.env, {
  DATABASE_URL: url,
  S3_ENDPOINT: fake.endpoint,
  S3_BUCKET: BUCKET,
  S3_ACCESS_KEY_ID: "S3RVER",
  S3_SECRET_ACCESS_KEY: "S3RVER",
  S3_FORCE_PATH_STYLE: "true",
  SESSION_SECRET: process.env.SESSION_SECRET ?? "benchmark-secret-0123456789abcdef",
});

await dropDatabase(url);
await createDatabase(url);
const knex = connect(url);
await knex.migrate.latest();
await seedLibrary(knex);
const { action } = await import("../app/routes/api/photo.ts");
const { sessionStorage } = await import("../app/server/session.server.ts");
const { startChecklists } = await import("../app/server/checklists.server.ts");

const [lead] = await knex("users").insert({
  email: "lead@bench.example",
  name: "Bench lead",
  role: "lead",
  password_hash: "x",
});
const [tech] = await knex("users").insert({
  email: "tech@bench.example",
  name: "Bench tech",
  role: "technician",
  password_hash: "x",
});
const [vessel] = await knex("vessels").insert({
  name: "Bench hull",
  length_value: 30,
  length_unit: "ft",
  length_m: 9.144,
  hull_type: "planing",
  owner_name: "Bench",
});
const [job] = await knex("jobs").insert({
  vessel_id: vessel,
  scope: "repower",
  status: "underway",
  engine_model: "Bench",
  engine_serial: "B-1",
  rated_power_hp: 200,
  rated_rpm_min: 2600,
  rated_rpm_max: 2800,
  gear_ratio: 2,
  prop_diameter_in: 20,
  prop_pitch_in: 18,
  prop_blades: 3,
  shaft_diameter_in: 1.25,
  shaft_material: "316",
  coupling_type: "Split",
  lead_id: lead,
});
await knex("job_technicians").insert({ job_id: job, user_id: tech });
const [checklistId] = await startChecklists(job, ["engine-alignment"], lead);
const session = await sessionStorage().getSession();
session.set("userId", tech);
const cookie = (await sessionStorage().commitSession(session)).split(";")[0]!;

/** A JPEG's first bytes (SOI, APP0 "JFIF"), then noise: 1 MB that sniffs as JPEG and does not compress. */
const JFIF = Buffer.from([
  0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01,
  0x00, 0x00,
]);
const photo = () =>
  new Uint8Array(Buffer.concat([JFIF, randomBytes(BYTES - JFIF.length)])) as Uint8Array<ArrayBuffer>;

async function throughRoute(bytes: Uint8Array<ArrayBuffer>) {
  const id = randomUUID();
  const request = new Request(
    `http://localhost/api/photos/${id}?checklistId=${checklistId}&itemKey=alignment-photo`,
    {
      method: "PUT",
      body: bytes,
      headers: { Cookie: cookie, "Content-Type": "image/jpeg", "Content-Length": String(bytes.byteLength) },
    },
  );
  const response = await action({ request, params: { photoId: id }, context: {} } as unknown as Parameters<
    typeof action
  >[0]);
  if (response.status !== 201)
    throw new Error(`the route answered ${response.status}: ${await response.text()}`);
}

const plain = new S3Client({
  endpoint: fake.endpoint,
  region: "us-east-1",
  forcePathStyle: true,
  credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
  requestChecksumCalculation: "WHEN_REQUIRED",
  responseChecksumValidation: "WHEN_REQUIRED",
});
const plainPut = (bytes: Uint8Array) =>
  plain.send(
    new PutObjectCommand({
      Bucket: BUCKET,
      Key: `bench/plain/${randomUUID()}`,
      Body: bytes,
      ContentType: "image/jpeg",
      ContentLength: bytes.byteLength,
    }),
  );

/** MB/s for PHOTOS uploads one after another (a tablet sends its queue in order). */
async function throughput(upload: (bytes: Uint8Array<ArrayBuffer>) => Promise<unknown>) {
  const batch = Array.from({ length: PHOTOS }, photo);
  const t = performance.now();
  for (const bytes of batch) await upload(bytes);
  return (PHOTOS * BYTES) / 1e6 / ((performance.now() - t) / 1000);
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
await throughRoute(photo()); // warm-up: pools, the S3 client, the first query plans
await plainPut(photo());
const route: number[] = [];
const raw: number[] = [];
for (let round = 0; round < ROUNDS; round++) {
  route.push(await throughput(throughRoute));
  raw.push(await throughput(plainPut));
}
const r = median(route);
const p = median(raw);
console.log(
  `PUT /api/photos/:id, ${PHOTOS} × 1 MB: ${r.toFixed(1)} MB/s (${(r / (BYTES / 1e6)).toFixed(1)} photos/s, median of ${ROUNDS})`,
);
console.log(
  `plain S3 PutObject,   ${PHOTOS} × 1 MB: ${p.toFixed(1)} MB/s (${(p / (BYTES / 1e6)).toFixed(1)} photos/s, median of ${ROUNDS})`,
);
console.log(`ratio route / plain put: ${(r / p).toFixed(2)}× of the plain throughput`);

plain.destroy();
const { s3Client } = await import("../app/server/storage.server.ts");
(await s3Client()).destroy();
const { db } = await import("../app/server/db.server.ts");
await db().destroy();
await knex.destroy();
await dropDatabase(url);
await fake.close();
rmSync(s3Dir, { recursive: true, force: true });
