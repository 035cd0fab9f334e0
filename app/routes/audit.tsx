import { getFormProps, getSelectProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { useMemo } from "react";
import { Form, Link, useSearchParams } from "react-router";
import type { Route } from "./+types/audit";
import { PageHeader } from "~/components/app-shell";
import { Field, InputField } from "~/components/field";
import { roleLabels } from "~/lib/roles";
import {
  actionInWords,
  auditActionGroups,
  auditActionLabels,
  auditEntityLabels,
  auditFiltersSchema,
} from "~/lib/validation/audit";
import { listAuditEntries, type AuditLogEntry } from "~/server/audit-log.server";
import { requireCapability } from "~/server/permissions.server";
import { listUsers } from "~/server/users.server";
import { TableBody } from "~/components/table-body";
import { useYardTimeZone } from "~/components/local-time";
import { formatMoment } from "~/lib/format";
import { yardSettings } from "~/server/yard.server";

export const meta: Route.MetaFunction = () => [{ title: "Audit log · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireCapability(request, "audit:read");
  // A form sends each filter once; of a repeated one in a typed address the last counts.
  const params = new URLSearchParams(Object.fromEntries(new URL(request.url).searchParams));
  // Days are the yard's days, whatever zone the reader's computer is in.
  params.set("tz", (await yardSettings()).timeZone);
  const submission = parseWithZod(params, { schema: auditFiltersSchema });
  const people = (await listUsers()).map((p) => ({
    id: p.id,
    label: `${p.name} (${roleLabels[p.role]}${p.active ? "" : ", deactivated"})`,
  }));
  // Bad filters answer the page with the message at the field, not an error page.
  if (submission.status !== "success")
    return {
      people,
      reply: submission.reply() as SubmissionResult<string[]>,
      entries: [],
      olderThan: null,
    };
  return { people, reply: null, ...(await listAuditEntries(submission.value)) };
}

/** The current filters with one changed and paging restarted. */
function withFilter(search: URLSearchParams, changes: Record<string, string | null>) {
  const next = new URLSearchParams(search);
  next.delete("before");
  for (const [key, value] of Object.entries(changes)) {
    if (value === null) next.delete(key);
    else next.set(key, value);
  }
  return `?${next}`;
}

const column = createColumnHelper<AuditLogEntry>();
const cellLink = "flex min-h-12 items-center font-bold text-harbour underline";

function auditColumns(zone: string, search: URLSearchParams) {
  return [
    column.accessor("at", {
      header: "When",
      cell: (c) => (
        <time dateTime={c.getValue()} className="whitespace-nowrap">
          {formatMoment(c.getValue(), zone, "full")}
        </time>
      ),
    }),
    column.accessor("who", {
      header: "Who",
      cell: (c) => {
        const who = c.getValue();
        if (!who) return <span className="text-ink-soft">The system</span>;
        return (
          <>
            <Link
              to={withFilter(search, { person: String(who.id) })}
              className={cellLink}
              title="Only this person's entries"
            >
              {who.name}
            </Link>
            <span className="block text-sm text-ink-soft">{roleLabels[who.role]}</span>
          </>
        );
      },
    }),
    column.accessor("deviceId", {
      header: "Device",
      cell: (c) => {
        const device = c.getValue();
        if (!device) return <span className="text-ink-soft">—</span>;
        return (
          <Link
            to={withFilter(search, { device })}
            className={`${cellLink} break-all font-mono text-sm`}
            title="Only this device's entries"
          >
            {device}
          </Link>
        );
      },
    }),
    column.accessor("sentence", {
      header: "What happened",
      cell: (c) => {
        const { views, action } = c.row.original;
        return (
          <>
            <span title={actionInWords(action)}>{c.getValue()}</span>
            {views && (
              <span className="block text-sm text-ink-soft" data-testid="views">
                {views.count} times, first {formatMoment(views.firstAt, zone, "full")}
              </span>
            )}
          </>
        );
      },
    }),
    column.display({
      id: "what",
      header: "About",
      cell: (c) => {
        const { what: words, href } = c.row.original;
        return href ? (
          <Link to={href} className={`${cellLink} break-all`}>
            {words}
          </Link>
        ) : (
          <span className="break-all">{words}</span>
        );
      },
    }),
    column.accessor("detail", {
      header: "Detail",
      cell: (c) => <span className="text-sm">{c.getValue() ?? "—"}</span>,
    }),
  ];
}

function AuditTable({ entries, zone }: { entries: AuditLogEntry[]; zone: string }) {
  const [search] = useSearchParams();
  // The table re-derives its rows whenever an option changes identity: keep them stable.
  const columns = useMemo(() => auditColumns(zone, search), [zone, search]);
  const table = useReactTable({ data: entries, columns, getCoreRowModel: getCoreRowModel() });
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse" data-testid="audit-table">
        <thead>
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id} className="border-b-2 border-ink text-left">
              {group.headers.map((header) => (
                <th key={header.id} className="px-2 py-3 font-bold">
                  {flexRender(header.column.columnDef.header, header.getContext())}
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <TableBody rows={table.getRowModel().rows} rowClassName="border-b border-rule align-top" />
      </table>
    </div>
  );
}

const knownActions = new Set<string>([
  ...Object.keys(auditActionLabels),
  ...auditActionGroups.map((g) => g.prefix),
]);

function AuditFilters({
  people,
  reply,
}: {
  people: { id: number; label: string }[];
  reply: SubmissionResult<string[]> | null;
}) {
  const [search] = useSearchParams();
  const current = Object.fromEntries(search);
  const [form, fields] = useForm({
    id: "audit-filters",
    lastResult: reply,
    defaultValue: current,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: auditFiltersSchema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  const action = current.action ?? "";
  const entity = current.entity ?? "";
  return (
    <Form
      method="get"
      {...getFormProps(form)}
      className="card mb-6 grid gap-4 md:grid-cols-2 xl:grid-cols-4 md:items-start"
    >
      <Field id={fields.action.id} label="Action" errors={fields.action.errors}>
        <select {...getSelectProps(fields.action)} className="field-input">
          <option value="">Any action</option>
          {action && !knownActions.has(action) && <option value={action}>{action}</option>}
          {auditActionGroups.map((g) => (
            <optgroup key={g.prefix} label={g.label}>
              <option value={g.prefix}>{g.all}</option>
              {g.actions.map((code) => (
                <option key={code} value={code}>
                  {actionInWords(code)}
                </option>
              ))}
            </optgroup>
          ))}
        </select>
      </Field>
      <Field id={fields.person.id} label="Person" errors={fields.person.errors}>
        <select {...getSelectProps(fields.person)} className="field-input">
          <option value="">Anyone</option>
          {people.map((p) => (
            <option key={p.id} value={p.id}>
              {p.label}
            </option>
          ))}
        </select>
      </Field>
      <Field id={fields.entity.id} label="Kind of thing" errors={fields.entity.errors}>
        <select {...getSelectProps(fields.entity)} className="field-input">
          <option value="">Anything</option>
          {entity && !(entity in auditEntityLabels) && <option value={entity}>{entity}</option>}
          {Object.entries(auditEntityLabels).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </select>
      </Field>
      <InputField
        meta={fields.entityId}
        label="Its id"
        hint="The number or code after the kind, e.g. 12."
        autoComplete="off"
      />
      <InputField meta={fields.from} type="date" label="First day" />
      <InputField meta={fields.to} type="date" label="Last day" />
      <InputField
        meta={fields.device}
        label="Device"
        hint="A tablet's id, as shown in the Device column."
        className="field-input font-mono"
        autoComplete="off"
      />
      <div className="flex flex-wrap items-end gap-2 self-end">
        <button type="submit" className="btn btn-primary">
          Show entries
        </button>
        <Link to="/audit" className="btn">
          Clear filters
        </Link>
      </div>
    </Form>
  );
}

export default function AuditLog({ loaderData }: Route.ComponentProps) {
  const [search] = useSearchParams();
  const zone = useYardTimeZone();
  const { entries, olderThan, reply, people } = loaderData;
  return (
    <>
      <PageHeader title="Audit log" />
      {/* A new address starts the form afresh from it, errors included. */}
      <AuditFilters key={search.toString()} people={people} reply={reply} />
      {reply ? (
        <p role="status" className="rounded-md border-2 border-fault bg-fault-light p-3 font-bold text-fault">
          Correct the marked filter to see the log.
        </p>
      ) : (
        <>
          <p className="mb-2 text-sm text-ink-soft">
            Newest first. Days and times are the yard's, in {zone}.
          </p>
          <AuditTable entries={entries} zone={zone} />
          {entries.length === 0 && <p className="mt-4 text-ink-soft">No entries match these filters.</p>}
          <nav aria-label="Pages of the log" className="mt-4 flex flex-wrap gap-2">
            {search.has("before") && (
              <Link to={withFilter(search, {})} className="btn">
                Newest entries
              </Link>
            )}
            {olderThan !== null && (
              <Link
                to={`?${new URLSearchParams({ ...Object.fromEntries(search), before: String(olderThan) })}`}
                className="btn"
              >
                Older entries
              </Link>
            )}
          </nav>
        </>
      )}
    </>
  );
}
