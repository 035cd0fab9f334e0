import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/review";
import { CalcDiagram } from "~/components/checklist/calc-diagram";
import { FillItem } from "~/components/checklist/fill-item";
import { FormErrors } from "~/components/field";
import { checklistStateLabels } from "~/lib/checklist-sets";
import { progress } from "~/lib/templates";
import { reviewActionSchema } from "~/lib/validation/review";
import { requireChecklist } from "~/server/checklist-access.server";
import { checklistResponses } from "~/server/checklists.server";
import { commentsOn } from "~/server/offline.server";
import { invariantForbidden } from "~/server/permissions.server";
import { addComment, countersign, returnChecklist, ReviewError } from "~/server/review.server";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Review: ${data?.checklist.title ?? "Checklist"} · Sternpost` },
];

async function reviewable(request: Request, checklistId: string) {
  const found = await requireChecklist(request, checklistId);
  invariantForbidden(
    found.user.role === "manager" || (found.user.role === "lead" && found.job.leadId === found.user.id),
    "Only the job's lead and the manager open the review.",
  );
  return found;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const { user, checklist, job } = await reviewable(request, params.checklistId);
  const { template, ...summary } = checklist;
  return {
    checklist: summary,
    template,
    responses: await checklistResponses(checklist.id),
    comments: (await commentsOn([checklist.id])).map(({ checklistId: _, ...c }) => c),
    canReview: user.role === "lead" && job.leadId === user.id && checklist.state === "submitted",
    job: { id: job.id, vesselName: job.vesselName },
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { user, checklist } = await reviewable(request, params.checklistId);
  const parsed = reviewActionSchema.safeParse(Object.fromEntries(await request.formData()));
  if (!parsed.success)
    return data({ error: parsed.error.issues[0]!.message, itemKey: null }, { status: 400 });
  try {
    switch (parsed.data.intent) {
      case "comment":
        await addComment(user, checklist.id, parsed.data.itemKey, parsed.data.text);
        return { error: null, itemKey: parsed.data.itemKey };
      case "return":
        await returnChecklist(user, checklist.id);
        return redirect(`/jobs/${checklist.jobId}`);
      case "countersign":
        await countersign(user, checklist.id, parsed.data.password);
        return redirect(`/jobs/${checklist.jobId}`);
    }
  } catch (error) {
    if (error instanceof ReviewError)
      return data(
        { error: error.message, itemKey: parsed.data.intent === "comment" ? parsed.data.itemKey : null },
        { status: error.status },
      );
    throw error;
  }
}

export default function Review({ loaderData, actionData }: Route.ComponentProps) {
  const { checklist, template, responses, comments, canReview, job } = loaderData;
  const busy = useNavigation().state !== "idle";
  const values = Object.fromEntries(Object.entries(responses).map(([k, r]) => [k, r.value]));
  const state = progress(template, values);
  return (
    <>
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
      {actionData?.error && !actionData.itemKey && (
        <div className="mb-4">
          <FormErrors errors={[actionData.error]} />
        </div>
      )}
      {template.sections.map((section, i) => (
        <section key={section.key} className="mb-8">
          <h2 className="mb-3 border-b-2 border-ink pb-1 text-2xl font-bold">
            {i + 1}. {section.title}
          </h2>
          <ol className="flex flex-col gap-4">
            {section.items.map((item) => (
              <FillItem
                key={item.key}
                item={item}
                template={template}
                value={responses[item.key]?.value}
                verdict={state.verdicts[item.key]!}
                pending={false}
                by=""
                disabled
                onSave={() => {}}
                checklistId={checklist.id}
                diagram={
                  <CalcDiagram
                    item={item}
                    template={template}
                    responses={values}
                    verdict={state.verdicts[item.key]!}
                  />
                }
              >
                {responses[item.key] && (
                  <p className="text-sm text-ink-soft">
                    Last entry by {responses[item.key]!.by},{" "}
                    {new Date(responses[item.key]!.at).toLocaleString("en-GB", {
                      dateStyle: "short",
                      timeStyle: "short",
                    })}{" "}
                    (revision {responses[item.key]!.rev})
                  </p>
                )}
                {comments
                  .filter((c) => c.itemKey === item.key)
                  .map((c, j) => (
                    <p
                      key={j}
                      className="rounded-md border-2 border-harbour p-2"
                      data-testid="review-comment"
                    >
                      <strong>Comment: </strong>
                      {c.text} <span className="text-sm text-ink-soft">({c.by})</span>
                    </p>
                  ))}
                {canReview && (
                  <Form method="post" className="flex flex-wrap items-end gap-2">
                    <input type="hidden" name="intent" value="comment" />
                    <input type="hidden" name="itemKey" value={item.key} />
                    <label className="flex flex-1 flex-col gap-1 font-bold">
                      Comment on this item
                      <input name="text" className="field-input font-normal" />
                    </label>
                    <button className="btn" type="submit" disabled={busy}>
                      Add comment
                    </button>
                    {actionData?.error && actionData.itemKey === item.key && (
                      <p role="alert" className="w-full font-bold text-fault">
                        ▲ {actionData.error}
                      </p>
                    )}
                  </Form>
                )}
              </FillItem>
            ))}
          </ol>
        </section>
      ))}
      {canReview && (
        <section className="card flex flex-col gap-4" aria-labelledby="decision">
          <h2 id="decision" className="text-xl font-bold">
            Your decision
          </h2>
          <Form method="post">
            <input type="hidden" name="intent" value="return" />
            <button className="btn" type="submit" disabled={busy}>
              Return to the technician with the comments
            </button>
          </Form>
          <Form method="post" className="flex flex-wrap items-end gap-2">
            <input type="hidden" name="intent" value="countersign" />
            <label className="flex flex-col gap-1 font-bold">
              Your password, to countersign
              <input
                name="password"
                type="password"
                autoComplete="current-password"
                className="field-input font-normal"
              />
            </label>
            <button className="btn btn-primary" type="submit" disabled={busy}>
              Countersign and lock
            </button>
          </Form>
          <p className="text-sm text-ink-soft">
            Countersigning stores your name, the time and the SHA-256 digest of everything recorded here, and
            locks the checklist. A later correction is an amendment.
          </p>
        </section>
      )}
    </>
  );
}
