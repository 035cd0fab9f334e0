import { convert, isUnit, type Unit } from "./units";

/**
 * The one precision rule for every calculated value on every screen and in the PDF: a value is
 * rounded to the decimals its unit is read to in a shop (a tenth of a thou in inches, a
 * micrometre in millimetres, a tenth of a degree...), then trailing zeros dropped. A result and
 * the rule beside it are written by the same rule, so "1.2346 in" never sits above "≥ 1.2346 in"
 * written differently.
 */
const DECIMALS: Record<string, number> = {
  in: 4,
  thou: 1,
  mm: 3,
  m: 4,
  ft: 3,
  psi: 2,
  kPa: 2,
  bar: 3,
  mbar: 0,
  inHg: 2,
  inH2O: 1,
  mmH2O: 0,
  degF: 1,
  degC: 1,
  kn: 2,
  mph: 1,
  "km/h": 1,
  nmi: 3,
  gal: 2,
  L: 2,
  "L/min": 1,
  "gal/min": 2,
  hp: 1,
  kW: 1,
  lb: 1,
  kg: 1,
  lbf: 1,
  N: 0,
  lbfFt: 0,
  Nm: 0,
  s: 1,
  min: 2,
  h: 2,
  "in/in": 5,
  "thou/in": 2,
  "mm/m": 2,
  rpm: 0,
  tpi: 1,
  V: 2,
  A: 1,
  "%": 1,
  deg: 1,
  turns: 2,
  CM: 0,
  "mm²": 2,
  "1": 3,
};
const DEFAULT_DECIMALS = 4;

/** The value rounded by the precision rule of its unit (no negative zero). */
export function roundForUnit(value: number, unit: string | undefined): number {
  const decimals = unit !== undefined && Object.hasOwn(DECIMALS, unit) ? DECIMALS[unit] : DEFAULT_DECIMALS;
  const rounded = Number(value.toFixed(decimals));
  return rounded === 0 ? 0 : rounded;
}

/** How a unit is written next to a number for a person ("gal" is the US gallon, and says so). */
const LABELS: Record<string, string> = {
  degF: "°F",
  degC: "°C",
  inH2O: "inH₂O",
  mmH2O: "mm H₂O",
  lbfFt: "lbf·ft",
  Nm: "N·m",
  deg: "°",
  gal: "US gal",
  "gal/min": "US gal/min",
  nmi: "nmi",
  "lb/in3": "lb/in³",
  "kg/m3": "kg/m³",
  "1": "",
};

export function unitLabel(unit: string): string {
  return LABELS[unit] ?? unit;
}

/** A number and its unit, by the one precision rule: "0.0250 mm" is "0.025 mm", "3%", "180°". */
export function formatQuantity(value: number, unit: string | undefined): string {
  const text = String(roundForUnit(value, unit));
  if (!unit) return text;
  const label = unitLabel(unit);
  const tight = label === "" || label === "%" || label.startsWith("°");
  return tight ? `${text}${label}` : `${text} ${label}`;
}

/** A length written in the other system for a second look ("0.001 in" beside "0.025 mm"). */
export function otherSystem(value: number, unit: Unit): { value: number; unit: Unit } | undefined {
  const pairs: Partial<Record<Unit, Unit>> = { in: "mm", mm: "in", ft: "m", m: "ft" };
  const to = isUnit(unit) ? pairs[unit] : undefined;
  return to ? { value: convert(value, unit, to), unit: to } : undefined;
}
