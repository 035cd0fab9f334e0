/**
 * The one way Sternpost reads a number a person typed: digits with an optional sign and one
 * decimal separator, a comma read as the decimal point it is in most of Europe ("1,25" is 1.25).
 * Exponents ("1e3"), thousands separators and anything else are refused: on a tablet in a bilge
 * an "e" is a slip of the finger, not a power of ten.
 */
export function readDecimal(text: string): number | null | "invalid" {
  const t = text.trim().replace(",", ".");
  if (t === "") return null;
  return /^[-+]?(\d+\.?\d*|\.\d+)$/.test(t) ? Number(t) : "invalid";
}

/** A reading, or null when the text is empty or not a number. */
export function readNumber(text: string): number | null {
  const value = readDecimal(text);
  return typeof value === "number" ? value : null;
}
