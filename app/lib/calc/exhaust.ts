import { CAUTION_EXHAUST, defineCalc } from "./define";
import { requireFinite, requireFiniteResult, requireNonNegative, requirePositive } from "./errors";
import { atLeast, atMost, tidy } from "./numbers";
import { convert, type Unit } from "./units";

/**
 * Common practice (engine makers' installation manuals typically ask for at least this; many
 * ask more for sailing boats that heel): water injection point 6 in above the waterline.
 */
export const DEFAULT_MIN_INJECTION_HEIGHT_IN = 6;

export interface ExhaustInjectionResult {
  minimumIn: number;
  /** Height above the minimum (negative = below it). */
  marginIn: number;
  pass: boolean;
}

/**
 * Wet-exhaust injection height: where cooling water enters the exhaust must sit high enough
 * above the loaded waterline that sea water cannot run back into the engine (Gerr, Boat
 * Mechanical Systems Handbook, exhaust chapter; ABYC P-1). The engine maker's figure governs.
 * Caution: exhaust leaks give off carbon monoxide; a working CO alarm belongs aboard.
 */
export function exhaustInjection(input: {
  injectionHeightIn: number;
  minimumIn?: number;
}): ExhaustInjectionResult {
  const height = requireFinite("injectionHeightIn", input?.injectionHeightIn);
  const minimumIn =
    input.minimumIn === undefined
      ? DEFAULT_MIN_INJECTION_HEIGHT_IN
      : requireNonNegative("minimumIn", input.minimumIn);
  return requireFiniteResult("injectionHeightIn", {
    minimumIn,
    marginIn: tidy(height - minimumIn),
    pass: atLeast(height, minimumIn),
  });
}

export interface ExhaustBackPressureResult {
  backPressureKPa: number;
  backPressureInHg: number;
  backPressureInH2O: number;
  backPressurePsi: number;
  percentOfLimit: number;
  pass: boolean;
}

/**
 * Exhaust back pressure at full load against the engine maker's limit, given in any of the
 * units makers use (NIST SP 811 conventional inHg and inH₂O). Too much back pressure costs
 * power and raises exhaust temperature. Caution: carbon monoxide, as above.
 */
export function exhaustBackPressure(input: {
  backPressureKPa: number;
  limitKPa: number;
}): ExhaustBackPressureResult {
  const kPa = requireNonNegative("backPressureKPa", input?.backPressureKPa);
  const limit = requirePositive("limitKPa", input.limitKPa);
  return requireFiniteResult("backPressureKPa", {
    backPressureKPa: kPa,
    backPressureInHg: tidy(convert(kPa, "kPa", "inHg")),
    backPressureInH2O: tidy(convert(kPa, "kPa", "inH2O")),
    backPressurePsi: tidy(convert(kPa, "kPa", "psi")),
    percentOfLimit: tidy((kPa / limit) * 100),
    pass: atMost(kPa, limit),
  });
}

export const exhaustInjectionCalc = defineCalc({
  name: "exhaustInjection",
  title: "Exhaust water-injection height",
  summary: "Height of the water injection point above the waterline against the minimum.",
  source:
    "Engine maker's installation instructions; 6 in common practice (ABYC P-1, Gerr, Boat Mechanical Systems Handbook)",
  caution: CAUTION_EXHAUST,
  inputs: {
    injectionHeight: {
      label: "Injection point above the waterline",
      accepts: ["number"],
      unit: "in",
      field: "injectionHeightIn",
    },
    minimumHeight: {
      label: "Minimum height",
      accepts: ["number"],
      unit: "in",
      optional: true,
      field: "minimumIn",
    },
  },
  run(read, show) {
    const result = exhaustInjection({
      injectionHeightIn: read.number("injectionHeight", "in")!,
      minimumIn: read.number("minimumHeight", "in"),
    });
    return {
      values: { margin: result.marginIn },
      units: { margin: "in" },
      verdict: result.pass ? "pass" : "fail",
      primary: "margin",
      rule: `injection point at least ${show.q(result.minimumIn, "in")} above the waterline`,
      detail: result,
    };
  },
});

const PRESSURE_UNITS: Unit[] = ["kPa", "psi", "bar", "mbar", "inHg", "inH2O", "mmH2O"];

export const exhaustBackPressureCalc = defineCalc({
  name: "exhaustBackPressure",
  title: "Exhaust back pressure",
  summary:
    "Back pressure measured under way at full throttle and rated rpm, once steady, against the engine maker's limit, in the maker's unit.",
  source: "Engine maker's limit; unit factors from NIST SP 811",
  caution: CAUTION_EXHAUST,
  inputs: {
    backPressure: {
      label: "Back pressure at full throttle and rated rpm, under way",
      accepts: ["number"],
      unit: "kPa",
      field: "backPressureKPa",
    },
    limit: { label: "Engine maker's limit", accepts: ["number"], unit: "kPa", field: "limitKPa" },
  },
  run(read, show) {
    const limitKPa = read.number("limit", "kPa")!;
    const result = exhaustBackPressure({ backPressureKPa: read.number("backPressure", "kPa")!, limitKPa });
    // The maker's unit is the one the limit was given in; the reading is shown in it too.
    const given = read.unitOf("limit");
    const unit: Unit = given && PRESSURE_UNITS.includes(given) ? given : "kPa";
    const values: Record<string, number> = {
      "back pressure": convert(result.backPressureKPa, "kPa", unit),
      "of limit": result.percentOfLimit,
    };
    const units: Record<string, string> = { "back pressure": unit, "of limit": "%" };
    for (const other of ["kPa", "inHg"] as const) {
      if (other === unit) continue;
      values[`in ${other}`] = convert(result.backPressureKPa, "kPa", other);
      units[`in ${other}`] = other;
    }
    return {
      values,
      units,
      verdict: result.pass ? "pass" : "fail",
      primary: "back pressure",
      rule: `back pressure ≤ ${show.q(convert(limitKPa, "kPa", unit), unit)}, under way at full throttle and rated rpm`,
      detail: result,
    };
  },
});
