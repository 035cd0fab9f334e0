import { describe, expect, it } from "vitest";
import { fieldOf } from "../../support/calc.ts";
import { propSlip, seaTrialLoading } from "~/lib/calc";

describe("propSlip — Gerr, Propeller Handbook, apparent slip", () => {
  it("20 in pitch, 3000 engine rpm through 2 : 1, 20 kn → 1500 shaft rpm, 24.69 kn theoretical, 19 % slip", () => {
    // Gerr, The Propeller Handbook, apparent slip (pitch speed with the constant 1215): theoretical knots = pitch × shaft rpm ÷ 1215; by hand
    // 20 × 1500 / 1215 = 24.69 kn and (24.69 − 20) / 24.69 = 19.0 %. The exact divisor from the
    // nautical mile (1852 m, NIST SP 811) and 1 in = 0.0254 m is 72,913.39 / 60 = 1215.22.
    const r = propSlip({ pitchIn: 20, engineRpm: 3000, gearRatio: 2, speedKnots: 20 });
    expect(r.shaftRpm).toBe(1500);
    expect(r.theoreticalKnots).toBeCloseTo(24.69, 2);
    expect(r.slipPercent).toBeCloseTo(19.0, 1);
    expect(r.theoreticalKnots).toBeCloseTo((20 * 1500 * 60 * 0.0254) / 1852, 9);
  });

  it("zero speed is 100 % slip; a speed above the theoretical gives negative slip", () => {
    expect(propSlip({ pitchIn: 16, engineRpm: 2400, gearRatio: 1, speedKnots: 0 }).slipPercent).toBe(100);
    expect(
      propSlip({ pitchIn: 10, engineRpm: 1215.22, gearRatio: 1, speedKnots: 11 }).slipPercent,
    ).toBeLessThan(0);
  });

  it("refuses a gear ratio of zero and other impossible input, naming the field", () => {
    expect(fieldOf(() => propSlip({ pitchIn: 20, engineRpm: 3000, gearRatio: 0, speedKnots: 20 }))).toBe(
      "gearRatio",
    );
    expect(fieldOf(() => propSlip({ pitchIn: 0, engineRpm: 3000, gearRatio: 2, speedKnots: 20 }))).toBe(
      "pitchIn",
    );
    expect(fieldOf(() => propSlip({ pitchIn: 20, engineRpm: 3000, gearRatio: 2, speedKnots: -1 }))).toBe(
      "speedKnots",
    );
  });
});

describe("seaTrialLoading — rated band and about 200 rpm per inch of pitch (common practice)", () => {
  const band = { ratedRpmMin: 3400, ratedRpmMax: 3600 };
  it("short of the band is over-propped: take pitch out", () => {
    // (3200 − 3500) / 200 = −1.5 in, by hand
    expect(seaTrialLoading({ wotRpm: 3200, ...band })).toEqual({
      verdict: "over-propped",
      pitchChangeIn: -1.5,
      targetRpm: 3500,
    });
  });
  it("inside the band (ends included) is in range", () => {
    expect(seaTrialLoading({ wotRpm: 3400, ...band }).verdict).toBe("in-range");
    expect(seaTrialLoading({ wotRpm: 3600, ...band }).pitchChangeIn).toBe(0);
  });
  it("over the band is under-propped: add pitch", () => {
    expect(seaTrialLoading({ wotRpm: 3800, ...band })).toMatchObject({
      verdict: "under-propped",
      pitchChangeIn: 1.5,
    });
    expect(seaTrialLoading({ wotRpm: 3800, ...band, rpmPerPitchIn: 150 }).pitchChangeIn).toBe(2);
  });
  it("names the field of a band upside down", () => {
    expect(fieldOf(() => seaTrialLoading({ wotRpm: 3000, ratedRpmMin: 3600, ratedRpmMax: 3400 }))).toBe(
      "ratedRpmMax",
    );
    expect(fieldOf(() => seaTrialLoading({ wotRpm: 0, ...band }))).toBe("wotRpm");
  });
});
