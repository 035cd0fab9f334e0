import type { OfflineBundle } from "../sync/bundle.ts";
import { SUBMIT_KEY, submitValue } from "../sync/submission.ts";
import { unstorableJson, type Change, type ChecklistStateChange, type OpResult } from "../sync/protocol.ts";
import { localDb, type LocalResponse, type OutboxEntry } from "./db.client.ts";

/**
 * The device's copy of a person's work. Every local entry and its outbox operation are written
 * in one IndexedDB transaction, so a crash between "saved" and "sent" loses nothing.
 */

export class LocalStoreError extends Error {}

export async function deviceId(): Promise<string> {
  const db = await localDb();
  const tx = db.transaction("meta", "readwrite");
  let id = (await tx.store.get("deviceId")) as string | undefined;
  if (!id) {
    id = crypto.randomUUID();
    await tx.store.put(id, "deviceId");
  }
  await tx.done;
  return id;
}

export async function getMeta<T>(key: string): Promise<T | undefined> {
  return (await (await localDb()).get("meta", key)) as T | undefined;
}

export async function outboxCount(): Promise<number> {
  return (await localDb()).count("outbox");
}

/** Stores what the server sent for offline work, keeping entries not yet confirmed. */
export async function saveBundle(bundle: OfflineBundle): Promise<void> {
  const db = await localDb();
  const previousUser = await getMeta<{ id: number }>("user");
  if (previousUser && previousUser.id !== bundle.user.id) {
    if ((await db.count("outbox")) > 0) {
      throw new LocalStoreError(
        "Entries by the person who used this tablet before are still waiting to sync; they must sign in and sync first.",
      );
    }
    const stores = ["templates", "jobs", "checklists", "responses", "conflicts", "rejections"] as const;
    const wipe = db.transaction(stores, "readwrite");
    await Promise.all(stores.map((name) => wipe.objectStore(name).clear()));
    await wipe.done;
  }
  const tx = db.transaction(
    ["templates", "jobs", "checklists", "responses", "conflicts", "meta", "outbox"],
    "readwrite",
  );
  const pendingItems = new Set(
    (await tx.objectStore("outbox").getAll()).map((o) => `${o.checklistId}|${o.itemKey}`),
  );
  await tx.objectStore("jobs").clear();
  await tx.objectStore("checklists").clear();
  for (const job of bundle.jobs) await tx.objectStore("jobs").put(job);
  for (const checklist of bundle.checklists) await tx.objectStore("checklists").put(checklist);
  for (const template of bundle.templates) await tx.objectStore("templates").put(template);
  const responses = tx.objectStore("responses");
  for (const r of bundle.responses) {
    const local = await responses.get([r.checklistId, r.itemKey]);
    if (pendingItems.has(`${r.checklistId}|${r.itemKey}`) && local) {
      await responses.put({ ...local, serverValue: r.value, rev: Math.max(local.rev, r.rev) });
    } else {
      await responses.put({
        checklistId: r.checklistId,
        itemKey: r.itemKey,
        value: r.value,
        serverValue: r.value,
        rev: r.rev,
        by: r.by,
        at: r.at,
        pending: false,
      });
    }
  }
  await tx.objectStore("conflicts").clear();
  for (const c of bundle.conflicts) await tx.objectStore("conflicts").put(c);
  const meta = tx.objectStore("meta");
  await meta.put(bundle.user, "user");
  await meta.put(bundle.cursor, "cursor");
  await meta.put(new Date().toISOString(), "bundleAt");
  await tx.done;
}

export async function readChecklist(checklistId: string) {
  const db = await localDb();
  const checklist = await db.get("checklists", checklistId);
  if (!checklist) return null;
  const [template, responses, conflicts, rejections, outbox] = await Promise.all([
    db.get("templates", [checklist.key, checklist.version]),
    db.getAllFromIndex("responses", "byChecklist", checklistId),
    db.getAllFromIndex("conflicts", "byChecklist", checklistId),
    db.getAll("rejections"),
    db.getAll("outbox"),
  ]);
  if (!template) return null;
  return {
    checklist,
    template: template.template,
    responses: Object.fromEntries(responses.map((r) => [r.itemKey, r])) as Record<string, LocalResponse>,
    conflicts,
    rejections: rejections.filter((r) => r.checklistId === checklistId),
    waiting: outbox.filter((o) => o.checklistId === checklistId).length,
  };
}

export async function listLocalJobs() {
  const db = await localDb();
  const [jobs, checklists] = await Promise.all([db.getAll("jobs"), db.getAll("checklists")]);
  return jobs.map((job) => ({ ...job, checklists: checklists.filter((c) => c.jobId === job.id) }));
}

/** Records an entry and queues its operation, atomically. */
export async function recordEntry(
  checklistId: string,
  itemKey: string,
  value: unknown,
  by: string,
  resolves?: number[],
): Promise<OutboxEntry> {
  // Refused here, at the field, rather than queued for a server that cannot store it.
  const problem = unstorableJson(value);
  if (problem) throw new LocalStoreError(`This entry ${problem}; correct it and save again.`);
  const id = await deviceId();
  const db = await localDb();
  const tx = db.transaction(["checklists", "responses", "outbox", "meta", "conflicts"], "readwrite");
  const checklist = await tx.objectStore("checklists").get(checklistId);
  if (!checklist) throw new LocalStoreError("This checklist is not on this tablet.");
  if (checklist.state === "submitted" || checklist.state === "countersigned") {
    throw new LocalStoreError("This checklist is locked for review; it takes no more entries.");
  }
  const responses = tx.objectStore("responses");
  const current = await responses.get([checklistId, itemKey]);
  // Any entry made on an item after its conflict was shown decides that conflict.
  const decided = (await tx.objectStore("conflicts").index("byChecklist").getAll(checklistId))
    .filter((c) => c.itemKey === itemKey)
    .map((c) => c.id);
  resolves = [...new Set([...(resolves ?? []), ...decided])];
  const seq = (((await tx.objectStore("meta").get("seq")) as number | undefined) ?? 0) + 1;
  const at = new Date().toISOString();
  const entry: OutboxEntry = {
    opId: crypto.randomUUID(),
    deviceId: id,
    seq,
    checklistId,
    itemKey,
    value,
    baseRev: current?.rev ?? 0,
    at,
    ...(resolves?.length ? { resolves } : {}),
  };
  try {
    await responses.put({
      checklistId,
      itemKey,
      value,
      serverValue: current?.serverValue ?? null,
      rev: current?.rev ?? 0,
      by,
      at,
      pending: true,
    });
    await tx.objectStore("outbox").add(entry);
    await tx.objectStore("meta").put(seq, "seq");
    for (const conflictId of resolves ?? []) await tx.objectStore("conflicts").delete(conflictId);
    await tx.done;
  } catch (error) {
    // All or nothing: a full tablet keeps nothing half-written, and says so.
    tx.done.catch(() => undefined); // the abort below settles it; nothing waits on it here
    try {
      tx.abort();
    } catch {
      // already ended by the failure itself
    }
    if (isStorageFull(error)) throw new LocalStoreError(STORAGE_FULL);
    throw error;
  }
  return entry;
}

export const STORAGE_FULL =
  "This tablet's storage is full, so this entry was NOT saved. Connect so waiting photos and entries can be sent, or free space on the tablet, then save it again.";

const isStorageFull = (error: unknown) =>
  error instanceof DOMException && (error.name === "QuotaExceededError" || error.code === 22);

/** Queues the checklist's submission behind its entries and stops further entries on this tablet. */
export async function queueSubmission(checklistId: string): Promise<OutboxEntry> {
  const id = await deviceId();
  const db = await localDb();
  const tx = db.transaction(["checklists", "outbox", "meta", "conflicts"], "readwrite");
  const checklist = await tx.objectStore("checklists").get(checklistId);
  if (!checklist) throw new LocalStoreError("This checklist is not on this tablet.");
  const undecided = await tx.objectStore("conflicts").index("byChecklist").count(checklistId);
  if (undecided)
    throw new LocalStoreError(
      `Not submitted: ${undecided} conflict(s) on this checklist wait to be decided (see To decide).`,
    );
  if (checklist.state !== "in-progress" && checklist.state !== "returned")
    throw new LocalStoreError("This checklist has already been submitted.");
  const seq = (((await tx.objectStore("meta").get("seq")) as number | undefined) ?? 0) + 1;
  const entry: OutboxEntry = {
    opId: crypto.randomUUID(),
    deviceId: id,
    seq,
    checklistId,
    itemKey: SUBMIT_KEY,
    value: submitValue,
    baseRev: 0,
    at: new Date().toISOString(),
  };
  await tx.objectStore("outbox").add(entry);
  await tx.objectStore("meta").put(seq, "seq");
  await tx.objectStore("checklists").put({ ...checklist, state: "submitted" });
  await tx.done;
  return entry;
}

/** The outbox in the order entries were made. */
export async function outboxInOrder(): Promise<OutboxEntry[]> {
  return (await localDb()).getAllFromIndex("outbox", "bySeq");
}

/** Takes in a sync answer: confirmed entries leave the outbox, conflicts and refusals are kept for the person. */
export async function applySyncAnswer(
  sent: OutboxEntry[],
  answer: { results: OpResult[]; changes: Change[]; checklists?: ChecklistStateChange[]; cursor?: string },
  me: string,
) {
  const db = await localDb();
  const tx = db.transaction(
    ["responses", "outbox", "conflicts", "rejections", "meta", "checklists"],
    "readwrite",
  );
  const outbox = tx.objectStore("outbox");
  const responses = tx.objectStore("responses");
  const byId = new Map(sent.map((op) => [op.opId, op]));
  const keepRejection = (op: OutboxEntry, result: OpResult) =>
    tx.objectStore("rejections").put({
      opId: op.opId,
      checklistId: op.checklistId,
      itemKey: op.itemKey,
      value: op.value,
      reason: result.reason ?? "Refused.",
      ...(result.code ? { code: result.code } : {}),
      at: op.at,
    });
  for (const result of answer.results) {
    const op = byId.get(result.opId);
    if (!op) continue;
    await outbox.delete(op.opId);
    if (op.itemKey === SUBMIT_KEY) {
      if (result.status === "rejected") {
        // Refused (say, an item left): the checklist is open again here, and the reason is shown.
        const checklist = await tx.objectStore("checklists").get(op.checklistId);
        if (checklist) await tx.objectStore("checklists").put({ ...checklist, state: "in-progress" });
        await keepRejection(op, result);
      }
      continue;
    }
    const later = (await outbox.getAll()).filter(
      (o) => o.checklistId === op.checklistId && o.itemKey === op.itemKey,
    );
    const local = await responses.get([op.checklistId, op.itemKey]);
    const base = local ?? { checklistId: op.checklistId, itemKey: op.itemKey, by: me, at: op.at };
    // A repeated answer describes the server as it was at its first decision: when this tablet
    // already knows a newer revision, the answer only confirms the entry left the outbox.
    const stale = result.rev !== undefined && local !== undefined && result.rev < local.rev;
    if (result.status === "applied") {
      // Later entries on this item were made on top of this one: they follow its new revision.
      for (const next of later)
        if (next.baseRev === op.baseRev && !stale) await outbox.put({ ...next, baseRev: result.rev! });
      await responses.put({
        ...base,
        value: later.length ? local?.value : stale ? local?.serverValue : op.value,
        serverValue: stale ? local?.serverValue : op.value,
        rev: stale ? local!.rev : result.rev!,
        pending: later.length > 0,
      } as LocalResponse);
    } else {
      const fresh = result.status === "conflict" && !stale;
      const serverValue = fresh ? result.serverValue : local?.serverValue;
      await responses.put({
        ...base,
        value: later.length ? local?.value : serverValue,
        serverValue,
        rev: fresh ? result.rev! : (local?.rev ?? 0),
        pending: later.length > 0,
      } as LocalResponse);
      if (result.status === "conflict" && result.conflictId) {
        await tx.objectStore("conflicts").put({
          id: result.conflictId,
          checklistId: op.checklistId,
          itemKey: op.itemKey,
          serverValue: result.serverValue,
          serverRev: result.rev!,
          clientValue: op.value,
          ...(result.serverBy ? { serverBy: result.serverBy, serverAt: result.serverAt } : {}),
          by: me,
          at: new Date().toISOString(),
          deviceId: op.deviceId,
        });
      } else if (result.status === "rejected") {
        await keepRejection(op, result);
      }
    }
  }
  const stillPending = new Set((await outbox.getAll()).map((o) => `${o.checklistId}|${o.itemKey}`));
  for (const change of answer.changes) {
    const local = await responses.get([change.checklistId, change.itemKey]);
    if (local && stillPending.has(`${change.checklistId}|${change.itemKey}`)) {
      if (change.rev >= local.rev)
        await responses.put({ ...local, serverValue: change.value, rev: change.rev });
    } else if (!local || change.rev >= local.rev) {
      await responses.put({
        checklistId: change.checklistId,
        itemKey: change.itemKey,
        value: change.value,
        serverValue: change.value,
        rev: change.rev,
        by: change.by,
        at: change.at,
        pending: false,
      });
    }
  }
  // Another tablet's submission, or the lead's return: unless this tablet's own submission still waits.
  const submitting = new Set(
    (await outbox.getAll()).filter((o) => o.itemKey === SUBMIT_KEY).map((o) => o.checklistId),
  );
  for (const change of answer.checklists ?? []) {
    const checklist = await tx.objectStore("checklists").get(change.id);
    if (checklist && !submitting.has(change.id))
      await tx.objectStore("checklists").put({ ...checklist, state: change.state });
  }
  if (answer.cursor !== undefined) {
    await tx.objectStore("meta").put(answer.cursor, "cursor");
    await tx.objectStore("meta").put(new Date().toISOString(), "lastSyncAt");
  }
  await tx.done;
}

/**
 * An entry the server refuses as a whole request (not as one operation of a batch): it leaves
 * the outbox as a refusal the technician sees, exactly as a refused operation does.
 */
export async function refuseLocally(op: OutboxEntry, reason: string) {
  const me = (await getMeta<{ name: string }>("user"))?.name ?? "me";
  await applySyncAnswer(
    [op],
    { results: [{ opId: op.opId, status: "rejected", code: "invalid-operation", reason }], changes: [] },
    me,
  );
}

export async function dismissRejection(opId: string) {
  await (await localDb()).delete("rejections", opId);
}

export async function allConflicts() {
  const db = await localDb();
  return { conflicts: await db.getAll("conflicts"), rejections: await db.getAll("rejections") };
}
