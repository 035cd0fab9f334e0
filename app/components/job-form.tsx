import {
  getCollectionProps,
  getFormProps,
  getInputProps,
  getSelectProps,
  useForm,
  type SubmissionResult,
} from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { Form } from "react-router";
import { Field, FormErrors } from "./field.tsx";
import {
  jobSchema,
  jobScopeLabels,
  jobScopes,
  jobStatusLabels,
  jobStatuses,
  shaftSystemLabels,
  shaftSystems,
  systemVoltages,
  type JobInput,
} from "~/lib/validation/jobs";

interface Option {
  id: number;
  name: string;
}

type Defaults = Partial<Omit<JobInput, "startDate" | "dueDate">> & {
  startDate?: string | null;
  dueDate?: string | null;
};

export function JobForm({
  defaults,
  lastResult,
  vessels,
  leads,
  technicians,
  leadFixed,
  submitLabel,
}: {
  defaults?: Defaults;
  lastResult?: SubmissionResult<string[]> | null;
  vessels: Option[];
  leads: Option[];
  technicians: Option[];
  /** A lead creating a job leads it. */
  leadFixed?: Option;
  submitLabel: string;
}) {
  const [form, fields] = useForm({
    lastResult,
    defaultValue: {
      scope: "repower",
      status: "planned",
      propBlades: "3",
      shaftSystem: "inch",
      systemVolts: "12",
      ...Object.fromEntries(
        Object.entries(defaults ?? {}).map(([k, v]) => [
          k,
          Array.isArray(v) ? v.map(String) : v == null ? undefined : String(v),
        ]),
      ),
      ...(leadFixed ? { leadId: String(leadFixed.id) } : {}),
    },
    onValidate: ({ formData }) => parseWithZod(formData, { schema: jobSchema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  const numeric = (name: keyof typeof fields, label: string, unit: string, hint?: string) => {
    const meta = fields[name];
    return (
      <Field id={meta.id} label={`${label} (${unit})`} hint={hint} errors={meta.errors}>
        <input {...getInputProps(meta, { type: "text" })} inputMode="decimal" className="field-input num" />
      </Field>
    );
  };
  const text = (name: keyof typeof fields, label: string) => {
    const meta = fields[name];
    return (
      <Field id={meta.id} label={label} errors={meta.errors}>
        <input {...getInputProps(meta, { type: "text" })} className="field-input" />
      </Field>
    );
  };
  return (
    <Form method="post" {...getFormProps(form)} className="flex flex-col gap-6">
      <FormErrors errors={form.errors} />
      <fieldset className="card grid gap-4 md:grid-cols-3">
        <legend className="px-1 text-xl font-bold">The work</legend>
        <Field id={fields.vesselId.id} label="Vessel" errors={fields.vesselId.errors}>
          <select {...getSelectProps(fields.vesselId)} className="field-input">
            <option value="">Choose…</option>
            {vessels.map((v) => (
              <option key={v.id} value={v.id}>
                {v.name}
              </option>
            ))}
          </select>
        </Field>
        <Field id={fields.scope.id} label="Scope" errors={fields.scope.errors}>
          <select {...getSelectProps(fields.scope)} className="field-input">
            {jobScopes.map((s) => (
              <option key={s} value={s}>
                {jobScopeLabels[s]}
              </option>
            ))}
          </select>
        </Field>
        <Field id={fields.status.id} label="Status" errors={fields.status.errors}>
          <select {...getSelectProps(fields.status)} className="field-input">
            {jobStatuses.map((s) => (
              <option key={s} value={s}>
                {jobStatusLabels[s]}
              </option>
            ))}
          </select>
        </Field>
        <Field id={fields.startDate.id} label="Start" errors={fields.startDate.errors}>
          <input {...getInputProps(fields.startDate, { type: "date" })} className="field-input" />
        </Field>
        <Field id={fields.dueDate.id} label="Due" errors={fields.dueDate.errors}>
          <input {...getInputProps(fields.dueDate, { type: "date" })} className="field-input" />
        </Field>
      </fieldset>
      <fieldset className="card grid gap-4 md:grid-cols-3">
        <legend className="px-1 text-xl font-bold">Installed equipment</legend>
        {text("engineModel", "Engine model")}
        {text("engineSerial", "Engine serial number")}
        {numeric("ratedPowerHp", "Rated power", "hp")}
        {numeric("ratedRpmMin", "Rated rpm, lowest", "rpm", "The engine maker's full-load rpm band.")}
        {numeric("ratedRpmMax", "Rated rpm, highest", "rpm")}
        {numeric("gearRatio", "Gear ratio", ": 1", "Enter 2.0 for a 2:1 reduction.")}
        {numeric("propDiameterIn", "Propeller diameter", "in")}
        {numeric("propPitchIn", "Propeller pitch", "in")}
        {numeric("propBlades", "Propeller blades", "count")}
        <Field
          id={fields.shaftSystem.id}
          label="Shaft system"
          hint="Decides the key, taper and nut tables the checklists use."
          errors={fields.shaftSystem.errors}
        >
          <select {...getSelectProps(fields.shaftSystem)} className="field-input">
            {shaftSystems.map((s) => (
              <option key={s} value={s}>
                {shaftSystemLabels[s]}
              </option>
            ))}
          </select>
        </Field>
        {numeric("shaftDiameterIn", "Shaft diameter", "in", "For an inch shaft.")}
        {numeric("shaftDiameterMm", "Metric shaft diameter", "mm", "For a metric shaft, instead of inches.")}
        {text("shaftMaterial", "Shaft material")}
        {text("couplingType", "Coupling type")}
        <Field id={fields.systemVolts.id} label="DC system voltage" errors={fields.systemVolts.errors}>
          <select {...getSelectProps(fields.systemVolts)} className="field-input">
            {systemVoltages.map((v) => (
              <option key={v} value={v}>
                {v} V
              </option>
            ))}
          </select>
        </Field>
      </fieldset>
      <fieldset className="card grid gap-4 md:grid-cols-2">
        <legend className="px-1 text-xl font-bold">People</legend>
        {leadFixed ? (
          <div>
            <input type="hidden" name={fields.leadId.name} value={leadFixed.id} />
            <p className="font-bold">Lead</p>
            <p>{leadFixed.name} (you)</p>
          </div>
        ) : (
          <Field id={fields.leadId.id} label="Lead" errors={fields.leadId.errors}>
            <select {...getSelectProps(fields.leadId)} className="field-input">
              <option value="">Choose…</option>
              {leads.map((l) => (
                <option key={l.id} value={l.id}>
                  {l.name}
                </option>
              ))}
            </select>
          </Field>
        )}
        <fieldset>
          <legend className="font-bold">Technicians</legend>
          {fields.technicianIds.errors && (
            <p className="font-bold text-fault">{fields.technicianIds.errors.join(" ")}</p>
          )}
          <div className="mt-1 flex flex-wrap gap-2">
            {getCollectionProps(fields.technicianIds, {
              type: "checkbox",
              options: technicians.map((t) => String(t.id)),
            }).map((props) => (
              <label
                key={props.key}
                className="flex min-h-12 items-center gap-2 rounded-md border-2 border-rule px-3"
              >
                <input {...props} key={props.key} className="size-6" />
                {technicians.find((t) => String(t.id) === props.value)?.name}
              </label>
            ))}
          </div>
        </fieldset>
      </fieldset>
      <div>
        <button type="submit" className="btn btn-primary">
          {submitLabel}
        </button>
      </div>
    </Form>
  );
}
