import { Form, Link } from "react-router";
import type { LibraryTemplate, LibraryVersion } from "~/server/library.server";
import { LocalTime } from "~/components/local-time";
import { VersionStatusBadge } from "./version-status.tsx";
import { VersionUses } from "./version-uses.tsx";

function UsedBy({ version }: { version: LibraryVersion }) {
  if (version.jobCount === 0) return <span className="text-ink-soft">No jobs</span>;
  const hidden = version.jobCount - version.jobs.length;
  return (
    <div className="flex flex-col gap-1">
      <span className="font-bold">
        {version.jobCount} job{version.jobCount === 1 ? "" : "s"}
      </span>
      {version.jobs.length > 0 && <VersionUses uses={version.jobs} linkTo="job" className="flex flex-col" />}
      {hidden > 0 && <span className="text-sm text-ink-soft">and {hidden} not on your jobs</span>}
    </div>
  );
}

function VersionRow({
  template,
  version,
  canEdit,
}: {
  template: LibraryTemplate;
  version: LibraryVersion;
  canEdit: boolean;
}) {
  const older = template.versions.find((v) => v.version < version.version);
  return (
    <tr className="border-t border-rule align-top" data-version={version.version}>
      <th scope="row" className="p-2 text-left whitespace-nowrap">
        <Link
          to={`/library/${version.key}/${version.version}`}
          className="flex min-h-12 items-center text-lg text-harbour underline"
        >
          Version {version.version}
        </Link>
      </th>
      <td className="p-2">
        <VersionStatusBadge status={version.status} newest={version.version === template.newestPublished} />
        <p className="mt-1 text-sm text-ink-soft">
          {version.status === "draft" && (
            <>
              Started <LocalTime at={version.createdAt} style="date" />
              {version.createdByName ? ` by ${version.createdByName}` : ""}
            </>
          )}
          {version.publishedAt && (
            <>
              Published <LocalTime at={version.publishedAt} style="date" />
            </>
          )}
          {version.retiredAt && (
            <>
              , retired <LocalTime at={version.retiredAt} style="date" />
            </>
          )}
        </p>
      </td>
      <td className="p-2">
        <UsedBy version={version} />
      </td>
      <td className="p-2">
        <div className="flex flex-wrap justify-end gap-2">
          {older && (
            <Link
              className="btn"
              to={`/library/${version.key}/compare?from=${older.version}&to=${version.version}`}
            >
              Changes
            </Link>
          )}
          {canEdit && version.status === "draft" && (
            <Link className="btn btn-primary" to={`/library/${version.key}/${version.version}/edit`}>
              Edit draft
            </Link>
          )}
          {canEdit && template.draft === null && (
            <Form method="post">
              <input type="hidden" name="intent" value="new-draft" />
              <input type="hidden" name="key" value={version.key} />
              <input type="hidden" name="version" value={version.version} />
              <button type="submit" className="btn">
                New draft from version {version.version}
              </button>
            </Form>
          )}
        </div>
      </td>
    </tr>
  );
}

/** Every template with its versions, their states, and the jobs on each version. */
export function LibraryList({ templates, canEdit }: { templates: LibraryTemplate[]; canEdit: boolean }) {
  if (!templates.length) return <p className="card">The library is empty.</p>;
  return (
    <div className="flex flex-col gap-6">
      {templates.map((t) => (
        <section key={t.key} className="card" aria-labelledby={`template-${t.key}`} data-template={t.key}>
          <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
            <h2 id={`template-${t.key}`} className="text-2xl font-bold">
              {t.title}
            </h2>
            <span className="font-mono text-sm text-ink-soft">{t.key}</span>
          </div>
          <p className="mb-3" data-testid="newest-published">
            {t.newestPublished !== null ? (
              <>
                New jobs start from <strong>version {t.newestPublished}</strong>.
              </>
            ) : (
              <strong className="text-fault">
                <span aria-hidden="true">▲ </span>No published version: new jobs cannot start this checklist.
              </strong>
            )}
          </p>
          <div className="overflow-x-auto">
            <table className="w-full border-collapse">
              <thead className="sr-only">
                <tr>
                  <th>Version</th>
                  <th>State</th>
                  <th>Used by</th>
                  <th>Actions</th>
                </tr>
              </thead>
              <tbody>
                {t.versions.map((v) => (
                  <VersionRow key={v.id} template={t} version={v} canEdit={canEdit} />
                ))}
              </tbody>
            </table>
          </div>
        </section>
      ))}
    </div>
  );
}
