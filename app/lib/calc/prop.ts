import { CalcError, requireFiniteResult, requireNonNegative, requirePositive } from "./errors";
import { tidy } from "./numbers";

/** Inches in one international nautical mile (1852 m exactly, 1 in = 0.0254 m exactly). */
const IN_PER_NAUTICAL_MILE = 1852 / 0.0254;

export interface PropSlipInput {
  pitchIn: number;
  engineRpm: number;
  /** Reduction ratio of the gear, e.g. 2.5 for 2.5 : 1. */
  gearRatio: number;
  speedKnots: number;
}

export interface PropSlipResult {
  shaftRpm: number;
  theoreticalKnots: number;
  /** (theoretical − actual) ÷ theoretical × 100; negative means the speed reading is suspect. */
  slipPercent: number;
}

/**
 * Apparent propeller slip (Gerr, Propeller Handbook, apparent slip formula): shaft rpm =
 * engine rpm ÷ gear ratio; theoretical speed = pitch × shaft rpm × 60 ÷ inches per nautical
 * mile (≈ pitch × rpm ÷ 1215); slip = (theoretical − actual) ÷ theoretical.
 */
export function propSlip(input: PropSlipInput): PropSlipResult {
  const pitch = requirePositive("pitchIn", input?.pitchIn);
  const engineRpm = requirePositive("engineRpm", input.engineRpm);
  const ratio = requirePositive("gearRatio", input.gearRatio);
  const speed = requireNonNegative("speedKnots", input.speedKnots);
  const shaftRpm = engineRpm / ratio;
  const theoreticalKnots = (pitch * shaftRpm * 60) / IN_PER_NAUTICAL_MILE;
  return requireFiniteResult("pitchIn", {
    shaftRpm: tidy(shaftRpm),
    theoreticalKnots: tidy(theoreticalKnots),
    slipPercent: tidy(((theoreticalKnots - speed) / theoreticalKnots) * 100),
  });
}

/** Common practice for planing boats: one inch of pitch moves wide-open-throttle rpm by about 200. */
export const DEFAULT_RPM_PER_PITCH_IN = 200;

export type LoadingVerdict = "over-propped" | "in-range" | "under-propped";

export interface SeaTrialLoadingInput {
  wotRpm: number;
  ratedRpmMin: number;
  ratedRpmMax: number;
  rpmPerPitchIn?: number;
}

export interface SeaTrialLoadingResult {
  verdict: LoadingVerdict;
  /** Indicative: negative = less pitch. Aims at the middle of the rated band; 0 when in range. */
  pitchChangeIn: number;
  targetRpm: number;
}

/**
 * Propeller loading from the wide-open-throttle rpm of a loaded sea trial against the engine
 * maker's rated rpm band: below the band the engine cannot reach rated speed (over-propped, take
 * pitch out); above it the propeller is too light (under-propped, add pitch). The pitch change
 * is (WOT − mid-band) ÷ rpm per inch of pitch: an indication for the propeller shop, not a
 * substitute for its advice. Caution: sea trials need a second person at the helm or watch,
 * life jackets, and a plan for a stopped engine.
 */
export function seaTrialLoading(input: SeaTrialLoadingInput): SeaTrialLoadingResult {
  const wot = requirePositive("wotRpm", input?.wotRpm);
  const min = requirePositive("ratedRpmMin", input.ratedRpmMin);
  const max = requirePositive("ratedRpmMax", input.ratedRpmMax);
  if (max < min) throw new CalcError("ratedRpmMax", "The top of the rated band is below its bottom.");
  const perInch =
    input.rpmPerPitchIn === undefined
      ? DEFAULT_RPM_PER_PITCH_IN
      : requirePositive("rpmPerPitchIn", input.rpmPerPitchIn);
  const targetRpm = tidy((min + max) / 2);
  const verdict: LoadingVerdict = wot < min ? "over-propped" : wot > max ? "under-propped" : "in-range";
  const pitchChangeIn = verdict === "in-range" ? 0 : tidy((wot - targetRpm) / perInch);
  return requireFiniteResult("wotRpm", { verdict, pitchChangeIn, targetRpm });
}
