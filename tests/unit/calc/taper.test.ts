import { describe, expect, it } from "vitest";
import { fieldOf } from "../../support/calc.ts";
import { propellerTaper, threadPitch } from "~/lib/calc";

// SAE J755, marine propeller-shaft ends and hubs (dimension table as published by propeller
// shops, and the standard's own table for shafts 3/4 to 3 in).
describe("propellerTaper — SAE J755", () => {
  it("1 in shaft: 3/4 in per foot, taper 2 3/4 in long, small end 0.828 in, 1/4 in keyway", () => {
    const r = propellerTaper({ shaftDiameterIn: 1 });
    expect(r).toMatchObject({
      standard: "SAE J755",
      taperPerFootIn: 0.75,
      taperLengthIn: 2.75,
      smallEndIn: 0.828,
      keywayWidthIn: 0.25,
    });
    expect(r.keywaySideDepthIn).toEqual({ min: 0.125, max: 0.127 });
  });

  it("every tabulated small end agrees with a 1:16 taper over the tabulated length", () => {
    // 3/4 in per foot on the diameter = 1/16 in per inch: small end = D − L / 16.
    for (const d of [
      0.75, 0.875, 1, 1.125, 1.25, 1.375, 1.5, 1.75, 2, 2.25, 2.5, 2.75, 3, 3.25, 3.5, 3.75, 4, 4.5, 5, 5.5,
    ]) {
      const r = propellerTaper({ shaftDiameterIn: d });
      expect(Math.abs(r.smallEndIn - (d - r.taperLengthIn / 16))).toBeLessThanOrEqual(0.0015);
    }
  });

  it("other rows of the table", () => {
    expect(propellerTaper({ shaftDiameterIn: 1.25 })).toMatchObject({
      taperLengthIn: 3.5,
      smallEndIn: 1.031,
      keywayWidthIn: 0.3125,
    });
    expect(propellerTaper({ shaftDiameterIn: 2 })).toMatchObject({
      taperLengthIn: 5.75,
      smallEndIn: 1.641,
      keywayWidthIn: 0.5,
    });
    expect(propellerTaper({ shaftDiameterIn: 3 })).toMatchObject({
      taperLengthIn: 8.625,
      smallEndIn: 2.461,
      keywayWidthIn: 0.75,
    });
  });

  it("the propeller nut threads are Unified coarse threads (cross-check with ASME B1.1)", () => {
    for (const d of [0.75, 1, 1.25, 1.5, 2, 2.5, 3]) {
      const nut = propellerTaper({ shaftDiameterIn: d }).nutThread!;
      expect(threadPitch({ nominalIn: nut.nominalIn, series: "UNC" }).tpi).toBe(nut.tpi);
    }
  });

  it("takes a measured shaft within 0.005 in of its nominal size and refuses others", () => {
    expect(propellerTaper({ shaftDiameterIn: 0.998 }).shaftDiameterIn).toBe(1);
    expect(fieldOf(() => propellerTaper({ shaftDiameterIn: 1.1 }))).toBe("shaftDiameterIn");
    expect(() => propellerTaper({ shaftDiameterIn: 6 })).toThrow(/1 in per foot/);
    expect(fieldOf(() => propellerTaper({ shaftDiameterIn: 0 }))).toBe("shaftDiameterIn");
  });
});
