import type { Route } from "./+types/job";
import { canViewJob } from "~/lib/permissions";
import { requireApiUser } from "~/server/auth.server";
import { findJob } from "~/server/jobs.server";

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  const id = Number(params.jobId);
  if (!Number.isInteger(id) || id <= 0)
    return Response.json({ error: "jobId must be a positive whole number." }, { status: 400 });
  const job = await findJob(id);
  if (!job) return Response.json({ error: "There is no such job." }, { status: 404 });
  if (!canViewJob(user, job))
    return Response.json({ error: "This job is not one of yours." }, { status: 403 });
  return Response.json({ job });
}
