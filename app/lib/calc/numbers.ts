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
