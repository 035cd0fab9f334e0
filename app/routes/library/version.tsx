import { useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect } from "react-router";
import type { Route } from "./+types/version";
import { Refusal } from "~/lib/refusal";
import { ChecklistPreview } from "~/components/library/checklist-preview";
import { FormErrors } from "~/components/field";
import { TemplateDiffView } from "~/components/library/template-diff";
import { TwoStepButton } from "~/components/library/two-step-button";
import { VersionUses } from "~/components/library/version-uses";
import { LocalTime } from "~/components/local-time";
import { VersionStatusBadge } from "~/components/library/version-status";
import { can } from "~/lib/permissions";
import { diffTemplates } from "~/lib/templates";
import { versionActionSchema } from "~/lib/validation/library";
import {
  createDraftFrom,
  discardDraft,
  fallbackAfterRetiring,
  publishDraft,
  readableVersion,
  retireVersion,
  templateHistory,
} from "~/server/library.server";
import { invariantFound, requireCapability } from "~/server/permissions.server";

export const meta: Route.MetaFunction = ({ data }) => [
  {
    title: data
      ? `${data.template.title}, version ${data.template.version} · Sternpost`
      : "Template · Sternpost",
  },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireCapability(request, "library:view");
  const version = Number(params.version);
  const found = await readableVersion(user, params.key, version);
  invariantFound(found, "There is no such template version.");
  const history = await templateHistory(user, params.key);
  invariantFound(history, "There is no such template version.");
  const entry = history.versions.find((v) => v.version === version)!;
  // A draft is reviewed against what new jobs start from today.
  const base =
    found.status === "draft" && history.newestPublished !== null
      ? await readableVersion(user, params.key, history.newestPublished)
      : undefined;
  return {
    template: found.template,
    entry,
    newestPublished: history.newestPublished,
    hasDraft: history.draft !== null,
    others: history.versions
      .filter((v) => v.version !== version)
      .map((v) => ({ version: v.version, status: v.status, jobCount: v.jobCount })),
    diff: base ? diffTemplates(base.template, found.template) : null,
    fallback: fallbackAfterRetiring(history.versions, version),
    canEdit: can(user, "library:edit"),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireCapability(request, "library:edit");
  const version = Number(params.version);
  const here = `/library/${params.key}/${version}`;
  const submission = parseWithZod(await request.formData(), { schema: versionActionSchema });
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  try {
    switch (submission.value.intent) {
      case "publish":
        await publishDraft(params.key, version, user.id);
        return redirect(here);
      case "retire":
        await retireVersion(params.key, version, user.id);
        return redirect(here);
      case "discard":
        await discardDraft(params.key, version, user.id);
        return redirect("/library");
      case "new-draft": {
        const draft = await createDraftFrom(params.key, version, user.id);
        return redirect(`/library/${draft.key}/${draft.version}/edit`);
      }
    }
  } catch (error) {
    if (error instanceof Refusal)
      return data(submission.reply({ formErrors: [error.message] }), { status: error.status });
    throw error;
  }
}

function jobsWord(n: number) {
  return `${n} job${n === 1 ? "" : "s"}`;
}

const keep = (n: number) => (n === 1 ? "keeps" : "keep");

export default function TemplateVersion({ loaderData, actionData }: Route.ComponentProps) {
  const { template, entry, newestPublished, hasDraft, others, diff, fallback, canEdit } = loaderData;
  const previous = others.find((o) => o.version < template.version);
  const onPrevious = newestPublished !== null ? others.find((o) => o.version === newestPublished) : undefined;
  const compareWith = others[0];
  const [form, fields] = useForm({ id: "template-version", lastResult: actionData });
  return (
    <>
      <p className="mb-1">
        <Link to="/library" className="font-bold text-harbour underline">
          ← Template library
        </Link>
      </p>
      <div className="mb-4 flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-3xl font-bold">{template.title}</h1>
          <p className="flex flex-wrap items-center gap-3 text-lg">
            <span>Version {template.version}</span>
            <VersionStatusBadge status={entry.status} newest={template.version === newestPublished} />
            <span className="font-mono text-sm text-ink-soft">{template.key}</span>
          </p>
          <p className="text-sm text-ink-soft">
            {entry.publishedAt ? (
              <>
                Published <LocalTime at={entry.publishedAt} style="date" />
              </>
            ) : (
              <>
                Draft started <LocalTime at={entry.createdAt} style="date" />
              </>
            )}
            {entry.retiredAt && (
              <>
                , retired <LocalTime at={entry.retiredAt} style="date" />
              </>
            )}
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          {canEdit && entry.status === "draft" && (
            <Link className="btn btn-primary" to="edit">
              Edit draft
            </Link>
          )}
          {compareWith && (
            <Link
              className="btn"
              to={`/library/${template.key}/compare?from=${(previous ?? compareWith).version}&to=${template.version}`}
            >
              Compare versions
            </Link>
          )}
          <a className="btn" href={`/api/templates/${template.key}/${template.version}/export`} download>
            Export file
          </a>
        </div>
      </div>
      <div className="mb-4">
        <FormErrors errors={[...(form.errors ?? []), ...(fields.intent.errors ?? [])]} />
      </div>

      <section className="card mb-6" aria-labelledby="uses-title">
        <h2 id="uses-title" className="mb-2 text-xl font-bold">
          Jobs on this version
        </h2>
        {entry.jobCount === 0 ? (
          <p>No job uses this version.</p>
        ) : (
          <>
            <p>
              {jobsWord(entry.jobCount)} started from this version {keep(entry.jobCount)} it, whatever is
              published later.
            </p>
            <VersionUses uses={entry.jobs} linkTo="checklist" className="mt-2 flex flex-col gap-1" />
            {entry.jobCount > entry.jobs.length && (
              <p className="text-sm text-ink-soft">
                and {entry.jobCount - entry.jobs.length} not on your jobs
              </p>
            )}
          </>
        )}
      </section>

      {canEdit && entry.status === "draft" && (
        <section className="card mb-6 border-2 border-brass" aria-labelledby="publish-title">
          <h2 id="publish-title" className="mb-3 text-xl font-bold">
            Before you publish
          </h2>
          {diff ? (
            <TemplateDiffView diff={diff} />
          ) : (
            <p>This is the first version of the template: everything in it is new.</p>
          )}
          <div className="mt-4 flex flex-wrap gap-3">
            <Form method="post" className="contents">
              <TwoStepButton
                label={`Publish version ${template.version}…`}
                confirmLabel={`Publish version ${template.version}`}
                submit={{ name: "intent", value: "publish" }}
              >
                <p>
                  Version {template.version} will never change again, and new jobs will start from it.
                  {onPrevious && onPrevious.jobCount > 0 && (
                    <>
                      {" "}
                      The {jobsWord(onPrevious.jobCount)} on version {onPrevious.version}{" "}
                      {keep(onPrevious.jobCount)} version {onPrevious.version}.
                    </>
                  )}
                </p>
              </TwoStepButton>
            </Form>
            <Form method="post" className="contents">
              <TwoStepButton
                label="Discard this draft…"
                confirmLabel="Discard the draft"
                danger
                submit={{ name: "intent", value: "discard" }}
              >
                <p>The draft of version {template.version} is deleted. Published versions are not touched.</p>
              </TwoStepButton>
            </Form>
          </div>
        </section>
      )}

      {canEdit && entry.status !== "draft" && (
        <section className="card mb-6" aria-labelledby="manage-title">
          <h2 id="manage-title" className="mb-3 text-xl font-bold">
            Change the library
          </h2>
          <div className="flex flex-wrap gap-3">
            {hasDraft ? (
              <p>This template has a draft already; edit or publish it first.</p>
            ) : (
              <Form method="post">
                <input type="hidden" name="intent" value="new-draft" />
                <button type="submit" className="btn btn-primary">
                  New draft from version {template.version}
                </button>
              </Form>
            )}
            {entry.status === "published" && (
              <Form method="post" className="contents">
                <TwoStepButton
                  label={`Retire version ${template.version}…`}
                  confirmLabel={`Retire version ${template.version}`}
                  danger
                  submit={{ name: "intent", value: "retire" }}
                >
                  <p>
                    No new job will start from version {template.version}; the {jobsWord(entry.jobCount)} on
                    it {keep(entry.jobCount)} it.{" "}
                    {template.version === newestPublished &&
                      (fallback !== null ? (
                        <strong>New jobs will start from version {fallback} again.</strong>
                      ) : (
                        <strong>
                          No other version is published: new jobs will not be able to start this checklist.
                        </strong>
                      ))}
                  </p>
                </TwoStepButton>
              </Form>
            )}
          </div>
        </section>
      )}

      <section aria-labelledby="preview-title">
        <h2 id="preview-title" className="mb-3 text-sm font-bold tracking-wide text-ink-soft uppercase">
          As a technician sees it
        </h2>
        <ChecklistPreview template={template} />
      </section>
    </>
  );
}
