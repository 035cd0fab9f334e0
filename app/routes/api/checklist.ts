import type { Route } from "./+types/checklist";
import { canOnJob } from "~/lib/permissions";
import { requireApiUser } from "~/server/auth.server";
import { findChecklist } from "~/server/checklists.server";
import { loadChecklistAccess } from "~/server/checklist-access.server";
import { problem } from "~/server/problem.server";

/** A job checklist with the template version it is pinned to. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  const access = await loadChecklistAccess(params.checklistId);
  if (!access) return problem(404, "There is no such checklist.");
  if (!canOnJob(user, "view", access.job))
    return problem(403, "This checklist belongs to a job that is not yours.");
  return Response.json({ checklist: await findChecklist(access.id) });
}
