import {
  getFormProps,
  getInputProps,
  getTextareaProps,
  useForm,
  type SubmissionResult,
} from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { useEffect, useState } from "react";
import { Form } from "react-router";
import { z } from "zod";
import { Field, FormErrors } from "~/components/field";
import { parseTemplateText, type TemplateProblem } from "~/lib/templates";

export const importSchema = z
  .object({
    file: z.instanceof(File).optional(),
    text: z.string().optional(),
    renumber: z.boolean().optional(),
    replaceDraft: z.boolean().optional(),
  })
  .refine((v) => v.file || v.text?.trim(), {
    message: "Choose a template file or paste its text.",
    path: ["file"],
  });

/** Every problem of a template file with the path of its field, as the seed reports them. */
export function ProblemList({ problems, title }: { problems: TemplateProblem[]; title: string }) {
  return (
    <div
      role="alert"
      className="rounded-md border-2 border-fault bg-fault-light p-3"
      data-testid="import-problems"
    >
      <p className="font-bold text-fault">
        <span aria-hidden="true">▲ </span>
        {title}
      </p>
      <ol className="mt-2 flex list-decimal flex-col gap-1 pl-6">
        {problems.map((p, i) => (
          <li key={i}>
            {p.path && <code className="rounded bg-card px-1 font-mono text-sm">{p.path}</code>} {p.message}
          </li>
        ))}
      </ol>
    </div>
  );
}

type Check = { name: string; problems: TemplateProblem[]; summary?: string } | null;

function checkText(name: string, text: string): Check {
  const parsed = parseTemplateText(text);
  if (!parsed.ok) return { name, problems: parsed.problems };
  const t = parsed.template;
  return {
    name,
    problems: [],
    summary: `${t.title} (${t.key}), version ${t.version}: ${t.sections.length} sections, ${t.sections.reduce((n, s) => n + s.items.length, 0)} items`,
  };
}

export function ImportForm({
  lastResult,
  problems,
}: {
  lastResult?: SubmissionResult<string[]> | null;
  problems?: TemplateProblem[] | null;
}) {
  const [form, fields] = useForm({
    lastResult,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: importSchema }),
    shouldValidate: "onSubmit",
  });
  // The browser reads the file with the same schema before it is sent; the server checks it again.
  const [check, setCheck] = useState<Check>(null);
  // Once the server has answered, its list is the one to read.
  useEffect(() => {
    if (problems?.length) setCheck(null);
  }, [problems]);
  return (
    <Form
      method="post"
      encType="multipart/form-data"
      {...getFormProps(form)}
      className="card flex flex-col gap-4"
    >
      <FormErrors errors={form.errors} />
      {problems?.length ? (
        <ProblemList problems={problems} title="Nothing was imported. Fix these in the file and try again:" />
      ) : null}
      <Field
        id={fields.file.id}
        label="Template file"
        hint="A .json file in the format of checklists/, as the library exports it."
        errors={fields.file.errors}
      >
        <input
          {...getInputProps(fields.file, { type: "file" })}
          accept="application/json,.json"
          className="field-input"
          onChange={async (e) => {
            const file = e.currentTarget.files?.[0];
            setCheck(file ? checkText(file.name, await file.text()) : null);
          }}
        />
      </Field>
      <Field id={fields.text.id} label="…or paste the file's text" errors={fields.text.errors}>
        <textarea
          {...getTextareaProps(fields.text)}
          rows={6}
          className="field-input font-mono text-sm"
          spellCheck={false}
          onChange={(e) =>
            setCheck(
              e.currentTarget.value.trim() ? checkText("The pasted text", e.currentTarget.value) : null,
            )
          }
        />
      </Field>
      {check &&
        (check.problems.length ? (
          <ProblemList problems={check.problems} title={`${check.name} does not load as a template:`} />
        ) : (
          <p className="rounded-md border-2 border-sound bg-sound-light p-3" role="status">
            <span aria-hidden="true">✓ </span>
            {check.name} loads: {check.summary}.
          </p>
        ))}
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 font-bold">If that version is taken</legend>
        <label className="flex min-h-12 items-center gap-3">
          <input {...getInputProps(fields.renumber, { type: "checkbox" })} className="size-6" />
          Take the next version number of the template, whatever the file says
        </label>
        <label className="flex min-h-12 items-center gap-3">
          <input {...getInputProps(fields.replaceDraft, { type: "checkbox" })} className="size-6" />
          Replace the template's draft, if it has one
        </label>
      </fieldset>
      <p className="text-sm text-ink-soft">
        An import always becomes a draft; a published version is never overwritten. Review it and publish it
        from its page.
      </p>
      <div>
        <button type="submit" className="btn btn-primary">
          Import as a draft
        </button>
      </div>
    </Form>
  );
}
