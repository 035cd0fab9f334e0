import { describe, expect, it } from "vitest";
import { CalcError, conductorCheck, runCalc, type CalcInput, type Unit } from "~/lib/calc";

/*
 * Allowable amperage: 33 CFR 183.425 Table 5 "Allowable Amperage of Conductors" (US Coast Guard,
 * eCFR / GPO, 33 CFR Part 183 Subpart I; ABYC E-11 carries the same table), e.g. 16 AWG: 25 A at
 * 105 °C, 15 A at 60 °C. Inside engine spaces, note 1: 105 °C × 0.85 — the "inside engine
 * space" column of the Ancor wire chart (Ancor catalogue appendix "Temperature Rating of
 * Conductor Insulation", 16 AWG 21 A, 6 AWG 102 A). Voltage drop: ABYC E-11 CM = 10.75 × I × L / E.
 */
const base = {
  currentA: 10,
  roundTripFt: 10,
  systemVolts: 12,
  dropPercent: 10,
  insulationRatingC: 105,
  inEngineSpace: false,
};

describe("conductorCheck — ABYC E-11 on three counts", () => {
  it("40 A on 16 AWG fails on ampacity although the drop is small (issue 12, item 8 finding)", () => {
    // 40 A, 2 ft round trip, 12 V, 10 %: 10.75 × 40 × 2 / 1.2 = 717 CM, so 18 AWG would do for the drop.
    const r = conductorCheck({ ...base, currentA: 40, roundTripFt: 2, awg: "16" });
    expect(r.minAwgForDrop).toBe("18");
    expect(r.ampacityA).toBe(25); // Table 5, 16 AWG, 105 °C
    expect(r.pass).toBe(false);
    expect(r.problems).toHaveLength(1);
    expect(r.problems[0]).toMatch(
      /40 A is more than the conductor's allowable 25 A \(16 AWG, 105 °C insulation\)/,
    );
  });

  it("derates inside an engine space and reads the insulation column asked for", () => {
    expect(conductorCheck({ ...base, awg: "16", inEngineSpace: true }).ampacityA).toBe(21.25); // 25 × 0.85
    expect(conductorCheck({ ...base, awg: "6", inEngineSpace: true }).ampacityA).toBe(102); // 120 × 0.85
    expect(conductorCheck({ ...base, awg: "16", insulationRatingC: 60 }).ampacityA).toBe(15);
    expect(conductorCheck({ ...base, awg: "4/0", insulationRatingC: 200 }).ampacityA).toBe(510);
    expect(() => conductorCheck({ ...base, awg: "16", insulationRatingC: 100 })).toThrow(CalcError);
  });

  it("fails a conductor too small for the voltage drop", () => {
    // 10 A over 50 ft at 12 V, 3 %: 10.75 × 10 × 50 / 0.36 = 14,931 CM → 8 AWG (16,510 CM, NEC Ch. 9 Table 8).
    const r = conductorCheck({ ...base, roundTripFt: 50, dropPercent: 3, awg: "10" });
    expect(r.minAwgForDrop).toBe("8");
    expect(r.pass).toBe(false);
    expect(r.problems[0]).toMatch(/Too small for the voltage drop/);
  });

  it("checks the fuse or breaker: at most 150 % of the allowable amperage (ABYC E-11, from memory), not below the load", () => {
    // 14 AWG 105 °C = 35 A; 150 % = 52.5 A.
    expect(conductorCheck({ ...base, awg: "14", overcurrentA: 50 }).pass).toBe(true);
    const big = conductorCheck({ ...base, awg: "14", overcurrentA: 60 });
    expect(big.pass).toBe(false);
    expect(big.problems[0]).toMatch(/larger than 150 % of the conductor's 35 A \(52.5 A at most\)/);
    expect(conductorCheck({ ...base, currentA: 15, awg: "14", overcurrentA: 10 }).problems[0]).toMatch(
      /smaller than the 15 A load/,
    );
  });

  it("takes metric conductors: 2.5 mm² is read in the 14 AWG row, the next AWG size down (IEC 60228 vs NEC Ch. 9 Table 8)", () => {
    // 2.5 mm² = 4934 CM: between 14 AWG (4110) and 12 AWG (6530).
    const r = conductorCheck({ ...base, awg: "2.5 mm²" });
    expect(r.ampacityRow).toBe("14");
    expect(r.ampacityA).toBe(35);
  });

  it("works at 24 V as at 12 V: the same conductor passes the drop on twice the voltage", () => {
    // 20 A over 30 ft, 3 %: at 12 V 10.75 × 20 × 30 / 0.36 = 17,917 CM → 6 AWG; at 24 V 8958 CM → 10 AWG.
    expect(conductorCheck({ ...base, currentA: 20, roundTripFt: 30, dropPercent: 3, awg: "10" }).pass).toBe(
      false,
    );
    expect(
      conductorCheck({ ...base, currentA: 20, roundTripFt: 30, dropPercent: 3, systemVolts: 24, awg: "10" })
        .pass,
    ).toBe(true);
  });
});

describe("conductorCheck in the registry", () => {
  const num = (value: number, unit: Unit): CalcInput => ({ kind: "number", value, unit });
  const text = (value: string): CalcInput => ({ kind: "text", value });

  it("says which table, column and rating it used, and fails 40 A on 16 AWG", () => {
    const r = runCalc("conductorCheck", {
      current: num(40, "A"),
      roundTripLength: num(2, "ft"),
      systemVoltage: num(12, "V"),
      dropPercent: num(10, "%"),
      conductor: text("16"),
      insulationRating: text("105"),
      inEngineSpace: text("yes"),
    });
    if ("error" in r) throw new Error(r.error.message);
    expect(r.verdict).toBe("fail");
    expect(r.values["allowable amperage"]).toBe(21.3); // 21.25 A to the precision rule for A (0.1 A)
    expect(r.rule).toBe(
      "ABYC E-11: voltage drop, allowable amperage from the 105 °C column for 16 AWG inside an engine space (× 0.85), fuse or breaker at most 150 % of it",
    );
  });

  it("blames the input, not the argument", () => {
    const r = runCalc("conductorCheck", {
      current: num(10, "A"),
      roundTripLength: num(10, "ft"),
      systemVoltage: num(12, "V"),
      dropPercent: num(3, "%"),
      conductor: text("17"),
      insulationRating: num(105, "degC"),
      inEngineSpace: text("no"),
    });
    expect(r).toMatchObject({ error: { field: "conductor" } });
    const maybe = runCalc("conductorCheck", {
      current: num(10, "A"),
      roundTripLength: num(10, "ft"),
      systemVoltage: num(12, "V"),
      dropPercent: num(3, "%"),
      conductor: text("16"),
      insulationRating: num(105, "degC"),
      inEngineSpace: text("maybe"),
    });
    expect(maybe).toMatchObject({ error: { field: "inEngineSpace" } });
  });
});
