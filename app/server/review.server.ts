import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { canFillJob, type Actor } from "~/lib/permissions";
import { checklistDigest } from "~/lib/record/digest.server";
import { progress, type Template } from "~/lib/templates";
import { audit } from "./audit.server.ts";
import { db } from "./db.server.ts";
import { photosNotYetStored } from "./photos.server.ts";
import { checklistStateChanged } from "./sync-clock.server.ts";
import { loadRecordChecklist } from "./record-data.server.ts";
import { checkPassword } from "./users.server.ts";

/** A review step refused, worded for the person who asked. */
export class ReviewError extends Error {
  constructor(
    message: string,
    public status = 400,
  ) {
    super(message);
  }
}

const json = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v);

/** How many conflicts on a checklist still wait for a person: it cannot be submitted or countersigned. */
export async function undecidedConflicts(trx: Knex | Knex.Transaction, checklistId: string) {
  const row = await trx("sync_conflicts")
    .where({ checklist_id: checklistId })
    .whereNull("resolved_at")
    .count({ n: "*" })
    .first();
  return Number(row?.n ?? 0);
}

async function checklistWithJob(trx: Knex | Knex.Transaction, checklistId: string) {
  const row = await trx("job_checklists as c")
    .join("template_versions as t", "t.id", "c.template_version_id")
    .join("jobs as j", "j.id", "c.job_id")
    .where("c.id", checklistId)
    .first(
      "c.id",
      "c.state",
      "c.job_id",
      "c.amends_id",
      "c.template_version_id",
      "c.template_key",
      "t.body",
      "j.lead_id",
    );
  if (!row) throw new ReviewError("There is no such checklist.", 404);
  const technicianIds: number[] = await trx("job_technicians").where({ job_id: row.job_id }).pluck("user_id");
  return { ...row, job: { leadId: row.lead_id as number, technicianIds } };
}

/** What is still missing before a checklist can be submitted, recomputed on the server. */
export async function missingItems(trx: Knex | Knex.Transaction, checklistId: string, template: Template) {
  const rows = await trx("checklist_responses")
    .where({ checklist_id: checklistId })
    .select("item_key", "value");
  const values = Object.fromEntries(rows.map((r: any) => [r.item_key, json(r.value)]));
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
  const c = await checklistWithJob(trx, checklistId);
  if (!canFillJob(actor, c.job)) return "Only the job's technicians and its lead submit its checklists.";
  if (c.state !== "in-progress" && c.state !== "returned")
    return `The checklist is already ${c.state === "submitted" ? "waiting for review" : "countersigned"}.`;
  const undecided = await undecidedConflicts(trx, checklistId);
  if (undecided)
    return `Not submitted: ${undecided} conflict(s) on this checklist wait to be decided on the To-decide page.`;
  const template = JSON.parse(c.body) as Template;
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

function requireLead(actor: Actor, job: { leadId: number }) {
  if (!(actor.role === "lead" && job.leadId === actor.id))
    throw new ReviewError("Only the job's lead reviews its checklists.", 403);
}

export async function addComment(actor: Actor, checklistId: string, itemKey: string, text: string) {
  const c = await checklistWithJob(db(), checklistId);
  requireLead(actor, c.job);
  if (c.state !== "submitted")
    throw new ReviewError("Comments are written while the checklist is waiting for review.");
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
    const c = await checklistWithJob(trx, checklistId);
    requireLead(actor, c.job);
    if (c.state !== "submitted")
      throw new ReviewError("Only a checklist waiting for review can be returned.");
    await checklistStateChanged(trx, checklistId); // other tablets learn it from their pull
    await trx("job_checklists")
      .where({ id: checklistId })
      .update({ state: "returned", updated_at: trx.fn.now(3) });
    await audit(
      { userId: actor.id, action: "checklist.returned", entity: "checklist", entityId: checklistId },
      trx,
    );
  });
}

/**
 * Countersigns with the lead's password: stores who, when and the SHA-256 of the checklist's
 * canonical content, and locks it (the database refuses changes from then on).
 */
export async function countersign(actor: Actor, checklistId: string, password: string): Promise<string> {
  const user = await db()("users").where({ id: actor.id }).first();
  if (!user?.password_hash || !(await checkPassword(password, user.password_hash)))
    throw new ReviewError("That password is not right; the checklist was not countersigned.");
  return db().transaction(async (trx) => {
    const c = await checklistWithJob(trx, checklistId);
    requireLead(actor, c.job);
    if (c.state !== "submitted")
      throw new ReviewError("Only a checklist waiting for review can be countersigned.");
    const undecided = await undecidedConflicts(trx, checklistId);
    if (undecided)
      throw new ReviewError(
        `${undecided} conflict(s) on this checklist wait to be decided on the To-decide page; return it to the technician or decide them first.`,
      );
    await checklistStateChanged(trx, checklistId); // the clock first: it is every applier's first lock
    // The digest covers the photos: every photo an entry lists must have reached the store.
    const missing = await photosNotYetStored(checklistId, trx);
    if (missing.length)
      throw new ReviewError(
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
    const c = await checklistWithJob(trx, checklistId);
    if (!(actor.role === "manager" || (actor.role === "lead" && c.job.leadId === actor.id)))
      throw new ReviewError("Only the job's lead or the manager starts an amendment.", 403);
    if (c.state !== "countersigned")
      throw new ReviewError(
        "Only a countersigned checklist is amended; this one can still be changed directly.",
      );
    if (await trx("job_checklists").where({ amends_id: checklistId }).first())
      throw new ReviewError("This checklist already has an amendment.");
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
    const { seq } = await trx("sync_clock").where({ id: 1 }).forUpdate().first();
    await trx("sync_clock")
      .where({ id: 1 })
      .update({ seq: Number(seq) + 1 });
    for (const r of rows) {
      const value = typeof r.value === "string" ? r.value : JSON.stringify(r.value);
      await trx("checklist_responses").insert({
        checklist_id: id,
        item_key: r.item_key,
        value,
        rev: 1,
        updated_by: actor.id,
        device_id: null,
        updated_at: now,
        change_seq: Number(seq) + 1,
      });
      await trx("response_history").insert({
        checklist_id: id,
        item_key: r.item_key,
        rev: 1,
        value,
        user_id: actor.id,
        at: now,
      });
    }
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
