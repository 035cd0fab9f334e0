import { parseWithZod } from "@conform-to/zod/v4";
import { data, Link, redirect } from "react-router";
import type { Route } from "./+types/import";
import { PageHeader } from "~/components/app-shell";
import { ImportForm, importSchema } from "~/components/library/import-form";
import { importTemplate } from "~/server/library.server";
import { requireCapability } from "~/server/permissions.server";

export const meta: Route.MetaFunction = () => [{ title: "Import a template · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireCapability(request, "library:edit");
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireCapability(request, "library:edit");
  const submission = parseWithZod(await request.formData(), { schema: importSchema });
  if (submission.status !== "success")
    return data({ result: submission.reply(), problems: null, unchanged: null }, { status: 400 });
  const { file, text, renumber, replaceDraft } = submission.value;
  const result = await importTemplate(
    file ? await file.text() : (text ?? ""),
    { renumber, replaceDraft },
    user.id,
  );
  if (!result.ok)
    return data({ result: submission.reply(), problems: result.problems, unchanged: null }, { status: 400 });
  if (result.action === "unchanged")
    return { result: null, problems: null, unchanged: { key: result.key, version: result.version } };
  return redirect(`/library/${result.key}/${result.version}`);
}

export default function ImportTemplate({ actionData }: Route.ComponentProps) {
  return (
    <>
      <p className="mb-1">
        <Link to="/library" className="font-bold text-harbour underline">
          ← Template library
        </Link>
      </p>
      <PageHeader title="Import a template file" />
      {actionData?.unchanged && (
        <p className="mb-4 rounded-md border-2 border-sound bg-sound-light p-3" role="status">
          Version {actionData.unchanged.version} of {actionData.unchanged.key} is in the library already, word
          for word: nothing to import.{" "}
          <Link
            className="font-bold text-harbour underline"
            to={`/library/${actionData.unchanged.key}/${actionData.unchanged.version}`}
          >
            Open it
          </Link>
        </p>
      )}
      <ImportForm lastResult={actionData?.result} problems={actionData?.problems} />
    </>
  );
}
