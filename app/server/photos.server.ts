import { fileTypeFromBuffer } from "file-type";
import type { Knex } from "knex";
import { createHash } from "node:crypto";
import { canOnJob, type Actor } from "~/lib/permissions";
import type { RecordPhoto } from "~/lib/record/types";
import { Refusal } from "~/lib/refusal";
import { findItem, type PhotoValue, type Template } from "~/lib/templates";
import { loadChecklistAccess } from "./checklist-access.server.ts";
import { db } from "./db.server.ts";
import { env } from "./env.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import { getObject, headObject, putObject } from "./storage.server.ts";
import type { PhotoRow } from "./tables.server.ts";

/**
 * Photo evidence on the server. A photo is known by the UUID the tablet made; its bytes go to the
 * S3 store under a key made from their SHA-256, then a row records who sent them for which item.
 * Storing is idempotent (the same bytes again change nothing) and never half-done: the object is
 * written before the row, and an object with no row is harmless and written again on the retry.
 */

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

const toStored = (row: PhotoRow): StoredPhoto => ({
  id: row.id,
  checklistId: row.checklist_id,
  itemKey: row.item_key,
  sha256: row.sha256,
  bytes: Number(row.bytes),
  contentType: row.content_type,
});

/** The checklist's state, template and whether this person may see and fill it. */
async function checklistAccess(actor: Actor, checklistId: string) {
  const access = await loadChecklistAccess(checklistId);
  if (!access) return undefined;
  return {
    state: access.state,
    body: access.body,
    canView: canOnJob(actor, "view", access.job),
    canFill: canOnJob(actor, "fill", access.job),
  };
}

/**
 * Refuses anyone who may not add photos to the item. A submitted checklist still takes the bytes
 * of a photo one of its applied entries lists: the entry was made while it was open, and the
 * tablet sends photos only after the entries (and a submission queued offline) reached the
 * server. A countersigned one takes none: its digest covers the photos stored when it was signed.
 */
function refuseUnlessFillable(
  access: Awaited<ReturnType<typeof checklistAccess>>,
  itemKey: string,
  listed: boolean,
): void {
  if (!access) throw new Refusal("not-found", "There is no such checklist.");
  if (!access.canView) throw new Refusal("forbidden", "This checklist belongs to a job that is not yours.");
  if (!access.canFill) throw new Refusal("forbidden", "Only the job's technicians and its lead add photos.");
  if (!findItem(parseJsonColumn<Template>(access.body), itemKey))
    throw new Refusal("not-found", `The checklist has no item "${itemKey}".`);
  if (access.state === "countersigned")
    throw new Refusal("wrong-state", "The checklist is countersigned and locked; it takes no more photos.");
  if (access.state === "submitted" && !listed)
    throw new Refusal("wrong-state", "The checklist has been submitted for review and takes no more photos.");
}

/** The photos a stored value (a JSON column) lists; none for values of other kinds. */
function photosListedIn(raw: unknown): PhotoValue["photos"] {
  const value = parseJsonColumn<Partial<PhotoValue> | null>(raw);
  return Array.isArray(value?.photos) ? value.photos : [];
}

/** The SHA-256s that the item's applied entries (every revision) give for this photo id. */
async function listedShas(
  checklistId: string,
  itemKey: string,
  id: string,
): Promise<{ listed: boolean; sha256s: Set<string> }> {
  const revisions = await db()("response_history")
    .where({ checklist_id: checklistId, item_key: itemKey })
    .pluck("value");
  const entries = revisions.flatMap((raw) => photosListedIn(raw).filter((p) => p.id === id));
  return {
    listed: entries.length > 0,
    sha256s: new Set(entries.flatMap((p) => (p.sha256 ? [p.sha256] : []))),
  };
}

/** The answer to sending bytes for an id that is already stored: the same bytes, or a conflict. */
async function repeated(
  existing: StoredPhoto,
  input: { checklistId: string; itemKey: string; bytes: Uint8Array },
  sha256: string,
) {
  if (existing.checklistId !== input.checklistId || existing.itemKey !== input.itemKey) {
    throw new Refusal("wrong-state", "This photo id is already used for another item.");
  }
  if (existing.sha256 !== sha256)
    throw new Refusal(
      "wrong-state",
      "A different photo is already stored under this id; a photo never changes once stored.",
    );
  // A 200 promises the store has the bytes: put them back if the object went missing.
  if (!(await headObject(storageKeyFor(sha256))))
    await putObject(storageKeyFor(sha256), input.bytes, existing.contentType);
  return { created: false, photo: existing };
}

/**
 * Stores a photo's bytes for an item of a checklist the person may fill. Answers created: true
 * the first time, created: false when the same bytes were already stored under the id.
 */
export async function storePhoto(
  actor: Actor,
  input: { id: string; checklistId: string; itemKey: string; bytes: Uint8Array },
): Promise<{ created: boolean; photo: StoredPhoto }> {
  const max = env().PHOTO_MAX_BYTES;
  if (input.bytes.byteLength > max)
    throw new Refusal(
      "too-large",
      `A photo may be at most ${max} bytes; this one is ${input.bytes.byteLength}.`,
    );
  if (input.bytes.byteLength === 0) throw new Refusal("invalid", "The photo is empty.");
  const sha256 = sha256Of(input.bytes);

  // Three independent reads, side by side: they are most of what a photo costs besides the put.
  const [found, listing, access] = await Promise.all([
    db()("photos").where({ id: input.id }).first(),
    listedShas(input.checklistId, input.itemKey, input.id),
    checklistAccess(actor, input.checklistId),
  ]);
  if (found) {
    const existing = toStored(found);
    const owner =
      existing.checklistId === input.checklistId
        ? access
        : await checklistAccess(actor, existing.checklistId);
    if (!owner?.canView) throw new Refusal("forbidden", "This photo belongs to a job that is not yours.");
    return repeated(existing, input, sha256);
  }

  refuseUnlessFillable(access, input.itemKey, listing.listed);
  const type = await fileTypeFromBuffer(input.bytes);
  if (!type || !ACCEPTED_TYPES.has(type.mime)) {
    throw new Refusal(
      "unsupported-type",
      `Only JPEG, PNG and WebP photos are accepted; these bytes are ${type?.mime ?? "not an image"}.`,
    );
  }
  if (listing.sha256s.size && !listing.sha256s.has(sha256)) {
    throw new Refusal(
      "wrong-state",
      "These bytes are not the photo the entry refers to (their SHA-256 differs).",
    );
  }

  const key = storageKeyFor(sha256);
  await putObject(key, input.bytes, type.mime);
  const photo: StoredPhoto = {
    id: input.id,
    checklistId: input.checklistId,
    itemKey: input.itemKey,
    sha256,
    bytes: input.bytes.byteLength,
    contentType: type.mime,
  };
  try {
    await db().transaction(async (trx) => {
      // Under the checklist row's lock: a countersignature cannot slip in between the check and the row.
      const locked = await trx("job_checklists").where({ id: photo.checklistId }).forShare().first("state");
      if (locked?.state === "countersigned")
        throw new Refusal(
          "wrong-state",
          "The checklist is countersigned and locked; it takes no more photos.",
        );
      await trx("photos").insert({
        id: photo.id,
        checklist_id: photo.checklistId,
        item_key: photo.itemKey,
        sha256,
        bytes: photo.bytes,
        content_type: photo.contentType,
        uploaded_by: actor.id,
        uploaded_at: new Date(),
        storage_key: key,
      });
    });
  } catch (error) {
    // The same id sent twice at once: the first insert won; this one is a repeat of it.
    if ((error as { code?: string }).code !== "ER_DUP_ENTRY") throw error;
    return repeated(toStored((await db()("photos").where({ id: input.id }).first())!), input, sha256);
  }
  return { created: true, photo };
}

/** A photo's bytes for someone who may see its checklist. */
export async function readPhoto(actor: Actor, id: string): Promise<StoredPhoto & { data: Uint8Array }> {
  const row = await db()("photos").where({ id }).first();
  if (!row)
    throw new Refusal("not-found", "There is no such photo (it may not have been sent from the tablet yet).");
  const photo = toStored(row);
  const access = await checklistAccess(actor, photo.checklistId);
  if (!access?.canView) throw new Refusal("forbidden", "This photo belongs to a job that is not yours.");
  const data = await getObject(row.storage_key);
  if (!data)
    throw new Refusal("store-missing", "The photo is recorded but its file is missing from the store.");
  return { ...photo, data };
}

/** The stored photos of a checklist, for the commissioning record (its digest covers them). */
export async function checklistPhotos(checklistId: string, knex: Knex = db()): Promise<RecordPhoto[]> {
  const rows = await knex("photos")
    .where({ checklist_id: checklistId })
    .orderBy(["item_key", "id"])
    .select("item_key", "id", "sha256");
  return rows.map((r) => ({ itemKey: r.item_key, id: r.id, sha256: r.sha256 }));
}

/**
 * Photos the checklist's current entries list whose bytes have not reached the store yet (still
 * on a tablet). A countersignature waits for them: the digest covers the stored photos, and a
 * countersigned checklist takes no more.
 */
export async function photosNotYetStored(checklistId: string, knex: Knex = db()): Promise<string[]> {
  const [values, stored] = await Promise.all([
    knex("checklist_responses").where({ checklist_id: checklistId }).pluck("value"),
    knex("photos").where({ checklist_id: checklistId }).pluck("id"),
  ]);
  const have = new Set<string>(stored);
  const listed = values.flatMap((raw) => photosListedIn(raw).map((p) => p.id));
  return [...new Set(listed.filter((id) => !have.has(id)))].sort();
}

/** A stored photo's bytes by id, for the record PDF (renderRecordPdf's photoBytes). */
export async function photoBytes(id: string): Promise<Buffer | undefined> {
  const row = await db()("photos").where({ id }).first("storage_key");
  const data = row ? await getObject(row.storage_key) : undefined;
  return data ? Buffer.from(data) : undefined;
}
