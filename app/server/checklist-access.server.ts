import { canViewJob } from "~/lib/permissions";
import { requireUser } from "./auth.server.ts";
import { findChecklist } from "./checklists.server.ts";
import { findJob } from "./jobs.server.ts";
import { invariantForbidden, invariantFound } from "./permissions.server.ts";

/** A checklist, if its job is one this person may see. */
export async function requireChecklist(request: Request, checklistId: string) {
  const user = await requireUser(request);
  const checklist = await findChecklist(checklistId);
  invariantFound(checklist, "There is no such checklist.");
  const job = await findJob(checklist.jobId);
  invariantForbidden(job && canViewJob(user, job), "This checklist belongs to a job that is not yours.");
  return { user, checklist, job };
}
