import { getFormProps, getInputProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/review";
import { CalcDiagram } from "~/components/checklist/calc-diagram";
import { ItemComments } from "~/components/checklist/item-comments";
import { ConfirmAction } from "~/components/confirm-action";
import { FillItem } from "~/components/checklist/fill-item";
import { Field, FormErrors } from "~/components/field";
import { checklistStateLabels } from "~/lib/checklist-sets";
import { canOnJob } from "~/lib/permissions";
import { Refusal } from "~/lib/refusal";
import { calculations } from "~/lib/calc/registry";
import { progress, type VerdictStatus } from "~/lib/templates";
import { CalculationsContext } from "~/components/checklist/calculations-context";
import { reviewActionSchema } from "~/lib/validation/review";
import { requireChecklist } from "~/server/checklist-access.server";
import { checklistResponses } from "~/server/checklists.server";
import { commentsOn, openConflicts } from "~/server/offline.server";
import { addComment, countersign, returnChecklist } from "~/server/review.server";
import { LocalTime } from "~/components/local-time";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Review: ${data?.checklist.title ?? "Checklist"} · Sternpost` },
];

const reviewable = (request: Request, checklistId: string) =>
  requireChecklist(request, checklistId, "oversee", "Only the job's lead and the manager open the review.");

export async function loader({ request, params }: Route.LoaderArgs) {
  const { user, checklist, job } = await reviewable(request, params.checklistId);
  const { template, ...summary } = checklist;
  return {
    checklist: summary,
    template,
    responses: await checklistResponses(checklist.id),
    comments: (await commentsOn([checklist.id])).map(({ checklistId: _, ...c }) => c),
    conflictItems: [...new Set((await openConflicts([checklist.id])).map((c) => c.itemKey))],
    canReview: canOnJob(user, "countersign", job) && checklist.state === "submitted",
    job: { id: job.id, vesselName: job.vesselName },
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { user, checklist } = await reviewable(request, params.checklistId);
  const submission = parseWithZod(await request.formData(), { schema: reviewActionSchema });
  if (submission.status !== "success")
    return data({ result: submission.reply(), itemKey: itemKeyOf(submission.payload) }, { status: 400 });
  const intent = submission.value;
  try {
    switch (intent.intent) {
      case "comment":
        await addComment(user, checklist.id, intent.itemKey, intent.text);
        return { result: submission.reply({ resetForm: true }), itemKey: intent.itemKey };
      case "return":
        await returnChecklist(user, checklist.id);
        return redirect(`/jobs/${checklist.jobId}`);
      case "countersign":
        await countersign(user, checklist.id, intent.password);
        return redirect(`/jobs/${checklist.jobId}`);
    }
  } catch (error) {
    if (!(error instanceof Refusal)) throw error;
    const result = submission.reply(
      error.field ? { fieldErrors: { [error.field]: [error.message] } } : { formErrors: [error.message] },
    );
    return data(
      { result, itemKey: intent.intent === "comment" ? intent.itemKey : null },
      { status: error.status },
    );
  }
}

/** The item a refused comment belongs to, so its error shows at that item. */
const itemKeyOf = (payload: Record<string, unknown>) =>
  payload.intent === "comment" && typeof payload.itemKey === "string" ? payload.itemKey : null;

function CommentForm({
  itemKey,
  lastResult,
  busy,
}: {
  itemKey: string;
  lastResult: SubmissionResult<string[]> | null;
  busy: boolean;
}) {
  const [form, fields] = useForm({
    id: `comment-${itemKey}`,
    lastResult,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: reviewActionSchema }),
    shouldValidate: "onSubmit",
  });
  const errors = [...(form.errors ?? []), ...(fields.text.errors ?? [])];
  return (
    <Form method="post" {...getFormProps(form)} className="flex flex-wrap items-end gap-2">
      <input type="hidden" name="intent" value="comment" />
      <input type="hidden" name="itemKey" value={itemKey} />
      <label className="flex flex-1 flex-col gap-1 font-bold">
        Comment on this item
        <input {...getInputProps(fields.text, { type: "text" })} className="field-input font-normal" />
      </label>
      <button className="btn" type="submit" disabled={busy}>
        Add comment
      </button>
      {errors.length > 0 && (
        <p role="alert" id={fields.text.errorId} className="w-full font-bold text-fault">
          ▲ {errors.join(" ")}
        </p>
      )}
    </Form>
  );
}

function DecisionForms({
  lastResult,
  busy,
  comments,
}: {
  lastResult: SubmissionResult<string[]> | null;
  busy: boolean;
  comments: number;
}) {
  const [form, fields] = useForm({
    id: "countersign",
    lastResult,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: reviewActionSchema }),
    shouldValidate: "onSubmit",
  });
  return (
    <section className="card flex scroll-mt-32 flex-col gap-4" aria-labelledby="decision" id="your-decision">
      <h2 id="decision" className="text-xl font-bold">
        Your decision
      </h2>
      <FormErrors errors={form.errors} />
      <Form method="post">
        <ConfirmAction
          label="Return to the technician with the comments"
          yes="return it"
          value="return"
          consequence={
            comments
              ? `The technician gets it back with your ${comments} comment${comments === 1 ? "" : "s"} and can change it again; it comes back to you when they submit it.`
              : "You have written no comment: the technician gets it back without being told what to change."
          }
        />
      </Form>
      <Form method="post" {...getFormProps(form)} className="flex flex-wrap items-end gap-2">
        <input type="hidden" name="intent" value="countersign" />
        <Field id={fields.password.id} label="Your password, to countersign" errors={fields.password.errors}>
          <input
            {...getInputProps(fields.password, { type: "password" })}
            autoComplete="current-password"
            className="field-input font-normal"
          />
        </Field>
        <button className="btn btn-primary" type="submit" disabled={busy}>
          Countersign and lock
        </button>
      </Form>
      <p className="text-sm text-ink-soft">
        Countersigning stores your name, the time and the SHA-256 digest of everything recorded here, and
        locks the checklist. A later correction is an amendment.
      </p>
    </section>
  );
}

type Finding = "outside" | "noted" | "conflict" | "comment";

const findingTitles: Record<Finding, string> = {
  outside: "Outside limits or failed",
  noted: "Noted (not applicable, or a note written)",
  conflict: "Conflicts to decide",
  comment: "Comments",
};

const OUTSIDE = new Set<VerdictStatus>(["out-of-range", "needs-note", "action-noted", "invalid"]);

/** Whether an entry carries a note of the technician's (whatever its verdict). */
const hasNote = (value: unknown) =>
  !!value &&
  typeof value === "object" &&
  "note" in value &&
  typeof value.note === "string" &&
  !!value.note.trim();

export default function Review({ loaderData, actionData }: Route.ComponentProps) {
  const { checklist, template, responses, comments, conflictItems, canReview, job } = loaderData;
  const busy = useNavigation().state !== "idle";
  const values = Object.fromEntries(Object.entries(responses).map(([k, r]) => [k, r.value]));
  const state = progress(template, values);
  // What the lead should read first: each item's findings, by kind.
  const findingsOf = (key: string): Finding[] => {
    const verdict = state.verdicts[key]!;
    return [
      ...(OUTSIDE.has(verdict.status) || verdict.finding ? (["outside"] as const) : []),
      ...(verdict.status === "noted" || hasNote(values[key]) ? (["noted"] as const) : []),
      ...(conflictItems.includes(key) ? (["conflict"] as const) : []),
      ...(comments.some((c) => c.itemKey === key) ? (["comment"] as const) : []),
    ];
  };
  const items = template.sections.flatMap((section, i) =>
    section.items.map((item) => ({ item, section: i, findings: findingsOf(item.key) })),
  );
  const findings = (Object.keys(findingTitles) as Finding[]).map((kind) => ({
    kind,
    items: items.filter((x) => x.findings.includes(kind)),
  }));
  const renderItem = (item: (typeof items)[number]["item"]) => (
    <FillItem
      key={item.key}
      item={item}
      template={template}
      responses={values}
      value={responses[item.key]?.value}
      verdict={state.verdicts[item.key]!}
      pending={false}
      by=""
      disabled
      onSave={() => {}}
      checklistId={checklist.id}
      diagram={
        <CalcDiagram item={item} template={template} responses={values} verdict={state.verdicts[item.key]!} />
      }
    >
      {responses[item.key] && (
        <p className="text-sm text-ink-soft">
          Last entry by {responses[item.key]!.by}, <LocalTime at={responses[item.key]!.at} /> (revision{" "}
          {responses[item.key]!.rev})
        </p>
      )}
      <ItemComments comments={comments.filter((c) => c.itemKey === item.key)} />
      {canReview && (
        <CommentForm
          itemKey={item.key}
          lastResult={actionData?.itemKey === item.key ? actionData.result : null}
          busy={busy}
        />
      )}
    </FillItem>
  );
  return (
    <CalculationsContext value={calculations}>
      <p className="mb-1">
        <Link to={`/jobs/${job.id}`} className="font-bold text-harbour underline">
          ← {job.vesselName}
        </Link>
      </p>
      <div className="mb-4 flex flex-wrap items-end justify-between gap-2">
        <h1 className="text-3xl font-bold">Review: {checklist.title}</h1>
        <p className="text-lg">
          Version {checklist.version} · {checklistStateLabels[checklist.state]}
        </p>
      </div>
      <p className="mb-4">
        <strong>
          {state.overall.done} of {state.overall.required}
        </strong>{" "}
        required items done
        {state.overall.attention.length ? `, ▲ ${state.overall.attention.length} need attention` : ""}.
      </p>
      <nav aria-label="On this page" className="card mb-6 flex flex-col gap-3" data-testid="review-outline">
        <h2 className="text-xl font-bold">Findings first</h2>
        {findings.every((f) => f.items.length === 0) ? (
          <p>No findings: every entry is within its limits, with no note, conflict or comment.</p>
        ) : (
          findings
            .filter((f) => f.items.length > 0)
            .map((f) => (
              <div key={f.kind} data-testid={`findings-${f.kind}`}>
                <h3 className="font-bold">
                  {findingTitles[f.kind]} <span className="num">({f.items.length})</span>
                </h3>
                <ul className="flex flex-wrap gap-2">
                  {f.items.map(({ item, section }) => (
                    <li key={item.key}>
                      <a href={`#item-${item.key}`} className="btn">
                        {section + 1}. {item.label}
                      </a>
                    </li>
                  ))}
                </ul>
              </div>
            ))
        )}
        <h2 className="text-xl font-bold">Sections</h2>
        <ul className="flex flex-wrap gap-2">
          {template.sections.map((section, i) => (
            <li key={section.key}>
              <a href={`#section-${section.key}`} className="btn">
                {i + 1}. {section.title}
              </a>
            </li>
          ))}
          {canReview && (
            <li>
              <a href="#your-decision" className="btn btn-primary">
                Your decision
              </a>
            </li>
          )}
        </ul>
      </nav>
      {template.sections.map((section, i) => {
        const here = items.filter((x) => x.section === i);
        const flagged = here.filter((x) => x.findings.length > 0);
        const quiet = here.filter((x) => x.findings.length === 0);
        return (
          <section key={section.key} id={`section-${section.key}`} className="mb-8 scroll-mt-32">
            <h2 className="mb-3 border-b-2 border-ink pb-1 text-2xl font-bold">
              {i + 1}. {section.title}
            </h2>
            {flagged.length > 0 && (
              <ol className="mb-4 flex flex-col gap-4 [&>li]:scroll-mt-32">
                {flagged.map((x) => renderItem(x.item))}
              </ol>
            )}
            {quiet.length > 0 && (
              <details className="group" data-testid="within-limits">
                <summary className="btn w-full justify-between">
                  <span>
                    {quiet.length} item{quiet.length === 1 ? "" : "s"} within limits, nothing to note
                  </span>
                  <span aria-hidden="true" className="transition-transform group-open:rotate-180">
                    ▾
                  </span>
                </summary>
                <ol className="mt-4 flex flex-col gap-4">{quiet.map((x) => renderItem(x.item))}</ol>
              </details>
            )}
          </section>
        );
      })}
      {canReview && (
        <DecisionForms
          lastResult={actionData && !actionData.itemKey ? actionData.result : null}
          busy={busy}
          comments={comments.filter((c) => !c.replyTo).length}
        />
      )}
    </CalculationsContext>
  );
}
