import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, useNavigation } from "react-router";
import type { Route } from "./+types/account";
import { PageHeader } from "~/components/app-shell";
import { FormErrors } from "~/components/field";
import { notificationKinds, notificationLabels } from "~/lib/notifications";
import { notificationSettingsSchema } from "~/lib/validation/account";
import { requireUser } from "~/server/auth.server";
import { invariantForbidden } from "~/server/permissions.server";
import { optOutsOf, setNotifications } from "~/server/notifications.server";

export const meta: Route.MetaFunction = () => [{ title: "Account settings · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const off = await optOutsOf(user.id);
  return {
    name: user.name,
    email: user.email,
    // A surveyor is sent records, never these messages.
    kinds:
      user.role === "surveyor" ? [] : notificationKinds.map((kind) => ({ kind, on: !off.includes(kind) })),
  };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  invariantForbidden(user.role !== "surveyor", "Records issued to you are always e-mailed to you.");
  const submission = parseWithZod(await request.formData(), { schema: notificationSettingsSchema });
  if (submission.status !== "success")
    return data(
      { errors: Object.values(submission.reply().error ?? {}).flat() as string[], saved: false },
      { status: 400 },
    );
  await setNotifications(user.id, submission.value.notify, notificationKinds);
  return { errors: null, saved: true };
}

export default function Account({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state !== "idle";
  return (
    <>
      <PageHeader title="Account settings" />
      <p className="mb-6">
        Signed in as <strong>{loaderData.name}</strong> ({loaderData.email}).
      </p>
      <section className="card max-w-2xl" aria-labelledby="mail-title">
        <h2 id="mail-title" className="mb-3 text-xl font-bold">
          E-mail when something waits for me
        </h2>
        {loaderData.kinds.length === 0 ? (
          <p>Records issued to you are e-mailed to you; there is nothing else to choose.</p>
        ) : (
          <Form method="post" className="flex flex-col gap-3">
            <FormErrors errors={actionData?.errors} />
            {loaderData.kinds.map(({ kind, on }) => (
              <label
                key={kind}
                className="flex min-h-12 items-start gap-3 rounded-md border-2 border-rule p-3"
              >
                <input
                  type="checkbox"
                  name="notify"
                  value={kind}
                  defaultChecked={on}
                  className="mt-1 size-6"
                />
                <span>
                  <span className="font-bold">{notificationLabels[kind].title}</span>
                  <span className="block text-sm text-ink-soft">{notificationLabels[kind].hint}</span>
                </span>
              </label>
            ))}
            <div className="flex flex-wrap items-center gap-3">
              <button type="submit" className="btn btn-primary" disabled={busy}>
                Save
              </button>
              {actionData?.saved && !busy && (
                <p role="status" className="font-bold">
                  Saved.
                </p>
              )}
            </div>
          </Form>
        )}
      </section>
    </>
  );
}
