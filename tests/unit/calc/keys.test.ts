import { describe, expect, it } from "vitest";
import { fieldOf } from "../../support/calc.ts";
import { keyForShaft, keyForShaftMm } from "~/lib/calc";

// ASME B17.1-1967 (R2013) Table 1, "Key Size Versus Shaft Diameter", as reproduced in
// Machinery's Handbook ("Keys and Keyseats"): rows run over one size up to and including the next.
describe("keyForShaft — ASME B17.1 Table 1", () => {
  it("1 in shaft: 1/4 in square key, keyseat depth H/2 = 1/8 in", () => {
    const r = keyForShaft({ diameterIn: 1 });
    expect(r).toMatchObject({ standard: "ASME B17.1", widthIn: 0.25, heightIn: 0.25, shaftDepthIn: 0.125 });
  });

  it("boundary sizes belong to the row they end", () => {
    expect(keyForShaft({ diameterIn: 7 / 8 }).widthIn).toBe(3 / 16); // 9/16 – 7/8
    expect(keyForShaft({ diameterIn: 0.885 }).widthIn).toBe(1 / 4); // over 7/8 (beyond the 0.005 in slack)
    expect(keyForShaft({ diameterIn: 1.25 }).widthIn).toBe(1 / 4); // 7/8 – 1 1/4
    expect(keyForShaft({ diameterIn: 1.26 }).widthIn).toBe(5 / 16); // 1 1/4 – 1 3/8
    expect(keyForShaft({ diameterIn: 1.75 }).widthIn).toBe(3 / 8); // 1 3/8 – 1 3/4
    expect(keyForShaft({ diameterIn: 2.25 }).widthIn).toBe(1 / 2); // 1 3/4 – 2 1/4
    expect(keyForShaft({ diameterIn: 3 }).widthIn).toBe(3 / 4); // 2 3/4 – 3 1/4
    expect(keyForShaft({ diameterIn: 11 }).widthIn).toBe(2.5); // 9 – 11
  });

  it("rectangular keys from the same table", () => {
    expect(keyForShaft({ diameterIn: 2, style: "rectangular" })).toMatchObject({
      widthIn: 0.5,
      heightIn: 0.375,
      shaftDepthIn: 0.1875,
    });
    expect(keyForShaft({ diameterIn: 1.5, style: "rectangular" }).heightIn).toBe(0.25);
    expect(fieldOf(() => keyForShaft({ diameterIn: 0.4, style: "rectangular" }))).toBe("style");
  });

  it("chordal height and the S check dimension (Machinery's Handbook keyseat formulas)", () => {
    // Y = (D − √(D² − W²)) / 2; for D = 1, W = 1/4: (1 − √0.9375) / 2 = 0.01588 (hand calculation;
    // from memory the handbook's table of S gives 0.859 in for a 1 in shaft with a 1/4 in key).
    const r = keyForShaft({ diameterIn: 1 });
    expect(r.chordalHeightIn).toBeCloseTo(0.015877, 6);
    expect(r.sDimensionIn).toBeCloseTo(0.859, 3);
  });

  it("names the field for a size outside the table", () => {
    expect(fieldOf(() => keyForShaft({ diameterIn: 5 / 16 }))).toBe("diameterIn"); // the table starts over 5/16
    expect(fieldOf(() => keyForShaft({ diameterIn: 12 }))).toBe("diameterIn");
    expect(fieldOf(() => keyForShaft({ diameterIn: -1 }))).toBe("diameterIn");
  });
});

// DIN 6885-1:1968-08 "Passfedern, hohe Form": b × h, t1 (shaft) and t2 (hub) by shaft diameter.
describe("keyForShaftMm — DIN 6885-1", () => {
  it("34 mm shaft: 10 × 8 key, t1 = 5 mm, t2 = 3.3 mm (worked example in a German technical drawing textbook)", () => {
    expect(keyForShaftMm({ diameterMm: 34 })).toEqual({
      standard: "DIN 6885-1",
      widthMm: 10,
      heightMm: 8,
      shaftDepthMm: 5,
      hubDepthMm: 3.3,
    });
  });

  it("boundary sizes and the ends of the table", () => {
    expect(keyForShaftMm({ diameterMm: 22 })).toMatchObject({
      widthMm: 6,
      heightMm: 6,
      shaftDepthMm: 3.5,
      hubDepthMm: 2.8,
    }); // 17–22
    expect(keyForShaftMm({ diameterMm: 22.5 })).toMatchObject({
      widthMm: 8,
      heightMm: 7,
      shaftDepthMm: 4,
      hubDepthMm: 3.3,
    }); // 22–30
    expect(keyForShaftMm({ diameterMm: 30 }).widthMm).toBe(8);
    expect(keyForShaftMm({ diameterMm: 30.5 }).widthMm).toBe(10);
    expect(keyForShaftMm({ diameterMm: 50 })).toMatchObject({
      widthMm: 14,
      heightMm: 9,
      shaftDepthMm: 5.5,
      hubDepthMm: 3.8,
    });
    expect(keyForShaftMm({ diameterMm: 7 })).toMatchObject({
      widthMm: 2,
      heightMm: 2,
      shaftDepthMm: 1.2,
      hubDepthMm: 1,
    });
    expect(keyForShaftMm({ diameterMm: 500 })).toMatchObject({
      widthMm: 100,
      heightMm: 50,
      shaftDepthMm: 31,
      hubDepthMm: 19.5,
    });
    expect(fieldOf(() => keyForShaftMm({ diameterMm: 6 }))).toBe("diameterMm");
    expect(fieldOf(() => keyForShaftMm({ diameterMm: 501 }))).toBe("diameterMm");
  });
});
