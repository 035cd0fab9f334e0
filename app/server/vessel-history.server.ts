import { phaseLabels, progress, type Template } from "~/lib/templates";
import { formatNumber, verdictInWords } from "~/lib/format";
import type { VerdictStatus } from "~/lib/templates";
import { checklistResponses } from "./checklists.server.ts";
import { db } from "./db.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";

/** The calculations whose figures a yard compares season to season: alignment and runout. */
const HISTORY_CALCS = new Set(["couplingFace", "couplingRim", "shaftRunout"]);

export interface VesselJob {
  id: number;
  scope: string;
  status: string;
  engineModel: string;
  startDate: string | null;
}

export interface VesselRecord {
  id: string;
  jobId: number;
  issuedAt: string;
}

export interface VesselFigure {
  jobId: number;
  checklistId: string;
  /** When the figure was last entered (the newest response of its checklist). */
  at: string;
  phase: string;
  item: string;
  /** The calculation's figures as a line, with units. */
  figures: string;
  verdict: string;
  status: VerdictStatus;
  state: "submitted" | "countersigned";
}

export async function vesselJobsAndRecords(
  vesselId: number,
): Promise<{ jobs: VesselJob[]; records: VesselRecord[] }> {
  const jobs: {
    id: number;
    scope: string;
    status: string;
    engine_model: string;
    start_date: string | null;
  }[] = await db()("jobs")
    .where({ vessel_id: vesselId })
    .orderBy([
      { column: "start_date", order: "desc" },
      { column: "id", order: "desc" },
    ])
    // The day as stored, as text: a DATE read into a JavaScript Date would move with the server's zone.
    .select(
      "id",
      "scope",
      "status",
      "engine_model",
      db().raw("DATE_FORMAT(start_date, '%Y-%m-%d') as start_date"),
    );
  const records = jobs.length
    ? await db()("records")
        .whereIn(
          "job_id",
          jobs.map((j) => j.id),
        )
        .orderBy("issued_at", "desc")
        .select("id", "job_id", "issued_at")
    : [];
  return {
    jobs: jobs.map((j) => ({
      id: j.id,
      scope: j.scope,
      status: j.status,
      engineModel: j.engine_model,
      startDate: j.start_date ?? null,
    })),
    records: records.map((r) => ({
      id: r.id,
      jobId: r.job_id,
      issuedAt: new Date(r.issued_at).toISOString(),
    })),
  };
}

/**
 * The vessel's alignment and runout figures over the years, from checklists handed in for review
 * or countersigned (never from work in progress), newest first: what changed since last season,
 * on the hard, afloat and after the sea trial.
 */
export async function vesselFigures(vesselId: number): Promise<VesselFigure[]> {
  const checklists: { id: string; job_id: number; state: "submitted" | "countersigned"; body: string }[] =
    await db()("job_checklists as c")
      .join("jobs as j", "j.id", "c.job_id")
      .join("template_versions as t", "t.id", "c.template_version_id")
      .where("j.vessel_id", vesselId)
      .whereIn("c.state", ["submitted", "countersigned"])
      .select("c.id", "c.job_id", "c.state", "t.body");
  const figures: VesselFigure[] = [];
  for (const checklist of checklists) {
    const template = parseJsonColumn<Template>(checklist.body);
    const responses = await checklistResponses(checklist.id);
    const values = Object.fromEntries(Object.entries(responses).map(([key, r]) => [key, r.value]));
    const at = Object.values(responses).reduce((last, r) => (r.at > last ? r.at : last), "");
    const { verdicts } = progress(template, values);
    for (const section of template.sections)
      for (const item of section.items) {
        const verdict = verdicts[item.key];
        if (item.kind !== "calc" || !HISTORY_CALCS.has(item.calc) || !verdict?.outcome) continue;
        const { values: results, units } = verdict.outcome;
        figures.push({
          jobId: checklist.job_id,
          checklistId: checklist.id,
          at,
          phase: item.phase ? phaseLabels[item.phase] : "—",
          item: item.label,
          figures: Object.entries(results)
            .filter(([, v]) => typeof v === "number")
            .map(([name, v]) => `${name} ${formatNumber(v as number)}${units[name] ? ` ${units[name]}` : ""}`)
            .join(", "),
          verdict: verdictInWords(verdict.status),
          status: verdict.status,
          state: checklist.state,
        });
      }
  }
  return figures.sort((a, b) => (a.at < b.at ? 1 : a.at > b.at ? -1 : 0));
}
