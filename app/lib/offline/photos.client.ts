import type { DBSchema, IDBPDatabase } from "idb";
import type { PhotoValue } from "../templates/index.ts";
import { reopeningDatabase } from "./reopening-db.client.ts";
import { outboxInOrder, readChecklist, recordEntry } from "./store.client.ts";

/**
 * Photos on the tablet: compressed, kept in their own IndexedDB database until the server has
 * them, and uploaded by the id made here, each only once no operation waiting in the outbox
 * refers to it (so the entry that lists a photo always reaches the server before the photo).
 * After the server confirmed a photo only a small copy stays, so the screen still shows it offline.
 */

/** waiting: on this tablet only; sent: the server confirmed it; refused: the server said no (kept here). */
export type PhotoState = "waiting" | "sent" | "refused";

export interface LocalPhoto {
  id: string;
  checklistId: string;
  itemKey: string;
  sha256: string;
  /** The order photos were taken in, which is the order they are sent in. */
  seq: number;
  takenAt: string;
  state: PhotoState;
  /** The compressed photo, until the server confirmed it. */
  bytes?: ArrayBuffer;
  type: string;
  thumb: ArrayBuffer;
  thumbType: string;
  /** Why the server refused it. */
  problem?: string;
}

/** A photo ready to keep: the file to send and a small copy to show. */
export interface PreparedPhoto {
  bytes: ArrayBuffer;
  type: string;
  thumb: ArrayBuffer;
  thumbType: string;
}

interface PhotoDB extends DBSchema {
  photos: { key: string; value: LocalPhoto; indexes: { bySeq: number } };
  meta: { key: string; value: number };
}

// Bytes are kept as ArrayBuffers: some WebKit versions cannot store Blobs in IndexedDB.
const database = reopeningDatabase<PhotoDB>("sternpost-photos", 1, (db) => {
  db.createObjectStore("photos", { keyPath: "id" }).createIndex("bySeq", "seq");
  db.createObjectStore("meta");
});
const photoDb = (): Promise<IDBPDatabase<PhotoDB>> => database.open();

/** For tests: forget the open connection, or switch to another device's photo database. */
export const forgetPhotoDb = (nextName?: string) => database.forget(nextName);

const listeners = new Set<() => void>();

/** Called whenever a photo is added, sent or refused (the screens show each photo's state). */
export function onPhotosChanged(listener: () => void) {
  listeners.add(listener);
  return () => void listeners.delete(listener);
}
const changed = () => listeners.forEach((l) => l());

/**
 * Compresses a photo to what a shop's connection carries (at most 1600 px on the long side, about
 * half a megabyte, JPEG without its EXIF block, so no location leaves the tablet) and makes a
 * 320 px copy for the screen. On the main thread: the library's worker would load its code from a CDN.
 */
export async function preparePhoto(file: File): Promise<PreparedPhoto> {
  const { default: imageCompression } = await import("browser-image-compression");
  const photo = await imageCompression(file, {
    maxSizeMB: 0.5,
    maxWidthOrHeight: 1600,
    fileType: "image/jpeg",
    initialQuality: 0.85,
    useWebWorker: false,
  });
  const thumb = await imageCompression(photo, {
    maxSizeMB: 0.04,
    maxWidthOrHeight: 320,
    fileType: "image/jpeg",
    useWebWorker: false,
  });
  return {
    bytes: await photo.arrayBuffer(),
    type: photo.type,
    thumb: await thumb.arrayBuffer(),
    thumbType: thumb.type,
  };
}

async function sha256Hex(bytes: ArrayBuffer): Promise<string> {
  const digest = new Uint8Array(await crypto.subtle.digest("SHA-256", bytes));
  return Array.from(digest, (b) => b.toString(16).padStart(2, "0")).join("");
}

/** Photos being added in this tab: not sent before the entry that lists them is written. */
const adding = new Set<string>();
let addQueue: Promise<unknown> = Promise.resolve();

/**
 * Keeps a new photo on the tablet and records the item's new photo list as an entry. The photo is
 * stored first: a crash in between leaves a photo no entry lists (harmless), never an entry
 * listing a photo the tablet does not have. Adds run one after another, so two quick photos on
 * one item both end up in its list.
 */
export function addPhoto(
  place: { checklistId: string; itemKey: string; by: string },
  file: File,
  prepare: (file: File) => Promise<PreparedPhoto> = preparePhoto,
): Promise<LocalPhoto> {
  const run = async () => {
    const prepared = await prepare(file);
    const photo: LocalPhoto = {
      id: crypto.randomUUID(),
      checklistId: place.checklistId,
      itemKey: place.itemKey,
      sha256: await sha256Hex(prepared.bytes),
      seq: 0,
      takenAt: new Date().toISOString(),
      state: "waiting",
      ...prepared,
    };
    const local = await readChecklist(place.checklistId);
    const current = (local?.responses[place.itemKey]?.value as PhotoValue | undefined)?.photos ?? [];
    adding.add(photo.id);
    try {
      const db = await photoDb();
      const tx = db.transaction(["photos", "meta"], "readwrite");
      photo.seq = ((await tx.objectStore("meta").get("seq")) ?? 0) + 1;
      await tx.objectStore("meta").put(photo.seq, "seq");
      await tx.objectStore("photos").put(photo);
      await tx.done;
      try {
        await recordEntry(
          place.checklistId,
          place.itemKey,
          { photos: [...current, { id: photo.id, sha256: photo.sha256 }] } satisfies PhotoValue,
          place.by,
        );
      } catch (error) {
        await db.delete("photos", photo.id);
        throw error;
      }
    } finally {
      adding.delete(photo.id);
    }
    changed();
    return photo;
  };
  const next = addQueue.then(run, run);
  addQueue = next.catch(() => undefined);
  return next;
}

/** The photo as this tablet holds it, if it does. */
export async function localPhoto(id: string): Promise<LocalPhoto | undefined> {
  return (await photoDb()).get("photos", id);
}

/**
 * Where to show a photo from: the tablet's copy while it has one (the photo until the server
 * confirmed it, then the small copy), as an object URL to revoke after use; else the server's.
 */
export async function photoUrl(id: string): Promise<string> {
  const photo = await localPhoto(id).catch(() => undefined);
  if (photo?.bytes) return URL.createObjectURL(new Blob([photo.bytes], { type: photo.type }));
  if (photo) return URL.createObjectURL(new Blob([photo.thumb], { type: photo.thumbType }));
  return `/api/photos/${id}`;
}

function photoIdsIn(value: unknown): string[] {
  const photos = (value as Partial<PhotoValue> | null)?.photos;
  return Array.isArray(photos) ? photos.map((p) => p.id) : [];
}

/** Answers that may go better later: the next round sends the photo again. */
const tryAgainLater = (status: number) => status === 401 || status === 408 || status === 429 || status >= 500;

async function settle(id: string, change: Partial<LocalPhoto>) {
  const db = await photoDb();
  const tx = db.transaction("photos", "readwrite");
  const photo = await tx.store.get(id);
  if (photo) await tx.store.put({ ...photo, ...change });
  await tx.done;
}

async function uploadRound(fetcher: typeof fetch): Promise<{ ok: boolean; uploaded: number }> {
  let uploaded = 0;
  try {
    const waiting = (await (await photoDb()).getAllFromIndex("photos", "bySeq")).filter(
      (p) => p.state === "waiting" && !adding.has(p.id),
    );
    if (!waiting.length) return { ok: true, uploaded };
    const listedInOutbox = new Set((await outboxInOrder()).flatMap((op) => photoIdsIn(op.value)));
    for (const photo of waiting) {
      if (listedInOutbox.has(photo.id)) continue;
      const query = new URLSearchParams({ checklistId: photo.checklistId, itemKey: photo.itemKey });
      let response: Response;
      try {
        response = await fetcher(`/api/photos/${photo.id}?${query}`, {
          method: "PUT",
          credentials: "same-origin",
          headers: { "Content-Type": photo.type },
          body: photo.bytes,
        });
      } catch {
        return { ok: false, uploaded }; // offline: everything stays queued, in order
      }
      if (response.status === 200 || response.status === 201) {
        // Confirmed: only now does the full photo leave the tablet (the small copy stays).
        await settle(photo.id, { state: "sent", bytes: undefined });
        uploaded++;
        changed();
      } else if (tryAgainLater(response.status)) {
        return { ok: false, uploaded };
      } else {
        const problem =
          ((await response.json().catch(() => ({}))) as { error?: string }).error ??
          `The server answered ${response.status}.`;
        await settle(photo.id, { state: "refused", problem });
        changed();
      }
    }
    return { ok: true, uploaded };
  } catch {
    return { ok: false, uploaded };
  }
}

let running: Promise<{ ok: boolean; uploaded: number }> | null = null;

/**
 * Sends the waiting photos, oldest first, that no outbox operation refers to any more. Safe to
 * call at any time: it never throws, and a call while a round is running joins that round.
 * ok: false means a photo could not be sent now (offline, signed out, server trouble): it stays
 * queued and the next call sends it. A refused photo is kept on the tablet with the reason.
 */
export function uploadPendingPhotos(
  fetcher: typeof fetch = fetch,
): Promise<{ ok: boolean; uploaded: number }> {
  running ??= uploadRound(fetcher).finally(() => (running = null));
  return running;
}
