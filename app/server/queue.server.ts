import type { Actor } from "~/lib/permissions";
import type { QueueEntry } from "~/lib/queue";
import { db } from "./db.server.ts";

const iso = (at: Date | string) => new Date(at).toISOString();

/** Jobs this person answers for: the ones they lead, or every job for the manager. */
const jobsOf = (actor: Actor) =>
  actor.role === "manager"
    ? db()("jobs").select("id")
    : db()("jobs").where({ lead_id: actor.id }).select("id");

/**
 * What waits for a lead on the jobs they lead: submitted checklists, undecided conflicts and
 * records ready to issue, oldest first. The manager, who issues records but neither reviews nor
 * decides a technician's conflict, sees the records ready to issue on every job.
 */
export async function waitingFor(actor: Actor): Promise<QueueEntry[]> {
  const submitted = await db()("job_checklists as c")
    .join("template_versions as t", "t.id", "c.template_version_id")
    .join("jobs as j", "j.id", "c.job_id")
    .join("vessels as v", "v.id", "j.vessel_id")
    .leftJoin("users as s", "s.id", "c.submitted_by")
    .where("c.state", "submitted")
    .whereIn("c.job_id", jobsOf(actor))
    .select("c.id", "c.submitted_at", "t.title", "v.name as vessel", "s.name as by");
  const conflicts: { id: string; title: string; vessel: string; since: Date; n: number | string }[] =
    await db()("sync_conflicts as k")
      .join("job_checklists as c", "c.id", "k.checklist_id")
      .join("template_versions as t", "t.id", "c.template_version_id")
      .join("jobs as j", "j.id", "c.job_id")
      .join("vessels as v", "v.id", "j.vessel_id")
      .whereNull("k.resolved_at")
      .whereIn("c.job_id", jobsOf(actor))
      .groupBy("c.id", "t.title", "v.name")
      .select(
        "c.id",
        "t.title",
        "v.name as vessel",
        db().raw("MIN(k.received_at) AS since"),
        db().raw("COUNT(*) AS n"),
      );
  // A job is ready when every checklist is countersigned (an amended original always is, so this
  // is every current one) and none was signed after its last record (a countersigned amendment
  // calls for a new record).
  const signed: { id: number; vessel: string; signed: Date }[] = await db()("jobs as j")
    .join("vessels as v", "v.id", "j.vessel_id")
    .join("job_checklists as c", "c.job_id", "j.id")
    .whereIn("j.id", jobsOf(actor))
    .groupBy("j.id", "v.name")
    .havingRaw("SUM(c.state <> 'countersigned') = 0")
    .select("j.id", "v.name as vessel", db().raw("MAX(c.countersigned_at) AS signed"));
  const issued = new Map<number, Date>(
    signed.length
      ? (
          await db()("records")
            .whereIn(
              "job_id",
              signed.map((j) => j.id),
            )
            .groupBy("job_id")
            .select("job_id")
            .max({ at: "issued_at" })
        ).map((r) => [r.job_id, new Date(r.at)])
      : [],
  );
  const ready = signed
    .filter((j) => !issued.has(j.id) || issued.get(j.id)! < new Date(j.signed))
    .map((j): QueueEntry => ({
      kind: "record-ready",
      since: iso(j.signed),
      title: "Record ready to issue",
      vessel: j.vessel,
      detail: "Every checklist is countersigned.",
      to: `/jobs/${j.id}#record-title`,
    }));
  return [
    ...submitted.map((c): QueueEntry => ({
      kind: "submitted",
      since: iso(c.submitted_at),
      title: c.title,
      vessel: c.vessel,
      detail: `Submitted by ${c.by ?? "a technician"}`,
      to: `/checklists/${c.id}/review`,
    })),
    ...conflicts.map((c): QueueEntry => ({
      kind: "conflict",
      since: iso(c.since),
      title: c.title,
      vessel: c.vessel,
      detail: `${c.n} conflict${Number(c.n) === 1 ? "" : "s"} to decide`,
      to: `/checklists/${c.id}`,
    })),
    ...ready,
  ]
    .filter((e) => actor.role === "lead" || e.kind === "record-ready")
    .sort((a, b) => a.since.localeCompare(b.since));
}

/** What came back to a technician on the jobs they work on, with the lead's comments. */
export async function returnedTo(actor: Actor) {
  const rows = await db()("job_checklists as c")
    .join("template_versions as t", "t.id", "c.template_version_id")
    .join("jobs as j", "j.id", "c.job_id")
    .join("vessels as v", "v.id", "j.vessel_id")
    .where("c.state", "returned")
    .whereIn("c.job_id", db()("job_technicians").where({ user_id: actor.id }).select("job_id"))
    .orderBy("c.updated_at")
    .select("c.id", "c.updated_at", "t.title", "v.name as vessel");
  const comments = rows.length
    ? await db()("checklist_comments")
        .whereIn(
          "checklist_id",
          rows.map((r) => r.id),
        )
        .whereNull("reply_to")
        .orderBy("id")
        .select("checklist_id", "text")
    : [];
  return rows.map((r) => ({
    id: r.id,
    since: iso(r.updated_at),
    title: r.title,
    vessel: r.vessel,
    comments: comments.filter((m) => m.checklist_id === r.id).map((m) => m.text as string),
  }));
}

/** Records issued in the last 30 days, newest first, for the manager. */
export async function issuedRecently() {
  const since = new Date(Date.now() - 30 * 24 * 3600 * 1000);
  const rows = await db()("records as r")
    .join("jobs as j", "j.id", "r.job_id")
    .join("vessels as v", "v.id", "j.vessel_id")
    .where("r.issued_at", ">=", since)
    .orderBy("r.issued_at", "desc")
    .limit(20)
    .select("r.id", "r.issued_at", "v.name as vessel", "j.engine_model");
  const recipients = rows.length
    ? await db()("record_recipients")
        .whereIn(
          "record_id",
          rows.map((r) => r.id),
        )
        .select("record_id", "email", "first_viewed_at")
    : [];
  return rows.map((r) => ({
    id: r.id,
    issuedAt: iso(r.issued_at),
    vessel: r.vessel,
    engineModel: r.engine_model,
    to: recipients
      .filter((x) => x.record_id === r.id)
      .map((x) => ({ email: x.email as string, opened: !!x.first_viewed_at })),
  }));
}
