import { getFormProps, getTextareaProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { Form, Link } from "react-router";
import { issueRecordSchema } from "~/lib/validation/records";
import { ConfirmAction } from "./confirm-action.tsx";
import { Field, FormErrors } from "./field.tsx";
import { LocalTime } from "./local-time.tsx";

/** Issuing the job's record to surveyors, once every checklist is countersigned. */
export function IssueRecord({
  readiness,
  records,
  canIssue,
  lastResult,
  issued,
}: {
  readiness: { ready: boolean; open: string[]; count: number };
  records: { id: string; issued_at: string | Date; digest: string }[];
  canIssue: boolean;
  lastResult?: SubmissionResult<string[]> | null;
  issued?: string | null;
}) {
  const [form, fields] = useForm({
    id: "issue-record",
    lastResult,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: issueRecordSchema }),
    shouldValidate: "onSubmit",
  });
  return (
    <section className="card mb-6" aria-labelledby="record-title">
      <h2 id="record-title" className="mb-3 text-xl font-bold">
        Commissioning record
      </h2>
      {records.length > 0 && (
        <ul className="mb-3 flex flex-col gap-1" data-testid="records">
          {records.map((r) => (
            <li key={r.id}>
              <Link to={`/records/${r.id}`} className="font-bold text-harbour underline">
                Issued <LocalTime at={r.issued_at} style="medium" />
              </Link>{" "}
              <span className="font-mono text-sm">{r.digest.slice(0, 16)}…</span>
            </li>
          ))}
        </ul>
      )}
      {issued && (
        <p role="status" className="mb-3 font-bold">
          {issued}
        </p>
      )}
      {!readiness.ready ? (
        <p>
          {records.length > 0 && "The records above stay as issued. "}
          {readiness.count
            ? `A${records.length ? " new" : ""} record can be issued once every checklist is countersigned. Still open: ${readiness.open.join(", ")}.`
            : "Start the job's checklists first."}
        </p>
      ) : canIssue ? (
        <Form method="post" {...getFormProps(form)} className="flex flex-col gap-2">
          {records.length === 0 && <input type="hidden" name="intent" value="issue-record" />}
          <FormErrors errors={form.errors} />
          <Field
            id={fields.emails.id}
            label="Surveyors' e-mail addresses"
            hint="One per line, with the name for someone new: Nessa Quick <nessa.quick@survey.example>. Each gets a link to the record and its PDF; someone new gets an account limited to the records issued to them."
            errors={[...new Set(Object.values(fields.emails.allErrors).flat())]}
          >
            <textarea {...getTextareaProps(fields.emails)} rows={2} className="field-input" />
          </Field>
          <div>
            {records.length === 0 ? (
              <button className="btn btn-primary" type="submit">
                Issue the record
              </button>
            ) : (
              <ConfirmAction
                label="Issue the record again"
                yes="issue a new record"
                value="issue-record"
                testId="issue-again"
                consequence="This job's record has been issued before. Issuing again makes a new record with its own digest and e-mails it; the earlier record stays valid and its surveyors keep it."
              />
            )}
          </div>
        </Form>
      ) : (
        <p>Every checklist is countersigned; the manager or the job's lead issues the record.</p>
      )}
    </section>
  );
}
