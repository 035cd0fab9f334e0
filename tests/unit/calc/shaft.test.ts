import { describe, expect, it } from "vitest";
import { fieldOf } from "../../support/calc.ts";
import { bearingSpacing, shaftDiameter } from "~/lib/calc";

describe("shaftDiameter — Gerr, Propeller Handbook shaft-diameter formula", () => {
  it("worked example: 42 SHP at 2000 shaft rpm, bronze (St = 20,000 psi), SF 3 → about 1 in", () => {
    // Published worked example of Gerr's formula D = ∛(321,000 × SHP × SF / (St × RPM)):
    // "this computes to an ideal shaft diameter of one inch". By hand: ∛1.01115 = 1.0037 in.
    const r = shaftDiameter({ shp: 42, shaftRpm: 2000, torsionalYieldPsi: 20_000, safetyFactor: 3 });
    expect(r.diameterIn).toBeCloseTo(1.0037, 4);
  });

  it("its constant is the torsion formula: 16 × 63,025 / π ≈ 321,000", () => {
    // Gerr (Westlawn Masthead, shaft-diameter derivation): T = 63,025 × hp / rpm lb·in and
    // τ = 16 T / (π D³) give 320,983.7, rounded to 321,000. Machinery's Handbook gives the same
    // torque relation (hp = T × rpm / 63,025).
    const { diameterIn } = shaftDiameter({
      shp: 300,
      shaftRpm: 1200,
      torsionalYieldPsi: 60_000,
      safetyFactor: 2,
    });
    const constant = (diameterIn ** 3 * 60_000 * 1200) / (300 * 2);
    expect(Math.abs(constant / ((16 * 63_025) / Math.PI) - 1)).toBeLessThan(1e-4);
  });

  it("judges the shaft fitted against the minimum", () => {
    expect(
      shaftDiameter({
        shp: 42,
        shaftRpm: 2000,
        torsionalYieldPsi: 20_000,
        safetyFactor: 3,
        installedDiameterIn: 1,
      }).pass,
    ).toBe(false);
    expect(
      shaftDiameter({
        shp: 42,
        shaftRpm: 2000,
        torsionalYieldPsi: 20_000,
        safetyFactor: 3,
        installedDiameterIn: 1.125,
      }).pass,
    ).toBe(true);
  });

  it("names the field of bad input", () => {
    const ok = { shp: 42, shaftRpm: 2000, torsionalYieldPsi: 20_000, safetyFactor: 3 };
    expect(fieldOf(() => shaftDiameter({ ...ok, shaftRpm: 0 }))).toBe("shaftRpm");
    expect(fieldOf(() => shaftDiameter({ ...ok, shp: -1 }))).toBe("shp");
    expect(fieldOf(() => shaftDiameter({ ...ok, torsionalYieldPsi: Number.POSITIVE_INFINITY }))).toBe(
      "torsionalYieldPsi",
    );
    expect(fieldOf(() => shaftDiameter({ ...ok, safetyFactor: 0 }))).toBe("safetyFactor");
  });
});

describe("bearingSpacing — Gerr, Propeller Handbook bearing-spacing formula", () => {
  it("worked example: 1 in bronze shaft at 2000 rpm, E = 16,000,000 psi, 0.304 lb/in³ → 3 ft 5 in", () => {
    // Published worked example of L = √(3.21 × D / RPM) × (E / d)^¼: "3 feet and 5 inches".
    const r = bearingSpacing({
      shaftDiameterIn: 1,
      shaftRpm: 2000,
      elasticModulusPsi: 16e6,
      densityLbPerIn3: 0.304,
    });
    expect(Math.abs(r.maxSpacingFt - (3 + 5 / 12))).toBeLessThan(0.01);
  });

  it("is the span whose first whirling speed equals the running rpm (simply supported shaft)", () => {
    // Machinery's Handbook, critical speeds of shafts (from memory): ω = (π/L)² √(E I / (ρ A)),
    // with I/A = D²/16 for a solid shaft and ρ = weight density ÷ g (g = 9.80665 / 0.0254 in/s²).
    const d = 1.5;
    const rpm = 1800;
    const e = 28e6;
    const w = 0.286;
    const lIn =
      bearingSpacing({ shaftDiameterIn: d, shaftRpm: rpm, elasticModulusPsi: e, densityLbPerIn3: w })
        .maxSpacingFt * 12;
    const g = 9.80665 / 0.0254;
    const omega = (Math.PI / lIn) ** 2 * Math.sqrt((e * (d * d)) / 16 / (w / g));
    expect(Math.abs((omega * 60) / (2 * Math.PI) / rpm - 1)).toBeLessThan(0.005);
  });

  it("judges the span fitted", () => {
    const base = { shaftDiameterIn: 1, shaftRpm: 2000, elasticModulusPsi: 16e6, densityLbPerIn3: 0.304 };
    expect(bearingSpacing({ ...base, actualSpacingFt: 3 }).pass).toBe(true);
    expect(bearingSpacing({ ...base, actualSpacingFt: 4 }).pass).toBe(false);
    expect(fieldOf(() => bearingSpacing({ ...base, densityLbPerIn3: 0 }))).toBe("densityLbPerIn3");
  });
});
