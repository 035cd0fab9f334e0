import "fake-indexeddb/auto";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { forgetLocalDb, localDb } from "~/lib/offline/db.client";
import {
  applySyncAnswer,
  outboxInOrder,
  readChecklist,
  recordEntry,
  saveBundle,
  STORAGE_FULL,
} from "~/lib/offline/store.client";
import { syncOnce } from "~/lib/offline/sync.client";
import type { OfflineBundle } from "~/lib/sync/bundle";
import { demoBundle, demoTemplate } from "../../support/offline-bundle.ts";

const CHECKLIST = "7d0e7c1e-0000-4000-8000-000000000001";
const template = demoTemplate([
  { kind: "text", key: "note", label: "Note", required: true },
  { kind: "check", key: "seal", label: "Seal", required: true },
]);
const bundle = (over: Partial<OfflineBundle> = {}) => demoBundle(template, [{ id: CHECKLIST }], over);

let n = 0;
beforeEach(async () => {
  forgetLocalDb(`device-${++n}`);
  await saveBundle(bundle());
});

describe("the device's store and outbox", () => {
  it("writes the entry and its operation together, and both survive a crash before any push", async () => {
    await recordEntry(CHECKLIST, "note", { text: "first" }, "Tess Tech");
    (await localDb()).close();
    forgetLocalDb(); // the tab died: a new page opens the database again
    const outbox = await outboxInOrder();
    expect(outbox).toHaveLength(1);
    expect(outbox[0]).toMatchObject({
      checklistId: CHECKLIST,
      itemKey: "note",
      value: { text: "first" },
      baseRev: 0,
      seq: 1,
    });
    expect((await readChecklist(CHECKLIST))!.responses.note).toMatchObject({
      value: { text: "first" },
      pending: true,
    });
  });

  it("numbers operations in the order they were made", async () => {
    await recordEntry(CHECKLIST, "note", { text: "a" }, "T");
    await recordEntry(CHECKLIST, "seal", { result: "pass" }, "T");
    await recordEntry(CHECKLIST, "note", { text: "b" }, "T");
    expect((await outboxInOrder()).map((o) => [o.itemKey, o.seq])).toEqual([
      ["note", 1],
      ["seal", 2],
      ["note", 3],
    ]);
  });

  it("refuses entries on a locked checklist", async () => {
    await saveBundle(bundle({ checklists: [{ ...bundle().checklists[0]!, state: "submitted" }] }));
    await expect(recordEntry(CHECKLIST, "note", { text: "late" }, "T")).rejects.toThrow(/locked/);
    expect(await outboxInOrder()).toEqual([]);
  });

  it("removes an operation only when its result came back, and moves later entries on the same item to the new revision", async () => {
    const first = await recordEntry(CHECKLIST, "note", { text: "a" }, "T");
    const second = await recordEntry(CHECKLIST, "note", { text: "b" }, "T");
    await applySyncAnswer(
      [first],
      { results: [{ opId: first.opId, status: "applied", rev: 1 }], changes: [], cursor: "1" },
      "T",
    );
    const outbox = await outboxInOrder();
    expect(outbox.map((o) => o.opId)).toEqual([second.opId]);
    expect(outbox[0]!.baseRev).toBe(1);
    expect((await readChecklist(CHECKLIST))!.responses.note).toMatchObject({
      value: { text: "b" },
      serverValue: { text: "a" },
      rev: 1,
      pending: true,
    });
  });

  it("keeps a conflict with both values and shows the server's", async () => {
    const op = await recordEntry(CHECKLIST, "seal", { result: "fail", note: "weeps" }, "T");
    await applySyncAnswer(
      [op],
      {
        results: [
          { opId: op.opId, status: "conflict", rev: 3, serverValue: { result: "pass" }, conflictId: 9 },
        ],
        changes: [],
        cursor: "4",
      },
      "T",
    );
    const local = (await readChecklist(CHECKLIST))!;
    expect(local.responses.seal).toMatchObject({ value: { result: "pass" }, rev: 3, pending: false });
    expect(local.conflicts).toEqual([
      expect.objectContaining({
        id: 9,
        clientValue: { result: "fail", note: "weeps" },
        serverValue: { result: "pass" },
      }),
    ]);
    expect(await outboxInOrder()).toEqual([]);
  });

  it("takes in others' changes but never over an entry still waiting", async () => {
    await recordEntry(CHECKLIST, "note", { text: "mine" }, "T");
    await applySyncAnswer(
      [],
      {
        results: [],
        changes: [
          {
            checklistId: CHECKLIST,
            itemKey: "note",
            value: { text: "theirs" },
            rev: 2,
            by: "Other",
            at: new Date().toISOString(),
          },
          {
            checklistId: CHECKLIST,
            itemKey: "seal",
            value: { result: "pass" },
            rev: 1,
            by: "Other",
            at: new Date().toISOString(),
          },
        ],
        cursor: "7",
      },
      "T",
    );
    const local = (await readChecklist(CHECKLIST))!;
    expect(local.responses.note).toMatchObject({
      value: { text: "mine" },
      serverValue: { text: "theirs" },
      rev: 2,
      pending: true,
    });
    expect(local.responses.seal).toMatchObject({ value: { result: "pass" }, pending: false });
  });
});

describe("syncOnce", () => {
  it("sends one operation per item per round, in order, until the outbox is empty", async () => {
    await recordEntry(CHECKLIST, "note", { text: "a" }, "T");
    await recordEntry(CHECKLIST, "seal", { result: "pass" }, "T");
    await recordEntry(CHECKLIST, "note", { text: "b" }, "T");
    const sent: { itemKey: string; baseRev: number }[][] = [];
    const revs: Record<string, number> = {};
    const fake = (async (_url: string, init: RequestInit) => {
      const body = JSON.parse(String(init.body));
      sent.push(body.ops.map((o: any) => ({ itemKey: o.itemKey, baseRev: o.baseRev })));
      const results = body.ops.map((o: any) => ({
        opId: o.opId,
        status: "applied",
        rev: (revs[o.itemKey] = (revs[o.itemKey] ?? 0) + 1),
      }));
      return Response.json({ results, changes: [], cursor: String(sent.length) });
    }) as typeof fetch;
    expect(await syncOnce(fake)).toEqual({ ok: true, pushed: 3 });
    expect(sent).toEqual([
      [
        { itemKey: "note", baseRev: 0 },
        { itemKey: "seal", baseRev: 0 },
      ],
      [{ itemKey: "note", baseRev: 1 }],
    ]);
    expect(await outboxInOrder()).toEqual([]);
  });

  it("keeps everything when the request fails or the answer is lost, and sends the same operations again", async () => {
    const op = await recordEntry(CHECKLIST, "note", { text: "a" }, "T");
    const offline = (async () => {
      throw new TypeError("Failed to fetch");
    }) as typeof fetch;
    expect((await syncOnce(offline)).ok).toBe(false);
    const serverError = (async () => new Response("boom", { status: 503 })) as typeof fetch;
    expect((await syncOnce(serverError)).ok).toBe(false);
    expect((await outboxInOrder()).map((o) => o.opId)).toEqual([op.opId]);
    let seen: string[] = [];
    const ok = (async (_u: string, init: RequestInit) => {
      seen = JSON.parse(String(init.body)).ops.map((o: any) => o.opId);
      return Response.json({
        results: [{ opId: op.opId, status: "applied", rev: 1 }],
        changes: [],
        cursor: "1",
      });
    }) as typeof fetch;
    expect(await syncOnce(ok)).toEqual({ ok: true, pushed: 1 });
    expect(seen).toEqual([op.opId]);
  });

  it("stops and keeps the outbox when the session has ended", async () => {
    await recordEntry(CHECKLIST, "note", { text: "a" }, "T");
    const signedOut = (async () =>
      Response.json({ error: "Sign in first." }, { status: 401 })) as typeof fetch;
    expect(await syncOnce(signedOut)).toMatchObject({ ok: false, reason: "signed-out" });
    expect(await outboxInOrder()).toHaveLength(1);
  });
});

describe("a tablet whose storage is full", () => {
  it("says the entry was not saved, and keeps nothing half-written", async () => {
    await recordEntry(CHECKLIST, "note", { text: "kept" }, "Tess Tech");
    const full = vi.spyOn(IDBObjectStore.prototype, "add").mockImplementation(() => {
      throw new DOMException("The quota has been exceeded.", "QuotaExceededError");
    });
    try {
      await expect(recordEntry(CHECKLIST, "note", { text: "lost?" }, "Tess Tech")).rejects.toThrow(
        STORAGE_FULL,
      );
    } finally {
      full.mockRestore();
    }
    expect((await readChecklist(CHECKLIST))!.responses.note!.value).toEqual({ text: "kept" });
    expect((await outboxInOrder()).map((o) => o.value)).toEqual([{ text: "kept" }]);
  });
});
