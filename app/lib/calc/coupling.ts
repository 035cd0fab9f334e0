import { CAUTION_ROTATING, defineCalc, type CalcInputSpec } from "./define";
import { CalcError, requireFinite, requireFiniteResult, requireNonNegative, requirePositive } from "./errors";
import { atMost, tidy } from "./numbers";

/** Feeler-gauge gaps between the coupling faces at four clock positions, seen from aft. */
export interface ClockGapsIn {
  top: number;
  bottom: number;
  port: number;
  starboard: number;
}

export function readGaps(field: string, gaps: ClockGapsIn | undefined, allowNegative = false): ClockGapsIn {
  if (!gaps || typeof gaps !== "object") {
    throw new CalcError(field, "Enter the gaps at top, bottom, port and starboard.");
  }
  const read = allowNegative ? requireFinite : requireNonNegative;
  return {
    top: read(`${field}.top`, gaps.top),
    bottom: read(`${field}.bottom`, gaps.bottom),
    port: read(`${field}.port`, gaps.port),
    starboard: read(`${field}.starboard`, gaps.starboard),
  };
}

/**
 * The face gaps at each clock position: the 0° set, or the mean of the 0° and 180° sets when
 * both were read. Readings at the same place in space with the coupling turned half a turn:
 * the faces' own wobble adds to one and takes from the other, so the mean is the misalignment
 * alone (Carrier 17/19EX Start-Up, Operation and Maintenance Instructions, coupling alignment,
 * p. 212: readings repeated after half a turn, "add the two amounts and then divide by two to
 * get the actual or net misalignment").
 */
export function faceGaps(gapsIn: ClockGapsIn | undefined, gapsIn180?: ClockGapsIn): ClockGapsIn {
  const first = readGaps("gapsIn", gapsIn);
  if (gapsIn180 === undefined) return first;
  const turned = readGaps("gapsIn180", gapsIn180);
  const mean = (a: number, b: number) => tidy((a + b) / 2);
  return {
    top: mean(first.top, turned.top),
    bottom: mean(first.bottom, turned.bottom),
    port: mean(first.port, turned.port),
    starboard: mean(first.starboard, turned.starboard),
  };
}

/** Common practice: face gap difference of at most 0.001 in per inch of coupling diameter. */
export const DEFAULT_MAX_IN_PER_IN_DIAMETER = 0.001;

export interface CouplingFaceInput {
  diameterIn: number;
  /** Gaps with the shaft at its first position (0°). */
  gapsIn: ClockGapsIn;
  /**
   * The same four gaps after turning both halves together 180°: averaged with the first set, so
   * a face that is not square to its own bore (face runout) cancels out.
   */
  gapsIn180?: ClockGapsIn;
  /** Largest allowed gap difference, top to bottom and side to side. */
  maxGapDiffIn?: number;
  /** Largest allowed gap difference per inch of coupling diameter. */
  maxInPerInDiameter?: number;
}

export interface CouplingFaceResult {
  /** top − bottom: positive means the faces open at the top (the engine's nose is low). */
  verticalGapDiffIn: number;
  /** starboard − port: positive means the faces open to starboard (the nose points to port). */
  horizontalGapDiffIn: number;
  /** Gap difference ÷ diameter: the angle between the faces in radians (small-angle). */
  verticalSlope: number;
  horizontalSlope: number;
  /** The slope limit applied (the common-practice default when no limit was given). */
  limitInPerInDiameter?: number;
  limitGapDiffIn?: number;
  pass: boolean;
}

/**
 * Coupling face angularity from feeler gaps at top, bottom, port and starboard (the
 * straightedge-and-feeler method of millwright alignment practice): the faces' included angle is
 * the gap difference across the diameter divided by that diameter (similar triangles). The
 * verdict checks every limit given; with none, 0.001 in per inch of diameter (common practice;
 * the engine maker's figure governs where it gives one).
 */
export function couplingFace(input: CouplingFaceInput): CouplingFaceResult {
  const diameterIn = requirePositive("diameterIn", input?.diameterIn);
  const gaps = faceGaps(input.gapsIn, input.gapsIn180);
  const maxGapDiffIn =
    input.maxGapDiffIn === undefined ? undefined : requireNonNegative("maxGapDiffIn", input.maxGapDiffIn);
  let limitInPerInDiameter =
    input.maxInPerInDiameter === undefined
      ? undefined
      : requireNonNegative("maxInPerInDiameter", input.maxInPerInDiameter);
  if (maxGapDiffIn === undefined && limitInPerInDiameter === undefined) {
    limitInPerInDiameter = DEFAULT_MAX_IN_PER_IN_DIAMETER;
  }
  const verticalGapDiffIn = tidy(gaps.top - gaps.bottom);
  const horizontalGapDiffIn = tidy(gaps.starboard - gaps.port);
  const verticalSlope = tidy(verticalGapDiffIn / diameterIn);
  const horizontalSlope = tidy(horizontalGapDiffIn / diameterIn);
  let pass = true;
  if (maxGapDiffIn !== undefined) {
    pass &&=
      atMost(Math.abs(verticalGapDiffIn), maxGapDiffIn) &&
      atMost(Math.abs(horizontalGapDiffIn), maxGapDiffIn);
  }
  if (limitInPerInDiameter !== undefined) {
    pass &&=
      atMost(Math.abs(verticalSlope), limitInPerInDiameter) &&
      atMost(Math.abs(horizontalSlope), limitInPerInDiameter);
  }
  return requireFiniteResult("diameterIn", {
    verticalGapDiffIn,
    horizontalGapDiffIn,
    verticalSlope,
    horizontalSlope,
    ...(limitInPerInDiameter !== undefined ? { limitInPerInDiameter } : {}),
    ...(maxGapDiffIn !== undefined ? { limitGapDiffIn: maxGapDiffIn } : {}),
    pass,
  });
}

export interface CouplingRimInput {
  /**
   * Dial readings on the rim of the engine-side half, with the dial clamped to the shaft-side
   * half and both halves turned together; the reading rises as the plunger is pushed in.
   * The dial may be zeroed at any position.
   */
  readingsIn: ClockGapsIn;
  maxOffsetIn?: number;
}

export interface CouplingRimResult {
  /** How far the engine-side centre sits above the shaft-side centre (negative = below). */
  verticalOffsetIn: number;
  /** How far the engine-side centre sits to starboard (negative = to port). */
  horizontalOffsetIn: number;
  /**
   * top + bottom − (port + starboard): near zero for a sound set of readings (the rim
   * validity check of millwright practice); a large value means a slipped or sagging dial.
   */
  validityIn: number;
  pass?: boolean;
}

/**
 * Centre offset from rim readings: the dial sweeps a circle around the shaft-side centre, so
 * opposite readings differ by twice the offset — offset = (top − bottom) / 2 vertically and
 * (starboard − port) / 2 sideways (the "divide the TIR by two" rule of rim-and-face alignment).
 */
export function couplingRim(input: CouplingRimInput): CouplingRimResult {
  const r = readGaps("readingsIn", input?.readingsIn, true);
  const maxOffsetIn =
    input.maxOffsetIn === undefined ? undefined : requireNonNegative("maxOffsetIn", input.maxOffsetIn);
  const verticalOffsetIn = tidy((r.top - r.bottom) / 2);
  const horizontalOffsetIn = tidy((r.starboard - r.port) / 2);
  return requireFiniteResult("readingsIn", {
    verticalOffsetIn,
    horizontalOffsetIn,
    validityIn: tidy(r.top + r.bottom - r.port - r.starboard),
    ...(maxOffsetIn !== undefined
      ? {
          pass:
            atMost(Math.abs(verticalOffsetIn), maxOffsetIn) &&
            atMost(Math.abs(horizontalOffsetIn), maxOffsetIn),
        }
      : {}),
  });
}

const diameterInput = {
  label: "Coupling diameter",
  accepts: ["number"],
  unit: "in",
  field: "diameterIn",
} as const satisfies CalcInputSpec;
const gapsInput = {
  label: "Face gaps (top, bottom, port, starboard)",
  accepts: ["grid", "numbers"],
  unit: "in",
  field: "gapsIn",
  clock: true,
} as const satisfies CalcInputSpec;
const gaps180Input = {
  label: "Face gaps with the shaft turned 180°",
  accepts: ["grid", "numbers"],
  unit: "in",
  optional: true,
  field: "gapsIn180",
  clock: true,
} as const satisfies CalcInputSpec;
/** Shared with the mount moves, which start from the same face readings. */
export const faceReadingInputs = { diameter: diameterInput, gaps: gapsInput, gaps180: gaps180Input };

export const couplingFaceCalc = defineCalc({
  name: "couplingFace",
  title: "Coupling face gaps",
  summary:
    "Angularity between the coupling faces from feeler gaps at four clock positions (seen from aft), at 0° and 180° of shaft rotation.",
  source:
    "Gap difference ÷ coupling diameter (straightedge-and-feeler alignment); 0.001 in per inch of diameter common practice",
  caution: CAUTION_ROTATING,
  inputs: {
    ...faceReadingInputs,
    maxGapDiff: {
      label: "Largest gap difference",
      accepts: ["number"],
      unit: "in",
      optional: true,
      field: "maxGapDiffIn",
    },
    maxInPerInDiameter: {
      label: "Largest gap difference per inch of diameter",
      accepts: ["number"],
      unit: "in/in",
      optional: true,
      field: "maxInPerInDiameter",
    },
  },
  run(read, show) {
    const result = couplingFace({
      diameterIn: read.number("diameter", "in")!,
      gapsIn: read.clock("gaps", "in")!,
      gapsIn180: read.clock("gaps180", "in"),
      maxGapDiffIn: read.number("maxGapDiff", "in"),
      maxInPerInDiameter: read.number("maxInPerInDiameter", "in/in"),
    });
    const limits = [
      result.limitGapDiffIn !== undefined ? `gap difference ≤ ${show.q(result.limitGapDiffIn, "in")}` : "",
      result.limitInPerInDiameter !== undefined
        ? show.system === "metric"
          ? `≤ ${show.q(result.limitInPerInDiameter, "in/in")} of diameter`
          : `≤ ${show.q(result.limitInPerInDiameter, "in")} per inch of diameter`
        : "",
    ].filter(Boolean);
    return {
      values: {
        "top − bottom": result.verticalGapDiffIn,
        "starboard − port": result.horizontalGapDiffIn,
        "vertical slope": result.verticalSlope,
        "horizontal slope": result.horizontalSlope,
      },
      units: {
        "top − bottom": "in",
        "starboard − port": "in",
        "vertical slope": "in/in",
        "horizontal slope": "in/in",
      },
      verdict: result.pass ? "pass" : "fail",
      primary: "top − bottom",
      rule: `face gaps, top to bottom and side to side${read.clock("gaps180", "in") ? " (mean of 0° and 180°)" : ""}: ${limits.join(" and ")}`,
      detail: result,
    };
  },
});

export const couplingRimCalc = defineCalc({
  name: "couplingRim",
  title: "Coupling rim offset",
  summary:
    "How far the engine-side coupling centre sits from the shaft-side centre, from rim readings taken with the spigot just clear.",
  source: "Offset = difference of opposite rim readings ÷ 2 (rim-and-face alignment)",
  caution: CAUTION_ROTATING,
  inputs: {
    rim: {
      label: "Rim readings (top, bottom, port, starboard)",
      accepts: ["grid", "numbers"],
      unit: "in",
      field: "readingsIn",
      clock: true,
    },
    maxOffset: {
      label: "Largest centre offset",
      accepts: ["number"],
      unit: "in",
      optional: true,
      field: "maxOffsetIn",
    },
  },
  run(read, show) {
    const maxOffsetIn = read.number("maxOffset", "in");
    const result = couplingRim({ readingsIn: read.clock("rim", "in")!, maxOffsetIn });
    return {
      values: {
        "offset up": result.verticalOffsetIn,
        "offset to starboard": result.horizontalOffsetIn,
        "validity check": result.validityIn,
      },
      units: { "offset up": "in", "offset to starboard": "in", "validity check": "in" },
      verdict: result.pass === undefined ? "info" : result.pass ? "pass" : "fail",
      primary: "offset up",
      rule:
        maxOffsetIn !== undefined
          ? `centre offset ≤ ${show.q(maxOffsetIn, "in")} each way`
          : "offset only; no limit given",
      detail: result,
    };
  },
});
