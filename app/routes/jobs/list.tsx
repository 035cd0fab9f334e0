import { Link, type ShouldRevalidateFunctionArgs } from "react-router";
import type { Route } from "./+types/list";
import { PageHeader } from "~/components/app-shell";
import { JobsTable } from "~/components/jobs-table";
import { can } from "~/lib/permissions";
import { listVisibleJobs } from "~/server/jobs.server";
import { requireCapability } from "~/server/permissions.server";

export const meta: Route.MetaFunction = () => [{ title: "Jobs · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireCapability(request, "jobs:view");
  return { jobs: await listVisibleJobs(user), canCreate: can(user, "jobs:create") };
}

/** Sorting, filtering and searching change only the address: the rows are already here. */
export function shouldRevalidate({
  currentUrl,
  nextUrl,
  formMethod,
  defaultShouldRevalidate,
}: ShouldRevalidateFunctionArgs) {
  if (!formMethod && currentUrl.pathname === nextUrl.pathname) return false;
  return defaultShouldRevalidate;
}

export default function Jobs({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Jobs">
        {loaderData.canCreate && (
          <Link className="btn btn-primary" to="/jobs/new">
            New job
          </Link>
        )}
      </PageHeader>
      <JobsTable jobs={loaderData.jobs} />
    </>
  );
}
