import { data, redirect } from "react-router";
import type { Route } from "./+types/edit";
import { PageHeader } from "~/components/app-shell";
import { JobForm } from "~/components/job-form";
import { audit } from "~/server/audit.server";
import { requireJob } from "~/server/job-access.server";
import { jobFormOptions, parseJobForm } from "~/server/job-form.server";
import { updateJob } from "~/server/jobs.server";

export const meta: Route.MetaFunction = () => [{ title: "Edit job · Sternpost" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { user, job } = await requireJob(request, params.jobId, "edit");
  return { ...(await jobFormOptions()), job, me: { id: user.id, name: user.name, role: user.role } };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { user, job } = await requireJob(request, params.jobId, "edit");
  const submission = await parseJobForm(await request.formData(), user);
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  await updateJob(job.id, submission.value);
  await audit({ userId: user.id, action: "job.updated", entity: "job", entityId: job.id });
  return redirect(`/jobs/${job.id}`);
}

export default function EditJob({ loaderData, actionData }: Route.ComponentProps) {
  const { me, job, ...options } = loaderData;
  return (
    <>
      <PageHeader title={`Edit job: ${job.vesselName}`} />
      <JobForm
        {...options}
        defaults={job}
        lastResult={actionData}
        leadFixed={me.role === "lead" ? me : undefined}
        submitLabel="Save changes"
      />
    </>
  );
}
