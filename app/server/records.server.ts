import { randomUUID } from "node:crypto";
import { recordCanonical } from "~/lib/record/canonical";
import { inWorkOrder } from "~/lib/record/order";
import { checklistDigest, recordDigest, sha256Hex } from "~/lib/record/digest.server";
import type { CommissioningRecord } from "~/lib/record/types";
import { canOnJob, canReadRecord as mayReadRecord, type Actor } from "~/lib/permissions";
import { Refusal } from "~/lib/refusal";
import type { Recipient } from "~/lib/validation/records";
import { audit } from "./audit.server.ts";
import { db } from "./db.server.ts";
import { env } from "./env.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import { findJob } from "./jobs.server.ts";
import { deliver, queueMail, type OutgoingMail } from "./mail-outbox.server.ts";
import { loadRecordChecklist } from "./record-data.server.ts";
import type { JobChecklistRow } from "./tables.server.ts";
import { inviteUser } from "./users.server.ts";
import { findVessel } from "./vessels.server.ts";

/** The checklists a record is made of: for each template, the newest of its amendment chain. */
export async function currentChecklists(jobId: number) {
  const rows: (Pick<JobChecklistRow, "id" | "state" | "amends_id" | "template_key"> & { title: string })[] =
    await db()("job_checklists as c")
      .join("template_versions as t", "t.id", "c.template_version_id")
      .where("c.job_id", jobId)
      .select("c.id", "c.state", "c.amends_id", "c.template_key", "t.title");
  const amended = new Set(rows.map((r) => r.amends_id).filter(Boolean));
  return rows.filter((r) => !amended.has(r.id));
}

export async function recordReadiness(jobId: number) {
  const current = await currentChecklists(jobId);
  const open = current.filter((c) => c.state !== "countersigned");
  return {
    ready: current.length > 0 && open.length === 0,
    open: open.map((c) => c.title),
    count: current.length,
  };
}

const verifyUrl = (id: string) => `${env().APP_URL}/verify/${id}`;

/**
 * Issues the job's commissioning record to surveyors: a snapshot of every current checklist as
 * countersigned, its digest, and access for each surveyor (an invitation when they are new).
 */
export async function issueRecord(
  actor: Actor,
  jobId: number,
  recipients: Recipient[],
): Promise<{ id: string; mailWaiting: boolean }> {
  const issued = await createRecord(actor, jobId, recipients, { mail: true });
  // Kept with the record; a mail server that is away only delays them (mail-outbox.server.ts).
  const { sent } = await deliver(issued.mailIds);
  return { id: issued.id, mailWaiting: sent < issued.mailIds.length };
}

interface IssuedRecord {
  id: string;
  digest: string;
  vessel: { name: string };
  job: { engineModel: string; engineSerial: string };
  recipients: Recipient[];
  /** The surveyor's name for those who had an account, the invitation token for those new. */
  names: Map<string, string>;
  invitations: Map<string, string>;
  /** The messages to the surveyors, kept in the record's transaction (none for the demo seed). */
  mailIds: number[];
}

/**
 * The record stored, with access for each surveyor and, with `mail`, the messages to them kept
 * to send: issueRecord's first half, and all of it for the demo seed (whose surveyor already has
 * an account and no inbox).
 */
export async function createRecord(
  actor: Actor,
  jobId: number,
  recipients: Recipient[],
  { mail = false } = {},
): Promise<IssuedRecord> {
  const emails = recipients.map((r) => r.email);
  const job = await findJob(jobId);
  if (!job) throw new Refusal("not-found", "There is no such job.");
  if (!canOnJob(actor, "issue-record", job))
    throw new Refusal("forbidden", "Only the manager or the job's lead issues its record.");
  const readiness = await recordReadiness(jobId);
  if (!readiness.ready) {
    throw new Refusal(
      "wrong-state",
      readiness.count
        ? `Every checklist must be countersigned first; still open: ${readiness.open.join(", ")}.`
        : "The job has no checklists yet.",
    );
  }
  const people = await db()("users").whereIn("email", emails);
  const staff = people.filter((p) => p.role !== "surveyor");
  if (staff.length)
    throw new Refusal(
      "invalid",
      `${staff.map((p) => p.email).join(", ")} belongs to a yard account, not a surveyor's; use the surveyor's own address.`,
    );
  const inactive = people.filter((p) => !p.active);
  if (inactive.length)
    throw new Refusal("invalid", `${inactive.map((p) => p.email).join(", ")} is deactivated.`);

  // A newcomer is greeted by name in the invitation and the mail, never by the front of the address.
  const unnamed = recipients.filter((r) => !r.name && !people.some((p) => p.email === r.email));
  if (unnamed.length)
    throw new Refusal(
      "invalid",
      `Give the name of each new surveyor before the address, like "Nessa Quick <${unnamed[0]!.email}>": ${unnamed.map((r) => r.email).join(", ")}.`,
    );

  const vessel = (await findVessel(job.vesselId))!;
  const id = randomUUID();
  const issuedAt = new Date();
  const record: CommissioningRecord = {
    record: { id, issuedAt: issuedAt.toISOString() },
    yardName: env().YARD_NAME,
    vessel: {
      name: vessel.name,
      ...(vessel.hin ? { hin: vessel.hin } : {}),
      lengthValue: vessel.lengthValue,
      lengthUnit: vessel.lengthUnit,
      hullType: vessel.hullType,
      ownerName: vessel.ownerName,
    },
    job: {
      id: job.id,
      scope: job.scope,
      engineModel: job.engineModel,
      engineSerial: job.engineSerial,
      ratedPowerHp: job.ratedPowerHp,
      ratedRpmMin: job.ratedRpmMin,
      ratedRpmMax: job.ratedRpmMax,
      gearRatio: job.gearRatio,
      propDiameterIn: job.propDiameterIn,
      propPitchIn: job.propPitchIn,
      propBlades: job.propBlades,
      shaftDiameterIn: job.shaftDiameterIn,
      shaftMaterial: job.shaftMaterial,
      couplingType: job.couplingType,
      startDate: job.startDate,
      dueDate: job.dueDate,
      leadName: job.leadName,
      technicianNames: job.technicianNames,
    },
    checklists: inWorkOrder(
      await Promise.all(
        (await currentChecklists(jobId)).map(async (c) => (await loadRecordChecklist(c.id))!),
      ),
    ),
    verifyUrl: verifyUrl(id),
  };
  const digest = recordDigest(record);

  const invitations = new Map<string, string>();
  for (const { email, name } of recipients) {
    if (!people.some((p) => p.email === email)) {
      const { token } = await inviteUser({ email, name: name!, role: "surveyor" }, actor.id);
      invitations.set(email, token);
    }
  }
  const names = new Map(people.map((p) => [p.email as string, p.name as string]));
  const issued = { id, digest, vessel, job, recipients, names, invitations };
  const mailIds = await db().transaction(async (trx) => {
    await trx("records").insert({
      id,
      job_id: jobId,
      content: JSON.stringify(record),
      digest,
      issued_by: actor.id,
      issued_at: issuedAt,
    });
    const recipients = await trx("users").whereIn("email", emails).select("id", "email");
    await trx("record_recipients").insert(
      recipients.map((r) => ({ record_id: id, user_id: r.id, email: r.email, sent_at: issuedAt })),
    );
    await audit(
      {
        userId: actor.id,
        action: "record.issued",
        entity: "record",
        entityId: id,
        detail: { jobId, to: emails, digest },
      },
      trx,
    );
    return mail ? queueMail(recordMail(issued), trx) : [];
  });
  return { ...issued, mailIds };
}

/** One message per surveyor: the record's links, and the invitation of a newcomer. */
function recordMail({
  id,
  digest,
  vessel,
  job,
  recipients,
  names,
  invitations,
}: Omit<IssuedRecord, "mailIds">): OutgoingMail[] {
  return recipients.map(({ email, name }) => {
    const invitation = invitations.get(email);
    return {
      kind: "record",
      to: email,
      subject: `Commissioning record: ${vessel.name}`,
      text: [
        `Hello ${names.get(email) ?? name},`,
        "",
        `${env().YARD_NAME} has issued the commissioning record of ${vessel.name} (${job.engineModel}, serial ${job.engineSerial}) to you.`,
        "",
        invitation
          ? `You have a new Sternpost account for the records issued to you. Choose your password first:\n${env().APP_URL}/invitation/${invitation}\n`
          : "",
        `Read and download the record: ${env().APP_URL}/records/${id}`,
        `The same record as data (JSON, for a warranty desk or an insurer): ${env().APP_URL}/records/${id}/json`,
        `Check it is genuine: ${verifyUrl(id)}`,
        `Record digest (SHA-256): ${digest}`,
      ].join("\n"),
    };
  });
}

export async function findRecord(id: string) {
  const row = await db()("records").where({ id }).first();
  if (!row) return undefined;
  const content = parseJsonColumn<CommissioningRecord>(row.content);
  return {
    id: row.id,
    jobId: row.job_id,
    digest: row.digest,
    issuedAt: new Date(row.issued_at).toISOString(),
    content,
  };
}

/** Surveyors see the records issued to them; the manager and the job's lead see the job's. */
export async function canReadRecord(actor: Actor, record: { id: string; jobId: number }) {
  const [job, recipientIds] = await Promise.all([
    findJob(record.jobId),
    db()("record_recipients").where({ record_id: record.id }).pluck("user_id"),
  ]);
  return !!job && mayReadRecord(actor, { job, recipientIds });
}

export async function recordsIssuedTo(
  userId: number,
): Promise<{ id: string; issued_at: Date; vessel_name: string; engine_model: string }[]> {
  return db()("record_recipients as r")
    .join("records as d", "d.id", "r.record_id")
    .join("jobs as j", "j.id", "d.job_id")
    .join("vessels as v", "v.id", "j.vessel_id")
    .where("r.user_id", userId)
    .orderBy("d.issued_at", "desc")
    .select("d.id", "d.issued_at", "v.name as vessel_name", "j.engine_model");
}

export async function recordsOfJob(jobId: number) {
  return db()("records")
    .where({ job_id: jobId })
    .orderBy("issued_at", "desc")
    .select("id", "issued_at", "digest");
}

/** What /verify shows: enough to match the paper in the reader's hand, and nothing more. */
export interface Verification {
  genuine: boolean;
  issuedAt: string;
  digest: string;
  /** Absent when the stored record can no longer be read. */
  identity?: {
    yardName: string;
    vesselName: string;
    hin?: string;
    engineModel: string;
    engineSerial: string;
  };
  checklists: {
    title: string;
    version: number;
    submittedBy?: string;
    submittedAt?: string;
    countersignedBy?: string;
    countersignedAt?: string;
  }[];
  problems: string[];
}

/**
 * Recomputes the digests: the stored record against its digest, and each checklist, read again
 * from the locked tables, against the digest stored when it was countersigned.
 */
export async function verifyRecord(id: string): Promise<Verification | undefined> {
  const row = await db()("records").where({ id }).first();
  if (!row) return undefined;
  const problems: string[] = [];
  let content: CommissioningRecord | undefined;
  try {
    content = parseJsonColumn<CommissioningRecord>(row.content);
  } catch {
    problems.push("The stored record can no longer be read.");
  }
  if (content && sha256Hex(recordCanonical(content)) !== row.digest)
    problems.push("The stored record does not match the digest it was issued with.");
  const checklists = inWorkOrder(content?.checklists ?? []);
  for (const checklist of checklists) {
    const live = await loadRecordChecklist(checklist.id);
    if (!live) problems.push(`The checklist "${checklist.template.title}" is missing.`);
    else if (checklistDigest(live) !== checklist.digest || live.digest !== checklist.digest)
      problems.push(`"${checklist.template.title}" has changed since it was countersigned.`);
  }
  return {
    genuine: problems.length === 0,
    issuedAt: new Date(row.issued_at).toISOString(),
    digest: row.digest,
    identity: content && {
      yardName: content.yardName,
      vesselName: content.vessel.name,
      hin: content.vessel.hin,
      engineModel: content.job.engineModel,
      engineSerial: content.job.engineSerial,
    },
    checklists: checklists.map((c) => ({
      title: c.template.title,
      version: c.templateVersion,
      submittedBy: c.submittedBy,
      submittedAt: c.submittedAt,
      countersignedBy: c.countersignedBy,
      countersignedAt: c.countersignedAt,
    })),
    problems,
  };
}
