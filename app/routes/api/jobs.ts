import type { Route } from "./+types/jobs";
import { listVisibleJobs } from "~/server/jobs.server";
import { requireApiCapability } from "~/server/permissions.server";

/** The signed-in person's visible jobs. */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireApiCapability(request, "jobs:view");
  return Response.json({ jobs: await listVisibleJobs(user) });
}
