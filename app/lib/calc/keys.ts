import { CalcError, requirePositive } from "./errors";
import { nominalInch, tidy } from "./numbers";

/**
 * ASME B17.1-1967 (R2013) Table 1, key size versus shaft diameter (inch): each row covers
 * shafts over the previous row's top size up to and including `toIn`.
 * [toIn, width W, square key height H, rectangular key height H]
 */
const B17_1: [number, number, number, number | null][] = [
  [7 / 16, 3 / 32, 3 / 32, null], // first row: over 5/16
  [9 / 16, 1 / 8, 1 / 8, 3 / 32],
  [7 / 8, 3 / 16, 3 / 16, 1 / 8],
  [1.25, 1 / 4, 1 / 4, 3 / 16],
  [1.375, 5 / 16, 5 / 16, 1 / 4],
  [1.75, 3 / 8, 3 / 8, 1 / 4],
  [2.25, 1 / 2, 1 / 2, 3 / 8],
  [2.75, 5 / 8, 5 / 8, 7 / 16],
  [3.25, 3 / 4, 3 / 4, 1 / 2],
  [3.75, 7 / 8, 7 / 8, 5 / 8],
  [4.5, 1, 1, 3 / 4],
  [5.5, 1.25, 1.25, 7 / 8],
  [6.5, 1.5, 1.5, 1],
  [7.5, 1.75, 1.75, 1.5],
  [9, 2, 2, 1.5],
  [11, 2.5, 2.5, 1.75],
];
const B17_1_FROM_IN = 5 / 16;

export interface KeyInchResult {
  standard: "ASME B17.1";
  /** The nominal size the key was chosen for (the measure snapped to it when within 0.005 in). */
  nominalIn: number;
  style: "square" | "rectangular";
  widthIn: number;
  heightIn: number;
  /** Nominal keyseat depth in the shaft, H/2, measured at the side of the keyseat. */
  shaftDepthIn: number;
  /** Chordal height Y = (D − √(D² − W²)) / 2: how far the shaft's crown rises above the keyseat's edge. */
  chordalHeightIn: number;
  /** S = D − Y − H/2: micrometer check from the keyseat bottom to the opposite side of the shaft. */
  sDimensionIn: number;
}

/**
 * Parallel key for an inch shaft after ASME B17.1 Table 1, with the keyseat depth H/2 and the
 * chordal-height check of Machinery's Handbook ("Keys and Keyseats"). Square keys are the usual
 * choice up to 6 1/2 in; B17.1 prefers rectangular keys above that. The row is chosen by the
 * nominal size (a measured 1.2503 in shaft is a 1 1/4 in shaft); the chordal height and S
 * dimension use the measured diameter.
 */
export function keyForShaft(input: { diameterIn: number; style?: "square" | "rectangular" }): KeyInchResult {
  const d = requirePositive("diameterIn", input?.diameterIn);
  const style = input.style ?? "square";
  if (style !== "square" && style !== "rectangular") {
    throw new CalcError("style", 'Key style is "square" or "rectangular".');
  }
  const nominalIn = nominalInch(d);
  const row = nominalIn > B17_1_FROM_IN ? B17_1.find(([toIn]) => nominalIn <= toIn) : undefined;
  if (!row) {
    throw new CalcError(
      "diameterIn",
      `${d} in is outside ASME B17.1 Table 1 as held here (over 5/16 in up to 11 in).`,
    );
  }
  const [, widthIn, squareH, rectH] = row;
  if (style === "rectangular" && rectH === null) {
    throw new CalcError("style", "ASME B17.1 gives only a square key for shafts up to 7/16 in.");
  }
  const heightIn = style === "square" ? squareH : (rectH as number);
  const chordalHeightIn = (d - Math.sqrt(d * d - widthIn * widthIn)) / 2;
  return {
    standard: "ASME B17.1",
    nominalIn,
    style,
    widthIn,
    heightIn,
    shaftDepthIn: heightIn / 2,
    chordalHeightIn: tidy(chordalHeightIn),
    sDimensionIn: tidy(d - chordalHeightIn - heightIn / 2),
  };
}

/**
 * DIN 6885-1:1968-08 parallel keys, deep pattern: [over mm, up to mm, b, h, t1 shaft, t2 hub].
 */
const DIN_6885_1: [number, number, number, number, number, number][] = [
  [6, 8, 2, 2, 1.2, 1.0],
  [8, 10, 3, 3, 1.8, 1.4],
  [10, 12, 4, 4, 2.5, 1.8],
  [12, 17, 5, 5, 3.0, 2.3],
  [17, 22, 6, 6, 3.5, 2.8],
  [22, 30, 8, 7, 4.0, 3.3],
  [30, 38, 10, 8, 5.0, 3.3],
  [38, 44, 12, 8, 5.0, 3.3],
  [44, 50, 14, 9, 5.5, 3.8],
  [50, 58, 16, 10, 6.0, 4.3],
  [58, 65, 18, 11, 7.0, 4.4],
  [65, 75, 20, 12, 7.5, 4.9],
  [75, 85, 22, 14, 9.0, 5.4],
  [85, 95, 25, 14, 9.0, 5.4],
  [95, 110, 28, 16, 10.0, 6.4],
  [110, 130, 32, 18, 11.0, 7.4],
  [130, 150, 36, 20, 12.0, 8.4],
  [150, 170, 40, 22, 13.0, 9.4],
  [170, 200, 45, 25, 15.0, 10.4],
  [200, 230, 50, 28, 17.0, 11.4],
  [230, 260, 56, 32, 20.0, 12.4],
  [260, 290, 63, 32, 20.0, 12.4],
  [290, 330, 70, 36, 22.0, 14.4],
  [330, 380, 80, 40, 25.0, 15.4],
  [380, 440, 90, 45, 28.0, 17.4],
  [440, 500, 100, 50, 31.0, 19.5],
];

export interface KeyMetricResult {
  standard: "DIN 6885-1";
  widthMm: number;
  heightMm: number;
  /** t1: keyseat depth in the shaft (check d − t1). */
  shaftDepthMm: number;
  /** t2: keyway depth in the hub (check d + t2). */
  hubDepthMm: number;
}

/** Parallel key for a metric shaft, DIN 6885-1 (rows cover shafts over `over` up to `upTo`). */
export function keyForShaftMm(input: { diameterMm: number }): KeyMetricResult {
  const d = requirePositive("diameterMm", input?.diameterMm);
  const row = DIN_6885_1.find(([over, upTo]) => d > over && d <= upTo);
  if (!row) {
    throw new CalcError("diameterMm", `${d} mm is outside DIN 6885-1 (shafts over 6 mm up to 500 mm).`);
  }
  const [, , widthMm, heightMm, shaftDepthMm, hubDepthMm] = row;
  return { standard: "DIN 6885-1", widthMm, heightMm, shaftDepthMm, hubDepthMm };
}
