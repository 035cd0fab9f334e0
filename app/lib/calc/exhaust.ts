import { requireFinite, requireFiniteResult, requireNonNegative, requirePositive } from "./errors";
import { atLeast, atMost, tidy } from "./numbers";
import { convert } from "./units";

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
