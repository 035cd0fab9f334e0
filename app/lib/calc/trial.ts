import { CAUTION_EXHAUST, CAUTION_RUNNING_ENGINE, CAUTION_SEA_TRIAL, defineCalc } from "./define";
import { CalcError, requireFinite, requireFiniteResult, requireNonNegative, requirePositive } from "./errors";
import { atLeast, atMost, tidy } from "./numbers";
import { convert } from "./units";

/*
 * Figures taken on the first start and the sea trial that used to be worked out by hand:
 * raw-water flow, speed over timed runs, tachometer pulses, a point's height with the boat
 * heeled, and the engine's running angle.
 */

// ---- raw-water flow ------------------------------------------------------------------------

export interface RawWaterFlowResult {
  litresPerMinute: number;
  usGallonsPerMinute: number;
  pass?: boolean;
}

/**
 * Raw-water flow from a timed catch at the outlet: L/min = volume ÷ (seconds ÷ 60), and US gal/min
 * with 1 US gal = 3.785411784 L exactly (NIST SP 811, B.8). Passes when at least the engine
 * maker's minimum, when one is given.
 */
export function rawWaterFlow(input: {
  volumeL: number;
  seconds: number;
  minLitresPerMinute?: number;
}): RawWaterFlowResult {
  const volume = requirePositive("volumeL", input?.volumeL);
  const seconds = requirePositive("seconds", input.seconds);
  const min =
    input.minLitresPerMinute === undefined
      ? undefined
      : requireNonNegative("minLitresPerMinute", input.minLitresPerMinute);
  const litresPerMinute = tidy(requireFiniteResult("volumeL", (volume * 60) / seconds));
  return {
    litresPerMinute,
    usGallonsPerMinute: tidy(convert(litresPerMinute, "L/min", "gal/min")),
    ...(min !== undefined ? { pass: atLeast(litresPerMinute, min) } : {}),
  };
}

export const rawWaterFlowCalc = defineCalc({
  name: "rawWaterFlow",
  title: "Raw-water flow",
  summary: "Cooling-water flow from a timed catch at the outlet, against the engine maker's minimum.",
  source: "Flow = volume ÷ time; 1 US gal = 3.785411784 L (NIST SP 811); minimum: the engine maker's",
  caution: CAUTION_RUNNING_ENGINE,
  inputs: {
    volume: { label: "Water caught", accepts: ["number"], unit: "L", field: "volumeL" },
    time: { label: "Time to catch it", accepts: ["number"], unit: "s", field: "seconds" },
    minFlow: {
      label: "Engine maker's minimum flow",
      accepts: ["number"],
      unit: "L/min",
      optional: true,
      field: "minLitresPerMinute",
    },
  },
  run(read, show) {
    const minFlow = read.number("minFlow", "L/min");
    const result = rawWaterFlow({
      volumeL: read.number("volume", "L")!,
      seconds: read.number("time", "s")!,
      minLitresPerMinute: minFlow,
    });
    // The shop's own unit first: a catch in US gallons reads in US gal/min.
    const us = read.unitOf("volume") === "gal";
    const [unit, other] = us ? (["gal/min", "L/min"] as const) : (["L/min", "gal/min"] as const);
    const flow = { "L/min": result.litresPerMinute, "gal/min": result.usGallonsPerMinute };
    return {
      values: { flow: flow[unit], [`in ${other === "gal/min" ? "US gal/min" : "L/min"}`]: flow[other] },
      units: { flow: unit, [`in ${other === "gal/min" ? "US gal/min" : "L/min"}`]: other },
      verdict: result.pass === undefined ? "info" : result.pass ? "pass" : "fail",
      primary: "flow",
      rule:
        minFlow === undefined
          ? "flow only; no minimum given"
          : `flow ≥ ${show.q(convert(minFlow, "L/min", unit), unit)} (engine maker's minimum)`,
      detail: result,
    };
  },
});

// ---- speed from timed runs -----------------------------------------------------------------

export interface SpeedRunsResult {
  legKnots: number[];
  /** Mean of the speeds, weighted as the mean of means of successive legs. */
  meanKnots: number;
  /** Current along the first leg's direction (negative = against it). */
  currentKnots: number;
}

/** Binomial weights of the mean of means: 2 legs ½ ½; 3 legs ¼ ½ ¼; 4 legs ⅛ ⅜ ⅜ ⅛. */
function meanOfMeansWeights(n: number): number[] {
  let weights = [1];
  for (let i = 1; i < n; i++) weights = [...weights, 0].map((w, k) => (w + (k > 0 ? weights[k - 1] : 0)) / 2);
  return weights;
}

/**
 * Speed through the water from legs over a known distance run alternately in opposite
 * directions. Each leg's speed is distance ÷ time (1 kn = 1 nautical mile per hour); the speed is
 * the mean of the leg speeds, not the distance over the mean time, so a current helping one
 * way and hindering the other cancels. With more than two legs the mean of means of successive
 * pairs is taken, which also cancels a current changing steadily (ITTC Recommended Procedure
 * 7.5-04-01-01.1, speed trials; from memory). Current = half the difference of successive legs.
 */
export function speedRuns(input: { legs: { distanceNm: number; seconds: number }[] }): SpeedRunsResult {
  const legs = input?.legs;
  if (!Array.isArray(legs) || legs.length < 2) {
    throw new CalcError("legs", "Enter at least two legs, one each way.");
  }
  const legKnots = legs.map((leg, i) => {
    const distance = requirePositive(`legs[${i}].distanceNm`, leg?.distanceNm);
    const seconds = requirePositive(`legs[${i}].seconds`, leg.seconds);
    return tidy(requireFiniteResult(`legs[${i}].seconds`, distance / (seconds / 3600)));
  });
  const weights = meanOfMeansWeights(legKnots.length);
  const meanKnots = tidy(legKnots.reduce((sum, v, i) => sum + v * weights[i], 0));
  const halfDifferences = legKnots.slice(1).map((v, i) => ((legKnots[i] - v) / 2) * (i % 2 === 0 ? 1 : -1));
  const currentKnots = tidy(halfDifferences.reduce((a, b) => a + b, 0) / halfDifferences.length);
  return { legKnots, meanKnots, currentKnots };
}

export const speedRunsCalc = defineCalc({
  name: "speedRuns",
  title: "Speed from timed runs",
  summary:
    "Speed from legs over a known distance run both ways: the mean of the speeds over and back, and the current.",
  source: "1 kn = 1 nautical mile (1852 m) per hour; mean of the speeds over and back (ITTC 7.5-04-01-01.1)",
  caution: CAUTION_SEA_TRIAL,
  inputs: {
    distance: {
      label: "Distance of each leg",
      accepts: ["number", "numbers", "grid"],
      unit: "nmi",
      field: "distanceNm",
    },
    times: { label: "Time of each leg", accepts: ["numbers", "grid"], unit: "s", field: ["legs", "seconds"] },
  },
  run(read) {
    const times = read.numbers("times", "s")!;
    const distances = read.numbers("distance", "nmi")!;
    if (distances.length !== 1 && distances.length !== times.length) {
      throw new CalcError("distance", `Give one distance for every leg, or one per leg (${times.length}).`);
    }
    const result = speedRuns({
      legs: times.map((seconds, i) => ({
        distanceNm: distances.length === 1 ? distances[0] : distances[i],
        seconds,
      })),
    });
    const values: Record<string, number> = {
      speed: result.meanKnots,
      current: Math.abs(result.currentKnots),
    };
    result.legKnots.forEach((v, i) => (values[`leg ${i + 1}`] = v));
    const units: Record<string, string> = Object.fromEntries(Object.keys(values).map((k) => [k, "kn"]));
    return {
      values,
      units,
      verdict: "info",
      primary: "speed",
      rule: "mean of the leg speeds over and back, not of the times",
      detail: result,
    };
  },
});

// ---- tachometer pulses ---------------------------------------------------------------------

/**
 * Pulses per engine revolution at an alternator's W (AC) terminal, for setting a tachometer:
 * the winding gives one cycle per pair of poles per revolution (f = p × n / 120, the
 * synchronous-machine relation of IEC 60034-1 / any electrical machines text), and the
 * alternator turns crank pulley ÷ alternator pulley times per engine revolution:
 * pulses per rev = (poles ÷ 2) × (crank pulley ÷ alternator pulley).
 */
export function tachPulses(input: {
  crankPulleyDia: number;
  alternatorPulleyDia: number;
  alternatorPoles: number;
}): { pulsesPerRev: number } {
  const crank = requirePositive("crankPulleyDia", input?.crankPulleyDia);
  const alternator = requirePositive("alternatorPulleyDia", input.alternatorPulleyDia);
  const poles = requirePositive("alternatorPoles", input.alternatorPoles);
  if (!Number.isInteger(poles) || poles % 2 !== 0) {
    throw new CalcError("alternatorPoles", `An alternator has an even number of poles, not ${poles}.`);
  }
  return { pulsesPerRev: tidy(requireFiniteResult("crankPulleyDia", (poles / 2) * (crank / alternator))) };
}

export const tachPulsesCalc = defineCalc({
  name: "tachPulses",
  title: "Tachometer pulses per revolution",
  summary: "The pulses-per-revolution setting of a tachometer fed from the alternator's W terminal.",
  source:
    "f = p × n / 120 (synchronous machines); pulses per rev = poles ÷ 2 × crank pulley ÷ alternator pulley",
  caution: CAUTION_RUNNING_ENGINE,
  inputs: {
    crankPulley: {
      label: "Crankshaft pulley diameter",
      accepts: ["number"],
      unit: "in",
      field: "crankPulleyDia",
    },
    alternatorPulley: {
      label: "Alternator pulley diameter",
      accepts: ["number"],
      unit: "in",
      field: "alternatorPulleyDia",
    },
    alternatorPoles: { label: "Alternator poles", accepts: ["number"], unit: "1", field: "alternatorPoles" },
  },
  run(read) {
    const result = tachPulses({
      crankPulleyDia: read.number("crankPulley", "in")!,
      alternatorPulleyDia: read.number("alternatorPulley", "in")!,
      alternatorPoles: read.number("alternatorPoles", "1")!,
    });
    return {
      values: { "pulses per revolution": result.pulsesPerRev },
      units: { "pulses per revolution": "1" },
      verdict: "info",
      primary: "pulses per revolution",
      rule: "set the tachometer to this; check it against a hand tachometer at the crank",
      detail: result,
    };
  },
});

// ---- height with the boat heeled -----------------------------------------------------------

/**
 * Height above the waterline of a point (an exhaust riser, a vent) with the boat heeled,
 * turning the point about where the centreline meets the waterline (the usual simplification;
 * common practice): h' = h × cos θ − y × sin θ, with y its distance off the centreline towards
 * the low side.
 */
export function heeledHeight(input: { heightIn: number; offCentreIn: number; heelDeg: number }): {
  heightHeeledIn: number;
} {
  const h = requireFinite("heightIn", input?.heightIn);
  const y = requireFinite("offCentreIn", input.offCentreIn);
  const heel = requireFinite("heelDeg", input.heelDeg);
  if (heel < 0 || heel > 90) throw new CalcError("heelDeg", "The heel angle is from 0° to 90°.");
  const theta = (heel * Math.PI) / 180;
  return { heightHeeledIn: tidy(h * Math.cos(theta) - y * Math.sin(theta)) };
}

export const heeledHeightCalc = defineCalc({
  name: "heeledHeight",
  title: "Height with the boat heeled",
  summary:
    "How high a point (exhaust riser, injection point, vent) stands above the waterline with the boat heeled.",
  source: "h′ = h cos θ − y sin θ, heeling about the centreline at the waterline (common practice)",
  caution: CAUTION_EXHAUST,
  inputs: {
    height: {
      label: "Height above the waterline, upright",
      accepts: ["number"],
      unit: "in",
      field: "heightIn",
    },
    offCentre: {
      label: "Distance off the centreline, towards the low side",
      accepts: ["number"],
      unit: "in",
      field: "offCentreIn",
    },
    heel: { label: "Heel angle", accepts: ["number"], unit: "deg", field: "heelDeg" },
    minHeight: { label: "Least height wanted", accepts: ["number"], unit: "in", optional: true },
  },
  run(read, show) {
    const heel = read.number("heel", "deg")!;
    const min = read.number("minHeight", "in");
    const result = heeledHeight({
      heightIn: read.number("height", "in")!,
      offCentreIn: read.number("offCentre", "in")!,
      heelDeg: heel,
    });
    return {
      values: { "height heeled": result.heightHeeledIn },
      units: { "height heeled": "in" },
      verdict: min === undefined ? "info" : atLeast(result.heightHeeledIn, min) ? "pass" : "fail",
      primary: "height heeled",
      rule: `at ${show.q(heel, "deg")} of heel${min === undefined ? "" : `, height ≥ ${show.q(min, "in")}`}`,
      detail: result,
    };
  },
});

// ---- installation angle --------------------------------------------------------------------

/**
 * The engine's angle under way: its angle at rest (front up positive) plus the hull's bow-up
 * running trim, against the engine maker's maximum (the sump pick-up and lubrication limit the
 * maker states in the installation instructions).
 */
export function installationAngle(input: {
  measuredDeg: number;
  runningTrimDeg: number;
  makerMaxDeg: number;
}): {
  runningAngleDeg: number;
  pass: boolean;
} {
  const measured = requireFinite("measuredDeg", input?.measuredDeg);
  const trim = requireFinite("runningTrimDeg", input.runningTrimDeg);
  const max = requirePositive("makerMaxDeg", input.makerMaxDeg);
  const runningAngleDeg = tidy(measured + trim);
  return { runningAngleDeg, pass: atMost(runningAngleDeg, max) };
}

export const installationAngleCalc = defineCalc({
  name: "installationAngle",
  title: "Engine installation angle",
  summary: "The engine's angle under way (at rest plus running trim) against the engine maker's maximum.",
  source:
    "Running angle = angle at rest + bow-up running trim; maximum: the engine maker's installation instructions",
  inputs: {
    measured: {
      label: "Engine angle at rest (front up positive)",
      accepts: ["number"],
      unit: "deg",
      field: "measuredDeg",
    },
    runningTrim: { label: "Bow-up running trim", accepts: ["number"], unit: "deg", field: "runningTrimDeg" },
    makerMax: {
      label: "Engine maker's maximum angle",
      accepts: ["number"],
      unit: "deg",
      field: "makerMaxDeg",
    },
  },
  run(read, show) {
    const max = read.number("makerMax", "deg")!;
    const result = installationAngle({
      measuredDeg: read.number("measured", "deg")!,
      runningTrimDeg: read.number("runningTrim", "deg")!,
      makerMaxDeg: max,
    });
    return {
      values: { "running angle": result.runningAngleDeg },
      units: { "running angle": "deg" },
      verdict: result.pass ? "pass" : "fail",
      primary: "running angle",
      rule: `running angle ≤ ${show.q(max, "deg")} (engine maker's maximum)`,
      detail: result,
    };
  },
});
