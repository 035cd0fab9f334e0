import { getFormProps, getInputProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/login";
import { Field, FormErrors } from "~/components/field";
import { safeRedirect } from "~/lib/safe-redirect";
import { loginSchema } from "~/lib/validation/people";
import { currentUser, LoginError, signIn } from "~/server/auth.server";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  if (await currentUser(request)) throw redirect("/");
  return { redirectTo: safeRedirect(new URL(request.url).searchParams.get("redirectTo")) };
}

export async function action({ request, context }: Route.ActionArgs) {
  try {
    // The FormStrategy reads a copy of the form, so the body is still readable here for redirectTo.
    const cookie = await signIn(request, context.clientAddress ?? "unknown");
    const form = await request.formData();
    return redirect(safeRedirect(form.get("redirectTo")), { headers: { "Set-Cookie": cookie } });
  } catch (error) {
    if (error instanceof LoginError) return data(error.reply, { status: error.status });
    throw error;
  }
}

export default function Login({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state !== "idle";
  const [form, fields] = useForm({
    lastResult: actionData,
    constraint: getZodConstraint(loginSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: loginSchema }),
    shouldValidate: "onSubmit",
  });
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 p-6">
      <div className="flex items-center gap-3">
        <img src="/icon.svg" alt="" width={48} height={48} />
        <div>
          <h1 className="text-3xl font-bold">Sternpost</h1>
          <p className="text-ink-soft">Engine installation records for the yard</p>
        </div>
      </div>
      <Form method="post" {...getFormProps(form)} className="card flex flex-col gap-4">
        <h2 className="text-xl font-bold">Sign in</h2>
        <FormErrors errors={form.errors} />
        <input type="hidden" name="redirectTo" value={loaderData.redirectTo} />
        <Field id={fields.email.id} label="E-mail address" errors={fields.email.errors}>
          <input
            {...getInputProps(fields.email, { type: "email" })}
            autoComplete="username"
            className="field-input"
          />
        </Field>
        <Field id={fields.password.id} label="Password" errors={fields.password.errors}>
          <input
            {...getInputProps(fields.password, { type: "password" })}
            autoComplete="current-password"
            className="field-input"
          />
        </Field>
        <button type="submit" className="btn btn-primary" disabled={busy}>
          {busy ? "Signing in…" : "Sign in"}
        </button>
      </Form>
    </main>
  );
}
