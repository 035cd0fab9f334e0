import { GetObjectCommand, ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import { execFileSync } from "node:child_process";
import { createHash, randomUUID } from "node:crypto";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { checklistDigest } from "~/lib/record/digest.server";
import { startChecklists } from "~/server/checklists.server";
import { env } from "~/server/env.server";
import { checklistPhotos, photoBytes, photosNotYetStored } from "~/server/photos.server";
import { renderRecordPdf } from "~/server/record-pdf.server";
import { sync } from "~/server/sync.server";
import { seedLibrary } from "../../db/seeds/library.ts";
import { appHandler, signInCookie } from "../support/app.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";
import { commissioningRecordFixture } from "../support/record-fixture.ts";
import { op } from "../support/sync.ts";
import { gradientPng } from "../unit/photos/images.ts";

// The photo route through the production build's handler, against MariaDB and the S3 stand-in
// started by tests/setup/integration.ts. The store is also read directly, behind the app's back.

const knex = testDb();
const s3 = new S3Client({
  endpoint: process.env.S3_ENDPOINT,
  region: "us-east-1",
  forcePathStyle: true,
  credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
});
const BUCKET = process.env.S3_BUCKET!;
const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

/** Magic numbers of other formats: "GIF89a" (GIF89a specification, section 17) and "%PDF-" (ISO 32000-1, 7.5.2). */
const GIF = Buffer.concat([
  Buffer.from("GIF89a", "latin1"),
  Buffer.from([
    1, 0, 1, 0, 0x80, 0, 0, 0, 0, 0, 0xff, 0xff, 0xff, 0x21, 0xf9, 4, 1, 0, 0, 0, 0, 0x2c, 0, 0, 0, 0, 1, 0,
    1, 0, 0, 2, 2, 0x44, 1, 0, 0x3b,
  ]),
]);
const PDF = Buffer.from(
  "%PDF-1.7\n%âãÏÓ\n1 0 obj\n<< >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n",
  "latin1",
);
/** A JPEG begins with the SOI marker FF D8 and a marker segment, here APP0 "JFIF" (JFIF 1.02, ITU-T T.871). */
const JPEG_START = Buffer.from([
  0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01,
  0x00, 0x00,
]);

let app: Awaited<ReturnType<typeof appHandler>>;
let tech: Awaited<ReturnType<typeof makeUser>>,
  otherTech: typeof tech,
  lead: typeof tech,
  manager: typeof tech,
  surveyor: typeof tech;
const cookie: Record<string, string> = {};
let checklist: string, submitted: string;
let dir: string;

beforeAll(async () => {
  await seedLibrary(knex);
  [tech, otherTech, lead, manager, surveyor] = await Promise.all([
    makeUser(knex, "technician"),
    makeUser(knex, "technician"),
    makeUser(knex, "lead"),
    makeUser(knex, "manager"),
    makeUser(knex, "surveyor"),
  ]);
  const job = await makeJob(knex, lead.id, [tech.id]);
  [checklist, submitted] = await startChecklists(job.id, ["engine-alignment", "cooling"], lead.id);
  await knex("job_checklists").where({ id: submitted }).update({ state: "submitted" });
  app = await appHandler();
  for (const person of [tech, otherTech, lead, manager, surveyor])
    cookie[person.email] = await signInCookie(app, person.email);
  dir = mkdtempSync(join(tmpdir(), "sternpost-photos-"));
});

afterAll(async () => {
  rmSync(dir, { recursive: true, force: true });
  s3.destroy();
  await knex.destroy();
});

interface Put {
  as?: { email: string };
  id?: string;
  checklistId?: string;
  itemKey?: string;
  contentType?: string;
}
function put(
  bytes: Uint8Array,
  {
    as = tech,
    id = randomUUID(),
    checklistId = checklist,
    itemKey = "alignment-photo",
    contentType = "image/jpeg",
  }: Put = {},
) {
  const query = new URLSearchParams({ checklistId, itemKey });
  return app(`/api/photos/${id}?${query}`, {
    method: "PUT",
    body: new Uint8Array(bytes),
    headers: { "Content-Type": contentType },
    cookie: cookie[as.email],
  });
}
const get = (id: string, as: { email: string } | null = tech) =>
  app(`/api/photos/${id}`, { cookie: as ? cookie[as.email] : undefined });

async function storedKeys(): Promise<string[]> {
  const listing = await s3.send(new ListObjectsV2Command({ Bucket: BUCKET }));
  return (listing.Contents ?? []).map((o) => o.Key!).sort();
}
const rows = (id: string) => knex("photos").where({ id });

describe("PUT /api/photos/:id", () => {
  it("stores the bytes in S3 and records their SHA-256, as node:crypto computes it", async () => {
    const png = gradientPng(40, 30, 1);
    const id = randomUUID();
    const response = await put(png, { id, contentType: "image/png" });
    expect(response.status).toBe(201);
    const body = await response.json();
    expect(body).toEqual({
      id,
      checklistId: checklist,
      itemKey: "alignment-photo",
      sha256: sha256(png),
      bytes: png.length,
      contentType: "image/png",
    });
    const [row] = await rows(id);
    expect(row).toMatchObject({
      checklist_id: checklist,
      item_key: "alignment-photo",
      sha256: sha256(png),
      bytes: png.length,
      uploaded_by: tech.id,
    });
    const object = await s3.send(new GetObjectCommand({ Bucket: BUCKET, Key: row.storage_key }));
    expect(sha256(await object.Body!.transformToByteArray())).toBe(sha256(png));
  });

  it("is idempotent: the same bytes again answer 200 and change nothing", async () => {
    const png = gradientPng(20, 20, 2);
    const id = randomUUID();
    expect((await put(png, { id })).status).toBe(201);
    const before = await rows(id);
    const keys = await storedKeys();
    const again = await put(png, { id });
    expect(again.status).toBe(200);
    expect((await again.json()).sha256).toBe(sha256(png));
    expect(await rows(id)).toEqual(before);
    expect(await storedKeys()).toEqual(keys);
  });

  it("refuses different bytes for a stored id with 409 and keeps the first photo", async () => {
    const first = gradientPng(20, 20, 3);
    const id = randomUUID();
    await put(first, { id });
    const other = await put(gradientPng(20, 20, 4), { id });
    expect(other.status).toBe(409);
    expect((await other.json()).error).toMatch(/different photo/);
    expect(sha256(new Uint8Array(await (await get(id)).arrayBuffer()))).toBe(sha256(first));
    // The same bytes for the same id on another item are refused too: an id belongs to one place.
    expect((await put(first, { id, itemKey: "final-alignment-done" })).status).toBe(409);
  });

  it("judges the type by the bytes: a PNG sent as image/jpeg is stored as a PNG", async () => {
    const png = gradientPng(16, 12, 5);
    const response = await put(png, { contentType: "image/jpeg" });
    expect(response.status).toBe(201);
    expect((await response.json()).contentType).toBe("image/png");
    const jpeg = await put(Buffer.concat([JPEG_START, Buffer.alloc(64, 7)]), {
      contentType: "application/octet-stream",
    });
    expect(jpeg.status).toBe(201);
    expect((await jpeg.json()).contentType).toBe("image/jpeg");
  });

  it("refuses what is not a JPEG, PNG or WebP with 415, whatever the header says, and stores nothing", async () => {
    const keys = await storedKeys();
    for (const bytes of [Buffer.from("Shaft coupling bolts torqued, see sheet 3.\n".repeat(20)), GIF, PDF]) {
      const id = randomUUID();
      const response = await put(bytes, { id, contentType: "image/jpeg" });
      expect(response.status).toBe(415);
      expect((await response.json()).error).toMatch(/JPEG, PNG and WebP/);
      expect(await rows(id)).toEqual([]);
    }
    expect(await storedKeys()).toEqual(keys);
  });

  it("takes a photo at the size limit and refuses one byte more with 413, storing nothing", async () => {
    const max = env().PHOTO_MAX_BYTES;
    const png = gradientPng(8, 8, 6);
    const atLimit = Buffer.concat([png, Buffer.alloc(max - png.length)]);
    expect((await put(atLimit, { contentType: "image/png" })).status).toBe(201);
    const keys = await storedKeys();
    const id = randomUUID();
    const over = await put(Buffer.concat([atLimit, Buffer.from([0])]), { id });
    expect(over.status).toBe(413);
    expect(await rows(id)).toEqual([]);
    expect(await storedKeys()).toEqual(keys);
  });

  it("lets only the job's technicians and lead add photos, and only while the checklist is open", async () => {
    const png = gradientPng(10, 10, 7);
    expect((await put(png, { as: lead })).status).toBe(201);
    for (const outsider of [otherTech, manager, surveyor]) {
      const id = randomUUID();
      expect((await put(png, { as: outsider, id })).status).toBe(403);
      expect(await rows(id)).toEqual([]);
    }
    const locked = await put(png, { checklistId: submitted, itemKey: "seacock" });
    expect(locked.status).toBe(409);
    expect((await locked.json()).error).toMatch(/submitted/);
    expect((await put(png, { checklistId: randomUUID() })).status).toBe(404);
    expect((await put(png, { itemKey: "no-such-item" })).status).toBe(404);
    const anonymous = await app(
      `/api/photos/${randomUUID()}?checklistId=${checklist}&itemKey=alignment-photo`,
      { method: "PUT", body: new Uint8Array(png) },
    );
    expect(anonymous.status).toBe(401);
  });

  it("answers malformed requests with 400", async () => {
    const png = gradientPng(4, 4, 8);
    expect(
      (
        await app(`/api/photos/not-a-uuid?checklistId=${checklist}&itemKey=alignment-photo`, {
          method: "PUT",
          body: new Uint8Array(png),
          cookie: cookie[tech.email],
        })
      ).status,
    ).toBe(400);
    expect(
      (
        await app(`/api/photos/${randomUUID()}?itemKey=alignment-photo`, {
          method: "PUT",
          body: new Uint8Array(png),
          cookie: cookie[tech.email],
        })
      ).status,
    ).toBe(400);
    expect((await put(new Uint8Array(0))).status).toBe(400);
  });

  it("refuses bytes whose SHA-256 is not the one the item's entry gives for the id", async () => {
    const id = randomUUID();
    const png = gradientPng(12, 12, 9);
    const [result] = (
      await sync(tech, {
        deviceId: "photo-test-device",
        cursor: null,
        ops: [op(checklist, "alignment-photo", { photos: [{ id, sha256: sha256(png) }] }, 0)],
      })
    ).results;
    expect(result!.status).toBe("applied");
    expect((await put(gradientPng(12, 12, 10), { id })).status).toBe(409);
    expect((await put(png, { id })).status).toBe(201);
  });

  it("still takes, once the checklist is submitted, the photos its entries listed while it was open, and nothing else", async () => {
    const job = await makeJob(knex, lead.id, [tech.id]);
    const [own] = await startChecklists(job.id, ["engine-alignment"], lead.id);
    const [listed, unlisted] = [gradientPng(14, 14, 20), gradientPng(14, 14, 21)];
    const id = randomUUID();
    // Entered offline, then submitted offline: the entry and the submission reach the server before the photo.
    await sync(tech, {
      deviceId: "photo-test-device",
      cursor: null,
      ops: [op(own!, "alignment-photo", { photos: [{ id, sha256: sha256(listed) }] }, 0)],
    });
    await knex("job_checklists").where({ id: own }).update({ state: "submitted" });
    expect((await put(unlisted, { id, checklistId: own })).status).toBe(409);
    expect((await put(listed, { id, checklistId: own })).status).toBe(201);
    const other = await put(unlisted, { checklistId: own });
    expect(other.status).toBe(409);
    expect((await other.json()).error).toMatch(/submitted/);
    expect((await put(listed, { id, checklistId: own, as: otherTech })).status).toBe(403);
  });

  it("takes nothing new once countersigned, and says which listed photos a countersignature waits for", async () => {
    const job = await makeJob(knex, lead.id, [tech.id]);
    const [own] = await startChecklists(job.id, ["engine-alignment"], lead.id);
    const [sent, onTablet] = [gradientPng(14, 14, 22), gradientPng(14, 14, 23)];
    const ids = [randomUUID(), randomUUID()] as const;
    await sync(tech, {
      deviceId: "photo-test-device",
      cursor: null,
      ops: [
        op(
          own!,
          "alignment-photo",
          {
            photos: [
              { id: ids[0], sha256: sha256(sent) },
              { id: ids[1], sha256: sha256(onTablet) },
            ],
          },
          0,
        ),
      ],
    });
    expect(await photosNotYetStored(own!)).toEqual([...ids].sort());
    expect((await put(sent, { id: ids[0], checklistId: own })).status).toBe(201);
    expect(await photosNotYetStored(own!)).toEqual([ids[1]]);
    await knex("job_checklists").where({ id: own }).update({ state: "countersigned" });
    const late = await put(onTablet, { id: ids[1], checklistId: own });
    expect(late.status).toBe(409);
    expect((await late.json()).error).toMatch(/countersigned/);
    // A lost answer's retry of a photo stored before the countersignature still gets its 200.
    expect((await put(sent, { id: ids[0], checklistId: own })).status).toBe(200);
  });
});

describe("GET /api/photos/:id", () => {
  let id: string;
  const png = gradientPng(24, 18, 11);
  beforeAll(async () => {
    id = randomUUID();
    expect((await put(png, { id })).status).toBe(201);
  });

  it("serves the stored bytes, privately cached, to the people who may see the checklist", async () => {
    for (const person of [tech, lead, manager]) {
      const response = await get(id, person);
      expect(response.status).toBe(200);
      expect(response.headers.get("Content-Type")).toBe("image/png");
      expect(response.headers.get("Cache-Control")).toMatch(/^private/);
      expect(Buffer.from(await response.arrayBuffer()).equals(png)).toBe(true);
    }
  });

  it("refuses everyone else, and answers 404 for a photo not sent yet", async () => {
    expect((await get(id, otherTech)).status).toBe(403);
    expect((await get(id, surveyor)).status).toBe(403);
    expect((await get(id, null)).status).toBe(401);
    expect((await get(randomUUID())).status).toBe(404);
  });
});

async function pdfFile(name: string, pdf: Buffer) {
  const file = join(dir, name);
  writeFileSync(file, pdf);
  return file;
}

/** `pdfimages -list` (poppler-utils): a line per image after two header lines; columns 4 and 5 are its width and height in pixels. */
function embeddedImages(file: string): string[] {
  const lines = execFileSync("pdfimages", ["-list", file], { encoding: "utf8" })
    .split("\n")
    .slice(2)
    .filter((l) => l.trim());
  return lines.map((l) => l.trim().split(/\s+/)).map((cols) => `${cols[3]}x${cols[4]}`);
}

describe("photos in the commissioning record", () => {
  it("gives the record the stored SHA-256 of each photo, so the checklist's digest covers the bytes", async () => {
    const [a, b] = [gradientPng(30, 20, 12), gradientPng(30, 20, 13)];
    const job = await makeJob(knex, lead.id, [tech.id]);
    const [own] = await startChecklists(job.id, ["engine-alignment"], lead.id);
    const ids = [randomUUID(), randomUUID()];
    await put(a, { id: ids[0], checklistId: own });
    await put(b, { id: ids[1], checklistId: own });
    const photos = await checklistPhotos(own!);
    expect(photos).toEqual(
      [
        { itemKey: "alignment-photo", id: ids[0], sha256: sha256(a) },
        { itemKey: "alignment-photo", id: ids[1], sha256: sha256(b) },
      ].sort((x, y) => (x.id < y.id ? -1 : 1)),
    );
    const record = commissioningRecordFixture().checklists[0]!;
    const digest = checklistDigest({ ...record, photos });
    // Any other bytes under the first id would give another digest.
    const otherBytes = sha256(gradientPng(30, 20, 99));
    expect(
      checklistDigest({
        ...record,
        photos: photos.map((p, i) => (i === 0 ? { ...p, sha256: otherBytes } : p)),
      }),
    ).not.toBe(digest);
  });

  it("shows the stored photos in the PDF, and not a file whose SHA-256 differs from the record's", async () => {
    const record = commissioningRecordFixture();
    const alignment = record.checklists.find((c) => c.templateKey === "engine-alignment")!;
    const pictures = [gradientPng(64, 48, 14), gradientPng(48, 64, 15)];
    const ids: string[] = [randomUUID(), randomUUID()];
    for (const [i, bytes] of pictures.entries()) expect((await put(bytes, { id: ids[i] })).status).toBe(201);
    const listed = ids.map((id, i) => ({ id, sha256: sha256(pictures[i]!) }));
    alignment.responses["alignment-photo"] = {
      value: { photos: listed },
      rev: 1,
      by: "Tadhg Mulcair",
      at: "2025-05-20T11:00:00Z",
    };
    alignment.photos.push(...listed.map((p) => ({ itemKey: "alignment-photo", ...p })));
    // The fixture's other photo ids get bytes that are not theirs: the PDF must not show them as those photos.
    const impostor = gradientPng(10, 10, 16);
    const options = { digest: "0".repeat(64), verifyUrl: record.verifyUrl };
    const without = await pdfFile("without-photos.pdf", await renderRecordPdf(record, options));
    const withPhotos = await pdfFile(
      "with-photos.pdf",
      await renderRecordPdf(record, {
        ...options,
        photoBytes: async (id) => (ids.includes(id) ? photoBytes(id) : impostor),
      }),
    );
    // The two stored photos are the only images added (the cover's QR code is in both), at their own pixel size.
    expect(embeddedImages(withPhotos).sort()).toEqual([...embeddedImages(without), "48x64", "64x48"].sort());
    expect(execFileSync("pdftotext", ["-layout", withPhotos, "-"], { encoding: "utf8" })).toMatch(
      /does\s+not\s+match\s+its\s+SHA-256/,
    );
  });
});
