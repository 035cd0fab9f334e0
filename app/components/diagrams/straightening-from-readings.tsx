import { convert, shaftRunout, straighteningHistory, type StraighteningResult, type Unit } from "~/lib/calc";
import { StraighteningDiagram } from "./straightening-diagram";
import type { LengthUnit } from "./svg-kit";

/** One attempt of a runout readings item: a full set of dial readings (stations × angles). */
export interface RunoutAttempt {
  cells: (number | null)[][];
  unit: Unit;
}

/**
 * The straightening history of a runout readings item: the worst-station TIR of each complete
 * set of readings, in order, against the limit. Incomplete sets are left out. Undefined when
 * fewer than two sets are complete (one set is a reading, not a history).
 */
export function straighteningFromReadings(
  attempts: RunoutAttempt[],
  limitTirIn: number,
): { history: StraighteningResult; attempt: number[] } | undefined {
  const complete = attempts.flatMap((attempt, index) =>
    attempt.cells.length > 0 &&
    attempt.cells.every((row) => row.length > 0 && row.every((c) => typeof c === "number"))
      ? [{ attempt, index }]
      : [],
  );
  if (complete.length < 2) return undefined;
  const tirs = complete.map(
    ({ attempt }) =>
      shaftRunout({
        stations: attempt.cells.map((row, i) => ({
          positionIn: i,
          readingsIn: row.map((cell) => convert(cell as number, attempt.unit, "in")),
        })),
        limitTirIn,
      }).maxTirIn,
  );
  return {
    history: straighteningHistory({ attemptsTirIn: tirs, limitTirIn }),
    attempt: complete.map(({ index }) => index),
  };
}

/**
 * The straightening history drawn from a checklist's runout readings (every set of readings the
 * item keeps): the worst TIR after each attempt coming down to the limit. Used on the fill
 * screen, the review and the record through the calc item's diagram.
 */
export function StraighteningFromReadings({
  attempts,
  limitTirIn,
  lengthUnit,
}: {
  attempts: RunoutAttempt[];
  limitTirIn: number;
  lengthUnit?: LengthUnit;
}) {
  const found = straighteningFromReadings(attempts, limitTirIn);
  if (!found) return null;
  const labels = found.attempt.map((index, i) => (i === 0 ? "As found" : `Set ${index + 1}`));
  return (
    <StraighteningDiagram
      history={found.history}
      limitTirIn={limitTirIn}
      attemptLabels={labels}
      lengthUnit={lengthUnit ?? (attempts[0]?.unit === "mm" ? "mm" : "in")}
    />
  );
}
