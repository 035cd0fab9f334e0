import { getFormProps, getInputProps, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, redirect } from "react-router";
import type { Route } from "./+types/invitation";
import { Field, FormErrors } from "~/components/field";
import { newPasswordSchema } from "~/lib/validation/people";
import { roleLabels } from "~/lib/roles";
import { startSession } from "~/server/auth.server";
import { env } from "~/server/env.server";
import { strongPasswordSchema } from "~/server/password-strength.server";
import { recordsIssuedTo } from "~/server/records.server";
import { acceptInvitation, lookUpInvitation, type InvitationState } from "~/server/users.server";

export const meta: Route.MetaFunction = () => [{ title: "Set your password · Sternpost" }];

const refusals: Record<Exclude<InvitationState["state"], "valid">, string> = {
  expired: "This invitation has expired. Ask your shop manager to send a new one.",
  used: "This invitation has already been used. Sign in with the password you chose.",
  unknown: "This invitation link is not valid. Check that the whole link was copied.",
  deactivated: "This account has been deactivated. Ask your shop manager.",
};

export async function loader({ params }: Route.LoaderArgs) {
  const invitation = await lookUpInvitation(params.token);
  if (invitation.state !== "valid") return { refusal: refusals[invitation.state] } as const;
  const { user } = invitation;
  const [record] = user.role === "surveyor" ? await recordsIssuedTo(user.id) : [];
  return {
    refusal: null,
    name: user.name,
    email: user.email,
    yardName: env().YARD_NAME,
    role: roleLabels[user.role].toLowerCase(),
    record: record && { vesselName: record.vessel_name, engineModel: record.engine_model },
  };
}

// A refused form never carries the typed password back to the page.
const hideFields = ["password", "confirm"];

export async function action({ request, params }: Route.ActionArgs) {
  const invitation = await lookUpInvitation(params.token);
  const knownAbout = invitation.state === "valid" ? [invitation.user.email, invitation.user.name] : [];
  const submission = parseWithZod(await request.formData(), {
    schema: await strongPasswordSchema(knownAbout),
  });
  if (submission.status !== "success") return data(submission.reply({ hideFields }), { status: 400 });
  const outcome = await acceptInvitation(params.token, submission.value.password);
  if (outcome.state !== "valid")
    return data(submission.reply({ formErrors: [refusals[outcome.state]], hideFields }), { status: 400 });
  // Signed in at once (a new session), and straight to what they were invited for.
  const [record] = outcome.user.role === "surveyor" ? await recordsIssuedTo(outcome.user.id) : [];
  return redirect(record ? `/records/${record.id}` : "/", {
    headers: { "Set-Cookie": await startSession(request, outcome.user.id) },
  });
}

export default function Invitation({ loaderData, actionData }: Route.ComponentProps) {
  const [form, fields] = useForm({
    lastResult: actionData,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: newPasswordSchema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 p-6">
      <h1 className="text-3xl font-bold">
        {loaderData.refusal ? "Welcome to Sternpost" : `Welcome, ${loaderData.name}`}
      </h1>
      {loaderData.refusal ? (
        <div className="card">
          <FormErrors errors={[loaderData.refusal]} />
          <a className="btn mt-4" href="/login">
            Go to sign in
          </a>
        </div>
      ) : (
        <Form method="post" {...getFormProps(form)} className="card flex flex-col gap-4">
          <p data-testid="invitation-why">
            {loaderData.record ? (
              <>
                {loaderData.yardName} has issued you the commissioning record of{" "}
                <strong>{loaderData.record.vesselName}</strong> ({loaderData.record.engineModel}). Your
                Sternpost account shows you the records issued to you, and nothing else.
              </>
            ) : (
              <>
                {loaderData.yardName} has invited you to Sternpost as a {loaderData.role}.
              </>
            )}
          </p>
          <p>
            Choose a password for <strong>{loaderData.email}</strong>
            {loaderData.record ? "; the record opens next." : "."}
          </p>
          <FormErrors errors={form.errors} />
          <Field
            id={fields.password.id}
            label="New password"
            hint="At least 10 characters and hard to guess: three or four unrelated words work well."
            errors={fields.password.errors}
          >
            <input
              {...getInputProps(fields.password, { type: "password" })}
              autoComplete="new-password"
              className="field-input"
            />
          </Field>
          <Field id={fields.confirm.id} label="Type it again" errors={fields.confirm.errors}>
            <input
              {...getInputProps(fields.confirm, { type: "password" })}
              autoComplete="new-password"
              className="field-input"
            />
          </Field>
          <button className="btn btn-primary" type="submit">
            Set password
          </button>
        </Form>
      )}
    </main>
  );
}
