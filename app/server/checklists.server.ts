import { randomUUID } from "node:crypto";
import type { ChecklistState } from "~/lib/checklist-sets";
import { Refusal } from "~/lib/refusal";
import { workOrderIndex, type Template } from "~/lib/templates";
import { audit } from "./audit.server.ts";
import { authorName } from "./author-name.server.ts";
import { db } from "./db.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import type { ChecklistResponseRow, JobChecklistRow, TemplateVersionRow } from "./tables.server.ts";
import { latestPublished } from "./templates.server.ts";

export interface JobChecklistSummary {
  id: string;
  jobId: number;
  key: string;
  title: string;
  version: number;
  state: ChecklistState;
  /** A newer published version exists; this checklist stays on its own. */
  newerVersion: number | null;
  /** The countersigned checklist this one corrects, and the amendment that corrects this one. */
  amends: string | null;
  amendedBy: string | null;
}

/** A checklist row with its template's key, title and version (and body, when asked for). */
type ChecklistListRow = Pick<JobChecklistRow, "id" | "job_id" | "state" | "amends_id"> &
  Pick<TemplateVersionRow, "template_key" | "title" | "version">;

/** The checklists of several jobs at once (two queries, however many jobs), by job id. */
export async function listChecklistsOfJobs(jobIds: number[]): Promise<Map<number, JobChecklistSummary[]>> {
  const byJob = new Map<number, JobChecklistSummary[]>(jobIds.map((id) => [id, []]));
  if (!jobIds.length) return byJob;
  const [rows, latest]: [ChecklistListRow[], Awaited<ReturnType<typeof latestPublished>>] = await Promise.all(
    [
      db()("job_checklists as c")
        .join("template_versions as t", "t.id", "c.template_version_id")
        .whereIn("c.job_id", jobIds)
        .orderBy("c.created_at")
        .select("c.id", "c.job_id", "c.state", "c.amends_id", "t.template_key", "t.title", "t.version"),
      latestPublished(),
    ],
  );
  // The order the work is done in, whatever order the checklists were started in.
  rows.sort((a, b) => workOrderIndex(a.template_key) - workOrderIndex(b.template_key));
  for (const r of rows) {
    const newest = latest.find((l) => l.key === r.template_key);
    byJob.get(r.job_id)!.push({
      id: r.id,
      jobId: r.job_id,
      key: r.template_key,
      title: r.title,
      version: r.version,
      state: r.state,
      newerVersion: newest && newest.version > r.version ? newest.version : null,
      amends: r.amends_id ?? null,
      amendedBy: rows.find((other) => other.amends_id === r.id)?.id ?? null,
    });
  }
  return byJob;
}

export async function listJobChecklists(jobId: number): Promise<JobChecklistSummary[]> {
  return (await listChecklistsOfJobs([jobId])).get(jobId)!;
}

/**
 * Starts one checklist per chosen template on a job, each pinned to the version published now.
 * Templates already started on the job are skipped.
 */
export async function startChecklists(jobId: number, keys: string[], userId: number): Promise<string[]> {
  return db().transaction(async (trx) => {
    const latest = await latestPublished(trx);
    const unknown = keys.filter((k) => !latest.some((l) => l.key === k));
    if (unknown.length) throw new Refusal("invalid", `No published template named ${unknown.join(", ")}.`);
    const existing: string[] = await trx("job_checklists").where({ job_id: jobId }).pluck("template_key");
    const ids: string[] = [];
    for (const key of keys.filter((k) => !existing.includes(k))) {
      const version = latest.find((l) => l.key === key)!;
      const id = randomUUID();
      await trx("job_checklists").insert({
        id,
        job_id: jobId,
        template_version_id: version.id,
        template_key: key,
        started_by: userId,
      });
      await audit(
        {
          userId,
          action: "checklist.started",
          entity: "checklist",
          entityId: id,
          detail: { jobId, key, version: version.version },
        },
        trx,
      );
      ids.push(id);
    }
    return ids;
  });
}

export interface JobChecklist extends JobChecklistSummary {
  template: Template;
}

export async function findChecklist(id: string): Promise<JobChecklist | undefined> {
  const row: (ChecklistListRow & Pick<TemplateVersionRow, "body">) | undefined = await db()(
    "job_checklists as c",
  )
    .join("template_versions as t", "t.id", "c.template_version_id")
    .where("c.id", id)
    .first("c.id", "c.job_id", "c.state", "c.amends_id", "t.template_key", "t.title", "t.version", "t.body");
  if (!row) return undefined;
  const newest = (await latestPublished()).find((l) => l.key === row.template_key);
  return {
    id: row.id,
    jobId: row.job_id,
    key: row.template_key,
    title: row.title,
    version: row.version,
    state: row.state,
    newerVersion: newest && newest.version > row.version ? newest.version : null,
    amends: row.amends_id ?? null,
    amendedBy: (await db()("job_checklists").where({ amends_id: row.id }).first("id"))?.id ?? null,
    template: parseJsonColumn<Template>(row.body),
  };
}

type ResponseWithAuthor = Pick<ChecklistResponseRow, "item_key" | "value" | "rev" | "updated_at"> & {
  name: string;
};

/** The current responses of a checklist as the server holds them. */
export async function checklistResponses(checklistId: string) {
  const rows: ResponseWithAuthor[] = await db()("checklist_responses as r")
    .where("r.checklist_id", checklistId)
    .select("r.item_key", "r.value", "r.rev", "r.updated_at", authorName(db(), "r.updated_by"));
  return Object.fromEntries(
    rows.map((r) => [
      r.item_key,
      {
        value: parseJsonColumn(r.value),
        rev: r.rev,
        by: r.name,
        at: new Date(r.updated_at).toISOString(),
        pending: false,
      },
    ]),
  ) as Record<string, { value: unknown; rev: number; by: string; at: string; pending: boolean }>;
}
