import { canEditJob, canViewJob } from "~/lib/permissions";
import { requireUser } from "./auth.server.ts";
import { findJob } from "./jobs.server.ts";
import { invariantForbidden, invariantFound } from "./permissions.server.ts";

/** The job named in the URL, if this person may see it (404 when missing, 403 when not theirs). */
export async function requireJob(request: Request, jobId: string, need: "view" | "edit" = "view") {
  const user = await requireUser(request);
  const id = Number(jobId);
  const job = Number.isInteger(id) && id > 0 ? await findJob(id) : undefined;
  invariantFound(job, "There is no such job.");
  invariantForbidden(
    need === "view" ? canViewJob(user, job) : canEditJob(user, job),
    "This job is not one of yours.",
  );
  return { user, job };
}
