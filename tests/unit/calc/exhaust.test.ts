import { describe, expect, it } from "vitest";
import { CalcError, exhaustBackPressure, exhaustInjection, runCalc } from "~/lib/calc";

describe("exhaustInjection", () => {
  it("6 in above the waterline by default (common practice; the engine maker's figure governs)", () => {
    expect(exhaustInjection({ injectionHeightIn: 8 })).toEqual({ minimumIn: 6, marginIn: 2, pass: true });
    expect(exhaustInjection({ injectionHeightIn: 6 }).pass).toBe(true);
    expect(exhaustInjection({ injectionHeightIn: 4 })).toMatchObject({ marginIn: -2, pass: false });
    expect(exhaustInjection({ injectionHeightIn: 10, minimumIn: 12 }).pass).toBe(false);
    expect(() => exhaustInjection({ injectionHeightIn: Number.NaN })).toThrow(CalcError);
  });
});

describe("exhaustBackPressure — conversions per NIST SP 811", () => {
  it("a 3 inHg limit is 10.159 kPa (NIST SP 811 (2008), Appendix B.8, 'inch of mercury, conventional' = 3.386 389 E+03 Pa)", () => {
    // The limit goes in as inHg, so the inHg path of the registry is the one exercised.
    const run = (kPa: number) =>
      runCalc("exhaustBackPressure", {
        backPressure: { kind: "number", value: kPa, unit: "kPa" },
        limit: { kind: "number", value: 3, unit: "inHg" },
      });
    expect(run(10.15)).toMatchObject({ verdict: "pass", rule: expect.stringMatching(/≤ 3 inHg/) });
    expect(run(10.17)).toMatchObject({ verdict: "fail" });
  });

  it("gives the reading in inHg, inH2O and psi", () => {
    // 1 psi = 6.894757 kPa = 2.036021 inHg = 27.6799 inH2O (ratios of the SP 811 factors, by hand)
    const r = exhaustBackPressure({ backPressureKPa: 6.894757293168361, limitKPa: 10 });
    expect(r.backPressurePsi).toBeCloseTo(1, 9);
    expect(r.backPressureInHg).toBeCloseTo(2.036021, 5);
    expect(r.backPressureInH2O).toBeCloseTo(27.6799, 3);
    expect(r.percentOfLimit).toBeCloseTo(68.95, 2);
    expect(() => exhaustBackPressure({ backPressureKPa: 5, limitKPa: 0 })).toThrow(CalcError);
  });
});
