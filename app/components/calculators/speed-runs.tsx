import type { SeaTrialPoint } from "~/components/diagrams";
import { readDecimal } from "~/lib/read-number";

export interface SpeedRun {
  rpm: string;
  knots: string;
}

/** The runs that can be drawn: both numbers present and positive. */
export function plottableRuns(runs: SpeedRun[]): SeaTrialPoint[] {
  return runs.flatMap((run) => {
    const rpm = readDecimal(run.rpm);
    const knots = readDecimal(run.knots);
    return typeof rpm === "number" && typeof knots === "number" && rpm > 0 && knots >= 0
      ? [{ rpm, knots }]
      : [];
  });
}

/** Engine rpm and speed at a few throttle settings, for the rpm-against-speed diagram. */
export function SpeedRuns({ runs, onChange }: { runs: SpeedRun[]; onChange(runs: SpeedRun[]): void }) {
  const set = (i: number, field: keyof SpeedRun, text: string) =>
    onChange(runs.map((run, j) => (j === i ? { ...run, [field]: text } : run)));
  return (
    <fieldset className="flex flex-col gap-2">
      <legend className="font-bold">Runs at other throttle settings (optional, for the diagram)</legend>
      <p className="text-sm text-ink-soft">
        Engine rpm and speed through the water; average two runs in opposite directions (common practice).
      </p>
      <table className="border-collapse">
        <thead>
          <tr>
            <th scope="col" className="p-1 text-left text-sm">
              Run
            </th>
            <th scope="col" className="p-1 text-left text-sm">
              Engine rpm
            </th>
            <th scope="col" className="p-1 text-left text-sm">
              Speed (kn)
            </th>
          </tr>
        </thead>
        <tbody>
          {runs.map((run, i) => (
            <tr key={i}>
              <th scope="row" className="p-1 pr-2 text-left text-sm">
                {i + 1}
              </th>
              <td className="p-1">
                <input
                  inputMode="decimal"
                  autoComplete="off"
                  className="field-input num w-28"
                  aria-label={`Run ${i + 1}: engine rpm`}
                  value={run.rpm}
                  onChange={(e) => set(i, "rpm", e.target.value)}
                />
              </td>
              <td className="p-1">
                <input
                  inputMode="decimal"
                  autoComplete="off"
                  className="field-input num w-28"
                  aria-label={`Run ${i + 1}: speed (kn)`}
                  value={run.knots}
                  onChange={(e) => set(i, "knots", e.target.value)}
                />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn" onClick={() => onChange([...runs, { rpm: "", knots: "" }])}>
          Add a run
        </button>
        <button
          type="button"
          className="btn"
          disabled={runs.length <= 1}
          onClick={() => onChange(runs.slice(0, -1))}
        >
          Remove the last run
        </button>
      </div>
    </fieldset>
  );
}
