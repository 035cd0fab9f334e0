import { getFormProps, getInputProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { Form, Link } from "react-router";
import { checklistStateLabels } from "~/lib/checklist-sets";
import { jobPageActionSchema } from "~/lib/validation/job-page";
import type { SealOutcome } from "~/lib/validation/review";
import { ConfirmAction } from "./confirm-action.tsx";
import { Field, FormErrors } from "./field.tsx";

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
  countersignResult,
  sealed,
}: {
  checklists: Summary[];
  available: { key: string; title: string; version: number }[];
  defaults: string[];
  canStart: boolean;
  canReview: boolean;
  /** The answer to starting checklists or an amendment: its errors show above the list's form. */
  lastResult?: SubmissionResult<string[]> | null;
  /** The answer to countersigning several at once, and what became of each. */
  countersignResult?: SubmissionResult<string[]> | null;
  sealed?: SealOutcome[] | null;
}) {
  const [form, fields] = useForm({
    id: "job-checklists",
    lastResult,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: jobPageActionSchema }),
    shouldValidate: "onSubmit",
  });
  const errors = [...(form.errors ?? []), ...(fields.templates.errors ?? [])];
  const startable = available.filter((a) => !checklists.some((c) => c.key === a.key));
  const waiting = canReview ? checklists.filter((c) => c.state === "submitted") : [];
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
              {canReview && c.state === "submitted" && (
                <label className="flex min-h-12 items-center gap-2 rounded-md border-2 border-rule px-3">
                  <input
                    type="checkbox"
                    name="checklistIds"
                    value={c.id}
                    form="countersign-several"
                    defaultChecked
                    className="size-6"
                  />
                  Countersign
                </label>
              )}
              {canStart && c.state === "countersigned" && !c.amendedBy && (
                <Form method="post">
                  <input type="hidden" name="checklistId" value={c.id} />
                  <ConfirmAction
                    label="Correct it (amendment)"
                    yes="open an amendment"
                    value="amend"
                    consequence="A new checklist, filled with this one's values, opens for the correction. This countersigned checklist stays exactly as signed; the amendment is reviewed and countersigned in its turn. Opened by mistake, it can be discarded while nothing is entered in it."
                  />
                </Form>
              )}
              {canStart && c.amends && c.state === "in-progress" && (
                <Form method="post">
                  <input type="hidden" name="checklistId" value={c.id} />
                  <ConfirmAction
                    label="Discard this amendment"
                    yes="discard it"
                    value="discard-amendment"
                    danger
                    consequence="The amendment is removed and the countersigned checklist stays as the job's. Once anything is entered in the amendment it is kept."
                  />
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
      {sealed && sealed.length > 0 && <SealOutcomes outcomes={sealed} />}
      {waiting.length > 0 && <CountersignSeveral count={waiting.length} lastResult={countersignResult} />}
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

/** What became of each checklist countersigned together: signed with its digest, or why not. */
function SealOutcomes({ outcomes }: { outcomes: SealOutcome[] }) {
  return (
    <ul role="status" className="mb-4 flex flex-col gap-2" data-testid="seal-outcomes">
      {outcomes.map((o) =>
        "digest" in o ? (
          <li key={o.checklistId} className="rounded-md border-2 border-sound bg-sound-light p-2">
            <strong>✓ Countersigned: {o.title}</strong>{" "}
            <span className="font-mono text-sm">{o.digest.slice(0, 16)}…</span>
          </li>
        ) : (
          <li key={o.checklistId} className="rounded-md border-2 border-fault bg-fault-light p-2">
            <strong>▲ Not countersigned: {o.title}.</strong> {o.refused}
          </li>
        ),
      )}
    </ul>
  );
}

/**
 * One password entry for the submitted checklists ticked above (their boxes belong to this form
 * through the form attribute, so it works before the scripts load).
 */
function CountersignSeveral({
  count,
  lastResult,
}: {
  count: number;
  lastResult?: SubmissionResult<string[]> | null;
}) {
  const [form, fields] = useForm({
    id: "countersign-several",
    lastResult,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: jobPageActionSchema }),
    shouldValidate: "onSubmit",
  });
  return (
    <Form
      method="post"
      {...getFormProps(form)}
      className="mb-4 flex flex-col gap-2 rounded-md border-2 border-harbour p-3"
      aria-labelledby="countersign-several-title"
    >
      <h3 id="countersign-several-title" className="text-lg font-bold">
        Countersign {count === 1 ? "the checklist" : `the ${count} checklists`} waiting for you
      </h3>
      <p className="text-sm text-ink-soft">
        Review each first. Every ticked checklist gets its own signature, digest and lock; one that cannot be
        signed yet is named with the reason, and the others are still signed.
      </p>
      <input type="hidden" name="intent" value="countersign-several" />
      <FormErrors errors={[...(form.errors ?? []), ...(fields.checklistIds.errors ?? [])]} />
      <div className="flex flex-wrap items-end gap-2">
        <Field id={fields.password.id} label="Your password, to countersign" errors={fields.password.errors}>
          <input
            {...getInputProps(fields.password, { type: "password" })}
            autoComplete="current-password"
            className="field-input font-normal"
          />
        </Field>
        <button className="btn btn-primary" type="submit">
          Countersign the ticked checklists
        </button>
      </div>
    </Form>
  );
}
