import { describe, expect, it } from "vitest";
import { fieldOf } from "../../support/calc.ts";
import { CalcError, awgCircularMils, conductorCircularMils, wireSize } from "~/lib/calc";

describe("conductor areas — NEC Chapter 9 Table 8", () => {
  it("circular mils of AWG sizes (Table 8, 'Area, Circular mils')", () => {
    expect(awgCircularMils("18")).toBe(1620);
    expect(awgCircularMils("16")).toBe(2580);
    expect(awgCircularMils("14")).toBe(4110);
    expect(awgCircularMils("12")).toBe(6530);
    expect(awgCircularMils("10")).toBe(10380);
    expect(awgCircularMils("8")).toBe(16510);
    expect(awgCircularMils("6")).toBe(26240);
    expect(awgCircularMils("4")).toBe(41740);
    expect(awgCircularMils("2")).toBe(66360);
    expect(awgCircularMils("1/0")).toBe(105600);
    expect(awgCircularMils("AWG 2/0")).toBe(133100);
    expect(awgCircularMils("4/0")).toBe(211600);
  });

  it("circular mils to mm² agrees with the area column of NFPA 70 (NEC) Chapter 9 Table 8, Conductor Properties (14 AWG 2.08 mm², 4/0 107 mm²)", () => {
    expect(4110 / conductorCircularMils("1 mm2")).toBeCloseTo(2.08, 2);
    expect(211600 / conductorCircularMils("1 mm²")).toBeCloseTo(107.2, 1);
    expect(() => awgCircularMils("5")).toThrow(CalcError);
  });
});

describe("wireSize — ABYC E-11 voltage drop, CM = 10.75 × I × L / E", () => {
  it("worked example of a 10 % table: 10 A bilge pump, 11 ft out and 10 ft back at 12 V → 16 AWG", () => {
    // Published 10 % voltage-drop table for 12 V (marine supply catalogue, wiring pages):
    // 21 ft round trip, 10 A → 16 AWG. By the formula: 10.75 × 10 × 21 / 1.2 = 1881 CM.
    const r = wireSize({ currentA: 10, roundTripFt: 21, systemVolts: 12, dropPercent: 10 });
    expect(r.circularMils).toBeCloseTo(1881.25, 6);
    expect(r.awg).toBe("16");
    expect(r.allowedDropV).toBe(1.2);
  });

  it("3 % drop for a critical load (hand-worked): 15 A, 30 ft round trip, 12 V → 13,437.5 CM → 8 AWG, 10 mm²", () => {
    // E = 0.36 V; 10.75 × 15 × 30 / 0.36 = 13,437.5 CM: 10 AWG (10,380) is too small, 8 AWG (16,510) is enough.
    // 13,437.5 CM × 0.000506708 mm²/CM = 6.81 mm² → the next IEC 60228 size is 10 mm².
    const r = wireSize({ currentA: 15, roundTripFt: 30, systemVolts: 12, dropPercent: 3 });
    expect(r.circularMils).toBeCloseTo(13437.5, 6);
    expect(r.awg).toBe("8");
    expect(r.metricMm2).toBe(10);
  });

  it("an area exactly on a table size takes that size", () => {
    // 6530 CM (12 AWG) from 10.75 × I × L / E: I = 6530 × 0.36 / (10.75 × 20) = 10.9339… A at 20 ft.
    const r = wireSize({
      currentA: (6530 * 0.36) / (10.75 * 20),
      roundTripFt: 20,
      systemVolts: 12,
      dropPercent: 3,
    });
    expect(r.awg).toBe("12");
  });

  it("names the field when the run needs more than 4/0 or an input is impossible", () => {
    expect(
      fieldOf(() => wireSize({ currentA: 200, roundTripFt: 100, systemVolts: 12, dropPercent: 3 })),
    ).toBe("roundTripFt");
    expect(fieldOf(() => wireSize({ currentA: 10, roundTripFt: 20, systemVolts: 0, dropPercent: 3 }))).toBe(
      "systemVolts",
    );
    expect(fieldOf(() => wireSize({ currentA: 10, roundTripFt: 20, systemVolts: 12, dropPercent: 0 }))).toBe(
      "dropPercent",
    );
    expect(
      fieldOf(() => wireSize({ currentA: Number.NaN, roundTripFt: 20, systemVolts: 12, dropPercent: 3 })),
    ).toBe("currentA");
  });
});
