import { Form, Link } from "react-router";
import type { Route } from "./+types/compare";
import { TemplateDiffView } from "~/components/library/template-diff";
import { diffTemplates } from "~/lib/templates";
import { readableVersion, templateHistory } from "~/server/library.server";
import { invariantFound, requireCapability } from "~/server/permissions.server";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Compare versions of ${data?.title ?? "a template"} · Sternpost` },
];

const statusWords = { draft: "draft", published: "published", retired: "retired" } as const;

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireCapability(request, "library:view");
  const history = await templateHistory(user, params.key);
  invariantFound(history, "There is no such template.");
  const url = new URL(request.url);
  const newest = history.versions[0].version;
  const to = Number(url.searchParams.get("to") ?? newest);
  const from = Number(
    url.searchParams.get("from") ?? history.versions.find((v) => v.version < to)?.version ?? to,
  );
  const [a, b] = await Promise.all([
    readableVersion(user, params.key, from),
    readableVersion(user, params.key, to),
  ]);
  invariantFound(a, `There is no version ${url.searchParams.get("from")} of this template to compare.`);
  invariantFound(b, `There is no version ${url.searchParams.get("to")} of this template to compare.`);
  return {
    key: params.key,
    title: b.template.title,
    from,
    to,
    versions: history.versions.map((v) => ({ version: v.version, status: v.status })),
    diff: diffTemplates(a.template, b.template),
  };
}

export default function Compare({ loaderData }: Route.ComponentProps) {
  const { key, title, from, to, versions, diff } = loaderData;
  const choice = (name: "from" | "to", value: number, label: string) => (
    <label className="flex flex-col gap-1 font-bold">
      {label}
      <select name={name} defaultValue={value} className="field-input">
        {versions.map((v) => (
          <option key={v.version} value={v.version}>
            Version {v.version} ({statusWords[v.status]})
          </option>
        ))}
      </select>
    </label>
  );
  return (
    <>
      <p className="mb-1">
        <Link to={`/library/${key}/${to}`} className="font-bold text-harbour underline">
          ← {title}, version {to}
        </Link>
      </p>
      <h1 className="mb-4 text-3xl font-bold">Differences between versions</h1>
      <Form method="get" className="card mb-6 flex flex-wrap items-end gap-4">
        {choice("from", from, "Older")}
        {choice("to", to, "Newer")}
        <button type="submit" className="btn btn-primary">
          Compare
        </button>
      </Form>
      <TemplateDiffView diff={diff} />
    </>
  );
}
