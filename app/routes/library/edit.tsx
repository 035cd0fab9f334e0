import { data, Link, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/edit";
import { Refusal } from "~/lib/refusal";
import { TemplateEditor } from "~/components/library/editor/template-editor";
import { readableVersion, saveDraft } from "~/server/library.server";
import { invariantFound, requireCapability } from "~/server/permissions.server";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Editing ${data?.template.title ?? "a draft"} · Sternpost` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireCapability(request, "library:edit");
  const found = await readableVersion(user, params.key, Number(params.version));
  invariantFound(found, "There is no such template version.");
  // A published or retired version never changes: its page offers a new draft instead.
  if (found.status !== "draft") throw redirect(`/library/${params.key}/${params.version}`);
  return { template: found.template };
}

const draftPostSchema = z.object({ intent: z.enum(["save", "save-review"]), body: z.unknown() });

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireCapability(request, "library:edit");
  // The editor posts its draft as JSON: { intent, body } (the template itself is checked by saveDraft).
  const posted = draftPostSchema.safeParse(await request.json().catch(() => undefined));
  if (!posted.success)
    return data(
      { ok: false as const, problems: [{ path: "", message: "The draft did not arrive as JSON." }] },
      { status: 400 },
    );
  const { intent, body } = posted.data;
  try {
    const result = await saveDraft(params.key, Number(params.version), body, user.id);
    if (!result.ok) return data(result, { status: 400 });
  } catch (error) {
    if (error instanceof Refusal)
      return data({ ok: false as const, errors: [error.message] }, { status: error.status });
    throw error;
  }
  if (intent === "save-review") return redirect(`/library/${params.key}/${params.version}`);
  return { ok: true as const };
}

export default function EditDraft({ loaderData, params }: Route.ComponentProps) {
  const { template } = loaderData;
  return (
    <>
      <p className="mb-1">
        <Link to={`/library/${params.key}/${params.version}`} className="font-bold text-harbour underline">
          ← Version {params.version} of {template.title}
        </Link>
      </p>
      <h1 className="mb-4 text-3xl font-bold">Editing the draft of version {params.version}</h1>
      <TemplateEditor key={`${params.key}-${params.version}`} saved={template} />
    </>
  );
}
