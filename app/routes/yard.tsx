import { getFormProps, getSelectProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form } from "react-router";
import type { Route } from "./+types/yard";
import { PageHeader } from "~/components/app-shell";
import { Field, FormErrors, InputField } from "~/components/field";
import { LocalTime } from "~/components/local-time";
import { timeZoneNames, yardSchema } from "~/lib/validation/yard";
import { requireCapability } from "~/server/permissions.server";
import { saveYardSettings, yardSettings } from "~/server/yard.server";

export const meta: Route.MetaFunction = () => [{ title: "Yard settings · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireCapability(request, "users:manage");
  return { yard: await yardSettings(), zones: timeZoneNames(), now: new Date().toISOString() };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireCapability(request, "users:manage");
  const submission = parseWithZod(await request.formData(), { schema: yardSchema });
  if (submission.status !== "success")
    return data({ reply: submission.reply(), saved: false }, { status: 400 });
  await saveYardSettings(submission.value, user.id);
  return { reply: submission.reply(), saved: true };
}

export default function YardSettings({ loaderData, actionData }: Route.ComponentProps) {
  const { yard, zones, now } = loaderData;
  const [form, fields] = useForm({
    lastResult: actionData?.reply,
    defaultValue: yard,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: yardSchema }),
    shouldValidate: "onBlur",
  });
  return (
    <>
      <PageHeader title="Yard settings" />
      <Form method="post" {...getFormProps(form)} className="card grid max-w-2xl gap-4">
        <FormErrors errors={form.errors} />
        {actionData?.saved && (
          <p role="status" className="font-bold text-sound">
            ✓ Saved. Dates on every screen and in records now read in {yard.timeZone}.
          </p>
        )}
        <InputField meta={fields.name} label="Yard name" hint="Printed on commissioning records." />
        <Field
          id={fields.timeZone.id}
          label="Time zone"
          hint="Every date and time is written in the yard's zone, whatever zone a tablet or a surveyor's computer is set to."
          errors={fields.timeZone.errors}
        >
          <select {...getSelectProps(fields.timeZone)} className="field-input">
            {zones.map((zone) => (
              <option key={zone} value={zone}>
                {zone}
              </option>
            ))}
          </select>
        </Field>
        <p className="text-ink-soft" data-testid="yard-clock">
          The yard's clock now: <LocalTime at={now} style="full" />
        </p>
        <button type="submit" className="btn btn-primary justify-self-start">
          Save settings
        </button>
      </Form>
    </>
  );
}
