import "fake-indexeddb/auto";
import { beforeEach, describe, expect, it } from "vitest";
import { forgetLocalDb } from "~/lib/offline/db.client";
import {
  allConflicts,
  applySyncAnswer,
  LocalStoreError,
  outboxInOrder,
  queueSubmission,
  readChecklist,
  recordEntry,
  saveBundle,
} from "~/lib/offline/store.client";
import { syncOnce, UNREACHABLE, type SyncProgress } from "~/lib/offline/sync.client";
import type { OfflineBundle } from "~/lib/sync/bundle";
import { demoBundle, demoTemplate } from "../../support/offline-bundle.ts";

/** Issue 13 §1 and §2 on the tablet: a refused batch never wedges the outbox; revisions never go back. */
const CHECKLIST = "7d0e7c1e-0000-4000-8000-0000000000c1";
const template = demoTemplate([
  { kind: "text", key: "a", label: "A", required: true },
  { kind: "text", key: "b", label: "B", required: true },
  { kind: "text", key: "c", label: "C", required: true },
]);
const bundle = (responses: OfflineBundle["responses"] = []) =>
  demoBundle(template, [{ id: CHECKLIST }], { responses });

let n = 0;
beforeEach(async () => {
  forgetLocalDb(`sync-client-${++n}`);
  await saveBundle(bundle());
});

/** A server that refuses, as a whole request, any batch holding an operation on item "b". */
function refusingB(requests: string[][]) {
  let rev = 0;
  return (async (_url: string, init: RequestInit) => {
    const ops = JSON.parse(String(init.body)).ops as { opId: string; itemKey: string }[];
    requests.push(ops.map((o) => o.itemKey));
    if (ops.some((o) => o.itemKey === "b"))
      return Response.json({ error: "The sync request is malformed; nothing was applied." }, { status: 400 });
    return Response.json({
      results: ops.map((o) => ({ opId: o.opId, status: "applied", rev: ++rev })),
      changes: [],
      cursor: String(rev),
    });
  }) as typeof fetch;
}

describe("a batch the server keeps refusing", () => {
  it("is split until the refused entry is alone; it becomes a refusal the technician sees and the rest is sent", async () => {
    await recordEntry(CHECKLIST, "a", { text: "1" }, "T");
    const refused = await recordEntry(CHECKLIST, "b", { text: "2" }, "T");
    await recordEntry(CHECKLIST, "c", { text: "3" }, "T");
    const requests: string[][] = [];
    const result = await syncOnce(refusingB(requests));
    expect(result).toMatchObject({ ok: true });
    expect(await outboxInOrder()).toEqual([]);
    const { rejections } = await allConflicts();
    expect(rejections).toEqual([
      expect.objectContaining({ opId: refused.opId, itemKey: "b", code: "invalid-operation" }),
    ]);
    expect(rejections[0]!.reason).toContain("malformed");
    const local = await readChecklist(CHECKLIST);
    expect(local!.responses.a).toMatchObject({ value: { text: "1" }, pending: false });
    expect(local!.responses.c).toMatchObject({ value: { text: "3" }, pending: false });
    expect(local!.responses.b).toMatchObject({ pending: false });
    // Bounded: never the same refused batch again and again.
    expect(requests.length).toBeLessThan(8);
  });

  it("reports progress while it sends", async () => {
    for (const item of ["a", "c"]) await recordEntry(CHECKLIST, item, { text: item }, "T");
    const seen: SyncProgress[] = [];
    await syncOnce(refusingB([]), "", (p) => seen.push(p));
    expect(seen.at(-1)).toEqual({ sent: 2, total: 2 });
  });
});

describe("an unreachable server", () => {
  it("is offline, in words a technician reads, with everything kept", async () => {
    const op = await recordEntry(CHECKLIST, "a", { text: "1" }, "T");
    const noNetwork = (async () => {
      throw new TypeError("Failed to fetch");
    }) as typeof fetch;
    expect(await syncOnce(noNetwork)).toEqual({ ok: false, reason: "offline", message: UNREACHABLE });
    const databaseDown = (async () =>
      Response.json({ error: "down" }, { status: 503, headers: { "Retry-After": "20" } })) as typeof fetch;
    expect(await syncOnce(databaseDown)).toEqual({
      ok: false,
      reason: "offline",
      message: UNREACHABLE,
      retryAfterMs: 20_000,
    });
    expect((await outboxInOrder()).map((o) => o.opId)).toEqual([op.opId]);
    expect((await allConflicts()).rejections).toEqual([]);
  });
});

describe("a repeated answer", () => {
  it("never lowers a revision the tablet knows (lost answer, then a refresh, then the retry)", async () => {
    const op = await recordEntry(CHECKLIST, "a", { text: "mine" }, "T");
    // The answer "applied at 1" was lost; the lead then wrote rev 2, which a refresh brought in.
    await saveBundle(
      bundle([{ checklistId: CHECKLIST, itemKey: "a", value: { text: "lead's" }, rev: 2, by: "L", at: "x" }]),
    );
    await applySyncAnswer(
      [op],
      {
        results: [{ opId: op.opId, status: "applied", rev: 1, repeat: true }],
        changes: [],
        cursor: "1",
      },
      "T",
    );
    const local = await readChecklist(CHECKLIST);
    expect(local!.responses.a).toMatchObject({ rev: 2, value: { text: "lead's" }, pending: false });
  });
});

describe("an entry no server could store", () => {
  it("is refused at the field (a note cut in the middle of an emoji)", async () => {
    await expect(recordEntry(CHECKLIST, "a", { text: "Fine 🚤".slice(0, -1) }, "T")).rejects.toThrow(
      LocalStoreError,
    );
    expect(await outboxInOrder()).toEqual([]);
  });
});

describe("conflicts on the tablet", () => {
  const conflict = {
    id: 7,
    checklistId: CHECKLIST,
    itemKey: "a",
    serverValue: { text: "lead's" },
    serverRev: 1,
    clientValue: { text: "mine" },
    by: "T",
    at: "2026-01-01T00:00:00Z",
    deviceId: "d",
  };
  it("are decided by any later entry on the item, which carries the decision to the server", async () => {
    await saveBundle({ ...bundle(), conflicts: [conflict] });
    const entry = await recordEntry(CHECKLIST, "a", { text: "measured again" }, "T");
    expect(entry.resolves).toEqual([7]);
    expect((await allConflicts()).conflicts).toEqual([]);
  });

  it("block the submission, offline, with the reason", async () => {
    await saveBundle({ ...bundle(), conflicts: [conflict] });
    await expect(queueSubmission(CHECKLIST)).rejects.toThrow(/conflict/);
    expect(await outboxInOrder()).toEqual([]);
  });
});

describe("a checklist's state from the pull", () => {
  it("is taken in (returned by the lead), unless this tablet's own submission still waits", async () => {
    await applySyncAnswer(
      [],
      { results: [], changes: [], checklists: [{ id: CHECKLIST, state: "returned" }], cursor: "2" },
      "T",
    );
    expect((await readChecklist(CHECKLIST))!.checklist.state).toBe("returned");
    await queueSubmission(CHECKLIST);
    await applySyncAnswer(
      [],
      { results: [], changes: [], checklists: [{ id: CHECKLIST, state: "in-progress" }], cursor: "3" },
      "T",
    );
    expect((await readChecklist(CHECKLIST))!.checklist.state).toBe("submitted");
  });
});

describe("a long pull", () => {
  it("goes on, page by page, until the server says nothing more waits", async () => {
    const cursors: (string | null)[] = [];
    const pager = (async (_url: string, init: RequestInit) => {
      const { cursor } = JSON.parse(String(init.body));
      cursors.push(cursor);
      const page = Number(cursor ?? 0) + 1;
      return Response.json({
        results: [],
        changes: [
          {
            checklistId: CHECKLIST,
            itemKey: "a",
            value: { text: `page ${page}` },
            rev: page,
            by: "L",
            at: "x",
          },
        ],
        checklists: [],
        cursor: String(page),
        ...(page < 3 ? { more: true } : {}),
      });
    }) as typeof fetch;
    expect(await syncOnce(pager)).toEqual({ ok: true, pushed: 0 });
    expect(cursors).toEqual(["0", "1", "2"]);
    expect((await readChecklist(CHECKLIST))!.responses.a).toMatchObject({
      value: { text: "page 3" },
      rev: 3,
    });
  });
});
