import { Link } from "react-router";
import { LocalTime } from "./local-time.tsx";
import { formatMoment } from "~/lib/format";
import { jobScopeLabels, jobStatusLabels } from "~/lib/validation/jobs";
import type { VesselFigure, VesselJob, VesselRecord } from "~/server/vessel-history.server";

const cell = "border-b border-rule p-2 align-top";
const link = "font-bold text-harbour underline";
const day = (date: string) => formatMoment(`${date}T12:00:00Z`, "UTC", "date");

/** The vessel's jobs, its records and its alignment and runout figures over the years. */
export function VesselHistory({
  jobs,
  records,
  figures,
}: {
  jobs: VesselJob[];
  records: VesselRecord[];
  figures: VesselFigure[];
}) {
  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="vessel-jobs">
        <h2 id="vessel-jobs" className="mb-2 text-2xl font-bold">
          Jobs
        </h2>
        {jobs.length === 0 ? (
          <p className="text-ink-soft">No jobs on this vessel yet.</p>
        ) : (
          <ul className="flex flex-col gap-1" data-testid="vessel-jobs">
            {jobs.map((j) => (
              <li key={j.id}>
                <Link to={`/jobs/${j.id}`} className={link}>
                  {jobScopeLabels[j.scope as keyof typeof jobScopeLabels] ?? j.scope}: {j.engineModel}
                </Link>{" "}
                · {jobStatusLabels[j.status as keyof typeof jobStatusLabels] ?? j.status}
                {j.startDate && <> · from {day(j.startDate)}</>}
              </li>
            ))}
          </ul>
        )}
      </section>
      <section aria-labelledby="vessel-records">
        <h2 id="vessel-records" className="mb-2 text-2xl font-bold">
          Records
        </h2>
        {records.length === 0 ? (
          <p className="text-ink-soft">No commissioning record issued yet.</p>
        ) : (
          <ul className="flex flex-col gap-1">
            {records.map((r) => (
              <li key={r.id}>
                <Link to={`/records/${r.id}`} className={link}>
                  Commissioning record
                </Link>{" "}
                issued <LocalTime at={r.issuedAt} style="date" />
              </li>
            ))}
          </ul>
        )}
      </section>
      <section aria-labelledby="vessel-figures">
        <h2 id="vessel-figures" className="mb-2 text-2xl font-bold">
          Alignment and runout over the years
        </h2>
        {figures.length === 0 ? (
          <p className="text-ink-soft">No alignment or runout figures handed in for review yet.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full border-collapse tabular-nums" data-testid="vessel-figures">
              <thead>
                <tr className="border-b-2 border-ink text-left">
                  <th className="p-2">When</th>
                  <th className="p-2">Where</th>
                  <th className="p-2">Check</th>
                  <th className="p-2">Figures</th>
                  <th className="p-2">Verdict</th>
                </tr>
              </thead>
              <tbody>
                {figures.map((f) => (
                  <tr key={`${f.checklistId} ${f.item}`}>
                    <td className={cell}>
                      <Link to={`/jobs/${f.jobId}`} className={link}>
                        <LocalTime at={f.at} style="date" />
                      </Link>
                      {f.state === "submitted" && (
                        <span className="block text-sm text-ink-soft">not countersigned</span>
                      )}
                    </td>
                    <td className={cell}>{f.phase}</td>
                    <td className={cell}>{f.item}</td>
                    <td className={cell}>{f.figures}</td>
                    <td className={cell} data-verdict={f.status}>
                      {f.verdict}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </div>
  );
}
