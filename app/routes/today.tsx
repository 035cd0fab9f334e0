import { Link } from "react-router";
import type { Route } from "./+types/today";
import { can } from "~/lib/permissions";
import { jobStatusLabels } from "~/lib/validation/jobs";
import { requireUser } from "~/server/auth.server";
import { listVisibleJobs } from "~/server/jobs.server";

export const meta: Route.MetaFunction = () => [{ title: "Today · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const jobs = can(user, "jobs:view") ? await listVisibleJobs(user) : [];
  return { name: user.name, role: user.role, jobs: jobs.filter((j) => j.status !== "completed") };
}

export default function Today({ loaderData }: Route.ComponentProps) {
  const { name, role, jobs } = loaderData;
  return (
    <>
      <h1 className="mb-2 text-3xl font-bold">Good to see you, {name.split(" ")[0]}</h1>
      {role === "surveyor" ? (
        <p className="text-lg">Commissioning records issued to you will appear here.</p>
      ) : (
        <>
          <p className="mb-6 text-lg">{role === "technician" ? "The jobs you are assigned to:" : "Open jobs:"}</p>
          {jobs.length === 0 && <p>No open jobs.</p>}
          <ul className="grid gap-4 md:grid-cols-2">
            {jobs.map((j) => (
              <li key={j.id}>
                <Link to={`/jobs/${j.id}`} className="card flex min-h-24 flex-col no-underline hover:border-ink">
                  <span className="text-xl font-bold text-ink">{j.vesselName}</span>
                  <span className="text-ink-soft">
                    {j.engineModel} · {jobStatusLabels[j.status]} · due {j.dueDate ?? "—"}
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        </>
      )}
    </>
  );
}
