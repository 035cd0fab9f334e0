import { execFile } from "node:child_process";
import { createHash, randomUUID } from "node:crypto";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { SUBMIT_KEY, submitValue } from "~/lib/sync/submission";
import { startChecklists } from "~/server/checklists.server";
import { storePhoto } from "~/server/photos.server";
import { issueRecord } from "~/server/records.server";
import { countersign } from "~/server/review.server";
import { sync } from "~/server/sync.server";
import { dropDatabase } from "../../db/connect.ts";
import { seedLibrary } from "../../db/seeds/library.ts";
import { startS3Fake } from "../../scripts/s3-fake.ts";
import { freshDatabase } from "../support/database.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser, publishTemplate, TEST_PASSWORD } from "../support/fixtures.ts";
import { op } from "../support/sync.ts";
import { gradientPng } from "../unit/photos/images.ts";

// The backup and restore commands as an operator runs them, against MariaDB and the S3 stand-in:
// an issued record with a photo is backed up, restored into an empty database and an empty
// bucket, and must still verify as genuine with its photo intact.
const run = promisify(execFile);
// Its own source database: other files leave records behind that they tampered with on purpose.
let knex: ReturnType<typeof testDb>;
const template = {
  key: "backup-test",
  version: 1,
  title: "Backup test",
  purpose: "Integration tests of backup and restore.",
  sections: [
    {
      key: "s",
      title: "S",
      items: [
        { kind: "check", key: "a", label: "A", required: true },
        { kind: "photo", key: "p", label: "P", required: true },
      ],
    },
  ],
};

let recordId: string;
const folders: string[] = [];
const restoredUrl = (() => {
  const url = new URL(process.env.DATABASE_URL!);
  url.pathname = `${url.pathname}_restored`;
  return url.toString();
})();
let target: Awaited<ReturnType<typeof startS3Fake>>;

beforeAll(async () => {
  process.env.DATABASE_URL = await freshDatabase("sternpost_backup_source");
  knex = testDb();
  await seedLibrary(knex);
  await publishTemplate(knex, template);
  const [tech, lead, manager] = [
    await makeUser(knex, "technician"),
    await makeUser(knex, "lead"),
    await makeUser(knex, "manager"),
  ];
  const { id: jobId } = await makeJob(knex, lead.id, [tech.id]);
  const [checklistId] = await startChecklists(jobId, [template.key], lead.id);
  const photo = gradientPng(64, 48);
  const photoId = randomUUID();
  const value = { photos: [{ id: photoId, sha256: createHash("sha256").update(photo).digest("hex") }] };
  const push = (ops: ReturnType<typeof op>[]) => sync(tech, { deviceId: "backup-device", cursor: null, ops });
  await push([op(checklistId!, "a", { result: "pass" }, 0), op(checklistId!, "p", value, 0)]);
  await storePhoto(tech, { id: photoId, checklistId: checklistId!, itemKey: "p", bytes: photo });
  await push([op(checklistId!, SUBMIT_KEY, submitValue, 0)]);
  await countersign(lead, checklistId!, TEST_PASSWORD);
  recordId = (
    await issueRecord(manager, jobId, [
      { email: `surveyor-${Date.now()}@survey.example`, name: "Sela Sounding" },
    ])
  ).id;
  target = await startS3Fake({
    port: 0,
    directory: mkdtempSync(path.join(tmpdir(), "sternpost-restore-s3-")),
    bucket: "sternpost-restored",
  });
});
afterAll(async () => {
  await knex?.destroy();
  await target?.close();
  await dropDatabase(restoredUrl);
  for (const f of folders) rmSync(f, { recursive: true, force: true });
});

const targetEnv = () => ({
  ...process.env,
  DATABASE_URL: restoredUrl,
  S3_ENDPOINT: target.endpoint,
  S3_BUCKET: "sternpost-restored",
});

describe("backup and restore", () => {
  it("restores into an empty database and store with every record genuine and every photo intact", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "sternpost-backup-"));
    folders.push(dir);
    await run("node_modules/.bin/tsx", ["scripts/backup.ts", dir], { env: process.env });
    const manifest = JSON.parse(readFileSync(path.join(dir, "manifest.json"), "utf8"));
    expect(manifest.objects.length).toBeGreaterThanOrEqual(1);

    await dropDatabase(restoredUrl);
    const { stdout } = await run("node_modules/.bin/tsx", ["scripts/restore.ts", dir], { env: targetEnv() });
    expect(stdout).toMatch(/every record genuine, every photo intact/);
    const restored = testDbAt(restoredUrl);
    try {
      expect(await restored("records").where({ id: recordId }).first()).toBeDefined();
      // The lock survives: the database still refuses to change a countersigned checklist.
      await expect(restored("response_history").update({ rev: 99 })).rejects.toThrow();
    } finally {
      await restored.destroy();
    }
  });

  it("refuses a backup whose photo copy was damaged, and a target that is not empty", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "sternpost-backup-"));
    folders.push(dir);
    await run("node_modules/.bin/tsx", ["scripts/backup.ts", dir], { env: process.env });
    const manifest = JSON.parse(readFileSync(path.join(dir, "manifest.json"), "utf8"));
    const damaged = path.join(dir, "objects", manifest.objects[0].key);
    writeFileSync(damaged, Buffer.concat([readFileSync(damaged), Buffer.from([0])]));
    await dropDatabase(restoredUrl);
    const fresh = await startS3Fake({
      port: 0,
      directory: mkdtempSync(path.join(tmpdir(), "sternpost-restore-s3-")),
      bucket: "sternpost-restored",
    });
    try {
      const env = { ...targetEnv(), S3_ENDPOINT: fresh.endpoint };
      await expect(run("node_modules/.bin/tsx", ["scripts/restore.ts", dir], { env })).rejects.toThrow(
        /damaged/,
      );
      // The first test's restore left data behind in `target`'s bucket: not an empty target.
      await expect(
        run("node_modules/.bin/tsx", ["scripts/restore.ts", dir], { env: targetEnv() }),
      ).rejects.toThrow(/not empty|already holds/);
    } finally {
      await fresh.close();
    }
  });
});

function testDbAt(url: string) {
  const saved = process.env.DATABASE_URL;
  process.env.DATABASE_URL = url;
  try {
    return testDb();
  } finally {
    process.env.DATABASE_URL = saved;
  }
}
