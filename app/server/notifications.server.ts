import type { NotificationKind } from "~/lib/notifications";
import { SUBMIT_KEY } from "~/lib/sync/submission";
import type { OpResult } from "~/lib/sync/protocol";
import { findItem, type Template } from "~/lib/templates";
import { db } from "./db.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import { env } from "./env.server.ts";
import { logger } from "./logger.server.ts";
import { queueAndSend } from "./mail-outbox.server.ts";

/**
 * The e-mails that tell a person something waits for them. Each is sent after the change it
 * reports has been committed, only to active people who have not turned that kind off. A mail
 * server that refuses or is away is retried from the outbox, never passed on: the submission,
 * the return or the page view it follows has already happened.
 */
async function notify(
  kind: NotificationKind,
  userIds: number[],
  message: (name: string) => { subject: string; text: string },
) {
  if (!userIds.length) return;
  const people = await db()("users")
    .whereIn("id", [...new Set(userIds)])
    .where({ active: true })
    .whereNotExists(db()("notification_optouts as o").whereRaw("o.user_id = users.id").where("o.kind", kind))
    .select("id", "email", "name");
  await queueAndSend(people.map((person) => ({ kind, to: person.email, ...message(person.name) })));
}

/** Waits for a notification, but never lets it fail the action it follows. */
export async function quietly(work: Promise<unknown>) {
  try {
    await work;
  } catch (error) {
    logger.warn({ err: (error as Error).message }, "notification failed");
  }
}

/** Runs a notification without holding up or failing the answer it follows. */
export function inBackground(work: Promise<unknown>) {
  void quietly(work);
}

const hello = (name: string) => `Hello ${name.split(" ")[0]},`;

async function checklistContext(checklistId: string) {
  return db()("job_checklists as c")
    .join("template_versions as t", "t.id", "c.template_version_id")
    .join("jobs as j", "j.id", "c.job_id")
    .join("vessels as v", "v.id", "j.vessel_id")
    .leftJoin("users as s", "s.id", "c.submitted_by")
    .where("c.id", checklistId)
    .first(
      "c.id",
      "c.job_id",
      "c.submitted_by",
      "t.title",
      "j.lead_id",
      "v.name as vessel",
      "s.name as submitter",
    );
}

/** To the job's lead: a checklist waits for their review. */
export async function notifySubmitted(checklistIds: string[]) {
  for (const id of checklistIds) {
    const c = await checklistContext(id);
    if (!c) continue;
    await notify("checklist-submitted", [c.lead_id], (name) => ({
      subject: `Waiting for your review: ${c.title}, ${c.vessel}`,
      text: [
        hello(name),
        "",
        `${c.submitter ?? "A technician"} submitted "${c.title}" on ${c.vessel} for your review.`,
        `Review it: ${env().APP_URL}/checklists/${c.id}/review`,
        "",
        "You can turn these messages off in your account settings.",
      ].join("\n"),
    }));
  }
}

/** To the technicians who work on it: a checklist came back, with the lead's comments. */
export async function notifyReturned(checklistId: string) {
  const c = await checklistContext(checklistId);
  if (!c) return;
  const technicians: number[] = await db()("job_technicians").where({ job_id: c.job_id }).pluck("user_id");
  const comments = await db()("checklist_comments")
    .where({ checklist_id: checklistId })
    .whereNull("reply_to")
    .orderBy("id")
    .select("item_key", "text");
  const template = parseJsonColumn<Template>(
    (await db()("job_checklists as c")
      .join("template_versions as t", "t.id", "c.template_version_id")
      .where("c.id", checklistId)
      .first("t.body"))!.body,
  );
  const lines = comments.length
    ? comments.map((m) => `- ${findItem(template, m.item_key)?.label ?? m.item_key}: ${m.text}`)
    : ["(The lead left no comment on an item.)"];
  await notify(
    "checklist-returned",
    [...technicians, ...(c.submitted_by ? [c.submitted_by] : [])],
    (name) => ({
      subject: `Returned to you: ${c.title}, ${c.vessel}`,
      text: [
        hello(name),
        "",
        `"${c.title}" on ${c.vessel} was returned by the lead with these comments:`,
        ...lines,
        "",
        `Open it: ${env().APP_URL}/checklists/${c.id}`,
        "",
        "You can turn these messages off in your account settings.",
      ].join("\n"),
    }),
  );
}

/**
 * A surveyor opened a record sent to them. The first time only (one conditional update decides
 * it, so two tabs opening at once send one message), the job's lead is told.
 */
export async function recordOpened(user: { id: number; name: string; role: string }, recordId: string) {
  if (user.role !== "surveyor") return;
  const first = await db()("record_recipients")
    .where({ record_id: recordId, user_id: user.id })
    .whereNull("first_viewed_at")
    .update({ first_viewed_at: new Date() });
  if (!first) return;
  const r = await db()("records as r")
    .join("jobs as j", "j.id", "r.job_id")
    .join("vessels as v", "v.id", "j.vessel_id")
    .where("r.id", recordId)
    .first("j.lead_id", "v.name as vessel");
  if (!r) return;
  await notify("record-viewed", [r.lead_id], (name) => ({
    subject: `${user.name} opened the record of ${r.vessel}`,
    text: [
      hello(name),
      "",
      `${user.name} opened the commissioning record of ${r.vessel} for the first time.`,
      `The record: ${env().APP_URL}/records/${recordId}`,
      "",
      "You can turn these messages off in your account settings.",
    ].join("\n"),
  }));
}

export async function optOutsOf(userId: number): Promise<NotificationKind[]> {
  return db()("notification_optouts").where({ user_id: userId }).pluck("kind");
}

/** Replaces a person's choices: the kinds listed stay on, every other kind is turned off. */
export async function setNotifications(
  userId: number,
  on: NotificationKind[],
  all: readonly NotificationKind[],
) {
  await db().transaction(async (trx) => {
    await trx("notification_optouts").where({ user_id: userId }).delete();
    const off = all.filter((k) => !on.includes(k));
    if (off.length) await trx("notification_optouts").insert(off.map((kind) => ({ user_id: userId, kind })));
  });
}

/** The checklists a sync answer submitted for review just now (a repeated answer was told before). */
export function submittedBy(ops: { opId: string; [field: string]: unknown }[], results: OpResult[]) {
  const applied = new Set(results.filter((r) => r.status === "applied" && !r.repeat).map((r) => r.opId));
  return ops.flatMap((o) =>
    o.itemKey === SUBMIT_KEY && applied.has(o.opId) && typeof o.checklistId === "string"
      ? [o.checklistId]
      : [],
  );
}
