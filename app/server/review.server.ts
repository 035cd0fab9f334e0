import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { canOnJob, type Actor } from "~/lib/permissions";
import { Refusal } from "~/lib/refusal";
import type { ReviewComment } from "~/lib/sync/bundle";
import type { SealOutcome } from "~/lib/validation/review";
import { checklistDigest } from "~/lib/record/digest.server";
import { progress, type Template } from "~/lib/templates";
import { audit } from "./audit.server.ts";
import { checklistAccessFor, loadChecklistAccess } from "./checklist-access.server.ts";
import { db } from "./db.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import { photosNotYetStored } from "./photos.server.ts";
import { checklistStateChanged, nextChangeNumber } from "./sync-clock.server.ts";
import { notifyReturned, quietly } from "./notifications.server.ts";
import { loadRecordChecklist } from "./record-data.server.ts";
import { checkPassword } from "./users.server.ts";

/** How many conflicts on a checklist still wait for a person: it cannot be submitted or countersigned. */
export async function undecidedConflicts(trx: Knex | Knex.Transaction, checklistId: string) {
  const row = await trx("sync_conflicts")
    .where({ checklist_id: checklistId })
    .whereNull("resolved_at")
    .count({ n: "*" })
    .first();
  return Number(row?.n ?? 0);
}

/** What is still missing before a checklist can be submitted, recomputed on the server. */
export async function missingItems(trx: Knex | Knex.Transaction, checklistId: string, template: Template) {
  const rows = await trx("checklist_responses")
    .where({ checklist_id: checklistId })
    .select("item_key", "value");
  const values = Object.fromEntries(rows.map((r) => [r.item_key, parseJsonColumn(r.value)]));
  const state = progress(template, values);
  return { left: state.overall.left, attention: state.overall.attention, complete: state.complete };
}

/** Submits for review (from the sync, so an offline submission lands after its entries). */
export async function submitChecklist(
  trx: Knex.Transaction,
  actor: Actor,
  checklistId: string,
  deviceId: string | null,
): Promise<string | null> {
  const c = await loadChecklistAccess(checklistId, trx);
  if (!c) return "There is no such checklist.";
  if (!canOnJob(actor, "fill", c.job))
    return "Only the job's technicians and its lead submit its checklists.";
  if (c.state !== "in-progress" && c.state !== "returned")
    return `The checklist is already ${c.state === "submitted" ? "waiting for review" : "countersigned"}.`;
  const undecided = await undecidedConflicts(trx, checklistId);
  if (undecided)
    return `Not submitted: ${undecided} conflict(s) on this checklist wait to be decided on the To-decide page.`;
  const template = parseJsonColumn<Template>(c.body);
  const missing = await missingItems(trx, checklistId, template);
  if (!missing.complete) {
    return `Not submitted: ${missing.left.length} required item(s) left and ${missing.attention.length} needing attention.`;
  }
  await trx("job_checklists")
    .where({ id: checklistId })
    .update({
      state: "submitted",
      submitted_by: actor.id,
      submitted_at: new Date(),
      updated_at: trx.fn.now(3),
    });
  await audit(
    { userId: actor.id, deviceId, action: "checklist.submitted", entity: "checklist", entityId: checklistId },
    trx,
  );
  return null;
}

const onlyTheLead = "Only the job's lead reviews its checklists.";

export async function addComment(actor: Actor, checklistId: string, itemKey: string, text: string) {
  const c = await checklistAccessFor(actor, "countersign", checklistId, db(), onlyTheLead);
  if (c.state !== "submitted")
    throw new Refusal("wrong-state", "Comments are written while the checklist is waiting for review.");
  await db()("checklist_comments").insert({
    checklist_id: checklistId,
    item_key: itemKey,
    user_id: actor.id,
    text,
    at: new Date(),
  });
}

export async function returnChecklist(actor: Actor, checklistId: string) {
  await db().transaction(async (trx) => {
    const c = await checklistAccessFor(actor, "countersign", checklistId, trx, onlyTheLead);
    if (c.state !== "submitted")
      throw new Refusal("wrong-state", "Only a checklist waiting for review can be returned.");
    await checklistStateChanged(trx, checklistId); // other tablets learn it from their pull
    await trx("job_checklists")
      .where({ id: checklistId })
      .update({ state: "returned", updated_at: trx.fn.now(3) });
    await audit(
      { userId: actor.id, action: "checklist.returned", entity: "checklist", entityId: checklistId },
      trx,
    );
  });
  await quietly(notifyReturned(checklistId));
}

/** Checks the lead's password again before any countersignature; `outcome` says what was not done. */
async function confirmPassword(actor: Actor, password: string, outcome: string) {
  const user = await db()("users").where({ id: actor.id }).first();
  if (!user?.password_hash || !(await checkPassword(password, user.password_hash)))
    throw new Refusal("invalid", `That password is not right; ${outcome}.`, "password");
}

/**
 * Countersigns with the lead's password: stores who, when and the SHA-256 of the checklist's
 * canonical content, and locks it (the database refuses changes from then on).
 */
export async function countersign(actor: Actor, checklistId: string, password: string): Promise<string> {
  await confirmPassword(actor, password, "the checklist was not countersigned");
  return seal(actor, checklistId);
}

/**
 * Countersigns several checklists of one job with one password entry (decision 075). The password
 * is checked once, before anything; then each checklist is sealed in its own transaction, with its
 * own digest and lock, exactly as one at a time. A checklist that cannot be countersigned (a
 * conflict, a photo not yet arrived) is reported with its reason and the others are still signed.
 */
export async function countersignSeveral(
  actor: Actor,
  jobId: number,
  checklistIds: string[],
  password: string,
): Promise<SealOutcome[]> {
  await confirmPassword(actor, password, "none was countersigned");
  const rows = await db()("job_checklists as c")
    .join("template_versions as t", "t.id", "c.template_version_id")
    .whereIn("c.id", checklistIds)
    .select("c.id", "c.job_id", "t.title");
  const outcomes: SealOutcome[] = [];
  for (const id of checklistIds) {
    const row = rows.find((r) => r.id === id);
    if (!row || row.job_id !== jobId) {
      outcomes.push({
        checklistId: id,
        title: "Unknown checklist",
        refused: "That checklist is not one of this job's.",
      });
      continue;
    }
    try {
      outcomes.push({ checklistId: id, title: row.title, digest: await seal(actor, id) });
    } catch (error) {
      if (!(error instanceof Refusal)) throw error;
      outcomes.push({ checklistId: id, title: row.title, refused: error.message });
    }
  }
  return outcomes;
}

/** One checklist's countersignature, once the password has been confirmed. */
function seal(actor: Actor, checklistId: string): Promise<string> {
  return db().transaction(async (trx) => {
    const c = await checklistAccessFor(actor, "countersign", checklistId, trx, onlyTheLead);
    if (c.state !== "submitted")
      throw new Refusal("wrong-state", "Only a checklist waiting for review can be countersigned.");
    const undecided = await undecidedConflicts(trx, checklistId);
    if (undecided)
      throw new Refusal(
        "wrong-state",
        `${undecided} conflict(s) on this checklist wait to be decided on the To-decide page; return it to the technician or decide them first.`,
      );
    await checklistStateChanged(trx, checklistId); // the clock first: it is every applier's first lock
    // The digest covers the photos: every photo an entry lists must have reached the store.
    const missing = await photosNotYetStored(checklistId, trx);
    if (missing.length)
      throw new Refusal(
        "wrong-state",
        `${missing.length} photo(s) listed in the entries have not reached the server yet; countersign once the technician's tablet has synced.`,
      );
    const at = new Date();
    await trx("job_checklists")
      .where({ id: checklistId })
      .update({ countersigned_by: actor.id, countersigned_at: at });
    const content = await loadRecordChecklist(checklistId, trx);
    const digest = checklistDigest(content!);
    await trx("job_checklists")
      .where({ id: checklistId })
      .update({ state: "countersigned", digest, updated_at: trx.fn.now(3) });
    await audit(
      {
        userId: actor.id,
        action: "checklist.countersigned",
        entity: "checklist",
        entityId: checklistId,
        detail: { digest },
      },
      trx,
    );
    return digest;
  });
}

/** A correction of a countersigned checklist: a new checklist that references it, filled from its values. */
export async function startAmendment(actor: Actor, checklistId: string): Promise<string> {
  return db().transaction(async (trx) => {
    const c = await checklistAccessFor(
      actor,
      "amend",
      checklistId,
      trx,
      "Only the job's lead or the manager starts an amendment.",
    );
    if (c.state !== "countersigned")
      throw new Refusal(
        "wrong-state",
        "Only a countersigned checklist is amended; this one can still be changed directly.",
      );
    if (await trx("job_checklists").where({ amends_id: checklistId }).first())
      throw new Refusal("wrong-state", "This checklist already has an amendment.");
    const id = randomUUID();
    await trx("job_checklists").insert({
      id,
      job_id: c.job_id,
      template_version_id: c.template_version_id,
      template_key: c.template_key,
      amends_id: checklistId,
      started_by: actor.id,
    });
    const now = new Date();
    const rows = await trx("checklist_responses").where({ checklist_id: checklistId });
    const changeSeq = await nextChangeNumber(trx);
    // The original's values, each the first and current revision of the amendment's item
    // (decision 046: an item's current history row is its value).
    if (rows.length)
      await trx("response_history").insert(
        rows.map((r) => ({
          checklist_id: id,
          item_key: r.item_key,
          rev: 1,
          value: r.value,
          user_id: actor.id,
          at: now,
          change_seq: changeSeq,
        })),
      );
    await audit(
      {
        userId: actor.id,
        action: "checklist.amended",
        entity: "checklist",
        entityId: id,
        detail: { amends: checklistId },
      },
      trx,
    );
    return id;
  });
}

/**
 * Discards an amendment opened by mistake, while nothing has been entered in it: no entry, photo,
 * conflict or refused operation has reached the server for it. The sync clock's lock is taken
 * first, as every applier does, so no entry can land between the check and the delete.
 */
export async function discardAmendment(actor: Actor, checklistId: string) {
  await db().transaction(async (trx) => {
    await nextChangeNumber(trx);
    const c = await checklistAccessFor(
      actor,
      "amend",
      checklistId,
      trx,
      "Only the job's lead or the manager discards an amendment.",
    );
    const row = (await trx("job_checklists").where({ id: checklistId }).first("amends_id", "state"))!;
    if (!row.amends_id)
      throw new Refusal("wrong-state", "Only an amendment can be discarded; this checklist is kept.");
    if (row.state !== "in-progress")
      throw new Refusal("wrong-state", "This amendment has been submitted; it is kept.");
    const counts = await Promise.all([
      trx("response_history").where({ checklist_id: checklistId }).whereNotNull("op_id").first("id"),
      trx("sync_ops").where({ checklist_id: checklistId }).first("op_id"),
      trx("photos").where({ checklist_id: checklistId }).first("id"),
      trx("sync_conflicts").where({ checklist_id: checklistId }).first("id"),
    ]);
    if (counts.some(Boolean))
      throw new Refusal(
        "wrong-state",
        "Entries have been made in this amendment, so it is kept; finish it and submit it for review.",
      );
    await trx("job_checklists").where({ id: checklistId }).delete();
    await audit(
      {
        userId: actor.id,
        action: "checklist.amendment-discarded",
        entity: "checklist",
        entityId: row.amends_id,
        detail: { amendment: checklistId, jobId: c.job_id },
      },
      trx,
    );
  });
}

/**
 * A technician's answer to a lead's comment, at its item, while the checklist is back with them
 * (returned, or being filled again). The lead reads it on the review page once it is resubmitted.
 */
export async function replyToComment(
  actor: Actor & { name: string },
  checklistId: string,
  commentId: number,
  text: string,
): Promise<ReviewComment> {
  const c = await checklistAccessFor(
    actor,
    "fill",
    checklistId,
    db(),
    "Only the job's technicians and its lead answer the comments on its checklists.",
  );
  if (c.state !== "returned" && c.state !== "in-progress")
    throw new Refusal(
      "wrong-state",
      "Answers are written while the checklist is back with you, before it is submitted again.",
    );
  const comment = await db()("checklist_comments")
    .where({ id: commentId, checklist_id: checklistId })
    .whereNull("reply_to")
    .first("id", "item_key");
  if (!comment) throw new Refusal("not-found", "That comment is not on this checklist.");
  const at = new Date();
  const [id] = await db()("checklist_comments").insert({
    checklist_id: checklistId,
    item_key: comment.item_key,
    reply_to: comment.id,
    user_id: actor.id,
    text,
    at,
  });
  return {
    id: Number(id),
    replyTo: comment.id,
    itemKey: comment.item_key,
    by: actor.name,
    at: at.toISOString(),
    text,
  };
}
