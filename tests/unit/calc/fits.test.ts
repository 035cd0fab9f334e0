import { describe, expect, it } from "vitest";
import { fieldOf } from "../../support/calc.ts";
import { couplingFit, fitCheck, isoFit, isoFitIn } from "~/lib/calc";

// Limit deviations from ISO 286-2:2010, Tables for holes H and shafts f g h js k m n p r s,
// values in µm (from memory of the printed tables; each is IT grade of ISO 286-1 Table 1 plus
// the fundamental deviation, so the pairs below also agree with each other).
describe("isoFit — ISO 286-2 tables", () => {
  it("H7/k6 at 25 mm: hole +21/0 µm, shaft +15/+2 µm, a transition fit", () => {
    const r = isoFit({ nominalMm: 25, hole: "H7", shaft: "k6" });
    expect(r.hole).toEqual({ upperMm: 0.021, lowerMm: 0 });
    expect(r.shaft).toEqual({ upperMm: 0.015, lowerMm: 0.002 });
    expect(r.maxClearanceMm).toBe(0.019); // 21 − 2
    expect(r.maxInterferenceMm).toBe(0.015); // 15 − 0
    expect(r.kind).toBe("transition");
  });

  it("H7/h6 at 40 mm: hole +25/0, shaft 0/−16, a clearance fit with zero least clearance", () => {
    const r = isoFit({ nominalMm: 40, hole: "H7", shaft: "h6" });
    expect(r.hole).toEqual({ upperMm: 0.025, lowerMm: 0 });
    expect(r.shaft).toEqual({ upperMm: 0, lowerMm: -0.016 });
    expect(r.maxClearanceMm).toBe(0.041);
    expect(r.maxInterferenceMm).toBe(0);
    expect(r.kind).toBe("clearance");
  });

  it("H8/f7 at 60 mm: hole +46/0, shaft −30/−60, clearance 30 to 106 µm", () => {
    const r = isoFit({ nominalMm: 60, hole: "H8", shaft: "f7" });
    expect(r.hole.upperMm).toBe(0.046);
    expect(r.shaft).toEqual({ upperMm: -0.03, lowerMm: -0.06 });
    expect(r.maxClearanceMm).toBe(0.106);
    expect(r.maxInterferenceMm).toBe(-0.03);
    expect(r.kind).toBe("clearance");
  });

  it("H7/s6 at 100 mm: hole +35/0, shaft +93/+71, an interference fit", () => {
    const r = isoFit({ nominalMm: 100, hole: "H7", shaft: "s6" });
    expect(r.hole.upperMm).toBe(0.035);
    expect(r.shaft).toEqual({ upperMm: 0.093, lowerMm: 0.071 });
    expect(r.maxClearanceMm).toBe(-0.036);
    expect(r.maxInterferenceMm).toBe(0.093);
    expect(r.kind).toBe("interference");
  });

  it("other classes of the tables", () => {
    expect(isoFit({ nominalMm: 12, hole: "H7", shaft: "m6" }).shaft).toEqual({
      upperMm: 0.018,
      lowerMm: 0.007,
    });
    expect(isoFit({ nominalMm: 12, hole: "H7", shaft: "n6" }).shaft).toEqual({
      upperMm: 0.023,
      lowerMm: 0.012,
    });
    expect(isoFit({ nominalMm: 12, hole: "H7", shaft: "p6" }).shaft).toEqual({
      upperMm: 0.029,
      lowerMm: 0.018,
    });
    expect(isoFit({ nominalMm: 25, hole: "H7", shaft: "g6" }).shaft).toEqual({
      upperMm: -0.007,
      lowerMm: -0.02,
    });
    expect(isoFit({ nominalMm: 25, hole: "H7", shaft: "r6" }).shaft).toEqual({
      upperMm: 0.041,
      lowerMm: 0.028,
    });
    expect(isoFit({ nominalMm: 8, hole: "H7", shaft: "js6" }).shaft).toEqual({
      upperMm: 0.0045,
      lowerMm: -0.0045,
    });
    expect(isoFit({ nominalMm: 200, hole: "H9", shaft: "h9" }).shaft).toEqual({
      upperMm: 0,
      lowerMm: -0.115,
    });
    expect(isoFit({ nominalMm: 450, hole: "H7", shaft: "h7" }).shaft.lowerMm).toBe(-0.063);
    expect(isoFit({ nominalMm: 480, hole: "H7", shaft: "s6" }).shaft).toEqual({
      upperMm: 0.292,
      lowerMm: 0.252,
    });
    expect(isoFit({ nominalMm: 3, hole: "H6", shaft: "h6" }).hole.upperMm).toBe(0.006);
    expect(isoFit({ nominalMm: 50, hole: "H9", shaft: "h9" }).hole.upperMm).toBe(0.062);
    expect(isoFit({ nominalMm: 10, hole: "H11", shaft: "h9" }).hole.upperMm).toBe(0.09);
  });

  it("steps change just over the range boundaries ('over … up to and including')", () => {
    expect(isoFit({ nominalMm: 30, hole: "H7", shaft: "h6" }).hole.upperMm).toBe(0.021); // 18–30
    expect(isoFit({ nominalMm: 30.01, hole: "H7", shaft: "h6" }).hole.upperMm).toBe(0.025); // 30–50
    expect(isoFit({ nominalMm: 65, hole: "H7", shaft: "r6" }).shaft).toEqual({
      upperMm: 0.06,
      lowerMm: 0.041,
    }); // 50–65
    expect(isoFit({ nominalMm: 66, hole: "H7", shaft: "r6" }).shaft).toEqual({
      upperMm: 0.062,
      lowerMm: 0.043,
    }); // 65–80
  });

  it("names the field of an unknown class or a size outside the table", () => {
    expect(fieldOf(() => isoFit({ nominalMm: 25, hole: "X7", shaft: "k6" }))).toBe("hole");
    expect(() => isoFit({ nominalMm: 25, hole: "k6", shaft: "k6" })).toThrow(/capitals/);
    expect(fieldOf(() => isoFit({ nominalMm: 25, hole: "H7", shaft: "K6" }))).toBe("shaft");
    expect(fieldOf(() => isoFit({ nominalMm: 25, hole: "H13", shaft: "k6" }))).toBe("hole");
    expect(fieldOf(() => isoFit({ nominalMm: 501, hole: "H7", shaft: "k6" }))).toBe("nominalMm");
    expect(fieldOf(() => isoFit({ nominalMm: 0, hole: "H7", shaft: "k6" }))).toBe("nominalMm");
  });
});

describe("isoFitIn and fitCheck", () => {
  it("gives the same fit in inches for a shop that measures in inches (1 in = 25.4 mm)", () => {
    const r = isoFitIn({ nominalIn: 1, hole: "H7", shaft: "k6" }); // 25.4 mm, range 18–30
    expect(r.nominalMm).toBe(25.4);
    expect(r.hole.upperIn).toBeCloseTo(0.021 / 25.4, 12);
    expect(r.shaft.upperIn).toBeCloseTo(0.000591, 6);
    expect(r.kind).toBe("transition");
    expect(fieldOf(() => isoFitIn({ nominalIn: 20, hole: "H7", shaft: "k6" }))).toBe("nominalIn");
  });

  it("checks measured parts against the limits", () => {
    const r = fitCheck({
      nominalMm: 25,
      hole: "H7",
      shaft: "k6",
      measuredBoreMm: 25.01,
      measuredShaftMm: 25.016,
    });
    expect(r.boreWithinLimits).toBe(true);
    expect(r.shaftWithinLimits).toBe(false); // above 25 + 0.015
    expect(r.measuredClearanceMm).toBeCloseTo(-0.006, 12);
    expect(r.pass).toBe(false);
    expect(fitCheck({ nominalMm: 25, hole: "H7", shaft: "k6", measuredShaftMm: 25.015 }).pass).toBe(true);
    expect(fitCheck({ nominalMm: 25, hole: "H7", shaft: "k6" }).pass).toBeUndefined();
  });
});

describe("couplingFit", () => {
  it("clearance = bore − shaft; remove what stands between it and the clearance wanted (hand arithmetic)", () => {
    expect(couplingFit({ shaftIn: 1.0005, boreIn: 1.0 })).toEqual({
      clearanceIn: -0.0005,
      removeFromShaftIn: 0.0005,
    });
    expect(couplingFit({ shaftIn: 1.0005, boreIn: 1.0, targetClearanceIn: 0.0005 }).removeFromShaftIn).toBe(
      0.001,
    );
    expect(couplingFit({ shaftIn: 0.999, boreIn: 1.0 })).toEqual({
      clearanceIn: 0.001,
      removeFromShaftIn: 0,
    });
    expect(fieldOf(() => couplingFit({ shaftIn: 0, boreIn: 1 }))).toBe("shaftIn");
    expect(fieldOf(() => couplingFit({ shaftIn: 1, boreIn: -1 }))).toBe("boreIn");
  });
});
