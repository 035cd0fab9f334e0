import { getFormProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { Form, Link } from "react-router";
import { checklistStateLabels } from "~/lib/checklist-sets";
import { jobPageActionSchema } from "~/lib/validation/job-page";
import { FormErrors } from "./field.tsx";

interface Summary {
  id: string;
  key: string;
  title: string;
  version: number;
  state: keyof typeof checklistStateLabels;
  newerVersion: number | null;
  amends: string | null;
  amendedBy: string | null;
}

/** The job's checklists, and for its lead or the manager the form that starts more. */
export function JobChecklists({
  checklists,
  available,
  defaults,
  canStart,
  canReview,
  lastResult,
}: {
  checklists: Summary[];
  available: { key: string; title: string; version: number }[];
  defaults: string[];
  canStart: boolean;
  canReview: boolean;
  /** The answer to starting checklists or an amendment: its errors show above the list's form. */
  lastResult?: SubmissionResult<string[]> | null;
}) {
  const [form, fields] = useForm({
    id: "job-checklists",
    lastResult,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: jobPageActionSchema }),
    shouldValidate: "onSubmit",
  });
  const errors = [...(form.errors ?? []), ...(fields.templates.errors ?? [])];
  const startable = available.filter((a) => !checklists.some((c) => c.key === a.key));
  return (
    <section className="card mb-6" aria-labelledby="checklists-title">
      <h2 id="checklists-title" className="mb-3 text-xl font-bold">
        Checklists
      </h2>
      {checklists.length === 0 && <p className="mb-3">No checklists started on this job yet.</p>}
      {(!canStart || startable.length === 0) && <FormErrors errors={errors} />}
      <ul className="mb-4 flex flex-col gap-2" data-testid="job-checklists">
        {checklists.map((c) => (
          <li
            key={c.id}
            className="flex flex-wrap items-center justify-between gap-2 border-b border-rule py-2"
          >
            <Link
              to={`/checklists/${c.id}`}
              className="flex min-h-12 items-center text-lg font-bold text-harbour underline"
            >
              {c.title}
            </Link>
            <span className="flex flex-wrap items-center gap-3">
              {canReview && c.state === "submitted" && (
                <Link to={`/checklists/${c.id}/review`} className="btn btn-primary">
                  Review
                </Link>
              )}
              {canStart && c.state === "countersigned" && !c.amendedBy && (
                <Form method="post">
                  <input type="hidden" name="intent" value="amend" />
                  <input type="hidden" name="checklistId" value={c.id} />
                  <button className="btn" type="submit">
                    Correct it (amendment)
                  </button>
                </Form>
              )}
              {c.amends && <span className="text-sm">Amendment</span>}
              {c.amendedBy && <span className="text-sm">Corrected by an amendment</span>}
              <span>Version {c.version}</span>
              {c.newerVersion && (
                <span className="font-bold text-brass">Version {c.newerVersion} published since</span>
              )}
              <span>{checklistStateLabels[c.state]}</span>
            </span>
          </li>
        ))}
      </ul>
      {canStart && startable.length > 0 && (
        <Form method="post" {...getFormProps(form)} className="flex flex-col gap-3">
          <input type="hidden" name="intent" value="start-checklists" />
          <FormErrors errors={errors} />
          <fieldset>
            <legend className="mb-2 font-bold">Start checklists from the current library</legend>
            <div className="flex flex-wrap gap-2">
              {startable.map((t) => (
                <label
                  key={t.key}
                  className="flex min-h-12 items-center gap-2 rounded-md border-2 border-rule px-3"
                >
                  <input
                    type="checkbox"
                    name="templates"
                    value={t.key}
                    defaultChecked={defaults.includes(t.key)}
                    className="size-6"
                  />
                  {t.title} <span className="text-sm text-ink-soft">v{t.version}</span>
                </label>
              ))}
            </div>
          </fieldset>
          <div>
            <button className="btn btn-primary" type="submit">
              Start the ticked checklists
            </button>
          </div>
        </Form>
      )}
    </section>
  );
}
