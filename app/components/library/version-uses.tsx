import { Link } from "react-router";
import { checklistStateLabels, type ChecklistState } from "~/lib/checklist-sets";
import type { VersionUse } from "~/server/library.server";

/** The jobs using a version that this person may open, each with its checklist's state. */
export function VersionUses({
  uses,
  linkTo,
  className,
}: {
  uses: VersionUse[];
  /** Where a hull's name leads: its job, or the checklist itself. */
  linkTo: "job" | "checklist";
  className: string;
}) {
  return (
    <ul className={className}>
      {uses.map((j) => (
        <li key={j.checklistId}>
          <Link
            to={linkTo === "job" ? `/jobs/${j.jobId}` : `/checklists/${j.checklistId}`}
            className="text-harbour underline"
          >
            {j.vesselName}
          </Link>{" "}
          <span className="text-sm text-ink-soft">
            {checklistStateLabels[j.state as ChecklistState] ?? j.state}
          </span>
        </li>
      ))}
    </ul>
  );
}
