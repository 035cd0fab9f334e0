/**
 * The one error every calculation throws for input it cannot use. `field` names the input
 * (as spelled in the function's argument object, dotted for nested fields, e.g.
 * "gapsIn.top" or "stations[2].readingsIn") so a screen can show the message at that field.
 * No calculation returns NaN or Infinity instead.
 */
export class CalcError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = "CalcError";
    this.field = field;
  }
}

export function isCalcError(error: unknown): error is CalcError {
  return error instanceof CalcError;
}

const UNIT_SUFFIX = /(In|Mm|Ft|Psi|KPa|Knots|Volts|Percent|Deg|LbPerIn3)$/;
const WORDS: Record<string, string> = { tir: "TIR", shp: "SHP", wot: "WOT", tpi: "TPI", rpm: "rpm" };

/**
 * A field path in words for a message: "gapsIn.top" → "Gaps top", "stations[1].readingsIn" →
 * "Stations 2 readings". The unit suffix is dropped; the screen shows the unit beside the field.
 */
export function fieldWords(field: string): string {
  const words = field
    .replace(/\[(\d+)\]/g, (_, i: string) => ` ${Number(i) + 1}`)
    .split(".")
    .map((part) => part.replace(UNIT_SUFFIX, "").replace(/([a-z0-9])([A-Z])/g, "$1 $2"))
    .join(" ")
    .split(/\s+/)
    .filter(Boolean)
    .map((w) => WORDS[w.toLowerCase()] ?? w.toLowerCase());
  const text = words.join(" ");
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** A finite number, or a CalcError naming the field. */
export function requireFinite(field: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new CalcError(field, `${fieldWords(field)} is missing or is not a number.`);
  }
  return value;
}

/** A finite number greater than zero (diameters, lengths, rpm, voltages...). */
export function requirePositive(field: string, value: unknown): number {
  const n = requireFinite(field, value);
  if (n <= 0) throw new CalcError(field, `${fieldWords(field)} must be greater than zero (got ${n}).`);
  return n;
}

/** A finite number of zero or more (gaps, clearances, limits). */
export function requireNonNegative(field: string, value: unknown): number {
  const n = requireFinite(field, value);
  if (n < 0) throw new CalcError(field, `${fieldWords(field)} cannot be negative (got ${n}).`);
  return n;
}

/**
 * Guards a computed result: a formula fed with valid but extreme numbers (1e308, 5e-324) can
 * still overflow. Blames the input that drives the result so the screen has a field to point at.
 */
export function requireFiniteResult<T>(field: string, result: T): T {
  const finite = (value: unknown): boolean =>
    typeof value === "number"
      ? Number.isFinite(value)
      : typeof value === "object" && value !== null
        ? Object.values(value).every(finite)
        : true;
  if (!finite(result)) {
    throw new CalcError(field, `${fieldWords(field)} is out of the range this calculation can handle.`);
  }
  return result;
}
