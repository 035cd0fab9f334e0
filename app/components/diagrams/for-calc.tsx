import type { ReactElement } from "react";
import type {
  CalcInput,
  ClockGapsIn,
  CouplingFaceResult,
  CouplingRimResult,
  MountMovesResult,
  RunoutResult,
  SeaTrialLoadingResult,
} from "~/lib/calc";
import { convert, dimensionOf, type Unit } from "~/lib/calc";
import { CouplingFaceDiagram } from "./coupling-face-diagram";
import { MountMovesDiagram } from "./mount-moves-diagram";
import { RunoutDiagram } from "./runout-diagram";
import { SeaTrialDiagram, type SeaTrialPoint } from "./sea-trial-diagram";
import type { LengthUnit } from "./svg-kit";

type Inputs = Record<string, CalcInput | undefined>;

/** One number input in `unit`, or undefined when absent or not convertible. */
function numberIn(input: CalcInput | undefined, unit: Unit): number | undefined {
  if (input?.kind !== "number" || dimensionOf(input.unit) !== dimensionOf(unit)) return undefined;
  return convert(input.value, input.unit, unit);
}

/**
 * Top, bottom, port and starboard in inches from a four-cell grid (found by label) or four
 * numbers in that order: the same two shapes the registry accepts for face gaps.
 */
function clockIn(input: CalcInput | undefined): ClockGapsIn | undefined {
  if (!input || (input.kind !== "numbers" && input.kind !== "grid") || dimensionOf(input.unit) !== "length")
    return undefined;
  const inches = (v: number | null | undefined) =>
    typeof v === "number" && Number.isFinite(v) ? convert(v, input.unit, "in") : undefined;
  let cells: [string, number | undefined][];
  if (input.kind === "numbers") {
    if (input.values.length !== 4) return undefined;
    cells = ["top", "bottom", "port", "starboard"].map((label, i) => [label, inches(input.values[i])]);
  } else if (input.columns.length === 1) {
    cells = input.rows.map((label, i) => [label, inches(input.values[i]?.[0])]);
  } else if (input.rows.length === 1) {
    cells = input.columns.map((label, i) => [label, inches(input.values[0]?.[i])]);
  } else {
    return undefined;
  }
  const find = (pattern: RegExp) => cells.find(([label]) => pattern.test(label))?.[1];
  const gaps = {
    top: find(/top/i),
    bottom: find(/bottom/i),
    port: find(/port/i),
    starboard: find(/starboard|stbd/i),
  };
  return Object.values(gaps).every((v) => v !== undefined) ? (gaps as ClockGapsIn) : undefined;
}

const isObject = (detail: unknown): detail is Record<string, unknown> =>
  typeof detail === "object" && detail !== null;

export interface DiagramOptions {
  /** How lengths are written on the diagram (the library's results are in inches). */
  lengthUnit?: LengthUnit;
  /** Runs of a sea trial (engine rpm and speed) to plot on the loading diagram. */
  speedRuns?: SeaTrialPoint[];
}

/**
 * The diagram for a registry outcome, given the calculation's name, its `detail` and the inputs
 * it ran on, or null when the calculation has no diagram (or the inputs no longer fit it). Used
 * by the calculators and by a checklist's calc items.
 */
export function diagramFor(
  calcName: string,
  detail: unknown,
  inputs: Inputs,
  options: DiagramOptions = {},
): ReactElement | null {
  if (!isObject(detail)) return null;
  const { lengthUnit } = options;
  switch (calcName) {
    case "shaftRunout": {
      const limitTirIn = numberIn(inputs.limitTir, "in");
      const grid = inputs.readings?.kind === "grid" ? inputs.readings : undefined;
      if (limitTirIn === undefined) return null;
      return (
        <RunoutDiagram
          result={detail as unknown as RunoutResult}
          limitTirIn={limitTirIn}
          stationLabels={grid?.rows}
          angleLabels={grid?.columns}
          showPositions={inputs.positionsIn !== undefined}
          lengthUnit={lengthUnit}
        />
      );
    }
    case "couplingFace":
      return (
        <CouplingFaceDiagram
          gapsIn={clockIn(inputs.gaps)}
          diameterIn={numberIn(inputs.diameter, "in")}
          face={detail as unknown as CouplingFaceResult}
          lengthUnit={lengthUnit}
        />
      );
    case "couplingRim": {
      const rim = detail as unknown as CouplingRimResult;
      return (
        <CouplingFaceDiagram
          offset={{
            verticalIn: rim.verticalOffsetIn,
            horizontalIn: rim.horizontalOffsetIn,
            pass: rim.pass,
            limitIn: numberIn(inputs.maxOffset, "in"),
          }}
          lengthUnit={lengthUnit}
        />
      );
    }
    case "mountMoves": {
      const frontMountIn = numberIn(inputs.frontMount, "in");
      const rearMountIn = numberIn(inputs.rearMount, "in");
      if (frontMountIn === undefined || rearMountIn === undefined) return null;
      return (
        <MountMovesDiagram
          moves={detail as unknown as MountMovesResult}
          frontMountIn={frontMountIn}
          rearMountIn={rearMountIn}
          lengthUnit={lengthUnit}
        />
      );
    }
    case "seaTrialLoading":
      return (
        <SeaTrialDiagram
          ratedRpmMin={numberIn(inputs.ratedRpmMin, "rpm")}
          ratedRpmMax={numberIn(inputs.ratedRpmMax, "rpm")}
          wotRpm={numberIn(inputs.wotRpm, "rpm")}
          loading={detail as unknown as SeaTrialLoadingResult}
          points={options.speedRuns}
        />
      );
    case "propSlip": {
      const pitchIn = numberIn(inputs.pitch, "in");
      const gearRatio = numberIn(inputs.gearRatio, "1");
      const rpm = numberIn(inputs.engineRpm, "rpm");
      const knots = numberIn(inputs.speed, "kn");
      if (pitchIn === undefined || gearRatio === undefined || rpm === undefined || knots === undefined)
        return null;
      return <SeaTrialDiagram points={[{ rpm, knots }]} pitchLine={{ pitchIn, gearRatio }} />;
    }
    default:
      return null;
  }
}
