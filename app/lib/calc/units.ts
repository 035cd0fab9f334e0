import { CalcError } from "./errors";

/**
 * Units the shop enters and reads. Factors are the exact definitions of NIST SP 811 (2008),
 * Appendix B: 1 in = 0.0254 m, 1 ft = 0.3048 m, 1 lb = 0.45359237 kg,
 * 1 lbf = 4.4482216152605 N, 1 US gal = 231 in³ = 3.785411784 L, 1 kn = 1852 m/h,
 * 1 mi = 1609.344 m, 1 bar = 100 kPa, 1 hp = 550 ft·lbf/s. Inches of mercury and of water are
 * the conventional units (13.5951 g/cm³ and 1 g/cm³ under standard gravity 9.80665 m/s²);
 * 1 mm H2O = 9.80665 Pa and 1 mbar = 100 Pa (NIST SP 811, B.8); 1 nautical mile = 1852 m.
 */
const LBF_N = 4.4482216152605;
const IN_M = 0.0254;
const FT_M = 0.3048;
const STANDARD_GRAVITY = 9.80665;

interface UnitDefinition {
  dimension: Dimension;
  /** value in the dimension's base unit = (value + offset) × factor */
  factor: number;
  offset?: number;
}

export type Dimension =
  | "length"
  | "pressure"
  | "temperature"
  | "speed"
  | "volume"
  | "flow"
  | "power"
  | "mass"
  | "force"
  | "torque"
  | "time"
  | "slope"
  | "density"
  | "thread density"
  | "dimensionless"
  | "rotational speed"
  | "voltage"
  | "current"
  | "percent"
  | "angle";

const definitions = {
  // length, base metre
  in: { dimension: "length", factor: IN_M },
  mm: { dimension: "length", factor: 0.001 },
  thou: { dimension: "length", factor: IN_M / 1000 },
  ft: { dimension: "length", factor: FT_M },
  m: { dimension: "length", factor: 1 },
  nmi: { dimension: "length", factor: 1852 },
  // pressure, base pascal
  psi: { dimension: "pressure", factor: LBF_N / (IN_M * IN_M) },
  kPa: { dimension: "pressure", factor: 1000 },
  bar: { dimension: "pressure", factor: 100_000 },
  inHg: { dimension: "pressure", factor: 13_595.1 * STANDARD_GRAVITY * IN_M },
  inH2O: { dimension: "pressure", factor: 1000 * STANDARD_GRAVITY * IN_M },
  mbar: { dimension: "pressure", factor: 100 },
  mmH2O: { dimension: "pressure", factor: 1000 * STANDARD_GRAVITY * 0.001 },
  // temperature, base kelvin
  degF: { dimension: "temperature", factor: 5 / 9, offset: 459.67 },
  degC: { dimension: "temperature", factor: 1, offset: 273.15 },
  // speed, base metre per second
  kn: { dimension: "speed", factor: 1852 / 3600 },
  mph: { dimension: "speed", factor: 1609.344 / 3600 },
  "km/h": { dimension: "speed", factor: 1000 / 3600 },
  // volume, base litre
  gal: { dimension: "volume", factor: 3.785411784 },
  L: { dimension: "volume", factor: 1 },
  // flow, base litre per minute
  "L/min": { dimension: "flow", factor: 1 },
  "gal/min": { dimension: "flow", factor: 3.785411784 },
  // power, base watt
  hp: { dimension: "power", factor: 550 * FT_M * LBF_N },
  kW: { dimension: "power", factor: 1000 },
  // mass, base kilogram
  lb: { dimension: "mass", factor: 0.45359237 },
  kg: { dimension: "mass", factor: 1 },
  // force, base newton
  lbf: { dimension: "force", factor: LBF_N },
  N: { dimension: "force", factor: 1 },
  // torque, base newton metre
  lbfFt: { dimension: "torque", factor: LBF_N * FT_M },
  Nm: { dimension: "torque", factor: 1 },
  // time, base second
  s: { dimension: "time", factor: 1 },
  min: { dimension: "time", factor: 60 },
  h: { dimension: "time", factor: 3600 },
  // alignment slopes (gap difference per unit of diameter), base in/in
  "in/in": { dimension: "slope", factor: 1 },
  "thou/in": { dimension: "slope", factor: 0.001 },
  "mm/m": { dimension: "slope", factor: 0.001 },
  // density, base kilogram per cubic metre
  "lb/in3": { dimension: "density", factor: 0.45359237 / (IN_M * IN_M * IN_M) },
  "kg/m3": { dimension: "density", factor: 1 },
  // units that only convert to themselves; "1" is the unit one of plain ratios (NIST SP 811 §7.10)
  "1": { dimension: "dimensionless", factor: 1 },
  tpi: { dimension: "thread density", factor: 1 },
  rpm: { dimension: "rotational speed", factor: 1 },
  V: { dimension: "voltage", factor: 1 },
  A: { dimension: "current", factor: 1 },
  "%": { dimension: "percent", factor: 1 },
  deg: { dimension: "angle", factor: 1 },
} as const satisfies Record<string, UnitDefinition>;

export type Unit = keyof typeof definitions;

export const units: readonly Unit[] = Object.freeze(Object.keys(definitions) as Unit[]);

export function isUnit(value: unknown): value is Unit {
  return typeof value === "string" && Object.hasOwn(definitions, value);
}

function definitionOf(unit: Unit, field: string): UnitDefinition {
  if (!isUnit(unit)) throw new CalcError(field, `"${String(unit)}" is not a unit Sternpost knows.`);
  return definitions[unit];
}

export function dimensionOf(unit: Unit): Dimension {
  return definitionOf(unit, "unit").dimension;
}

/**
 * Converts between two units of the same dimension; throws a CalcError (field "to") when the
 * dimensions differ, e.g. inches to psi.
 */
export function convert(value: number, from: Unit, to: Unit): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new CalcError("value", "The value to convert is missing or is not a number.");
  }
  const a = definitionOf(from, "from");
  const b = definitionOf(to, "to");
  if (a.dimension !== b.dimension) {
    throw new CalcError("to", `Cannot convert ${from} (${a.dimension}) to ${to} (${b.dimension}).`);
  }
  if (from === to) return value;
  const base = (value + (a.offset ?? 0)) * a.factor;
  const result = base / b.factor - (b.offset ?? 0);
  if (!Number.isFinite(result)) throw new CalcError("value", "The value is too large to convert.");
  return result;
}
