import { CalcError, requireFinite, requireFiniteResult, requirePositive } from "./errors";
import { atLeast, atMost, tidy } from "./numbers";

/*
 * ISO 286-1:2010 Table 1 (standard tolerance grades) and ISO 286-2:2010 Tables 2–17 (limit
 * deviations), for nominal sizes up to 500 mm. Values in micrometres. Rows are "over the
 * previous step, up to and including" the listed size.
 */
const STEPS_MM = [3, 6, 10, 18, 30, 50, 80, 120, 180, 250, 315, 400, 500];
/** Finer steps above 50 mm used by the r and s deviations. */
const FINE_STEPS_MM = [65, 80, 100, 120, 140, 160, 180, 200, 225, 250, 280, 315, 355, 400, 450, 500];

const IT_UM: Record<number, number[]> = {
  5: [4, 5, 6, 8, 9, 11, 13, 15, 18, 20, 23, 25, 27],
  6: [6, 8, 9, 11, 13, 16, 19, 22, 25, 29, 32, 36, 40],
  7: [10, 12, 15, 18, 21, 25, 30, 35, 40, 46, 52, 57, 63],
  8: [14, 18, 22, 27, 33, 39, 46, 54, 63, 72, 81, 89, 97],
  9: [25, 30, 36, 43, 52, 62, 74, 87, 100, 115, 130, 140, 155],
  10: [40, 48, 58, 70, 84, 100, 120, 140, 160, 185, 210, 230, 250],
  11: [60, 75, 90, 110, 130, 160, 190, 220, 250, 290, 320, 360, 400],
};

/** Upper deviations es of shafts f and g (negative), ISO 286-1 Table 2. */
const ES_UM: Record<"f" | "g", number[]> = {
  f: [-6, -10, -13, -16, -20, -25, -30, -36, -43, -50, -56, -62, -68],
  g: [-2, -4, -5, -6, -7, -9, -10, -12, -14, -15, -17, -18, -20],
};

/** Lower deviations ei of shafts k (grades 4–7), m, n and p, ISO 286-1 Table 3. */
const EI_UM: Record<"k" | "m" | "n" | "p", number[]> = {
  k: [0, 1, 1, 1, 2, 2, 2, 3, 3, 4, 4, 4, 5],
  m: [2, 4, 6, 7, 8, 9, 11, 13, 15, 17, 20, 21, 23],
  n: [4, 8, 10, 12, 15, 17, 20, 23, 27, 31, 34, 37, 40],
  p: [6, 12, 15, 18, 22, 26, 32, 37, 43, 50, 56, 62, 68],
};

/** Lower deviations ei of shafts r and s: six steps up to 50 mm, then the finer steps. */
const EI_FINE_UM: Record<"r" | "s", { upTo50: number[]; above50: number[] }> = {
  r: {
    upTo50: [10, 15, 19, 23, 28, 34],
    above50: [41, 43, 51, 54, 63, 65, 68, 77, 80, 84, 94, 98, 108, 114, 126, 132],
  },
  s: {
    upTo50: [14, 19, 23, 28, 35, 43],
    above50: [53, 59, 71, 79, 92, 100, 108, 122, 130, 140, 158, 170, 190, 208, 232, 252],
  },
};

const SHAFT_LETTERS = ["f", "g", "h", "js", "k", "m", "n", "p", "r", "s"] as const;
const HOLE_LETTERS = ["F", "G", "H", "JS"] as const;
type ShaftLetter = (typeof SHAFT_LETTERS)[number];
type HoleLetter = (typeof HOLE_LETTERS)[number];

function stepIndex(steps: number[], sizeMm: number): number {
  return steps.findIndex((upper) => sizeMm <= upper);
}

function parseClass(field: string, text: unknown, kind: "hole" | "shaft"): { letter: string; grade: number } {
  const match = typeof text === "string" ? /^\s*([A-Za-z]{1,2})\s*(\d{1,2})\s*$/.exec(text) : null;
  const example = kind === "hole" ? "H7" : "k6";
  if (!match) throw new CalcError(field, `Write the ${kind} class as a letter and a grade, e.g. ${example}.`);
  const [, letter, gradeText] = match;
  const grade = Number(gradeText);
  const letters: readonly string[] = kind === "hole" ? HOLE_LETTERS : SHAFT_LETTERS;
  if (!letters.includes(letter)) {
    const hint =
      kind === "hole" && (SHAFT_LETTERS as readonly string[]).includes(letter)
        ? " Hole classes are written in capitals, shaft classes in small letters."
        : kind === "shaft" && (HOLE_LETTERS as readonly string[]).includes(letter)
          ? " Shaft classes are written in small letters, hole classes in capitals."
          : "";
    throw new CalcError(
      field,
      `${text} is not a ${kind} class this library holds (${letters.join(", ")}).${hint}`,
    );
  }
  if (!(grade in IT_UM)) {
    throw new CalcError(field, `Grade ${grade} is outside the tolerance grades held here (IT5 to IT11).`);
  }
  return { letter, grade };
}

function requireTableSize(field: string, sizeMm: number): number {
  if (sizeMm > 500) {
    throw new CalcError(field, `${tidy(sizeMm)} mm is outside the ISO 286 tables held here (up to 500 mm).`);
  }
  return stepIndex(STEPS_MM, sizeMm);
}

/** js and JS: ±IT/2; for grades 7 to 11 an odd IT value is first rounded down to even (ISO 286-1). */
function halfIt(grade: number, it: number): number {
  return grade >= 7 && it % 2 === 1 ? (it - 1) / 2 : it / 2;
}

/** Shaft limit deviations in micrometres. */
function shaftDeviationsUm(letter: ShaftLetter, grade: number, sizeMm: number, row: number) {
  const it = IT_UM[grade][row];
  switch (letter) {
    case "f":
    case "g":
      return { upper: ES_UM[letter][row], lower: ES_UM[letter][row] - it };
    case "h":
      return { upper: 0, lower: -it };
    case "js":
      return { upper: halfIt(grade, it), lower: -halfIt(grade, it) };
    case "k": {
      const ei = grade >= 4 && grade <= 7 ? EI_UM.k[row] : 0;
      return { upper: ei + it, lower: ei };
    }
    case "m":
    case "n":
    case "p":
      return { upper: EI_UM[letter][row] + it, lower: EI_UM[letter][row] };
    case "r":
    case "s": {
      const table = EI_FINE_UM[letter];
      const ei = sizeMm <= 50 ? table.upTo50[row] : table.above50[stepIndex(FINE_STEPS_MM, sizeMm)];
      return { upper: ei + it, lower: ei };
    }
  }
}

/** Hole limit deviations: F, G, H mirror f, g, h (EI = −es); JS is ±IT/2. */
function holeDeviationsUm(letter: HoleLetter, grade: number, row: number) {
  const it = IT_UM[grade][row];
  switch (letter) {
    case "F":
    case "G":
      return {
        upper: -ES_UM[letter === "F" ? "f" : "g"][row] + it,
        lower: -ES_UM[letter === "F" ? "f" : "g"][row],
      };
    case "H":
      return { upper: it, lower: 0 };
    case "JS":
      return { upper: halfIt(grade, it), lower: -halfIt(grade, it) };
  }
}

export type FitKind = "clearance" | "transition" | "interference";

export interface IsoFitInput {
  nominalMm: number;
  hole: string;
  shaft: string;
}

export interface IsoFitResult {
  /** Deviations from the nominal size, in mm. */
  hole: { upperMm: number; lowerMm: number };
  shaft: { upperMm: number; lowerMm: number };
  /** Largest hole − smallest shaft (negative: the fit never has clearance). */
  maxClearanceMm: number;
  /** Largest shaft − smallest hole (negative: the least clearance of a clearance fit). */
  maxInterferenceMm: number;
  kind: FitKind;
}

/**
 * ISO 286 limits and fit for a hole class and a shaft class at one nominal size:
 * hole and shaft deviations from ISO 286-1/-2 (IT grade + fundamental deviation), then
 * max clearance = hole upper − shaft lower, max interference = shaft upper − hole lower.
 * A fit is clearance when the least clearance (hole lower − shaft upper) is ≥ 0, interference
 * when the max clearance is ≤ 0, transition otherwise.
 */
export function isoFit(input: IsoFitInput): IsoFitResult {
  const nominalMm = requirePositive("nominalMm", input?.nominalMm);
  const hole = parseClass("hole", input.hole, "hole");
  const shaft = parseClass("shaft", input.shaft, "shaft");
  const row = requireTableSize("nominalMm", nominalMm);
  const h = holeDeviationsUm(hole.letter as HoleLetter, hole.grade, row);
  const s = shaftDeviationsUm(shaft.letter as ShaftLetter, shaft.grade, nominalMm, row);
  const maxClearanceUm = h.upper - s.lower;
  const leastClearanceUm = h.lower - s.upper;
  const kind: FitKind =
    leastClearanceUm >= 0 ? "clearance" : maxClearanceUm <= 0 ? "interference" : "transition";
  const mm = (um: number) => tidy(um / 1000);
  return {
    hole: { upperMm: mm(h.upper), lowerMm: mm(h.lower) },
    shaft: { upperMm: mm(s.upper), lowerMm: mm(s.lower) },
    maxClearanceMm: mm(maxClearanceUm),
    maxInterferenceMm: mm(-leastClearanceUm),
    kind,
  };
}

export interface IsoFitInchResult {
  hole: { upperIn: number; lowerIn: number };
  shaft: { upperIn: number; lowerIn: number };
  maxClearanceIn: number;
  maxInterferenceIn: number;
  kind: FitKind;
  /** The metric nominal the tables were read at (1 in = 25.4 mm exactly). */
  nominalMm: number;
}

/** The same ISO 286 fit for a shop that measures in inches: nominal in, deviations in inches. */
export function isoFitIn(input: { nominalIn: number; hole: string; shaft: string }): IsoFitInchResult {
  const nominalIn = requirePositive("nominalIn", input?.nominalIn);
  const nominalMm = nominalIn * 25.4;
  if (nominalMm > 500) {
    throw new CalcError(
      "nominalIn",
      `${nominalIn} in is outside the ISO 286 tables held here (up to 500 mm, 19.68 in).`,
    );
  }
  const fit = isoFit({ nominalMm, hole: input.hole, shaft: input.shaft });
  const inch = (mm: number) => tidy(mm / 25.4);
  return {
    hole: { upperIn: inch(fit.hole.upperMm), lowerIn: inch(fit.hole.lowerMm) },
    shaft: { upperIn: inch(fit.shaft.upperMm), lowerIn: inch(fit.shaft.lowerMm) },
    maxClearanceIn: inch(fit.maxClearanceMm),
    maxInterferenceIn: inch(fit.maxInterferenceMm),
    kind: fit.kind,
    nominalMm: tidy(nominalMm),
  };
}

export interface FitCheckInput extends IsoFitInput {
  measuredBoreMm?: number;
  measuredShaftMm?: number;
}

export interface FitCheckResult extends IsoFitResult {
  boreWithinLimits?: boolean;
  shaftWithinLimits?: boolean;
  /** Measured bore − measured shaft, when both were measured (negative = interference). */
  measuredClearanceMm?: number;
  pass?: boolean;
}

/** Measured parts against the ISO 286 limits of the chosen fit. */
export function fitCheck(input: FitCheckInput): FitCheckResult {
  const fit = isoFit(input);
  const nominal = input.nominalMm;
  const out: FitCheckResult = { ...fit };
  const within = (value: number, dev: { upperMm: number; lowerMm: number }) =>
    atLeast(value, nominal + dev.lowerMm) && atMost(value, nominal + dev.upperMm);
  if (input.measuredBoreMm !== undefined) {
    out.boreWithinLimits = within(requirePositive("measuredBoreMm", input.measuredBoreMm), fit.hole);
  }
  if (input.measuredShaftMm !== undefined) {
    out.shaftWithinLimits = within(requirePositive("measuredShaftMm", input.measuredShaftMm), fit.shaft);
  }
  if (input.measuredBoreMm !== undefined && input.measuredShaftMm !== undefined) {
    out.measuredClearanceMm = tidy(input.measuredBoreMm - input.measuredShaftMm);
  }
  if (out.boreWithinLimits !== undefined || out.shaftWithinLimits !== undefined) {
    out.pass = out.boreWithinLimits !== false && out.shaftWithinLimits !== false;
  }
  return out;
}

export interface CouplingFitInput {
  shaftIn: number;
  boreIn: number;
  /** The clearance wanted on the diameter; without it, only interference is machined away. */
  targetClearanceIn?: number;
}

export interface CouplingFitResult {
  /** bore − shaft on the diameter (negative = interference). */
  clearanceIn: number;
  /** Material to take off the shaft diameter to reach the wanted clearance (0 if none). */
  removeFromShaftIn: number;
}

/**
 * Measured coupling fit: clearance = bore − shaft (both on the diameter, Machinery's Handbook
 * "Allowances and Tolerances for Fits"); material to remove from the shaft diameter =
 * target clearance − clearance when positive.
 */
export function couplingFit(input: CouplingFitInput): CouplingFitResult {
  const shaftIn = requirePositive("shaftIn", input?.shaftIn);
  const boreIn = requirePositive("boreIn", input.boreIn);
  const target =
    input.targetClearanceIn === undefined ? 0 : requireFinite("targetClearanceIn", input.targetClearanceIn);
  const clearanceIn = tidy(boreIn - shaftIn);
  return requireFiniteResult("targetClearanceIn", {
    clearanceIn,
    removeFromShaftIn: tidy(Math.max(0, target - clearanceIn)),
  });
}
