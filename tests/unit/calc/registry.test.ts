import { describe, expect, it } from "vitest";
import { calculations, runCalc, type CalcInput, type CalcOutcome, type Unit } from "~/lib/calc";

const num = (value: number, unit: Unit): CalcInput => ({ kind: "number", value, unit });

function outcome(name: string, inputs: Record<string, CalcInput | undefined>): CalcOutcome {
  const result = runCalc(name, inputs);
  if ("error" in result) throw new Error(`${result.error.field}: ${result.error.message}`);
  for (const value of Object.values(result.values)) {
    if (typeof value === "number") expect(Number.isFinite(value)).toBe(true);
  }
  return result;
}

function errorOf(name: string, inputs: Record<string, CalcInput | undefined>) {
  const result = runCalc(name, inputs);
  if (!("error" in result)) throw new Error("expected an error");
  return result.error;
}

describe("calculation registry", () => {
  it("holds every calculation of the issue-4 contract under its function name", () => {
    for (const name of [
      "shaftRunout",
      "couplingFace",
      "mountMoves",
      "couplingFit",
      "isoFit",
      "keyForShaft",
      "keyForShaftMm",
      "propellerTaper",
      "threadPitch",
      "shaftDiameter",
      "bearingSpacing",
      "wireSize",
      "propSlip",
      "seaTrialLoading",
      "exhaustInjection",
      "exhaustBackPressure",
    ]) {
      expect(calculations[name]?.name).toBe(name);
    }
  });

  it("gives every numeric input a unit (a template constant takes it) and every calculation a source", () => {
    for (const definition of Object.values(calculations)) {
      expect(definition.source.length).toBeGreaterThan(0);
      for (const spec of Object.values(definition.inputs)) {
        if (spec.accepts.some((k) => k !== "text")) expect(spec.unit).toBeDefined();
      }
    }
  });

  it("shaftRunout from a readings grid in millimetres (1 in = 25.4 mm)", () => {
    // 0.0762 mm = 0.003 in; 0.1016 mm = 0.004 in
    const r = outcome("shaftRunout", {
      readings: {
        kind: "grid",
        rows: ["coupling", "mid", "strut"],
        columns: ["0", "90", "180", "270"],
        values: [
          [0, 0.0254, 0.0508, 0.0254],
          [0, 0.0508, 0.1016, 0.0508],
          [0, 0.0254, 0.0762, 0.0254],
        ],
        unit: "mm",
      },
      positionsIn: { kind: "numbers", values: [0, 18, 36], unit: "in" },
      limitTir: num(0.003, "in"),
    });
    // A millimetre shop sees millimetres, the rule too (issue 12, item 12); 0.003 in = 0.0762 mm.
    expect(r.values["worst TIR"]).toBe(0.102);
    expect(r.units["worst TIR"]).toBe("mm");
    expect(r.rule).toBe("TIR at every station ≤ 0.076 mm");
    expect(r.values.where).toBe("worst at mid, high spot at 180°");
    expect(r.verdict).toBe("fail");
  });

  it("couplingFace from a one-column grid labelled by clock position, with the contract's example constant", () => {
    const r = outcome("couplingFace", {
      diameter: num(4, "in"),
      gaps: {
        kind: "grid",
        rows: ["top", "bottom", "port", "starboard"],
        columns: ["gap"],
        values: [[0.006], [0.002], [0.004], [0.004]],
        unit: "in",
      },
      maxInPerInDiameter: num(0.001, "in/in"),
    });
    expect(r.verdict).toBe("pass");
    expect(r.values["vertical slope"]).toBe(0.001);
    expect(r.units["top − bottom"]).toBe("in");
  });

  it("mountMoves from rim readings and a metric adjuster pitch", () => {
    // Rim: engine centre 0.004 in low. M16 × 2 mm studs (ISO 261 Table 1, preferred sizes: coarse pitch of M16 is 2 mm;
    // Carr Lane, "Inch and Metric Thread Standards": "M16x2 is designated as M16"): 25.4 / 2 = 12.7 threads per inch.
    const r = outcome("mountMoves", {
      diameter: num(5, "in"),
      gaps: { kind: "numbers", values: [0.004, 0.004, 0.004, 0.004], unit: "in" },
      rim: { kind: "numbers", values: [0, 0.008, 0.004, 0.004], unit: "in" },
      frontMount: num(30, "in"),
      rearMount: num(12, "in"),
      adjusterPitch: num(2, "mm"),
    });
    expect(r.values["front mounts, height"]).toBe("raise 0.004 in");
    expect(r.values["rear mounts, height"]).toBe("raise 0.004 in");
    expect(r.values["front adjusting nuts"]).toBe("0.05 turns to raise"); // 0.004 × 12.7 = 0.0508
    expect(r.verdict).toBe("info");
  });

  it("reports errors under the template's input names", () => {
    expect(
      errorOf("couplingFace", {
        diameter: num(0, "in"),
        gaps: { kind: "numbers", values: [0, 0, 0, 0], unit: "in" },
      }).field,
    ).toBe("diameter");
    expect(errorOf("couplingFace", { diameter: num(4, "in") }).field).toBe("gaps");
    expect(
      errorOf("couplingFace", {
        diameter: num(4, "psi"),
        gaps: { kind: "numbers", values: [0, 0, 0, 0], unit: "in" },
      }).field,
    ).toBe("diameter");
    const moves = {
      diameter: num(5, "in"),
      gaps: { kind: "numbers", values: [0.004, 0.004, 0.004, 0.004], unit: "in" } as CalcInput,
      offsetVertical: num(0, "in"),
      frontMount: num(30, "in"),
      rearMount: num(12, "in"),
    };
    expect(errorOf("mountMoves", moves).field).toBe("offsetHorizontal");
    expect(
      errorOf("mountMoves", { ...moves, offsetHorizontal: num(0, "in"), frontMount: num(10, "in") }).field,
    ).toBe("frontMount");
    expect(
      errorOf("propSlip", {
        pitch: num(20, "in"),
        engineRpm: num(3000, "rpm"),
        gearRatio: num(0, "1"),
        speed: num(20, "kn"),
      }).field,
    ).toBe("gearRatio");
    expect(
      errorOf("isoFit", {
        nominal: num(25, "mm"),
        hole: { kind: "text", value: "Z7" },
        shaft: { kind: "text", value: "k6" },
      }).field,
    ).toBe("hole");
    expect(
      errorOf("shaftRunout", {
        readings: { kind: "grid", rows: ["a"], columns: ["0", "180"], values: [[0, null]], unit: "in" },
        limitTir: num(0.003, "in"),
      }),
    ).toMatchObject({ field: "readings", message: expect.stringMatching(/a at 180 is missing/) });
    expect(errorOf("nonsense", {}).field).toBe("calc");
  });

  it("wireSize judges the conductor fitted (NEC Ch. 9 Table 8 areas)", () => {
    const base = {
      current: num(10, "A"),
      roundTripLength: num(21, "ft"),
      systemVoltage: num(12, "V"),
      dropPercent: num(10, "%"),
    };
    expect(outcome("wireSize", { ...base, installed: { kind: "text", value: "14" } }).verdict).toBe("pass");
    expect(outcome("wireSize", { ...base, installed: { kind: "text", value: "18" } }).verdict).toBe("fail");
    expect(outcome("wireSize", { ...base, installed: { kind: "text", value: "1.5 mm2" } }).verdict).toBe(
      "pass",
    ); // 2960 CM ≥ 1881
    expect(outcome("wireSize", base).verdict).toBe("info");
  });

  it("converts units on the way in: back pressure in inHg against a limit in kPa", () => {
    const r = outcome("exhaustBackPressure", { backPressure: num(2.5, "inHg"), limit: num(10, "kPa") });
    expect(r.values["in inHg"]).toBe(2.5);
    expect(r.verdict).toBe("pass"); // 2.5 inHg = 8.47 kPa
  });

  it("runs the remaining calculations end to end", () => {
    expect(outcome("couplingFit", { shaft: num(25.4, "mm"), bore: num(1.001, "in") }).values.clearance).toBe(
      0.025,
    ); // 0.001 in = 0.0254 mm, shown in the unit the shaft was measured in
    expect(
      outcome("isoFit", {
        nominal: num(1, "in"),
        hole: { kind: "text", value: "H7" },
        shaft: { kind: "text", value: "k6" },
        measuredShaft: num(25.41, "mm"),
      }).verdict,
    ).toBe("pass");
    expect(outcome("keyForShaft", { diameter: num(1, "in") }).values["key width"]).toBe(0.25);
    expect(outcome("keyForShaftMm", { diameter: num(34, "mm") }).values["hub keyway depth"]).toBe(3.3);
    expect(
      outcome("propellerTaper", { shaftDiameter: num(1, "in"), system: { kind: "text", value: "inch" } })
        .values["taper length"],
    ).toBe(2.75);
    expect(
      outcome("threadPitch", { nominal: num(0.5, "in"), series: { kind: "text", value: "unc" } }).values[
        "threads per inch"
      ],
    ).toBe(13);
    expect(
      outcome("shaftDiameter", {
        power: num(42, "hp"),
        shaftRpm: num(2000, "rpm"),
        torsionalYield: num(20000, "psi"),
        safetyFactor: num(3, "1"),
        installedDiameter: num(1.125, "in"),
      }).verdict,
    ).toBe("pass");
    expect(
      outcome("bearingSpacing", {
        shaftDiameter: num(1, "in"),
        shaftRpm: num(2000, "rpm"),
        elasticModulus: num(16e6, "psi"),
        density: num(0.304, "lb/in3"),
      }).values["maximum spacing"],
    ).toBeCloseTo(3.41, 2);
    expect(
      outcome("propSlip", {
        pitch: num(20, "in"),
        engineRpm: num(3000, "rpm"),
        gearRatio: num(2, "1"),
        speed: num(20, "kn"),
      }).values.slip,
    ).toBe(19);
    expect(
      outcome("seaTrialLoading", {
        wotRpm: num(3200, "rpm"),
        ratedRpmMin: num(3400, "rpm"),
        ratedRpmMax: num(3600, "rpm"),
      }),
    ).toMatchObject({ verdict: "fail", values: { loading: "over-propped (rpm below the band)" } });
    expect(outcome("exhaustInjection", { injectionHeight: num(200, "mm") }).verdict).toBe("pass"); // 7.87 in ≥ 6 in
    expect(
      outcome("shimStack", {
        thickness: num(0.017, "in"),
        stock: { kind: "numbers", values: [0.002, 0.005, 0.01], unit: "in" },
      }).values.stack,
    ).toBe("1 × 0.01 in + 1 × 0.005 in + 1 × 0.002 in");
    expect(
      outcome("couplingRim", {
        rim: { kind: "numbers", values: [0, -0.012, -0.004, -0.008], unit: "in" },
        maxOffset: num(0.002, "in"),
      }).verdict,
    ).toBe("fail");
    expect(outcome("validateHin", { hin: { kind: "text", value: "SXT4A7C2K425" } })).toMatchObject({
      verdict: "pass",
      values: { "model year": 2025 },
    });
    expect(outcome("validateHin", { hin: { kind: "text", value: "SXT4O7C2K425" } }).verdict).toBe("fail");
  });
});
