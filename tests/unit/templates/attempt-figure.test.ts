import { describe, expect, it } from "vitest";
import { attemptFigure } from "~/components/checklist/attempt-figure";
import { calculations } from "~/lib/calc/registry";
import type { MeasureItem, ReadingsItem } from "~/lib/templates";
import { itemOf, loadLibrary } from "./fixtures";

/** Issue 15 §1: straightening attempts show as one TIR per attempt with its verdict, not rows of raw numbers. */
describe("one figure per attempt", () => {
  const shaft = loadLibrary().find((t) => t.key === "propeller-shaft-and-coupling" && t.version === 1)!;
  const readings = itemOf(shaft, "runout-readings") as ReadingsItem;
  const set = (cells: number[][]) => ({ cells, unit: "in" as const, at: "2026-05-01T09:00:00Z", by: "T" });

  it("gives a set of runout readings its worst-station TIR and the runout calculation's verdict", () => {
    // TIR = highest − lowest reading over one turn (ASME Y14.5 full indicator movement). Worst
    // station: 0.004 − (−0.002) = 0.006 in, over the template's 0.003 in (common practice).
    const bowed = set([
      [0, 0.001, 0.002, 0.001],
      [0, 0.002, 0.003, 0.001],
      [0, 0.003, 0.004, -0.002],
      [0, 0.002, 0.002, 0.001],
      [0, 0.001, 0.001, 0],
    ]);
    const out = attemptFigure(readings, bowed, shaft, {}, calculations);
    expect(out.figure).toMatch(/TIR.*0\.006 in/);
    expect(out.verdict.status).toBe("out-of-range");
    // Straightened: worst 0.003 − 0 = 0.003 in, at the limit: within.
    const straight = set(bowed.cells.map((row, r) => (r === 2 ? [0, 0.003, 0.001, 0.002] : row)));
    const within = attemptFigure(readings, straight, shaft, {}, calculations);
    expect(within.figure).toMatch(/TIR.*0\.003 in/);
    expect(within.verdict.status).toBe("ok");
  });

  it("gives a measure attempt its value and the rule's verdict", () => {
    const face = itemOf(shaft, "face-runout") as MeasureItem;
    const attempt = { value: 0.0016, unit: "in" as const, at: "2026-05-01T09:00:00Z", by: "T" };
    expect(attemptFigure(face, attempt, shaft, {}, calculations)).toMatchObject({
      figure: "0.0016 in",
      verdict: { status: "out-of-range" },
    });
  });
});
