import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import { useEffect, useMemo, useRef } from "react";
import { Link, useSearchParams } from "react-router";
import { formatMoment } from "~/lib/format";
import { TableBody } from "./table-body.tsx";
import { jobScopeLabels, jobStatusLabels, jobStatuses } from "~/lib/validation/jobs";

export interface JobRow {
  id: number;
  vesselName: string;
  hin: string | null;
  scope: keyof typeof jobScopeLabels;
  status: keyof typeof jobStatusLabels;
  engineModel: string;
  leadName: string;
  technicianNames: string[];
  dueDate: string | null;
}

const column = createColumnHelper<JobRow>();

const byDueDate = (a: string | null, b: string | null) =>
  a === b ? 0 : a === null ? 1 : b === null ? -1 : a < b ? -1 : 1;

const columns = [
  column.accessor("vesselName", {
    header: "Vessel",
    cell: (c) => (
      <Link
        to={`/jobs/${c.row.original.id}`}
        className="flex min-h-12 items-center font-bold text-harbour underline"
      >
        {c.getValue()}
      </Link>
    ),
  }),
  column.accessor("scope", { header: "Scope", cell: (c) => jobScopeLabels[c.getValue()] }),
  column.accessor("status", {
    header: "Status",
    cell: (c) => jobStatusLabels[c.getValue()],
    filterFn: "equalsString",
    sortingFn: (a, b) => jobStatuses.indexOf(a.original.status) - jobStatuses.indexOf(b.original.status),
  }),
  column.accessor("engineModel", { header: "Engine" }),
  column.accessor("leadName", { header: "Lead" }),
  column.accessor((j) => j.technicianNames.join(", "), { id: "technicians", header: "Technicians" }),
  column.accessor("dueDate", {
    header: "Due",
    // A due date is a day, not a moment: written as the day it is, in no zone's shift.
    cell: (c) => {
      const day = c.getValue();
      return day ? formatMoment(`${day}T12:00:00Z`, "UTC", "date") : "—";
    },
    // Jobs without a due date go last; an explicit order keeps the server's and the browser's rows alike.
    sortingFn: (a, b) => byDueDate(a.original.dueDate, b.original.dueDate) || a.original.id - b.original.id,
  }),
];

const sortable = new Set(columns.map((c) => ("accessorKey" in c ? String(c.accessorKey) : c.id)));
const DEFAULT_SORT = "dueDate";

/** `?sort=-dueDate` reads as due date, latest first; an unknown column is the default order. */
function sortingFrom(param: string | null): SortingState {
  const desc = !!param?.startsWith("-");
  const id = param?.replace(/^-/, "") ?? DEFAULT_SORT;
  return sortable.has(id) ? [{ id, desc }] : [{ id: DEFAULT_SORT, desc: false }];
}

/**
 * The shop's job list: sort by any column, filter by status, search every column. All three live
 * in the address (?q=…&status=…&sort=…), so a reload, the back button and a shared link keep them.
 */
export function JobsTable({ jobs }: { jobs: JobRow[] }) {
  const [params, setParams] = useSearchParams();
  const search = params.get("q") ?? "";
  const statusParam = params.get("status") ?? "";
  const status = (jobStatuses as readonly string[]).includes(statusParam) ? statusParam : "";
  const sortParam = params.get("sort");
  // The table re-derives its rows whenever a state object changes identity: keep them stable.
  const sorting = useMemo(() => sortingFrom(sortParam), [sortParam]);
  const columnFilters = useMemo(() => (status ? [{ id: "status", value: status }] : []), [status]);
  // Changes made while an earlier one is still on its way build on it, not on the address shown.
  const latest = useRef(params);
  useEffect(() => {
    latest.current = params;
  }, [params]);
  const update = (key: string, value: string) => {
    const next = new URLSearchParams(latest.current);
    if (value) next.set(key, value);
    else next.delete(key);
    latest.current = next;
    // Typing is not history: one entry for the page, whatever was typed.
    setParams(next, { replace: true, preventScrollReset: true });
  };
  const table = useReactTable({
    data: jobs,
    columns,
    state: { sorting, globalFilter: search, columnFilters },
    onSortingChange: (change) => {
      // From the latest order asked for: a second tap before the address has caught up still toggles.
      const [next] = typeof change === "function" ? change(sortingFrom(latest.current.get("sort"))) : change;
      update(
        "sort",
        !next || (next.id === DEFAULT_SORT && !next.desc) ? "" : `${next.desc ? "-" : ""}${next.id}`,
      );
    },
    onGlobalFilterChange: (value: string) => update("q", value),
    globalFilterFn: "includesString",
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  const rows = table.getRowModel().rows;
  return (
    <div>
      <div className="mb-4 flex flex-wrap items-end gap-4">
        <label className="flex flex-1 flex-col gap-1 font-bold">
          Search
          <input
            type="search"
            value={search}
            onChange={(e) => update("q", e.target.value)}
            placeholder="Vessel, engine, person…"
            className="field-input font-normal"
          />
        </label>
        <label className="flex flex-col gap-1 font-bold">
          Status
          <select
            value={status}
            onChange={(e) => update("status", e.target.value)}
            className="field-input font-normal"
          >
            <option value="">Any</option>
            {jobStatuses.map((s) => (
              <option key={s} value={s}>
                {jobStatusLabels[s]}
              </option>
            ))}
          </select>
        </label>
      </div>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse" data-testid="jobs-table">
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b-2 border-ink text-left">
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      className="p-0"
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
                    >
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className="flex min-h-12 w-full items-center gap-1 px-2 text-left font-bold"
                      >
                        {flexRender(header.column.columnDef.header, header.getContext())}
                        <span aria-hidden="true">
                          {sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}
                        </span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <TableBody rows={rows} rowClassName="border-b border-rule" />
        </table>
      </div>
      {rows.length === 0 && <p className="mt-4 text-ink-soft">No jobs match.</p>}
    </div>
  );
}
