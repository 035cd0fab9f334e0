import "fake-indexeddb/auto";
import { createHash } from "node:crypto";
import { beforeEach, describe, expect, it } from "vitest";
import { forgetLocalDb, localDb } from "~/lib/offline/db.client";
import {
  addPhoto,
  forgetPhotoDb,
  localPhoto,
  photoUrl,
  uploadPendingPhotos,
  type PreparedPhoto,
} from "~/lib/offline/photos.client";
import { applySyncAnswer, outboxInOrder, readChecklist, saveBundle } from "~/lib/offline/store.client";
import type { OpResult } from "~/lib/sync/protocol";
import { demoBundle, demoTemplate } from "../../support/offline-bundle.ts";

const CHECKLIST = "7d0e7c1e-0000-4000-8000-000000000002";
const LOCKED = "7d0e7c1e-0000-4000-8000-000000000003";
const template = demoTemplate([
  { kind: "photo", key: "coupling-photo", label: "Coupling", required: true, minPhotos: 2 },
  { kind: "photo", key: "mount-photo", label: "Mount", required: false, minPhotos: 1 },
]);
const bundle = demoBundle(template, [{ id: CHECKLIST }, { id: LOCKED, state: "submitted" }]);

const encode = (text: string) => new TextEncoder().encode(text).buffer as ArrayBuffer;
/** Stands in for the compression (which needs a canvas): the "photo" is the file's text. */
const prepare = async (file: File): Promise<PreparedPhoto> => ({
  bytes: await file.arrayBuffer(),
  type: "image/jpeg",
  thumb: encode(`thumb of ${file.name}`),
  thumbType: "image/jpeg",
});
const file = (text: string) => new File([text], `${text}.jpg`, { type: "image/jpeg" });
const take = (text: string, itemKey = "coupling-photo", checklistId = CHECKLIST) =>
  addPhoto({ checklistId, itemKey, by: "Tess Tech" }, file(text), prepare);
const sha256 = (text: string) => createHash("sha256").update(text).digest("hex");

/** The server's answer to everything in the outbox: each operation applied (or as given). */
async function serverConfirmsOutbox(status: OpResult["status"] = "applied") {
  const sent = await outboxInOrder();
  const results: OpResult[] = sent.map((op, i) =>
    status === "conflict"
      ? { opId: op.opId, status, rev: 1, serverValue: { photos: [] }, conflictId: i + 1 }
      : status === "rejected"
        ? { opId: op.opId, status, reason: "Locked." }
        : { opId: op.opId, status, rev: op.baseRev + 1 },
  );
  await applySyncAnswer(sent, { results, changes: [], cursor: "1" }, "Tess Tech");
}

interface Sent {
  url: string;
  method?: string;
  contentType: string | null;
  body: string;
}
/** A fake server: answers each PUT with the next scripted status (or throws, as fetch does offline). */
function fakeServer(...script: (number | "offline")[]) {
  const sent: Sent[] = [];
  const fetcher = (async (url: string, init: RequestInit = {}) => {
    const next = script.length > 1 ? script.shift()! : (script[0] ?? 201);
    if (next === "offline") throw new TypeError("Failed to fetch");
    sent.push({
      url,
      method: init.method,
      contentType: new Headers(init.headers).get("Content-Type"),
      body: new TextDecoder().decode(init.body as ArrayBuffer),
    });
    return Response.json(next < 300 ? { ok: true } : { error: `Refused with ${next}.` }, { status: next });
  }) as typeof fetch;
  return { fetcher, sent };
}
const photoIdOf = (url: string) => /\/api\/photos\/([^?]+)/.exec(url)![1];

let n = 0;
beforeEach(async () => {
  forgetLocalDb(`photo-device-${++n}`);
  forgetPhotoDb(`photo-store-${n}`);
  await saveBundle(bundle);
});

describe("adding a photo on the tablet", () => {
  it("keeps the photo with its SHA-256 and records the item's photo list as an entry", async () => {
    // FIPS 180-2, Appendix B.1: SHA-256("abc") = ba7816bf 8f01cfea 414140de 5dae2223 b00361a3 96177a9c b410ff61 f20015ad.
    const photo = await take("abc");
    expect(photo.sha256).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    expect(await localPhoto(photo.id)).toMatchObject({
      state: "waiting",
      checklistId: CHECKLIST,
      itemKey: "coupling-photo",
      type: "image/jpeg",
    });
    const [op] = await outboxInOrder();
    expect(op).toMatchObject({
      checklistId: CHECKLIST,
      itemKey: "coupling-photo",
      value: { photos: [{ id: photo.id, sha256: photo.sha256 }] },
    });
    expect(photo.id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/); // RFC 9562 version 4
  });

  it("adds photos one after another, so two quick ones both stay in the list, in order", async () => {
    const [first, second] = await Promise.all([take("bow"), take("stern")]);
    const value = (await readChecklist(CHECKLIST))!.responses["coupling-photo"]!.value;
    expect(value).toEqual({
      photos: [
        { id: first.id, sha256: sha256("bow") },
        { id: second.id, sha256: sha256("stern") },
      ],
    });
    expect((await outboxInOrder()).map((o) => (o.value as { photos: unknown[] }).photos.length)).toEqual([
      1, 2,
    ]);
  });

  it("keeps nothing when the checklist takes no more entries", async () => {
    await expect(take("late", "coupling-photo", LOCKED)).rejects.toThrow(/locked/);
    expect(await (await localDb()).count("outbox")).toBe(0);
    expect(await uploadPendingPhotos(fakeServer().fetcher)).toEqual({ ok: true, uploaded: 0 });
  });
});

describe("the upload queue", () => {
  it("sends a photo only once no operation in the outbox lists it", async () => {
    const server = fakeServer(201);
    const photo = await take("coupling");
    expect(await uploadPendingPhotos(server.fetcher)).toEqual({ ok: true, uploaded: 0 });
    expect(server.sent).toEqual([]);

    // A second photo: the newer entry lists both, so neither goes while it waits.
    const second = await take("coupling again");
    await serverConfirmsOutbox();
    await take("mount", "mount-photo"); // an entry on another item does not hold these back
    expect(await uploadPendingPhotos(server.fetcher)).toEqual({ ok: true, uploaded: 2 });
    expect(server.sent.map((s) => photoIdOf(s.url))).toEqual([photo.id, second.id]);
    expect(server.sent[0]).toEqual({
      url: `/api/photos/${photo.id}?checklistId=${CHECKLIST}&itemKey=coupling-photo`,
      method: "PUT",
      contentType: "image/jpeg",
      body: "coupling",
    });
  });

  it("sends in the order the photos were taken", async () => {
    const taken = [await take("one"), await take("two", "mount-photo"), await take("three")];
    await serverConfirmsOutbox();
    const server = fakeServer(201);
    await uploadPendingPhotos(server.fetcher);
    expect(server.sent.map((s) => photoIdOf(s.url))).toEqual(taken.map((p) => p.id));
  });

  it("keeps a photo queued when the upload fails, and stops there so the order holds", async () => {
    const taken = [await take("one"), await take("two", "mount-photo")];
    await serverConfirmsOutbox();
    for (const failure of ["offline", 503, 401, 429] as const) {
      const server = fakeServer(failure);
      expect(await uploadPendingPhotos(server.fetcher)).toEqual({ ok: false, uploaded: 0 });
      expect(server.sent.length).toBeLessThanOrEqual(1); // the first photo was tried, the second waited
      for (const photo of taken)
        expect(await localPhoto(photo.id)).toMatchObject({
          state: "waiting",
          bytes: expect.any(ArrayBuffer),
        });
    }
    const later = fakeServer(201);
    expect(await uploadPendingPhotos(later.fetcher)).toEqual({ ok: true, uploaded: 2 });
    expect(later.sent.map((s) => photoIdOf(s.url))).toEqual(taken.map((p) => p.id));
  });

  it("drops the full photo only after the server confirmed it, keeping the small copy to show", async () => {
    const photo = await take("coupling");
    await serverConfirmsOutbox();
    expect(await photoUrl(photo.id)).toMatch(/^blob:/);
    // 200: the server already had these bytes (a retry after a lost answer) — confirmed too.
    await uploadPendingPhotos(fakeServer(200).fetcher);
    const kept = (await localPhoto(photo.id))!;
    expect(kept.state).toBe("sent");
    expect(kept.bytes).toBeUndefined();
    expect(new TextDecoder().decode(kept.thumb)).toBe("thumb of coupling.jpg");
    expect(await photoUrl(photo.id)).toMatch(/^blob:/);
    expect(await photoUrl("0b9f5a1e-0000-4000-8000-00000000abcd")).toBe(
      "/api/photos/0b9f5a1e-0000-4000-8000-00000000abcd",
    );
    const again = fakeServer(201);
    await uploadPendingPhotos(again.fetcher);
    expect(again.sent).toEqual([]);
  });

  it("keeps a refused photo with the server's reason, goes on with the rest, and does not send it again", async () => {
    const [refused, fine] = [await take("not really an image"), await take("fine", "mount-photo")];
    await serverConfirmsOutbox();
    const server = fakeServer(415, 201);
    expect(await uploadPendingPhotos(server.fetcher)).toEqual({ ok: true, uploaded: 1 });
    expect(await localPhoto(refused.id)).toMatchObject({
      state: "refused",
      problem: "Refused with 415.",
      bytes: expect.any(ArrayBuffer),
    });
    expect((await localPhoto(fine.id))!.state).toBe("sent");
    const next = fakeServer(201);
    await uploadPendingPhotos(next.fetcher);
    expect(next.sent).toEqual([]);
  });

  it("sends the photo of an entry that came back as a conflict: the kept value still lists it", async () => {
    const photo = await take("coupling");
    await serverConfirmsOutbox("conflict");
    const server = fakeServer(201);
    await uploadPendingPhotos(server.fetcher);
    expect(server.sent.map((s) => photoIdOf(s.url))).toEqual([photo.id]);
  });

  it("joins a round already running instead of sending twice", async () => {
    await take("coupling");
    await serverConfirmsOutbox();
    const server = fakeServer(201);
    const [a, b] = await Promise.all([
      uploadPendingPhotos(server.fetcher),
      uploadPendingPhotos(server.fetcher),
    ]);
    expect(a).toEqual({ ok: true, uploaded: 1 });
    expect(b).toBe(a);
    expect(server.sent).toHaveLength(1);
  });

  it("survives the tab closing: the queue is still there when the app opens again", async () => {
    const photo = await take("coupling");
    await serverConfirmsOutbox();
    forgetPhotoDb(); // a new page opens the same database
    forgetLocalDb();
    const server = fakeServer(201);
    expect(await uploadPendingPhotos(server.fetcher)).toEqual({ ok: true, uploaded: 1 });
    expect(server.sent[0]!.body).toBe("coupling");
    expect((await localPhoto(photo.id))!.state).toBe("sent");
  });
});
