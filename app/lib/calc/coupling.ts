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

/** Common practice: face gap difference of at most 0.001 in per inch of coupling diameter. */
export const DEFAULT_MAX_IN_PER_IN_DIAMETER = 0.001;

export interface CouplingFaceInput {
  diameterIn: number;
  gapsIn: ClockGapsIn;
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
  const gaps = readGaps("gapsIn", input.gapsIn);
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
