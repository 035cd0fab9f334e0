import { defineCalc } from "./define";
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
  /** The largest shaft reading: the tightest place decides the fit. */
  shaftIn: number;
  /** The smallest bore reading. */
  boreIn: number;
  /** The clearance wanted on the diameter; without it, the smallest allowed (or none). */
  targetClearanceIn?: number;
  /** Acceptance: least clearance allowed (negative = the interference a shrink fit needs). */
  minClearanceIn?: number;
  /** Acceptance: most clearance allowed (negative = the least interference). */
  maxClearanceIn?: number;
}

export interface CouplingFitResult {
  /** bore − shaft on the diameter (negative = interference). */
  clearanceIn: number;
  /** Material to take off the shaft diameter to reach the wanted clearance (0 if none). */
  removeFromShaftIn: number;
  /** Within the minimum and maximum clearance, when either was given. */
  pass?: boolean;
}

/**
 * Measured coupling fit: clearance = bore − shaft (both on the diameter, Machinery's Handbook
 * "Allowances and Tolerances for Fits"), taken at the tightest place: the largest shaft
 * reading against the smallest bore reading. Material to remove from the shaft diameter =
 * wanted clearance − clearance when positive (wanted = the target, else the minimum, else 0).
 * The verdict is the item's own acceptance rule: min ≤ clearance ≤ max.
 */
export function couplingFit(input: CouplingFitInput): CouplingFitResult {
  const shaftIn = requirePositive("shaftIn", input?.shaftIn);
  const boreIn = requirePositive("boreIn", input.boreIn);
  const optional = (field: keyof CouplingFitInput) =>
    input[field] === undefined ? undefined : requireFinite(field, input[field]);
  const min = optional("minClearanceIn");
  const max = optional("maxClearanceIn");
  if (min !== undefined && max !== undefined && min > max) {
    throw new CalcError("maxClearanceIn", "The maximum clearance is below the minimum.");
  }
  const target = optional("targetClearanceIn") ?? min ?? 0;
  const clearanceIn = tidy(boreIn - shaftIn);
  const pass =
    min === undefined && max === undefined
      ? undefined
      : (min === undefined || atLeast(clearanceIn, min)) && (max === undefined || atMost(clearanceIn, max));
  return requireFiniteResult("targetClearanceIn", {
    clearanceIn,
    removeFromShaftIn: tidy(Math.max(0, target - clearanceIn)),
    ...(pass !== undefined ? { pass } : {}),
  });
}

export const couplingFitCalc = defineCalc({
  name: "couplingFit",
  title: "Coupling fit on the shaft",
  summary:
    "Clearance (or interference) between the coupling bore and the shaft at the tightest place, against the item's limits, and what to take off the shaft.",
  source:
    "Clearance = bore − shaft, on the diameter (Machinery's Handbook, allowances and tolerances for fits); limits: the coupling maker's or the job's",
  inputs: {
    shaft: {
      label: "Shaft diameter readings (the largest is used)",
      accepts: ["number", "numbers", "grid"],
      unit: "in",
      field: "shaftIn",
    },
    bore: {
      label: "Coupling bore readings (the smallest is used)",
      accepts: ["number", "numbers", "grid"],
      unit: "in",
      field: "boreIn",
    },
    targetClearance: {
      label: "Clearance wanted",
      accepts: ["number"],
      unit: "in",
      optional: true,
      field: "targetClearanceIn",
    },
    minClearance: {
      label: "Least clearance allowed (negative = interference)",
      accepts: ["number"],
      unit: "in",
      optional: true,
      field: "minClearanceIn",
    },
    maxClearance: {
      label: "Most clearance allowed",
      accepts: ["number"],
      unit: "in",
      optional: true,
      field: "maxClearanceIn",
    },
  },
  run(read, show) {
    const min = read.number("minClearance", "in");
    const max = read.number("maxClearance", "in");
    const result = couplingFit({
      shaftIn: Math.max(...read.numbers("shaft", "in")!),
      boreIn: Math.min(...read.numbers("bore", "in")!),
      targetClearanceIn: read.number("targetClearance", "in"),
      minClearanceIn: min,
      maxClearanceIn: max,
    });
    const limit =
      min !== undefined && max !== undefined
        ? `clearance from ${show.q(min, "in")} to ${show.q(max, "in")}`
        : min !== undefined
          ? `clearance ≥ ${show.q(min, "in")}`
          : max !== undefined
            ? `clearance ≤ ${show.q(max, "in")}`
            : "no limit given";
    return {
      values: { clearance: result.clearanceIn, "remove from shaft": result.removeFromShaftIn },
      units: { clearance: "in", "remove from shaft": "in" },
      verdict: result.pass === undefined ? "info" : result.pass ? "pass" : "fail",
      primary: "clearance",
      rule: `${limit}; largest shaft reading against smallest bore reading, negative clearance is interference, material to remove is on the diameter`,
      detail: result,
    };
  },
});

export const isoFitCalc = defineCalc({
  name: "isoFit",
  title: "ISO 286 fit",
  summary: "Hole and shaft limits of an ISO fit, its kind, and measured parts against them.",
  source: "ISO 286-1:2010 and ISO 286-2:2010 tables",
  inputs: {
    nominal: { label: "Nominal size", accepts: ["number"], unit: "mm", field: "nominalMm" },
    hole: { label: "Hole class (e.g. H7)", accepts: ["text"], field: "hole" },
    shaft: { label: "Shaft class (e.g. k6)", accepts: ["text"], field: "shaft" },
    measuredBore: {
      label: "Measured bore",
      accepts: ["number"],
      unit: "mm",
      optional: true,
      field: "measuredBoreMm",
    },
    measuredShaft: {
      label: "Measured shaft",
      accepts: ["number"],
      unit: "mm",
      optional: true,
      field: "measuredShaftMm",
    },
  },
  run(read) {
    const result = fitCheck({
      nominalMm: read.number("nominal", "mm")!,
      hole: read.text("hole")!,
      shaft: read.text("shaft")!,
      measuredBoreMm: read.number("measuredBore", "mm"),
      measuredShaftMm: read.number("measuredShaft", "mm"),
    });
    const values: Record<string, number | string> = {
      "hole upper": result.hole.upperMm,
      "hole lower": result.hole.lowerMm,
      "shaft upper": result.shaft.upperMm,
      "shaft lower": result.shaft.lowerMm,
      fit: result.kind,
    };
    if (result.measuredClearanceMm !== undefined) values["measured clearance"] = result.measuredClearanceMm;
    return {
      values,
      units: {
        "hole upper": "mm",
        "hole lower": "mm",
        "shaft upper": "mm",
        "shaft lower": "mm",
        "measured clearance": "mm",
      },
      verdict: result.pass === undefined ? "info" : result.pass ? "pass" : "fail",
      rule: `measured parts within the ISO 286 limits of ${read.text("hole")}/${read.text("shaft")}`,
      detail: result,
    };
  },
});
