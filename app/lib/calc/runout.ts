import { CAUTION_ROTATING, defineCalc } from "./define";
import { CalcError, requireFinite, requireFiniteResult, requireNonNegative } from "./errors";
import { atMost, tidy } from "./numbers";

export interface RunoutStationInput {
  positionIn: number;
  /** Dial readings taken at equal angles around one revolution, starting at the first mark. */
  readingsIn: number[];
}

export interface RunoutInput {
  stations: RunoutStationInput[];
  limitTirIn: number;
}

export interface RunoutStation {
  positionIn: number;
  tirIn: number;
  /** Index of the highest reading: where the shaft is bowed toward the dial. */
  highSpotIndex: number;
  /** Angle of the high spot from the first reading, assuming equally spaced readings. */
  highSpotAngleDeg: number;
}

export interface RunoutResult {
  stations: RunoutStation[];
  maxTirIn: number;
  /** Index of the station with the largest TIR (the first one, if several tie). */
  worstStation: number;
  pass: boolean;
}

/**
 * Shaft runout along the shaft. At each station the total indicator reading is
 * TIR = max(readings) − min(readings) over one revolution (ASME Y14.5 full indicator movement,
 * formerly TIR; Machinery's Handbook, dial indicator practice). The dial may be zeroed anywhere: only the
 * spread counts. The high spot is the largest reading, with a dial whose reading rises as the
 * plunger is pushed in. Verdict: the worst station's TIR is at most `limitTirIn`.
 * Shop practice (common practice, not a standard): about 0.001 in TIR is a good straightened
 * shaft, 0.002–0.003 in the usual limit, 0.008 in far out.
 */
export function shaftRunout(input: RunoutInput): RunoutResult {
  const limitTirIn = requireNonNegative("limitTirIn", input?.limitTirIn);
  if (!Array.isArray(input.stations) || input.stations.length === 0) {
    throw new CalcError("stations", "Enter the dial readings of at least one station.");
  }
  const stations = input.stations.map((station, i): RunoutStation => {
    const field = `stations[${i}]`;
    const positionIn = requireFinite(`${field}.positionIn`, station?.positionIn);
    const readings = station.readingsIn;
    if (!Array.isArray(readings) || readings.length < 2) {
      throw new CalcError(
        `${field}.readingsIn`,
        `Station ${i + 1} needs at least two dial readings around the shaft.`,
      );
    }
    readings.forEach((r, j) => {
      if (typeof r !== "number" || !Number.isFinite(r)) {
        throw new CalcError(`${field}.readingsIn`, `Station ${i + 1} is missing reading ${j + 1}.`);
      }
    });
    let high = 0;
    let low = 0;
    readings.forEach((r, j) => {
      if (r > readings[high]) high = j;
      if (r < readings[low]) low = j;
    });
    return {
      positionIn,
      tirIn: tidy(readings[high] - readings[low]),
      highSpotIndex: high,
      highSpotAngleDeg: tidy((high * 360) / readings.length),
    };
  });
  let worstStation = 0;
  stations.forEach((s, i) => {
    if (s.tirIn > stations[worstStation].tirIn) worstStation = i;
  });
  const maxTirIn = stations[worstStation].tirIn;
  return requireFiniteResult("stations", {
    stations,
    maxTirIn,
    worstStation,
    pass: atMost(maxTirIn, limitTirIn),
  });
}

export type RunoutGrade = "good" | "within usual limit" | "over usual limit" | "far out";

/**
 * Words for a TIR, after shop practice (common practice, not a standard): ≤ 0.001 in good,
 * ≤ 0.003 in within the usual limit, ≥ 0.008 in far out. The job's own limit still decides.
 */
export function runoutGrade(tirIn: number): RunoutGrade {
  const tir = requireNonNegative("tirIn", tirIn);
  if (atMost(tir, 0.001)) return "good";
  if (atMost(tir, 0.003)) return "within usual limit";
  if (tir < 0.008) return "over usual limit";
  return "far out";
}

export interface StraighteningInput {
  /** Worst-station TIR after each straightening attempt, in order (the first may be as found). */
  attemptsTirIn: number[];
  limitTirIn: number;
}

export interface StraighteningResult {
  attempts: { tirIn: number; changeIn: number; withinLimit: boolean }[];
  bestTirIn: number;
  bestAttempt: number;
  /** The first attempt that met the limit, if any. */
  reachedLimitAt?: number;
}

/** The history of straightening attempts converging (or not) on the limit, for the diagram. */
export function straighteningHistory(input: StraighteningInput): StraighteningResult {
  const limitTirIn = requireNonNegative("limitTirIn", input?.limitTirIn);
  const tirs = input.attemptsTirIn;
  if (!Array.isArray(tirs) || tirs.length === 0) {
    throw new CalcError("attemptsTirIn", "Enter the TIR of at least one attempt.");
  }
  tirs.forEach((t, i) => requireNonNegative(`attemptsTirIn[${i}]`, t));
  const attempts = tirs.map((tirIn, i) => ({
    tirIn,
    changeIn: i === 0 ? 0 : tidy(tirIn - tirs[i - 1]),
    withinLimit: atMost(tirIn, limitTirIn),
  }));
  let bestAttempt = 0;
  tirs.forEach((t, i) => {
    if (t < tirs[bestAttempt]) bestAttempt = i;
  });
  const reached = attempts.findIndex((a) => a.withinLimit);
  return requireFiniteResult("attemptsTirIn", {
    attempts,
    bestTirIn: tirs[bestAttempt],
    bestAttempt,
    ...(reached >= 0 ? { reachedLimitAt: reached } : {}),
  });
}

export const shaftRunoutCalc = defineCalc({
  name: "shaftRunout",
  title: "Shaft runout",
  summary: "TIR at each station along the shaft, the worst station and its high spot.",
  source:
    "TIR = max − min over one turn (ASME Y14.5 full indicator movement, formerly TIR); limits: the job's, 0.002–0.003 in common practice",
  caution: CAUTION_ROTATING,
  inputs: {
    readings: {
      label: "Dial readings (stations × angles)",
      accepts: ["grid"],
      unit: "in",
      field: ["stations", "readingsIn"],
    },
    positionsIn: {
      label: "Station positions along the shaft",
      accepts: ["numbers"],
      unit: "in",
      optional: true,
      field: "positionIn",
    },
    limitTir: { label: "TIR limit", accepts: ["number"], unit: "in", field: "limitTirIn" },
  },
  run(read, show) {
    const grid = read.grid("readings", "in")!;
    const positions = read.numbers("positionsIn", "in");
    const limitTirIn = read.number("limitTir", "in")!;
    if (positions && positions.length !== grid.rows.length) {
      throw new CalcError("positionsIn", `Give one position per station (${grid.rows.length}).`);
    }
    const result = shaftRunout({
      stations: grid.values.map((readingsIn, i) => ({
        positionIn: positions ? positions[i] : i,
        readingsIn,
      })),
      limitTirIn,
    });
    const worst = result.stations[result.worstStation];
    const station = grid.rowLabels[result.worstStation] ?? `station ${result.worstStation + 1}`;
    const column = grid.columnLabels[worst.highSpotIndex];
    // Columns of a runout grid are angles: "180" or "deg-180" both read "180°".
    const highSpot =
      column === undefined ? `${worst.highSpotAngleDeg}°` : /^\d+$/.test(column) ? `${column}°` : column;
    return {
      values: {
        "worst TIR": result.maxTirIn,
        where: `worst at ${station}, high spot at ${highSpot}`,
      },
      units: { "worst TIR": "in" },
      verdict: result.pass ? "pass" : "fail",
      primary: "worst TIR",
      rule: `TIR at every station ≤ ${show.q(limitTirIn, "in")}`,
      detail: result,
    };
  },
});
