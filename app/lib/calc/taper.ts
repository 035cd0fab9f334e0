import { CalcError, requirePositive } from "./errors";
import { keyForShaftMm } from "./keys";
import { SIZE_SLACK_IN, tidy } from "./numbers";

/**
 * SAE J755 marine propeller-shaft ends: 3/4 in per foot taper (1:16 on the diameter) for shafts
 * up to 5 1/2 in. Rows: [nominal shaft, small end of taper, taper length, keyway width,
 * keyway side depth min–max (given here up to 3 1/2 in), nut thread (nominal, tpi; up to 3 in)].
 */
type TaperRow = [number, number, number, number, [number, number] | null, [number, number] | null];
const SAE_J755: TaperRow[] = [
  [0.75, 0.625, 2.0, 0.1875, [0.095, 0.097], [0.5, 13]],
  [0.875, 0.727, 2.375, 0.25, [0.125, 0.127], [0.625, 11]],
  [1.0, 0.828, 2.75, 0.25, [0.125, 0.127], [0.75, 10]],
  [1.125, 0.93, 3.125, 0.25, [0.125, 0.127], [0.75, 10]],
  [1.25, 1.031, 3.5, 0.3125, [0.157, 0.16], [0.875, 9]],
  [1.375, 1.133, 3.875, 0.3125, [0.157, 0.16], [1.0, 8]],
  [1.5, 1.234, 4.25, 0.375, [0.189, 0.192], [1.125, 7]],
  [1.75, 1.438, 5.0, 0.4375, [0.219, 0.222], [1.25, 7]],
  [2.0, 1.641, 5.75, 0.5, [0.251, 0.254], [1.5, 6]],
  [2.25, 1.844, 6.5, 0.5625, [0.281, 0.284], [1.75, 5]],
  [2.5, 2.047, 7.25, 0.625, [0.312, 0.315], [1.75, 5]],
  [2.75, 2.258, 7.875, 0.625, [0.313, 0.316], [2.0, 4.5]],
  [3.0, 2.461, 8.625, 0.75, [0.311, 0.314], [2.25, 4.5]],
  [3.25, 2.664, 9.375, 0.75, [0.311, 0.314], null],
  [3.5, 2.867, 10.125, 0.875, [0.31, 0.313], null],
  [3.75, 3.07, 10.875, 0.875, null, null],
  [4.0, 3.273, 11.625, 1.0, null, null],
  [4.5, 3.828, 10.75, 1.125, null, null],
  [5.0, 4.25, 12.0, 1.25, null, null],
  [5.5, 4.672, 13.25, 1.25, null, null],
];

export interface PropellerTaperResult {
  standard: "SAE J755";
  shaftDiameterIn: number;
  taperPerFootIn: number;
  taperLengthIn: number;
  smallEndIn: number;
  keywayWidthIn: number;
  keywaySideDepthIn?: { min: number; max: number };
  nutThread?: { nominalIn: number; tpi: number };
}

/**
 * Propeller end dimensions of a standard shaft after SAE J755. The small end follows from the
 * taper: small end = D − taper length × (3/4 in per ft ÷ 12) = D − L / 16.
 */
export function propellerTaper(input: { shaftDiameterIn: number }): PropellerTaperResult {
  const d = requirePositive("shaftDiameterIn", input?.shaftDiameterIn);
  const row = SAE_J755.find(([nominal]) => Math.abs(nominal - d) <= SIZE_SLACK_IN);
  if (!row) {
    const range = d > 5.5 ? " Shafts of 6 to 8 in use a 1 in per foot taper, not held here." : "";
    throw new CalcError(
      "shaftDiameterIn",
      `${d} in is not a standard SAE J755 shaft size (3/4 in to 5 1/2 in in the table held here).${range}`,
    );
  }
  const [shaftDiameterIn, smallEndIn, taperLengthIn, keywayWidthIn, depth, thread] = row;
  return {
    standard: "SAE J755",
    shaftDiameterIn,
    taperPerFootIn: 0.75,
    taperLengthIn,
    smallEndIn,
    keywayWidthIn,
    ...(depth ? { keywaySideDepthIn: { min: depth[0], max: depth[1] } } : {}),
    ...(thread ? { nutThread: { nominalIn: thread[0], tpi: thread[1] } } : {}),
  };
}

/** ISO 4566:1992, scope: propeller shaft ends of 20 mm to 160 mm with a 1:10 taper. */
const ISO_4566_RANGE_MM: [number, number] = [20, 160];
/** Taper 1:10: the diameter changes by 1 unit per 10 units of length (ISO 1119 rate of taper C = (D − d) / L). */
const ISO_4566_TAPER = 0.1;

export interface PropellerTaperMmResult {
  standard: "ISO 4566";
  /** The nominal size used (the measure snapped to the whole millimetre within 0.005 in). */
  shaftDiameterMm: number;
  /** Diameter change per unit of taper length: 0.1 for 1:10. */
  taperRatio: number;
  /** Half the included angle of the taper, for setting a lathe's top slide. */
  halfAngleDeg: number;
  keyStandard: "DIN 6885-1";
  keyWidthMm: number;
  keyHeightMm: number;
  shaftKeywayDepthMm: number;
  hubKeywayDepthMm: number;
}

/**
 * A metric propeller shaft end after ISO 4566 (small craft, 1:10 taper, 20–160 mm), keyed with
 * the DIN 6885-1 parallel key for the shaft diameter. Taper length and nut thread come from
 * ISO 4566 Table 1 or the propeller maker's drawing; they are not held here. Half angle =
 * atan(C / 2) for a rate of taper C.
 */
export function propellerTaperMm(input: { shaftDiameterMm: number }): PropellerTaperMmResult {
  const measured = requirePositive("shaftDiameterMm", input?.shaftDiameterMm);
  const whole = Math.round(measured);
  const shaftDiameterMm = Math.abs(whole - measured) <= SIZE_SLACK_IN * 25.4 ? whole : measured;
  const [from, to] = ISO_4566_RANGE_MM;
  if (shaftDiameterMm < from || shaftDiameterMm > to) {
    throw new CalcError(
      "shaftDiameterMm",
      `${measured} mm is outside ISO 4566 (propeller shafts of ${from} mm to ${to} mm).`,
    );
  }
  const key = keyForShaftMm({ diameterMm: shaftDiameterMm });
  return {
    standard: "ISO 4566",
    shaftDiameterMm,
    taperRatio: ISO_4566_TAPER,
    halfAngleDeg: tidy((Math.atan(ISO_4566_TAPER / 2) * 180) / Math.PI),
    keyStandard: key.standard,
    keyWidthMm: key.widthMm,
    keyHeightMm: key.heightMm,
    shaftKeywayDepthMm: key.shaftDepthMm,
    hubKeywayDepthMm: key.hubDepthMm,
  };
}
