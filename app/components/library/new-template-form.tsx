import {
  getFormProps,
  getInputProps,
  getTextareaProps,
  useForm,
  type SubmissionResult,
} from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { Form } from "react-router";
import { z } from "zod";
import { Field, FormErrors, InputField } from "~/components/field";
import { templateSchema } from "~/lib/templates";

/** A new template's key, title and purpose, checked by the template schema's own rules. */
export const newTemplateSchema = z.object({
  intent: z.literal("create-template"),
  key: z.string({ error: "Give the template a key." }).pipe(templateSchema.shape.key),
  title: z.string({ error: "Give the template a title." }).pipe(templateSchema.shape.title),
  purpose: z.string({ error: "Say what the checklist is for." }).pipe(templateSchema.shape.purpose),
});

export function NewTemplateForm({ lastResult }: { lastResult?: SubmissionResult<string[]> | null }) {
  const [form, fields] = useForm({
    lastResult,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: newTemplateSchema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  return (
    <Form method="post" {...getFormProps(form)} className="grid gap-4 md:grid-cols-2">
      <input type="hidden" name="intent" value="create-template" />
      <div className="md:col-span-2">
        <FormErrors errors={form.errors} />
      </div>
      <InputField meta={fields.title} label="Title" />
      <Field
        id={fields.key.id}
        label="Key"
        hint="Lower-case words joined by hyphens, like stern-gland. It never changes."
        errors={fields.key.errors}
      >
        <input
          {...getInputProps(fields.key, { type: "text" })}
          className="field-input font-mono"
          autoCapitalize="none"
          spellCheck={false}
        />
      </Field>
      <div className="md:col-span-2">
        <Field
          id={fields.purpose.id}
          label="Purpose"
          hint="What the checklist is for and when it is used."
          errors={fields.purpose.errors}
        >
          <textarea {...getTextareaProps(fields.purpose)} rows={2} className="field-input" />
        </Field>
      </div>
      <div className="md:col-span-2">
        <button type="submit" className="btn btn-primary">
          Create the draft
        </button>
      </div>
    </Form>
  );
}
