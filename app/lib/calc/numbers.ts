/**
 * Floating-point housekeeping shared by the calculations. Sums of decimal readings carry binary
 * noise (0.003 − 0.001 = 0.0019999999999999996); results are tidied to 12 significant digits,
 * far finer than any shop instrument, so a reading exactly on the limit passes.
 */
export function tidy(value: number): number {
  if (value === 0) return 0;
  const tidied = Number(value.toPrecision(12));
  return tidied === 0 ? 0 : tidied; // no negative zero on a screen
}

const RELATIVE_SLACK = 1e-9;

/** value ≤ limit, forgiving binary noise. */
export function atMost(value: number, limit: number): boolean {
  return value <= limit + RELATIVE_SLACK * Math.max(1, Math.abs(limit));
}

/** value ≥ limit, forgiving binary noise. */
export function atLeast(value: number, limit: number): boolean {
  return value >= limit - RELATIVE_SLACK * Math.max(1, Math.abs(limit));
}

/**
 * A shaft measured within this of a nominal size is that size (worn, ground or oversize stock),
 * for key and taper look-ups: a 1.2503 in shaft is a 1 1/4 in shaft, not the next row up.
 */
export const SIZE_SLACK_IN = 0.005;
/** Inch shafting comes in sixteenths (SAE J755 sizes are all sixteenths). */
const NOMINAL_STEP_IN = 1 / 16;

/** The nominal inch size of a measured diameter: the nearest sixteenth within the slack, else the measure. */
export function nominalInch(diameterIn: number): number {
  const nearest = Math.round(diameterIn / NOMINAL_STEP_IN) * NOMINAL_STEP_IN;
  return Math.abs(nearest - diameterIn) <= SIZE_SLACK_IN + 1e-12 ? nearest : diameterIn;
}
