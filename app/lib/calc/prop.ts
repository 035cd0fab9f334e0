import { CAUTION_SEA_TRIAL, defineCalc } from "./define";
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

export const propSlipCalc = defineCalc({
  name: "propSlip",
  title: "Propeller slip",
  summary: "Shaft rpm, theoretical speed from pitch, and apparent slip.",
  source: "Gerr, Propeller Handbook, apparent slip",
  caution: CAUTION_SEA_TRIAL,
  inputs: {
    pitch: { label: "Propeller pitch", accepts: ["number"], unit: "in", field: "pitchIn" },
    engineRpm: { label: "Engine rpm", accepts: ["number"], unit: "rpm", field: "engineRpm" },
    gearRatio: {
      label: "Gear ratio (e.g. 2.5 for 2.5 : 1)",
      accepts: ["number"],
      unit: "1",
      field: "gearRatio",
    },
    speed: { label: "Speed through the water", accepts: ["number"], unit: "kn", field: "speedKnots" },
  },
  run(read) {
    const result = propSlip({
      pitchIn: read.number("pitch", "in")!,
      engineRpm: read.number("engineRpm", "rpm")!,
      gearRatio: read.number("gearRatio", "1")!,
      speedKnots: read.number("speed", "kn")!,
    });
    return {
      values: {
        "shaft rpm": result.shaftRpm,
        "theoretical speed": result.theoreticalKnots,
        slip: result.slipPercent,
      },
      units: { "shaft rpm": "rpm", "theoretical speed": "kn", slip: "%" },
      verdict: "info",
      rule: "slip = (pitch speed − actual speed) ÷ pitch speed",
      detail: result,
    };
  },
});

export const seaTrialLoadingCalc = defineCalc({
  name: "seaTrialLoading",
  title: "Sea-trial propeller loading",
  summary:
    "Whether the engine reaches its rated rpm band at wide-open throttle, and an indicative pitch change.",
  source:
    "Engine maker's rated rpm band; about 200 rpm per inch of pitch for planing boats, common practice (a displacement hull changes less per inch)",
  caution: CAUTION_SEA_TRIAL,
  inputs: {
    wotRpm: { label: "Wide-open-throttle rpm", accepts: ["number"], unit: "rpm", field: "wotRpm" },
    ratedRpmMin: { label: "Rated band, lowest rpm", accepts: ["number"], unit: "rpm", field: "ratedRpmMin" },
    ratedRpmMax: { label: "Rated band, highest rpm", accepts: ["number"], unit: "rpm", field: "ratedRpmMax" },
    rpmPerPitchIn: {
      label: "Rpm change per inch of pitch (about 200 for a planing boat)",
      accepts: ["number"],
      unit: "rpm",
      optional: true,
      field: "rpmPerPitchIn",
    },
  },
  run(read, show) {
    const min = read.number("ratedRpmMin", "rpm")!;
    const max = read.number("ratedRpmMax", "rpm")!;
    const perInch = read.number("rpmPerPitchIn", "rpm");
    const result = seaTrialLoading({
      wotRpm: read.number("wotRpm", "rpm")!,
      ratedRpmMin: min,
      ratedRpmMax: max,
      rpmPerPitchIn: perInch,
    });
    const words: Record<LoadingVerdict, string> = {
      "over-propped": "over-propped (rpm below the band)",
      "in-range": "within the rated band",
      "under-propped": "under-propped (rpm above the band)",
    };
    return {
      values: { loading: words[result.verdict], "pitch change": result.pitchChangeIn },
      units: { "pitch change": "in" },
      verdict: result.verdict === "in-range" ? "pass" : "fail",
      primary: "loading",
      rule: `wide-open-throttle rpm within ${show.q(min, "rpm")}–${show.q(max, "rpm")}${perInch === undefined ? "; pitch change at about 200 rpm per inch, a planing-boat figure" : ""}`,
      detail: result,
    };
  },
});
