import type { Route } from "./+types/job";
import { canOnJob } from "~/lib/permissions";
import { requireApiUser } from "~/server/auth.server";
import { findJob } from "~/server/jobs.server";
import { problem } from "~/server/problem.server";

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  const id = Number(params.jobId);
  if (!Number.isInteger(id) || id <= 0) return problem(400, "jobId must be a positive whole number.");
  const job = await findJob(id);
  if (!job) return problem(404, "There is no such job.");
  if (!canOnJob(user, "view", job)) return problem(403, "This job is not one of yours.");
  return Response.json({ job });
}
