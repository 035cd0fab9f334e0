import {
  getFormProps,
  getInputProps,
  getSelectProps,
  useForm,
  type SubmissionResult,
} from "@conform-to/react";
import { useState } from "react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, useNavigation } from "react-router";
import type { Route } from "./+types/people";
import { PageHeader } from "~/components/app-shell";
import { ConfirmAction } from "~/components/confirm-action";
import { Field, FormErrors } from "~/components/field";
import { roleLabels, roles } from "~/lib/roles";
import { inviteSchema, userChangeSchema } from "~/lib/validation/people";
import { audit } from "~/server/audit.server";
import { env } from "~/server/env.server";
import { mailWaiting, queueAndSend } from "~/server/mail-outbox.server";
import { requireCapability } from "~/server/permissions.server";
import { endSessionsOf } from "~/server/session.server";
import { findUserById, inviteUser, InviteError, listUsers, updateUser } from "~/server/users.server";

export const meta: Route.MetaFunction = () => [{ title: "People · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  const me = await requireCapability(request, "users:manage");
  return { me: me.id, people: await listUsers(), mail: await mailWaiting() };
}

/** Says whether the mail server took the invitation (if not, the outbox tries again). */
async function sendInvitation(to: string, name: string, token: string) {
  const link = `${env().APP_URL}/invitation/${token}`;
  const { sent } = await queueAndSend([
    {
      kind: "invitation",
      to,
      subject: "You are invited to Sternpost",
      text: `Hello ${name},\n\nYou have been given an account on Sternpost, the yard's engine installation records.\nChoose your password here (the link works once, for 7 days):\n\n${link}\n`,
    },
  ]);
  return sent > 0;
}

const WAITING =
  "The mail server did not take it yet; Sternpost keeps it and sends it as soon as the server answers.";

export async function action({ request }: Route.ActionArgs) {
  const me = await requireCapability(request, "users:manage");
  const formData = await request.formData();
  if (formData.get("intent") === "invite") {
    const submission = parseWithZod(formData, { schema: inviteSchema });
    if (submission.status !== "success")
      return data({ invite: submission.reply(), notice: null }, { status: 400 });
    try {
      const { userId, token } = await inviteUser(submission.value, me.id);
      const sent = await sendInvitation(submission.value.email, submission.value.name, token);
      await audit({
        userId: me.id,
        action: "user.invited",
        entity: "user",
        entityId: userId,
        detail: { role: submission.value.role },
      });
      return {
        invite: null,
        notice: sent
          ? `Invitation sent to ${submission.value.email}.`
          : `Invitation to ${submission.value.email} kept. ${WAITING}`,
        sent: `${userId}-${Date.now()}`,
      };
    } catch (error) {
      if (error instanceof InviteError)
        return data(
          { invite: submission.reply({ fieldErrors: { [error.field]: [error.message] } }), notice: null },
          { status: 400 },
        );
      throw error;
    }
  }
  // The buttons on each person's row: the same Conform parsing as the invitation form.
  const change = parseWithZod(formData, { schema: userChangeSchema });
  if (change.status !== "success")
    return data(
      { invite: null, notice: "That change was not understood; reload the page and try again." },
      { status: 400 },
    );
  const target = await findUserById(change.value.userId);
  if (!target) return data({ invite: null, notice: "That person no longer exists." }, { status: 404 });
  if (target.id === me.id && change.value.intent !== "reinvite")
    return data(
      {
        invite: null,
        notice: "You cannot change your own role or deactivate yourself; ask another manager.",
      },
      { status: 400 },
    );
  let mailKept = false;
  switch (change.value.intent) {
    case "role":
      await updateUser(target.id, { role: change.value.role });
      await endSessionsOf(target.id);
      break;
    case "deactivate":
      await updateUser(target.id, { active: false });
      await endSessionsOf(target.id);
      break;
    case "reactivate":
      await updateUser(target.id, { active: true });
      break;
    case "reinvite": {
      const { token } = await inviteUser(
        { email: target.email, name: target.name, role: target.role },
        me.id,
      ).catch((e) => {
        if (e instanceof InviteError) throw data({ message: e.message }, { status: 400 });
        throw e;
      });
      mailKept = !(await sendInvitation(target.email, target.name, token));
      break;
    }
  }
  await audit({
    userId: me.id,
    action: `user.${change.value.intent}`,
    entity: "user",
    entityId: target.id,
    detail: change.value,
  });
  return {
    invite: null,
    notice: mailKept
      ? `${target.name}: new invitation kept. ${WAITING}`
      : `${target.name}: ${change.value.intent === "role" ? "role changed" : change.value.intent + "d"}.`,
  };
}

/**
 * The invitation form, remounted after each invitation sent (keyed on it): a fresh form with its
 * defaults, the role included, rather than Conform's reset, which left the role list blank.
 */
function InviteForm({
  lastResult,
  busy,
  onEdit,
}: {
  lastResult: SubmissionResult<string[]> | null | undefined;
  busy: boolean;
  onEdit: () => void;
}) {
  const [form, fields] = useForm({
    lastResult,
    defaultValue: { role: "technician" },
    onValidate: ({ formData }) => parseWithZod(formData, { schema: inviteSchema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  return (
    <Form
      method="post"
      {...getFormProps(form)}
      onInput={onEdit}
      className="grid gap-4 md:grid-cols-4 md:items-end"
    >
      <input type="hidden" name="intent" value="invite" />
      <FormErrors errors={form.errors} />
      <Field id={fields.name.id} label="Name" errors={fields.name.errors}>
        <input {...getInputProps(fields.name, { type: "text" })} className="field-input" />
      </Field>
      <Field id={fields.email.id} label="E-mail address" errors={fields.email.errors}>
        <input {...getInputProps(fields.email, { type: "email" })} className="field-input" />
      </Field>
      <Field id={fields.role.id} label="Role" errors={fields.role.errors}>
        <select {...getSelectProps(fields.role)} className="field-input">
          {roles.map((r) => (
            <option key={r} value={r}>
              {roleLabels[r]}
            </option>
          ))}
        </select>
      </Field>
      <button type="submit" className="btn btn-primary" disabled={busy}>
        Send invitation
      </button>
    </Form>
  );
}

export default function People({ loaderData, actionData }: Route.ComponentProps) {
  const busy = useNavigation().state !== "idle";
  // The banner answers the last action; it goes once the next invitation is being written.
  const [editedSince, setEditedSince] = useState<unknown>(null);
  const notice = actionData?.notice && editedSince !== actionData ? actionData.notice : null;
  const sent = actionData && "sent" in actionData ? actionData.sent : undefined;
  return (
    <>
      <PageHeader title="People" />
      <MailWaiting {...loaderData.mail} />
      {notice && (
        <p role="status" className="mb-4 rounded-md border-2 border-sound bg-sound-light p-3 font-bold">
          {notice}
        </p>
      )}
      <section className="card mb-8">
        <h2 className="mb-4 text-xl font-bold">Invite someone</h2>
        <InviteForm
          key={sent ?? "invite"}
          lastResult={sent ? null : actionData?.invite}
          busy={busy}
          onEdit={() => setEditedSince(actionData)}
        />
      </section>
      <table className="w-full border-collapse">
        <thead>
          <tr className="border-b-2 border-ink text-left">
            <th className="p-2">Name</th>
            <th className="p-2">E-mail</th>
            <th className="p-2">Role</th>
            <th className="p-2">State</th>
            <th className="p-2">Actions</th>
          </tr>
        </thead>
        <tbody>
          {loaderData.people.map((p) => (
            <tr key={p.id} className="border-b border-rule align-middle" data-testid={`person-${p.email}`}>
              <td className="p-2 font-bold">{p.name}</td>
              <td className="p-2">{p.email}</td>
              <td className="p-2">
                <Form method="post" className="flex gap-2">
                  <input type="hidden" name="intent" value="role" />
                  <input type="hidden" name="userId" value={p.id} />
                  <label className="sr-only" htmlFor={`role-${p.id}`}>
                    Role of {p.name}
                  </label>
                  <select
                    id={`role-${p.id}`}
                    name="role"
                    defaultValue={p.role}
                    className="field-input w-auto"
                    disabled={p.id === loaderData.me}
                  >
                    {roles.map((r) => (
                      <option key={r} value={r}>
                        {roleLabels[r]}
                      </option>
                    ))}
                  </select>
                  {p.id !== loaderData.me && (
                    <button className="btn" type="submit">
                      Change
                    </button>
                  )}
                </Form>
              </td>
              <td className="p-2">{!p.active ? "Deactivated" : p.hasPassword ? "Active" : "Invited"}</td>
              <td className="p-2">
                {p.id !== loaderData.me && (
                  <Form method="post" className="flex flex-wrap items-start gap-2">
                    <input type="hidden" name="userId" value={p.id} />
                    {p.active ? (
                      <ConfirmAction
                        label="Deactivate"
                        yes={`deactivate ${p.name}`}
                        consequence={`${p.name} is signed out at once and cannot sign in until reactivated. Their entries and signatures stay.`}
                        value="deactivate"
                        danger
                      />
                    ) : (
                      <button className="btn" name="intent" value="reactivate">
                        Reactivate
                      </button>
                    )}
                    {p.active && !p.hasPassword && (
                      <button className="btn" name="intent" value="reinvite">
                        Send again
                      </button>
                    )}
                  </Form>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}

/** Mail the server has not taken yet, and mail given up this week: the manager should know. */
function MailWaiting({ waiting, lastError, failedThisWeek }: Route.ComponentProps["loaderData"]["mail"]) {
  if (!waiting && !failedThisWeek) return null;
  return (
    <div data-testid="mail-waiting" className="mb-4 rounded-md border-2 border-brass bg-brass-light p-3">
      {waiting > 0 && (
        <p className="font-bold">
          {`${waiting === 1 ? "1 e-mail waits" : `${waiting} e-mails wait`} for the mail server; Sternpost keeps trying.`}
          {lastError && <span className="font-normal">{` Last answer: ${lastError}`}</span>}
        </p>
      )}
      {failedThisWeek > 0 && (
        <p>
          {`${failedThisWeek === 1 ? "1 e-mail" : `${failedThisWeek} e-mails`} could not be sent this week (the address was refused, or the server stayed away three days). Check the address and invite again.`}
        </p>
      )}
    </div>
  );
}
