import { data, Form, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/login";
import { Field, FormErrors } from "~/components/field";
import { currentUser, LoginError, signIn } from "~/server/auth.server";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Sternpost" }];

/** Only same-site paths, so a crafted link cannot bounce a signed-in person elsewhere. */
function safeRedirect(to: unknown) {
  return typeof to === "string" && to.startsWith("/") && !to.startsWith("//") ? to : "/";
}

export async function loader({ request }: Route.LoaderArgs) {
  if (await currentUser(request)) throw redirect("/");
  return { redirectTo: safeRedirect(new URL(request.url).searchParams.get("redirectTo")) };
}

export async function action({ request, context }: Route.ActionArgs) {
  const form = await request.clone().formData();
  try {
    const cookie = await signIn(request, context.clientAddress ?? "unknown");
    return redirect(safeRedirect(form.get("redirectTo")), { headers: { "Set-Cookie": cookie } });
  } catch (error) {
    if (error instanceof LoginError) {
      return data({ error: error.message, email: String(form.get("email") ?? "") }, { status: 400 });
    }
    throw error;
  }
}

export default function Login({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state !== "idle";
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 p-6">
      <div className="flex items-center gap-3">
        <img src="/icon.svg" alt="" width={48} height={48} />
        <div>
          <h1 className="text-3xl font-bold">Sternpost</h1>
          <p className="text-ink-soft">Engine installation records for the yard</p>
        </div>
      </div>
      <Form method="post" className="card flex flex-col gap-4">
        <h2 className="text-xl font-bold">Sign in</h2>
        <FormErrors errors={actionData?.error ? [actionData.error] : null} />
        <input type="hidden" name="redirectTo" value={loaderData.redirectTo} />
        <Field id="email" label="E-mail address">
          <input
            id="email"
            name="email"
            type="email"
            autoComplete="username"
            required
            className="field-input"
            defaultValue={actionData?.email}
          />
        </Field>
        <Field id="password" label="Password">
          <input
            id="password"
            name="password"
            type="password"
            autoComplete="current-password"
            required
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
