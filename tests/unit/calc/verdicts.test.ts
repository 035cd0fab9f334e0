import { describe, expect, it } from "vitest";
import {
  calculations,
  couplingFace,
  couplingFit,
  convert,
  formatQuantity,
  presentOutcome,
  runCalc,
  type CalcInput,
  type CalcOutcome,
  type Unit,
} from "~/lib/calc";

const num = (value: number, unit: Unit): CalcInput => ({ kind: "number", value, unit });
const list = (values: number[], unit: Unit): CalcInput => ({ kind: "numbers", values, unit });
function outcome(name: string, inputs: Record<string, CalcInput | undefined>): CalcOutcome {
  const r = runCalc(name, inputs);
  if ("error" in r) throw new Error(`${r.error.field}: ${r.error.message}`);
  return r;
}

describe("coupling fit: the item's own limits decide, at the tightest place (issue 12, item 1)", () => {
  it("shaft 1.4993 in, bore 1.5010 in is 0.0017 in clearance: outside 0 to 0.001 in (the finding as reproduced)", () => {
    // Clearance = bore − shaft on the diameter (Machinery's Handbook, "Allowances and Tolerances for Fits").
    expect(couplingFit({ shaftIn: 1.4993, boreIn: 1.501, minClearanceIn: 0, maxClearanceIn: 0.001 })).toEqual(
      {
        clearanceIn: 0.0017,
        removeFromShaftIn: 0,
        pass: false,
      },
    );
    const r = outcome("couplingFit", {
      shaft: num(1.4993, "in"),
      bore: num(1.501, "in"),
      minClearance: num(0, "in"),
      maxClearance: num(0.001, "in"),
    });
    expect(r.verdict).toBe("fail");
    expect(r.primary).toBe("clearance");
    expect(r.rule).toMatch(/^clearance from 0 in to 0.001 in;/);
  });

  it("the largest shaft reading against the smallest bore reading", () => {
    const r = outcome("couplingFit", {
      shaft: list([1.499, 1.4996, 1.4993], "in"),
      bore: {
        kind: "grid",
        rows: ["fwd", "aft"],
        columns: ["0°", "90°"],
        values: [
          [1.5004, 1.5006],
          [1.5005, 1.5003],
        ],
        unit: "in",
      },
      minClearance: num(0, "in"),
      maxClearance: num(0.001, "in"),
    });
    expect(r.values.clearance).toBe(0.0007); // 1.5003 − 1.4996
    expect(r.verdict).toBe("pass");
  });

  it("interference fits: negative limits, and no verdict without limits", () => {
    expect(
      couplingFit({ shaftIn: 1.5005, boreIn: 1.5, minClearanceIn: -0.001, maxClearanceIn: -0.0003 }).pass,
    ).toBe(true);
    expect(couplingFit({ shaftIn: 1.4993, boreIn: 1.501 }).pass).toBeUndefined();
    expect(outcome("couplingFit", { shaft: num(1.4993, "in"), bore: num(1.501, "in") }).verdict).toBe("info");
  });
});

describe("face gaps at 0° and 180° of shaft rotation are averaged (issue 12, item 7)", () => {
  it("face wobble cancels: the mean of the two sets is the misalignment (Carrier 17/19EX instructions, coupling alignment, p. 212: add the two and divide by two)", () => {
    // A face 0.002 in out of square adds at the top in one position and at the bottom after half a turn.
    const at0 = { top: 0.006, bottom: 0.002, port: 0.004, starboard: 0.004 };
    const at180 = { top: 0.004, bottom: 0.004, port: 0.004, starboard: 0.004 };
    const r = couplingFace({ diameterIn: 5, gapsIn: at0, gapsIn180: at180, maxGapDiffIn: 0.003 });
    expect(r.verticalGapDiffIn).toBe(0.002); // (0.005 − 0.003), not 0.004 from the first set alone
    expect(r.pass).toBe(true);
    expect(couplingFace({ diameterIn: 5, gapsIn: at0, maxGapDiffIn: 0.003 }).pass).toBe(false);
  });
});

describe("instructions, not ticks; words that agree with the arrows (issue 12, item 13)", () => {
  const moves = (offsetHorizontal: number) =>
    outcome("mountMoves", {
      diameter: num(5, "in"),
      gaps: list([0.004, 0.004, 0.004, 0.004], "in"),
      offsetVertical: num(0.01, "in"),
      offsetHorizontal: num(offsetHorizontal, "in"),
      frontMount: num(30, "in"),
      rearMount: num(12, "in"),
    });

  it("a negative move to starboard is said 'to port', a negative raise 'lower'", () => {
    // Engine centre 0.01 in to starboard and 0.01 in high: move both mounts 0.01 in to port and lower them.
    const r = moves(0.01);
    expect(r.values["front mounts, sideways"]).toBe("to port 0.01 in");
    expect(r.values["front mounts, height"]).toBe("lower 0.01 in");
    expect(moves(-0.01).values["rear mounts, sideways"]).toBe("to starboard 0.01 in");
  });

  it("mount moves and shims have no pass/fail verdict: the alignment's verdict stands", () => {
    const r = moves(0);
    expect(r.verdict).toBe("info");
    expect(r.rule).toMatch(/instructions, not a check/);
    expect(presentOutcome(r).word).toBe("Figures and instructions, no pass or fail");
    expect(presentOutcome(r).mark).not.toBe("✓");
  });
});

describe("units as entered (issue 12, item 12)", () => {
  it("back pressure in mbar and mm H2O against a limit in the maker's unit (NIST SP 811 B.8: 1 mbar = 100 Pa; 1 mmH2O conventional = 9.80665 Pa)", () => {
    expect(convert(1, "mbar", "kPa")).toBe(0.1);
    expect(convert(1000, "mmH2O", "kPa")).toBeCloseTo(9.80665, 12);
    const r = outcome("exhaustBackPressure", { backPressure: num(800, "mmH2O"), limit: num(100, "mbar") });
    expect(r.values["back pressure"]).toBe(78); // 800 × 9.80665 Pa = 7845 Pa = 78.45 mbar
    expect(r.units["back pressure"]).toBe("mbar");
    expect(r.verdict).toBe("pass");
    expect(r.rule).toBe("back pressure ≤ 100 mbar, under way at full throttle and rated rpm");
  });

  it("a 3 inHg limit is 10.159 kPa: the reading passed in inHg exercises the inHg path (NIST SP 811 B.8, inch of mercury, conventional = 3.386389 kPa)", () => {
    const limit = num(3, "inHg");
    expect(outcome("exhaustBackPressure", { backPressure: num(10.15, "kPa"), limit }).verdict).toBe("pass");
    expect(outcome("exhaustBackPressure", { backPressure: num(10.17, "kPa"), limit }).verdict).toBe("fail");
  });

  it("the mount adjuster takes a metric pitch: M12 × 1.75 mm, 0.5 mm raise is 0.29 turns (ISO 261 coarse pitch)", () => {
    const r = outcome("mountMoves", {
      diameter: num(127, "mm"),
      gaps: list([0, 0, 0, 0], "mm"),
      offsetVertical: num(-0.5, "mm"),
      offsetHorizontal: num(0, "mm"),
      frontMount: num(760, "mm"),
      rearMount: num(300, "mm"),
      adjusterPitch: num(1.75, "mm"),
    });
    expect(r.values["front mounts, height"]).toBe("raise 0.5 mm");
    expect(r.values["front adjusting nuts"]).toBe("0.29 turns to raise"); // 0.5 / 1.75 = 0.2857
  });

  it("a millimetre shop sees mm in values and rules; 'gal' is written US gal", () => {
    const r = outcome("couplingFace", {
      diameter: num(127, "mm"),
      gaps: list([0.15, 0.05, 0.1, 0.1], "mm"),
      maxGapDiff: num(0.08, "mm"),
    });
    expect(r.unitSystem).toBe("metric");
    expect(r.units["top − bottom"]).toBe("mm");
    expect(r.values["top − bottom"]).toBe(0.1);
    expect(r.rule).toMatch(/gap difference ≤ 0.08 mm/);
    expect(formatQuantity(5, "gal")).toBe("5 US gal");
  });

  it("grid keys never reach a person: deg-180 reads 180°", () => {
    const r = outcome("shaftRunout", {
      readings: {
        kind: "grid",
        rows: ["coupling-end", "middle"],
        columns: ["deg-0", "deg-90", "deg-180", "deg-270"],
        values: [
          [0, 0.001, 0.002, 0.001],
          [0, 0.003, 0.005, 0.002],
        ],
        unit: "in",
      },
      limitTir: num(0.003, "in"),
    });
    expect(r.values.where).toBe("worst at middle, high spot at 180°");
  });
});

describe("one precision rule for values and rules", () => {
  it("the value and the rule beside it are written alike: 1.2346 in, not 1.235 in above ≥ 1.2346 in", () => {
    const r = outcome("shaftDiameter", {
      power: num(40, "hp"),
      shaftRpm: num(1500, "rpm"),
      torsionalYield: num(40000, "psi"),
      safetyFactor: num(3, "1"),
    });
    const shown = presentOutcome(r).values.find((v) => v.key === "minimum diameter")!.text;
    expect(r.rule).toBe(`shaft fitted ≥ ${shown}`);
  });
});

describe("each calculation carries its own caution, only where it applies (issue 12, item 11)", () => {
  it("hot work belongs to straightening, not to alignment calculations used afloat", () => {
    for (const name of ["couplingFace", "couplingRim", "mountMoves", "shaftRunout"]) {
      expect(calculations[name].caution ?? "").not.toMatch(/hot work/i);
    }
    expect(calculations.mountMoves.caution).toMatch(/Support the engine/);
    expect(calculations.exhaustBackPressure.caution).toMatch(/carbon monoxide/);
    expect(calculations.conductorCheck.caution).toMatch(/batteries/);
    expect(calculations.speedRuns.caution).toMatch(/Sea trials/);
    expect(calculations.couplingFit.caution).toBeUndefined();
  });
});

describe("labels of sources (issue 12, item 10)", () => {
  it("the 200 rpm per inch of pitch is said to be for planing boats", () => {
    expect(calculations.seaTrialLoading.source).toMatch(/200 rpm per inch of pitch for planing boats/);
    const r = outcome("seaTrialLoading", {
      wotRpm: num(3200, "rpm"),
      ratedRpmMin: num(3400, "rpm"),
      ratedRpmMax: num(3600, "rpm"),
    });
    expect(r.rule).toMatch(/a planing-boat figure/);
  });
});
