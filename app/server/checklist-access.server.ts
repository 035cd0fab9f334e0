import type { Knex } from "knex";
import { canOnJob, type JobAccess, type JobAction } from "~/lib/permissions";
import { Refusal } from "~/lib/refusal";
import { requireUser } from "./auth.server.ts";
import { findChecklist } from "./checklists.server.ts";
import { db } from "./db.server.ts";
import { findJob } from "./jobs.server.ts";
import { invariantForbidden, invariantFound } from "./permissions.server.ts";
import type { JobChecklistRow, TemplateVersionRow } from "./tables.server.ts";

/** What every guard needs to judge a checklist: its state, its template text and its job's crew. */
export type ChecklistAccess = Pick<
  JobChecklistRow,
  "id" | "state" | "job_id" | "amends_id" | "template_version_id" | "template_key"
> &
  Pick<TemplateVersionRow, "body"> & { job: JobAccess };

/**
 * The one way a checklist's access is loaded (review, photos, pages), inside the caller's
 * transaction when one is given; undefined when there is no such checklist.
 */
export async function loadChecklistAccess(
  checklistId: string,
  knex: Knex = db(),
): Promise<ChecklistAccess | undefined> {
  const row: (Omit<ChecklistAccess, "job"> & { lead_id: number }) | undefined = await knex(
    "job_checklists as c",
  )
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
  if (!row) return undefined;
  const technicianIds = await knex("job_technicians").where({ job_id: row.job_id }).pluck("user_id");
  const { lead_id, ...checklist } = row;
  return { ...checklist, job: { leadId: lead_id, technicianIds } };
}

/** Loads the checklist's access and refuses unless this person may take the action on its job. */
export async function checklistAccessFor(
  actor: Parameters<typeof canOnJob>[0],
  action: JobAction,
  checklistId: string,
  knex: Knex = db(),
  refusal = "This checklist belongs to a job that is not yours.",
): Promise<ChecklistAccess> {
  const access = await loadChecklistAccess(checklistId, knex);
  if (!access) throw new Refusal("not-found", "There is no such checklist.");
  if (!canOnJob(actor, action, access.job)) throw new Refusal("forbidden", refusal);
  return access;
}

/** A checklist page: the checklist and its job, if this person may take the action on that job. */
export async function requireChecklist(
  request: Request,
  checklistId: string,
  action: JobAction = "view",
  refusal = "This checklist belongs to a job that is not yours.",
) {
  const user = await requireUser(request);
  const access = await loadChecklistAccess(checklistId);
  invariantFound(access, "There is no such checklist.");
  invariantForbidden(canOnJob(user, action, access.job), refusal);
  const [checklist, job] = await Promise.all([findChecklist(checklistId), findJob(access.job_id)]);
  invariantFound(checklist, "There is no such checklist.");
  invariantFound(job, "There is no such job.");
  return { user, checklist, job };
}
