import type { SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Link } from "react-router";
import type { Route } from "./+types/detail";
import { IssueRecord } from "~/components/issue-record";
import { JobChecklists } from "~/components/job-checklists";
import { defaultTemplatesFor } from "~/lib/checklist-sets";
import { byWorkOrder } from "~/lib/templates";
import { canOnJob } from "~/lib/permissions";
import { Refusal } from "~/lib/refusal";
import { jobPageActionSchema } from "~/lib/validation/job-page";
import type { SealOutcome } from "~/lib/validation/review";
import { jobScopeLabels, jobStatusLabels } from "~/lib/validation/jobs";
import { listJobChecklists, startChecklists } from "~/server/checklists.server";
import { prefillFromJob } from "~/server/prefill.server";
import { requireJob } from "~/server/job-access.server";
import { recordReadiness, recordsOfJob, issueRecord } from "~/server/records.server";
import { countersignSeveral, discardAmendment, startAmendment } from "~/server/review.server";
import { latestPublished } from "~/server/templates.server";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.job.vesselName ?? "Job"} · Sternpost` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { user, job } = await requireJob(request, params.jobId);
  const [checklists, library, readiness, records] = await Promise.all([
    listJobChecklists(job.id),
    latestPublished(),
    recordReadiness(job.id),
    recordsOfJob(job.id),
  ]);
  return {
    job,
    canEdit: canOnJob(user, "edit", job),
    canReview: canOnJob(user, "countersign", job),
    readiness,
    records: canOnJob(user, "oversee", job) ? records : [],
    checklists,
    // Offered in the order the work is done, not alphabetically.
    available: library.map(({ key, title, version }) => ({ key, title, version })).sort(byWorkOrder),
    defaults: defaultTemplatesFor[job.scope],
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { user, job } = await requireJob(request, params.jobId, "edit");
  const submission = parseWithZod(await request.formData(), { schema: jobPageActionSchema });
  const answer = (result: SubmissionResult<string[]>, more: Partial<JobPageAnswer> = {}) => ({
    intent: submission.status === "success" ? submission.value.intent : intentOf(submission.payload),
    result,
    issued: null,
    sealed: null,
    ...more,
  });
  if (submission.status !== "success") return data(answer(submission.reply()), { status: 400 });
  const form = submission.value;
  try {
    switch (form.intent) {
      case "issue-record": {
        const { mailWaiting } = await issueRecord(user, job.id, form.emails);
        const to = form.emails.map((r) => r.email).join(", ");
        return answer(submission.reply({ resetForm: true }), {
          issued: mailWaiting
            ? `Record issued to ${to}. The mail server did not take the e-mail yet; Sternpost keeps it and sends it as soon as the server answers.`
            : `Record issued to ${to}.`,
        });
      }
      case "amend":
        await startAmendment(user, form.checklistId);
        break;
      case "discard-amendment":
        await discardAmendment(user, form.checklistId);
        break;
      case "countersign-several":
        if (!canOnJob(user, "countersign", job))
          throw new Refusal("forbidden", "Only the job's lead countersigns its checklists.");
        return answer(submission.reply({ resetForm: true }), {
          sealed: await countersignSeveral(user, job.id, form.checklistIds, form.password),
        });
      case "start-checklists":
        await prefillFromJob(user, job, await startChecklists(job.id, form.templates, user.id));
        break;
    }
  } catch (error) {
    if (!(error instanceof Refusal)) throw error;
    const result = submission.reply(
      error.field ? { fieldErrors: { [error.field]: [error.message] } } : { formErrors: [error.message] },
    );
    return data(answer(result), { status: error.status });
  }
  return answer(submission.reply());
}

interface JobPageAnswer {
  intent: string | null;
  result: SubmissionResult<string[]>;
  issued: string | null;
  sealed: SealOutcome[] | null;
}

const intentOf = (payload: Record<string, unknown>) =>
  typeof payload.intent === "string" ? payload.intent : null;

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-sm text-ink-soft">{label}</dt>
      <dd className="num text-lg font-bold">{children}</dd>
    </div>
  );
}

export default function JobDetail({ loaderData, actionData }: Route.ComponentProps) {
  const { job, canEdit, canReview, checklists, available, defaults, readiness, records } = loaderData;
  return (
    <>
      <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="font-bold text-copper">
            {jobScopeLabels[job.scope]} · {jobStatusLabels[job.status]}
          </p>
          <h1 className="text-3xl font-bold">{job.vesselName}</h1>
          {job.hin && <p className="font-mono">HIN {job.hin}</p>}
        </div>
        {canEdit && (
          <Link className="btn" to={`/jobs/${job.id}/edit`}>
            Edit job
          </Link>
        )}
      </div>
      <JobChecklists
        checklists={checklists}
        available={available}
        defaults={defaults}
        canStart={canEdit}
        canReview={canReview}
        lastResult={
          actionData?.intent === "issue-record" || actionData?.intent === "countersign-several"
            ? null
            : actionData?.result
        }
        countersignResult={actionData?.intent === "countersign-several" ? actionData.result : null}
        sealed={actionData?.sealed}
      />
      {(canEdit || records.length > 0) && (
        <IssueRecord
          readiness={readiness}
          records={records}
          canIssue={canEdit}
          lastResult={actionData?.intent === "issue-record" ? actionData.result : null}
          issued={actionData?.issued}
        />
      )}
      <section className="card mb-6">
        <h2 className="mb-3 text-xl font-bold">Installed equipment</h2>
        <dl className="grid grid-cols-2 gap-4 md:grid-cols-4">
          <Fact label="Engine">{job.engineModel}</Fact>
          <Fact label="Serial">{job.engineSerial}</Fact>
          <Fact label="Rated power">{job.ratedPowerHp} hp</Fact>
          <Fact label="Rated rpm">
            {job.ratedRpmMin}–{job.ratedRpmMax} rpm
          </Fact>
          <Fact label="Gear ratio">{job.gearRatio} : 1</Fact>
          <Fact label="Propeller">
            {job.propDiameterIn} in × {job.propPitchIn} in, {job.propBlades} blades
          </Fact>
          <Fact label="Shaft">
            {job.shaftDiameterIn} in, {job.shaftMaterial}
          </Fact>
          <Fact label="Coupling">{job.couplingType}</Fact>
        </dl>
      </section>
      <section className="card mb-6">
        <h2 className="mb-3 text-xl font-bold">People and dates</h2>
        <dl className="grid grid-cols-2 gap-4 md:grid-cols-4">
          <Fact label="Lead">{job.leadName}</Fact>
          <Fact label="Technicians">{job.technicianNames.join(", ") || "None yet"}</Fact>
          <Fact label="Start">{job.startDate ?? "—"}</Fact>
          <Fact label="Due">{job.dueDate ?? "—"}</Fact>
        </dl>
      </section>
    </>
  );
}
