// Issue 14, section 4: scripts/backup.ts dumps the database (one consistent snapshot) and the
// photo objects; restored into an empty database and an empty bucket, every issued record still
// verifies as genuine and every photo comes back byte for byte.
import { CreateBucketCommand, GetObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { spawnSync } from "node:child_process";
import { createHash, randomUUID } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { SUBMIT_KEY, submitValue } from "~/lib/sync/submission";
import { startChecklists } from "~/server/checklists.server";
import { storePhoto } from "~/server/photos.server";
import { issueRecord, verifyRecord } from "~/server/records.server";
import { countersign } from "~/server/review.server";
import { sync } from "~/server/sync.server";
import { connect, dropDatabase } from "../../db/connect.ts";
import { seedLibrary, sha256 } from "../../db/seeds/library.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser, TEST_PASSWORD } from "../support/fixtures.ts";
import { op } from "../support/sync.ts";
import { startServer } from "../support/server-process.ts";
import { gradientPng } from "../unit/photos/images.ts";

const knex = testDb();
const folder = mkdtempSync(path.join(tmpdir(), "sternpost-backup-"));
const restoredDb =
  process.env.DATABASE_URL!.replace(/\/[^/]+$/, "/sternpost_restored") + (process.env.TEST_DB_SUFFIX ?? "");
const restoredBucket = `sternpost-restored-${Date.now()}`;
afterAll(async () => {
  await knex.destroy();
  await dropDatabase(restoredDb);
  rmSync(folder, { recursive: true, force: true });
});

const template = {
  key: "backup-test",
  version: 1,
  title: "Backup test",
  purpose: "Integration test of backup and restore.",
  sections: [
    {
      key: "s",
      title: "S",
      items: [
        { kind: "check", key: "a", label: "A", required: true },
        { kind: "photo", key: "p", label: "P", required: false },
      ],
    },
  ],
};

let recordId: string;
const photos = [gradientPng(30, 20, 3), gradientPng(24, 24, 4)];
const photoIds = [randomUUID(), randomUUID()];

beforeAll(async () => {
  await seedLibrary(knex);
  const body = JSON.stringify(template);
  await knex("template_versions").insert({
    template_key: template.key,
    version: 1,
    status: "published",
    title: template.title,
    body,
    body_sha256: sha256(body),
    published_at: new Date(),
  });
  const [tech, lead, manager] = [
    await makeUser(knex, "technician"),
    await makeUser(knex, "lead"),
    await makeUser(knex, "manager"),
  ];
  const jobId = (await makeJob(knex, lead.id, [tech.id])).id;
  const [checklistId] = await startChecklists(jobId, [template.key], lead.id);
  const listed = photoIds.map((id, i) => ({
    id,
    sha256: createHash("sha256").update(photos[i]!).digest("hex"),
  }));
  await sync(tech, {
    deviceId: "backup-device",
    cursor: null,
    ops: [op(checklistId!, "a", { result: "pass" }, 0), op(checklistId!, "p", { photos: listed }, 0)],
  });
  for (const [i, id] of photoIds.entries()) {
    await storePhoto(tech, {
      id,
      checklistId: checklistId!,
      itemKey: "p",
      bytes: photos[i]!,
    });
  }
  await sync(tech, {
    deviceId: "backup-device",
    cursor: null,
    ops: [op(checklistId!, SUBMIT_KEY, submitValue, 0)],
  });
  await countersign(lead, checklistId!, TEST_PASSWORD);
  recordId = await issueRecord(manager, jobId, [`surveyor-${Date.now()}@survey.example`]);
  expect((await verifyRecord(recordId))!.genuine).toBe(true);
}, 60_000);

const script = (mode: string, env: Record<string, string>) =>
  spawnSync("node_modules/.bin/tsx", ["scripts/backup.ts", mode, folder], {
    env: { ...process.env, NODE_ENV: "development", ...env },
    encoding: "utf8",
  });

describe("backup and restore", () => {
  it("bring back every record genuine and every photo intact", { timeout: 120_000 }, async () => {
    const made = script("backup", {});
    expect(made.status, made.stderr).toBe(0);

    // An empty bucket of the same store, and an empty database.
    const s3 = new S3Client({
      endpoint: process.env.S3_ENDPOINT,
      region: "us-east-1",
      forcePathStyle: true,
      credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
    });
    await s3.send(new CreateBucketCommand({ Bucket: restoredBucket }));
    await dropDatabase(restoredDb);
    const restored = script("restore", {
      DATABASE_URL: restoredDb,
      S3_BUCKET: restoredBucket,
    });
    expect(restored.status, restored.stderr).toBe(0);

    const records = await knex("records").pluck("id");
    expect(records.length).toBeGreaterThan(0);
    const copy = connect(restoredDb);
    try {
      expect(await copy("records").pluck("id")).toEqual(records);
    } finally {
      await copy.destroy();
    }

    // The restored copy, served by the production server, verifies every record.
    const server = await startServer({
      DATABASE_URL: restoredDb,
      S3_BUCKET: restoredBucket,
    });
    try {
      // Every record reads as it does in the original (other test files may have tampered with theirs
      // on purpose), and the one issued here as genuine.
      for (const id of records) {
        const page = await (await fetch(`${server.url}/verify/${id}`)).text();
        const genuine = (await verifyRecord(id))!.genuine;
        expect(/Genuine and unchanged/.test(page), id).toBe(genuine);
        if (id === recordId) expect(page).toMatch(/Genuine and unchanged/);
      }
    } finally {
      await server.stop();
    }
    // Every photo is in the restored bucket under its key, byte for byte.
    const restoredRows = connect(restoredDb);
    try {
      for (const [i, id] of photoIds.entries()) {
        const row = await restoredRows("photos").where({ id }).first();
        const object = await s3.send(
          new GetObjectCommand({
            Bucket: restoredBucket,
            Key: row.storage_key,
          }),
        );
        const bytes = await object.Body!.transformToByteArray();
        expect(createHash("sha256").update(bytes).digest("hex")).toBe(
          createHash("sha256").update(photos[i]!).digest("hex"),
        );
      }
    } finally {
      await restoredRows.destroy();
    }
  });
});
