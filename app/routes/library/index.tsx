import { parseWithZod } from "@conform-to/zod/v4";
import { data, Link, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/index";
import { Refusal } from "~/lib/refusal";
import { PageHeader } from "~/components/app-shell";
import { FormErrors } from "~/components/field";
import { LibraryList } from "~/components/library/library-list";
import { NewTemplateForm, newTemplateSchema } from "~/components/library/new-template-form";
import { can } from "~/lib/permissions";
import { createDraftFrom, createTemplate, listLibrary } from "~/server/library.server";
import { requireCapability } from "~/server/permissions.server";

export const meta: Route.MetaFunction = () => [{ title: "Template library · Sternpost" }];

const newDraftSchema = z.object({
  intent: z.literal("new-draft"),
  key: z.string(),
  version: z.coerce.number().int().positive(),
});

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireCapability(request, "library:view");
  return { templates: await listLibrary(user), canEdit: can(user, "library:edit") };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireCapability(request, "library:edit");
  const formData = await request.formData();
  if (formData.get("intent") === "create-template") {
    const submission = parseWithZod(formData, { schema: newTemplateSchema });
    if (submission.status !== "success")
      return data({ newTemplate: submission.reply(), errors: null }, { status: 400 });
    try {
      const created = await createTemplate(submission.value, user.id);
      return redirect(`/library/${created.key}/${created.version}/edit`);
    } catch (error) {
      if (!(error instanceof Refusal)) throw error;
      const reply = submission.reply(
        error.field ? { fieldErrors: { [error.field]: [error.message] } } : { formErrors: [error.message] },
      );
      return data({ newTemplate: reply, errors: null }, { status: error.status });
    }
  }
  const parsed = newDraftSchema.safeParse(Object.fromEntries(formData));
  if (!parsed.success)
    return data({ newTemplate: null, errors: ["That request was not understood."] }, { status: 400 });
  try {
    const draft = await createDraftFrom(parsed.data.key, parsed.data.version, user.id);
    return redirect(`/library/${draft.key}/${draft.version}/edit`);
  } catch (error) {
    if (error instanceof Refusal)
      return data({ newTemplate: null, errors: [error.message] }, { status: error.status });
    throw error;
  }
}

export default function Library({ loaderData, actionData }: Route.ComponentProps) {
  const { templates, canEdit } = loaderData;
  return (
    <>
      <PageHeader title="Template library">
        {canEdit && (
          <Link className="btn" to="/library/import">
            Import a template file
          </Link>
        )}
      </PageHeader>
      <p className="mb-4 max-w-3xl">
        Each checklist is started from the newest published version of its template and keeps that version for
        good. A published version never changes: edits go into a new draft, which becomes the next version
        when it is published.
      </p>
      <div className="mb-4">
        <FormErrors errors={actionData?.errors} />
      </div>
      {canEdit && (
        <details className="card mb-6" open={!!actionData?.newTemplate}>
          <summary className="flex min-h-12 cursor-pointer items-center text-xl font-bold">
            New template
          </summary>
          <div className="mt-4">
            <NewTemplateForm lastResult={actionData?.newTemplate} />
          </div>
        </details>
      )}
      <LibraryList templates={templates} canEdit={canEdit} />
    </>
  );
}
