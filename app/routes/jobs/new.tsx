import { data, redirect } from "react-router";
import type { Route } from "./+types/new";
import { PageHeader } from "~/components/app-shell";
import { JobForm } from "~/components/job-form";
import { audit } from "~/server/audit.server";
import { jobFormOptions, parseJobForm } from "~/server/job-form.server";
import { createJob } from "~/server/jobs.server";
import { requireCapability } from "~/server/permissions.server";

export const meta: Route.MetaFunction = () => [{ title: "New job · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireCapability(request, "jobs:create");
  return { ...(await jobFormOptions()), me: { id: user.id, name: user.name, role: user.role } };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireCapability(request, "jobs:create");
  const submission = await parseJobForm(await request.formData(), user);
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  const id = await createJob(submission.value, user.id);
  await audit({ userId: user.id, action: "job.created", entity: "job", entityId: id });
  return redirect(`/jobs/${id}`);
}

export default function NewJob({ loaderData, actionData }: Route.ComponentProps) {
  const { me, ...options } = loaderData;
  return (
    <>
      <PageHeader title="New job" />
      <JobForm
        {...options}
        lastResult={actionData}
        leadFixed={me.role === "lead" ? me : undefined}
        submitLabel="Create job"
      />
    </>
  );
}
