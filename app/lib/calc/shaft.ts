import { defineCalc } from "./define";
import { requireFiniteResult, requirePositive } from "./errors";
import { atLeast, atMost, tidy } from "./numbers";

export interface ShaftDiameterInput {
  shp: number;
  shaftRpm: number;
  /** Yield strength of the shaft material in torsional shear. */
  torsionalYieldPsi: number;
  /** Gerr: about 2 for light pleasure craft, 3 for average yachts, up to 7.5 for inspected passenger vessels. */
  safetyFactor: number;
  /** The shaft fitted, for a verdict. */
  installedDiameterIn?: number;
}

export interface ShaftDiameterResult {
  diameterIn: number;
  pass?: boolean;
}

/**
 * Minimum solid propeller-shaft diameter in torsion (Gerr, Propeller Handbook, shaft diameter
 * formula; also ABYC P-6): D = ∛(321,000 × SHP × SF / (St × RPM)), inches. The constant is
 * 16 × 63,025 / π: torque T = 63,025 × hp / rpm (lb·in) in the torsion formula τ = 16T / (πD³).
 */
export function shaftDiameter(input: ShaftDiameterInput): ShaftDiameterResult {
  const shp = requirePositive("shp", input?.shp);
  const rpm = requirePositive("shaftRpm", input.shaftRpm);
  const st = requirePositive("torsionalYieldPsi", input.torsionalYieldPsi);
  const sf = requirePositive("safetyFactor", input.safetyFactor);
  const diameterIn = tidy(requireFiniteResult("shp", Math.cbrt((321_000 * shp * sf) / (st * rpm))));
  if (input.installedDiameterIn === undefined) return { diameterIn };
  const installed = requirePositive("installedDiameterIn", input.installedDiameterIn);
  return { diameterIn, pass: atLeast(installed, diameterIn) };
}

export interface BearingSpacingInput {
  shaftDiameterIn: number;
  shaftRpm: number;
  elasticModulusPsi: number;
  densityLbPerIn3: number;
  /** The longest unsupported span fitted, for a verdict. */
  actualSpacingFt?: number;
}

export interface BearingSpacingResult {
  maxSpacingFt: number;
  pass?: boolean;
}

/**
 * Longest span between shaft bearings before whirling (Gerr, Propeller Handbook, shaft bearing
 * spacing formula): L = √(3.21 × D / RPM) × (E / d)^¼, feet — the first critical speed of a
 * simply supported solid shaft set equal to the running rpm.
 */
export function bearingSpacing(input: BearingSpacingInput): BearingSpacingResult {
  const d = requirePositive("shaftDiameterIn", input?.shaftDiameterIn);
  const rpm = requirePositive("shaftRpm", input.shaftRpm);
  const e = requirePositive("elasticModulusPsi", input.elasticModulusPsi);
  const density = requirePositive("densityLbPerIn3", input.densityLbPerIn3);
  const maxSpacingFt = tidy(
    requireFiniteResult("elasticModulusPsi", Math.sqrt((3.21 * d) / rpm) * Math.pow(e / density, 0.25)),
  );
  if (input.actualSpacingFt === undefined) return { maxSpacingFt };
  const actual = requirePositive("actualSpacingFt", input.actualSpacingFt);
  return { maxSpacingFt, pass: atMost(actual, maxSpacingFt) };
}

export const shaftDiameterCalc = defineCalc({
  name: "shaftDiameter",
  title: "Minimum shaft diameter",
  summary: "Smallest solid propeller shaft for the power, rpm, material and safety factor.",
  source: "Gerr, Propeller Handbook: D = ∛(321,000 × SHP × SF / (St × rpm))",
  inputs: {
    power: { label: "Shaft power", accepts: ["number"], unit: "hp", field: "shp" },
    shaftRpm: { label: "Shaft rpm", accepts: ["number"], unit: "rpm", field: "shaftRpm" },
    torsionalYield: {
      label: "Torsional yield strength",
      accepts: ["number"],
      unit: "psi",
      field: "torsionalYieldPsi",
    },
    safetyFactor: { label: "Safety factor", accepts: ["number"], unit: "1", field: "safetyFactor" },
    installedDiameter: {
      label: "Shaft fitted",
      accepts: ["number"],
      unit: "in",
      optional: true,
      field: "installedDiameterIn",
    },
  },
  run(read, show) {
    const result = shaftDiameter({
      shp: read.number("power", "hp")!,
      shaftRpm: read.number("shaftRpm", "rpm")!,
      torsionalYieldPsi: read.number("torsionalYield", "psi")!,
      safetyFactor: read.number("safetyFactor", "1")!,
      installedDiameterIn: read.number("installedDiameter", "in"),
    });
    return {
      values: { "minimum diameter": result.diameterIn },
      units: { "minimum diameter": "in" },
      verdict: result.pass === undefined ? "info" : result.pass ? "pass" : "fail",
      primary: "minimum diameter",
      rule: `shaft fitted ≥ ${show.q(result.diameterIn, "in")}`,
      detail: result,
    };
  },
});

export const bearingSpacingCalc = defineCalc({
  name: "bearingSpacing",
  title: "Maximum bearing spacing",
  summary: "Longest unsupported shaft span before whirling.",
  source: "Gerr, Propeller Handbook: L = √(3.21 × D / rpm) × (E / density)^¼",
  inputs: {
    shaftDiameter: { label: "Shaft diameter", accepts: ["number"], unit: "in", field: "shaftDiameterIn" },
    shaftRpm: { label: "Shaft rpm", accepts: ["number"], unit: "rpm", field: "shaftRpm" },
    elasticModulus: {
      label: "Modulus of elasticity",
      accepts: ["number"],
      unit: "psi",
      field: "elasticModulusPsi",
    },
    density: {
      label: "Density of the shaft material",
      accepts: ["number"],
      unit: "lb/in3",
      field: "densityLbPerIn3",
    },
    actualSpacing: {
      label: "Longest span fitted",
      accepts: ["number"],
      unit: "ft",
      optional: true,
      field: "actualSpacingFt",
    },
  },
  run(read, show) {
    const result = bearingSpacing({
      shaftDiameterIn: read.number("shaftDiameter", "in")!,
      shaftRpm: read.number("shaftRpm", "rpm")!,
      elasticModulusPsi: read.number("elasticModulus", "psi")!,
      densityLbPerIn3: read.number("density", "lb/in3")!,
      actualSpacingFt: read.number("actualSpacing", "ft"),
    });
    return {
      values: { "maximum spacing": result.maxSpacingFt },
      units: { "maximum spacing": "ft" },
      verdict: result.pass === undefined ? "info" : result.pass ? "pass" : "fail",
      primary: "maximum spacing",
      rule: `span between bearings ≤ ${show.q(result.maxSpacingFt, "ft")}`,
      detail: result,
    };
  },
});
