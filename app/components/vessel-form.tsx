import {
  getFormProps,
  getInputProps,
  getSelectProps,
  getTextareaProps,
  useForm,
  type SubmissionResult,
} from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { Form } from "react-router";
import { Field, FormErrors, InputField } from "./field.tsx";
import { hullTypeLabels, hullTypes, vesselSchema, type VesselInput } from "~/lib/validation/vessels";

export function VesselForm({
  defaults,
  lastResult,
  submitLabel,
}: {
  defaults?: Partial<VesselInput>;
  lastResult?: SubmissionResult<string[]> | null;
  submitLabel: string;
}) {
  const [form, fields] = useForm({
    lastResult,
    defaultValue: {
      lengthUnit: "ft",
      hullType: "planing",
      ...defaults,
      lengthValue: defaults?.lengthValue?.toString(),
    },
    onValidate: ({ formData }) => parseWithZod(formData, { schema: vesselSchema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  return (
    <Form method="post" {...getFormProps(form)} className="card grid gap-4 md:grid-cols-2">
      <div className="md:col-span-2">
        <FormErrors errors={form.errors} />
      </div>
      <InputField meta={fields.name} label="Vessel name" />
      <Field
        id={fields.hin.id}
        label="Hull identification number (HIN)"
        hint="12 characters, as on the transom, e.g. XKB4C017J526. Leave empty if the hull has none."
        errors={fields.hin.errors}
      >
        <input
          {...getInputProps(fields.hin, { type: "text" })}
          className="field-input font-mono uppercase"
          autoCapitalize="characters"
          spellCheck={false}
        />
      </Field>
      <div className="grid grid-cols-[1fr_auto] gap-2">
        <Field id={fields.lengthValue.id} label="Length overall" errors={fields.lengthValue.errors}>
          <input
            {...getInputProps(fields.lengthValue, { type: "text" })}
            inputMode="decimal"
            className="field-input"
          />
        </Field>
        <Field id={fields.lengthUnit.id} label="Unit" errors={fields.lengthUnit.errors}>
          <select {...getSelectProps(fields.lengthUnit)} className="field-input">
            <option value="ft">ft</option>
            <option value="m">m</option>
          </select>
        </Field>
      </div>
      <Field id={fields.hullType.id} label="Hull type" errors={fields.hullType.errors}>
        <select {...getSelectProps(fields.hullType)} className="field-input">
          {hullTypes.map((h) => (
            <option key={h} value={h}>
              {hullTypeLabels[h]}
            </option>
          ))}
        </select>
      </Field>
      <InputField meta={fields.ownerName} label="Owner" />
      <InputField meta={fields.ownerEmail} type="email" label="Owner's e-mail" />
      <InputField meta={fields.ownerPhone} type="tel" label="Owner's phone" />
      <div className="md:col-span-2">
        <Field
          id={fields.waterlineNotes.id}
          label="Waterline notes"
          hint="Marks, trim, how she sits loaded — what the exhaust and alignment work must know."
          errors={fields.waterlineNotes.errors}
        >
          <textarea {...getTextareaProps(fields.waterlineNotes)} rows={3} className="field-input" />
        </Field>
      </div>
      <div className="md:col-span-2">
        <button type="submit" className="btn btn-primary">
          {submitLabel}
        </button>
      </div>
    </Form>
  );
}
