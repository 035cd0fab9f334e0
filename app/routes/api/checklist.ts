import type { Route } from "./+types/checklist";
import { canViewJob } from "~/lib/permissions";
import { requireApiUser } from "~/server/auth.server";
import { findChecklist } from "~/server/checklists.server";
import { findJob } from "~/server/jobs.server";

/** A job checklist with the template version it is pinned to. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  const checklist = await findChecklist(params.checklistId);
  if (!checklist) return Response.json({ error: "There is no such checklist." }, { status: 404 });
  const job = await findJob(checklist.jobId);
  if (!job || !canViewJob(user, job))
    return Response.json({ error: "This checklist belongs to a job that is not yours." }, { status: 403 });
  return Response.json({ checklist });
}
