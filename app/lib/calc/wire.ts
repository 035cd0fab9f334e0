import { CalcError, requireFiniteResult, requirePositive } from "./errors";
import { atLeast, tidy } from "./numbers";

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
