import { CAUTION_BATTERIES, defineCalc, type CalcInputSpec, type Reader } from "./define";
import { CalcError, requireFiniteResult, requirePositive } from "./errors";
import { atLeast, atMost, tidy } from "./numbers";

/** NEC Chapter 9 Table 8 (ASTM B258 sizes): conductor area in circular mils. */
const AWG_CIRCULAR_MILS: [string, number][] = [
  ["18", 1620],
  ["16", 2580],
  ["14", 4110],
  ["12", 6530],
  ["10", 10380],
  ["8", 16510],
  ["6", 26240],
  ["4", 41740],
  ["3", 52620],
  ["2", 66360],
  ["1", 83690],
  ["1/0", 105600],
  ["2/0", 133100],
  ["3/0", 167800],
  ["4/0", 211600],
];

/** IEC 60228 nominal cross-sections, mm². */
const METRIC_MM2 = [0.5, 0.75, 1, 1.5, 2.5, 4, 6, 10, 16, 25, 35, 50, 70, 95, 120, 150, 185, 240];

/** One circular mil is the area of a circle 0.001 in across: π/4 × (0.0254 mm)² in mm². */
export const MM2_PER_CIRCULAR_MIL = (Math.PI / 4) * 0.0254 * 0.0254;

/** ABYC E-11 constant for copper (resistance of a mil-foot, ohms). */
const K_COPPER = 10.75;

export interface WireSizeInput {
  currentA: number;
  /** Conductor length from the source to the load and back. */
  roundTripFt: number;
  systemVolts: number;
  /** ABYC E-11: 3 % for panel feeders, navigation lights and other critical loads, 10 % otherwise. */
  dropPercent: number;
}

export interface WireSizeResult {
  circularMils: number;
  /** Smallest AWG conductor with at least that area. */
  awg: string;
  /** Smallest metric conductor with at least that area, when one in the list is big enough. */
  metricMm2?: number;
  allowedDropV: number;
}

/**
 * Conductor size for voltage drop, ABYC E-11 method: CM = K × I × L / E with K = 10.75,
 * I the current (A), L the round-trip length (ft) and E the allowed drop (V) = system volts ×
 * drop % ÷ 100; then the smallest conductor of NEC Chapter 9 Table 8 with at least that area.
 * This sizes for voltage drop only: the conductor must also meet the ampacity tables of the
 * applicable standard, and overcurrent protection must suit it.
 */
export function wireSize(input: WireSizeInput): WireSizeResult {
  const current = requirePositive("currentA", input?.currentA);
  const length = requirePositive("roundTripFt", input.roundTripFt);
  const volts = requirePositive("systemVolts", input.systemVolts);
  const percent = requirePositive("dropPercent", input.dropPercent);
  if (percent >= 100) throw new CalcError("dropPercent", "The allowed drop must be less than 100 %.");
  const allowedDropV = tidy(requireFiniteResult("systemVolts", volts * (percent / 100)));
  const circularMils = tidy(requireFiniteResult("currentA", (K_COPPER * current * length) / allowedDropV));
  const row = AWG_CIRCULAR_MILS.find(([, cm]) => atLeast(cm, circularMils));
  if (!row) {
    throw new CalcError(
      "roundTripFt",
      `The run needs ${Math.round(circularMils).toLocaleString("en-US")} circular mils, more than 4/0 AWG (211,600); ` +
        "shorten the run, use parallel conductors or a higher system voltage.",
    );
  }
  const mm2 = circularMils * MM2_PER_CIRCULAR_MIL;
  const metricMm2 = METRIC_MM2.find((size) => atLeast(size, mm2));
  return { circularMils, awg: row[0], ...(metricMm2 !== undefined ? { metricMm2 } : {}), allowedDropV };
}

/** Area of an AWG size written as on the cable ("12", "1/0", "AWG 2/0"...). */
export function awgCircularMils(awg: string): number {
  const size = typeof awg === "string" ? awg.replace(/^\s*(awg|#)\s*/i, "").trim() : "";
  const row = AWG_CIRCULAR_MILS.find(([name]) => name === size);
  if (!row) throw new CalcError("awg", `"${awg}" is not an AWG size from 18 to 4/0.`);
  return row[1];
}

/** Area of a conductor written either way: an AWG size ("10", "1/0") or a metric one ("6 mm2", "6 mm²"). */
export function conductorCircularMils(size: string): number {
  const metric = typeof size === "string" ? /^\s*(\d+(?:\.\d+)?)\s*mm(?:2|²)\s*$/i.exec(size) : null;
  if (metric) return tidy(requirePositive("mm2", Number(metric[1])) / MM2_PER_CIRCULAR_MIL);
  return awgCircularMils(size);
}

/**
 * Allowable amperage of conductors by insulation temperature rating (°C), outside engine
 * spaces: 33 CFR 183.425 Table 5 (US Coast Guard; ABYC E-11 carries the same table for systems
 * under 50 V).
 */
const INSULATION_RATINGS_C = [60, 75, 80, 90, 105, 125, 200] as const;
type InsulationRating = (typeof INSULATION_RATINGS_C)[number];
const E11_AMPACITY: Record<string, number[]> = {
  "18": [10, 10, 15, 20, 20, 25, 25],
  "16": [15, 15, 20, 25, 25, 30, 35],
  "14": [20, 20, 25, 30, 35, 40, 45],
  "12": [25, 25, 35, 40, 45, 50, 55],
  "10": [40, 40, 50, 55, 60, 70, 70],
  "8": [55, 65, 70, 70, 80, 90, 100],
  "6": [80, 95, 100, 100, 120, 125, 135],
  "4": [105, 125, 130, 135, 160, 170, 180],
  "3": [120, 145, 150, 155, 180, 195, 210],
  "2": [140, 170, 175, 180, 210, 225, 240],
  "1": [165, 195, 210, 210, 245, 265, 280],
  "1/0": [195, 230, 245, 245, 285, 305, 325],
  "2/0": [225, 265, 285, 285, 330, 355, 370],
  "3/0": [260, 310, 330, 330, 385, 410, 430],
  "4/0": [300, 360, 385, 385, 445, 475, 510],
};
/**
 * Inside engine spaces (50 °C ambient) the allowable amperage is multiplied by these, in the
 * same order (33 CFR 183.425 Table 5, note 1). 0.85 for 105 °C is confirmed by the inside-engine-
 * space column the marine wire charts derive from it (120 A → 102 A for 6 AWG); the others are
 * from memory.
 */
const ENGINE_SPACE_FACTOR = [0.58, 0.75, 0.78, 0.82, 0.85, 0.89, 1.0];
/**
 * ABYC E-11 overcurrent protection: a fuse or breaker rated at most 150 % of the conductor's
 * allowable amperage (from memory; cranking-motor conductors are exempt and not checked here).
 */
const MAX_OVERCURRENT_RATIO = 1.5;

export interface ConductorCheckInput extends WireSizeInput {
  /** The conductor fitted: an AWG size ("16", "1/0") or a metric one ("2.5 mm²"). */
  awg: string;
  insulationRatingC: number;
  inEngineSpace: boolean;
  /** Rating of the fuse or breaker protecting the conductor. */
  overcurrentA?: number;
}

export interface ConductorCheckResult {
  minAwgForDrop: string;
  /** The conductor's allowable amperage where it runs (derated inside engine spaces). */
  ampacityA: number;
  /** The AWG row of the ampacity table used (a metric conductor is read as the next AWG size down). */
  ampacityRow: string;
  insulationRatingC: InsulationRating;
  engineSpaceFactor: number;
  circularMilsNeeded: number;
  circularMilsFitted: number;
  pass: boolean;
  problems: string[];
}

/**
 * A conductor against ABYC E-11 on three counts: voltage drop (the wireSize method), allowable
 * amperage by insulation rating, derated inside engine spaces, and the overcurrent device
 * (at most 150 % of the allowable amperage, and no smaller than the load it must carry).
 */
export function conductorCheck(input: ConductorCheckInput): ConductorCheckResult {
  const drop = wireSize(input);
  const circularMilsFitted = conductorCircularMils(input.awg);
  const rating = requirePositive("insulationRatingC", input.insulationRatingC);
  const column = INSULATION_RATINGS_C.indexOf(rating as InsulationRating);
  if (column < 0) {
    throw new CalcError(
      "insulationRatingC",
      `ABYC E-11 gives allowable amperage for insulation rated ${INSULATION_RATINGS_C.join(", ")} °C, not ${rating} °C.`,
    );
  }
  if (typeof input.inEngineSpace !== "boolean") {
    throw new CalcError("inEngineSpace", "Say whether the conductor runs inside an engine space.");
  }
  // The largest AWG row no bigger than the conductor: a metric size between two rows takes the smaller.
  const row = [...AWG_CIRCULAR_MILS].reverse().find(([, cm]) => atMost(cm, circularMilsFitted));
  if (!row)
    throw new CalcError("awg", `"${input.awg}" is smaller than 18 AWG, the smallest conductor E-11 lists.`);
  const engineSpaceFactor = input.inEngineSpace ? ENGINE_SPACE_FACTOR[column] : 1;
  const ampacityA = tidy(E11_AMPACITY[row[0]][column] * engineSpaceFactor);
  const current = input.currentA;
  const problems: string[] = [];
  if (!atLeast(circularMilsFitted, drop.circularMils)) {
    problems.push(
      `Too small for the voltage drop: ${drop.allowedDropV} V allowed needs ${drop.awg} AWG (${Math.round(drop.circularMils)} circular mils) or larger.`,
    );
  }
  if (!atMost(current, ampacityA)) {
    problems.push(
      `${current} A is more than the conductor's allowable ${ampacityA} A (${row[0]} AWG, ${rating} °C insulation${input.inEngineSpace ? ", inside an engine space" : ""}).`,
    );
  }
  if (input.overcurrentA !== undefined) {
    const device = requirePositive("overcurrentA", input.overcurrentA);
    const most = tidy(ampacityA * MAX_OVERCURRENT_RATIO);
    if (!atMost(device, most)) {
      problems.push(
        `A ${device} A fuse or breaker is larger than 150 % of the conductor's ${ampacityA} A (${most} A at most).`,
      );
    }
    if (device < current)
      problems.push(`A ${device} A fuse or breaker is smaller than the ${current} A load and will open.`);
  }
  return {
    minAwgForDrop: drop.awg,
    ampacityA,
    ampacityRow: row[0],
    insulationRatingC: rating as InsulationRating,
    engineSpaceFactor,
    circularMilsNeeded: drop.circularMils,
    circularMilsFitted,
    pass: problems.length === 0,
    problems,
  };
}

const dropInputs = {
  current: { label: "Current", accepts: ["number"], unit: "A", field: "currentA" },
  roundTripLength: {
    label: "Round-trip conductor length",
    accepts: ["number"],
    unit: "ft",
    field: "roundTripFt",
  },
  systemVoltage: {
    label: "System voltage (12, 24...)",
    accepts: ["number"],
    unit: "V",
    field: "systemVolts",
  },
  dropPercent: {
    label: "Allowed voltage drop (3 or 10 %)",
    accepts: ["number"],
    unit: "%",
    field: "dropPercent",
  },
} satisfies Record<string, CalcInputSpec>;

function readDrop(read: Reader): WireSizeInput {
  return {
    currentA: read.number("current", "A")!,
    roundTripFt: read.number("roundTripLength", "ft")!,
    systemVolts: read.number("systemVoltage", "V")!,
    dropPercent: read.number("dropPercent", "%")!,
  };
}

export const wireSizeCalc = defineCalc({
  name: "wireSize",
  title: "Conductor size for voltage drop",
  summary: "Circular mils and the smallest AWG and metric conductor for the allowed voltage drop.",
  source: "ABYC E-11: CM = 10.75 × I × L / E; areas from NEC Chapter 9 Table 8",
  caution: CAUTION_BATTERIES,
  inputs: {
    ...dropInputs,
    installed: {
      label: "Conductor fitted (AWG or mm²)",
      accepts: ["text"],
      optional: true,
      field: ["awg", "mm2"],
    },
  },
  run(read) {
    const result = wireSize(readDrop(read));
    const installed = read.text("installed");
    const installedCm = installed === undefined ? undefined : conductorCircularMils(installed);
    const values: Record<string, number | string> = {
      "circular mils": Math.round(result.circularMils),
      AWG: result.awg,
    };
    if (result.metricMm2 !== undefined) values["metric"] = result.metricMm2;
    return {
      values,
      units: { "circular mils": "CM", metric: "mm²" },
      verdict:
        installedCm === undefined ? "info" : atLeast(installedCm, result.circularMils) ? "pass" : "fail",
      primary: "circular mils",
      rule: `conductor of at least ${Math.round(result.circularMils)} circular mils for ${result.allowedDropV} V drop (voltage drop only: use the conductor check for ampacity and overcurrent protection)`,
      detail: { ...result, ...(installedCm !== undefined ? { installedCircularMils: installedCm } : {}) },
    };
  },
});

/** An insulation rating from a number (°C or °F) or a text such as "105", "105 °C". */
function readRating(read: Reader): number {
  if (read.unitOf("insulationRating") !== undefined)
    return Math.round(read.number("insulationRating", "degC")!);
  const text = read.text("insulationRating")!;
  const match = /^\s*(\d+)\s*(?:°?\s*c)?\s*$/i.exec(text);
  if (!match)
    throw new CalcError("insulationRating", `"${text}" is not an insulation rating in °C (such as 105).`);
  return Number(match[1]);
}

export const conductorCheckCalc = defineCalc({
  name: "conductorCheck",
  title: "Conductor check",
  summary:
    "A fitted conductor against ABYC E-11: voltage drop, allowable amperage for its insulation (derated inside engine spaces), and its fuse or breaker.",
  source:
    "ABYC E-11: voltage drop CM = 10.75 × I × L / E; allowable amperage by insulation rating and engine-space factor (33 CFR 183.425 Table 5, the same in E-11); fuse or breaker at most 150 % of the allowable amperage",
  caution: CAUTION_BATTERIES,
  inputs: {
    ...dropInputs,
    conductor: { label: "Conductor fitted (AWG or mm²)", accepts: ["text"], field: ["awg", "mm2"] },
    insulationRating: {
      label: "Insulation temperature rating (°C)",
      accepts: ["number", "text"],
      unit: "degC",
      field: "insulationRatingC",
    },
    inEngineSpace: {
      label: "Runs inside an engine space (yes or no)",
      accepts: ["text"],
      field: "inEngineSpace",
    },
    overcurrent: {
      label: "Fuse or breaker rating",
      accepts: ["number"],
      unit: "A",
      optional: true,
      field: "overcurrentA",
    },
  },
  run(read) {
    const result = conductorCheck({
      ...readDrop(read),
      awg: read.text("conductor")!,
      insulationRatingC: readRating(read),
      inEngineSpace: read.yesNo("inEngineSpace")!,
      overcurrentA: read.number("overcurrent", "A"),
    });
    const values: Record<string, number | string> = {
      "smallest for the drop": `${result.minAwgForDrop} AWG`,
      "allowable amperage": result.ampacityA,
    };
    if (result.problems.length) values.problems = result.problems.join(" ");
    const where =
      result.engineSpaceFactor === 1
        ? "outside engine spaces"
        : `inside an engine space (× ${result.engineSpaceFactor})`;
    return {
      values,
      units: { "allowable amperage": "A" },
      verdict: result.pass ? "pass" : "fail",
      primary: "allowable amperage",
      rule: `ABYC E-11: voltage drop, allowable amperage from the ${result.insulationRatingC} °C column for ${result.ampacityRow} AWG ${where}, fuse or breaker at most 150 % of it`,
      detail: result,
    };
  },
});
