import { fileTypeFromBuffer } from "file-type";
import { createHash } from "node:crypto";
import { canFillJob, canViewJob, type Actor } from "~/lib/permissions";
import type { RecordPhoto } from "~/lib/record/types";
import { findItem, type PhotoValue, type Template } from "~/lib/templates";
import { db } from "./db.server.ts";
import { env } from "./env.server.ts";
import { getObject, headObject, putObject } from "./storage.server.ts";

/**
 * Photo evidence on the server. A photo is known by the UUID the tablet made; its bytes go to the
 * S3 store under a key made from their SHA-256, then a row records who sent them for which item.
 * Storing is idempotent (the same bytes again change nothing) and never half-done: the object is
 * written before the row, and an object with no row is harmless and written again on the retry.
 */

/** A refused photo request, with the HTTP status the route answers. */
export class PhotoRefusal extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

/** What the store accepts, judged from the bytes (never the file name or the Content-Type header). */
const ACCEPTED_TYPES = new Set(["image/jpeg", "image/png", "image/webp"]);

export interface StoredPhoto {
  id: string;
  checklistId: string;
  itemKey: string;
  sha256: string;
  bytes: number;
  contentType: string;
}

/** Content-addressed: one key per set of bytes, spread over prefixes as S3 prefers. */
export const storageKeyFor = (sha256: string) => `photos/sha256/${sha256.slice(0, 2)}/${sha256}`;

const sha256Of = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

const toStored = (row: any): StoredPhoto => ({
  id: row.id,
  checklistId: row.checklist_id,
  itemKey: row.item_key,
  sha256: row.sha256,
  bytes: Number(row.bytes),
  contentType: row.content_type,
});

/** The checklist's state, template and who may see and fill it. */
async function checklistAccess(actor: Actor, checklistId: string) {
  const row = await db()("job_checklists as c")
    .join("jobs as j", "j.id", "c.job_id")
    .join("template_versions as t", "t.id", "c.template_version_id")
    .where("c.id", checklistId)
    .first("c.state", "c.job_id", "j.lead_id", "t.body");
  if (!row) return undefined;
  const technicianIds: number[] = await db()("job_technicians").where({ job_id: row.job_id }).pluck("user_id");
  const job = { leadId: row.lead_id, technicianIds };
  return { state: row.state as string, body: row.body as string, canView: canViewJob(actor, job), canFill: canFillJob(actor, job) };
}

function refuseUnlessFillable(access: Awaited<ReturnType<typeof checklistAccess>>, itemKey: string): Template {
  if (!access) throw new PhotoRefusal(404, "There is no such checklist.");
  if (!access.canView) throw new PhotoRefusal(403, "This checklist belongs to a job that is not yours.");
  if (!access.canFill) throw new PhotoRefusal(403, "Only the job's technicians and its lead add photos.");
  if (access.state === "submitted") throw new PhotoRefusal(409, "The checklist has been submitted for review and takes no more photos.");
  if (access.state === "countersigned") throw new PhotoRefusal(409, "The checklist is countersigned and locked; it takes no more photos.");
  const template = JSON.parse(access.body) as Template;
  if (!findItem(template, itemKey)) throw new PhotoRefusal(404, `The checklist has no item "${itemKey}".`);
  return template;
}

/** The photo an item's current entry lists under this id, if it gives a SHA-256 for it. */
async function referencedSha(checklistId: string, itemKey: string, id: string): Promise<string | undefined> {
  const row = await db()("checklist_responses").where({ checklist_id: checklistId, item_key: itemKey }).first("value");
  if (!row) return undefined;
  const value = (typeof row.value === "string" ? JSON.parse(row.value) : row.value) as Partial<PhotoValue>;
  return Array.isArray(value.photos) ? value.photos.find((p) => p.id === id)?.sha256 : undefined;
}

/** The answer to sending bytes for an id that is already stored: the same bytes, or a conflict. */
async function repeated(existing: StoredPhoto, input: { checklistId: string; itemKey: string; bytes: Uint8Array }, sha256: string) {
  if (existing.checklistId !== input.checklistId || existing.itemKey !== input.itemKey) {
    throw new PhotoRefusal(409, "This photo id is already used for another item.");
  }
  if (existing.sha256 !== sha256) throw new PhotoRefusal(409, "A different photo is already stored under this id; a photo never changes once stored.");
  // A 200 promises the store has the bytes: put them back if the object went missing.
  if (!(await headObject(storageKeyFor(sha256)))) await putObject(storageKeyFor(sha256), input.bytes, existing.contentType);
  return { created: false, photo: existing };
}

/**
 * Stores a photo's bytes for an item of a checklist the person may fill. Answers created: true
 * the first time, created: false when the same bytes were already stored under the id.
 */
export async function storePhoto(actor: Actor, input: { id: string; checklistId: string; itemKey: string; bytes: Uint8Array }): Promise<{ created: boolean; photo: StoredPhoto }> {
  const max = env().PHOTO_MAX_BYTES;
  if (input.bytes.byteLength > max) throw new PhotoRefusal(413, `A photo may be at most ${max} bytes; this one is ${input.bytes.byteLength}.`);
  if (input.bytes.byteLength === 0) throw new PhotoRefusal(400, "The photo is empty.");
  const sha256 = sha256Of(input.bytes);

  const found = await db()("photos").where({ id: input.id }).first();
  if (found) {
    const existing = toStored(found);
    const access = await checklistAccess(actor, existing.checklistId);
    if (!access?.canView) throw new PhotoRefusal(403, "This photo belongs to a job that is not yours.");
    return repeated(existing, input, sha256);
  }

  refuseUnlessFillable(await checklistAccess(actor, input.checklistId), input.itemKey);
  const type = await fileTypeFromBuffer(input.bytes);
  if (!type || !ACCEPTED_TYPES.has(type.mime)) {
    throw new PhotoRefusal(415, `Only JPEG, PNG and WebP photos are accepted; these bytes are ${type ? `${type.mime}` : "not an image"}.`);
  }
  const listed = await referencedSha(input.checklistId, input.itemKey, input.id);
  if (listed && listed !== sha256) throw new PhotoRefusal(409, "These bytes are not the photo the entry refers to (their SHA-256 differs).");

  const key = storageKeyFor(sha256);
  await putObject(key, input.bytes, type.mime);
  const photo: StoredPhoto = { id: input.id, checklistId: input.checklistId, itemKey: input.itemKey, sha256, bytes: input.bytes.byteLength, contentType: type.mime };
  try {
    await db()("photos").insert({
      id: photo.id, checklist_id: photo.checklistId, item_key: photo.itemKey, sha256, bytes: photo.bytes, content_type: photo.contentType,
      uploaded_by: actor.id, uploaded_at: new Date(), storage_key: key,
    });
  } catch (error) {
    // The same id sent twice at once: the first insert won; this one is a repeat of it.
    if ((error as { code?: string }).code !== "ER_DUP_ENTRY") throw error;
    return repeated(toStored(await db()("photos").where({ id: input.id }).first()), input, sha256);
  }
  return { created: true, photo };
}

/** A photo's bytes for someone who may see its checklist. */
export async function readPhoto(actor: Actor, id: string): Promise<StoredPhoto & { data: Uint8Array }> {
  const row = await db()("photos").where({ id }).first();
  if (!row) throw new PhotoRefusal(404, "There is no such photo (it may not have been sent from the tablet yet).");
  const photo = toStored(row);
  const access = await checklistAccess(actor, photo.checklistId);
  if (!access?.canView) throw new PhotoRefusal(403, "This photo belongs to a job that is not yours.");
  const data = await getObject(row.storage_key);
  if (!data) throw new PhotoRefusal(502, "The photo is recorded but its file is missing from the store.");
  return { ...photo, data };
}

/** The stored photos of these checklists, for the commissioning record (its digest covers them). */
export async function checklistPhotos(checklistId: string): Promise<RecordPhoto[]> {
  const rows = await db()("photos").where({ checklist_id: checklistId }).orderBy(["item_key", "id"]).select("item_key", "id", "sha256");
  return rows.map((r: any) => ({ itemKey: r.item_key, id: r.id, sha256: r.sha256 }));
}

/** A stored photo's bytes by id, for the record PDF (renderRecordPdf's photoBytes). */
export async function photoBytes(id: string): Promise<Buffer | undefined> {
  const row = await db()("photos").where({ id }).first("storage_key");
  const data = row ? await getObject(row.storage_key) : undefined;
  return data ? Buffer.from(data) : undefined;
}
