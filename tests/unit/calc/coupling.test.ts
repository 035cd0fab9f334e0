import { describe, expect, it } from "vitest";
import { fieldOf } from "../../support/calc.ts";
import { couplingFace, couplingRim } from "~/lib/calc";

describe("couplingFace", () => {
  it("angularity is the gap difference divided by the diameter (similar triangles)", () => {
    // By hand: 4 in coupling, gaps top 0.006 / bottom 0.002 → 0.004 in over 4 in = 0.001 in/in;
    // port 0.003 / starboard 0.005 → 0.002 in over 4 in = 0.0005 in/in.
    const r = couplingFace({
      diameterIn: 4,
      gapsIn: { top: 0.006, bottom: 0.002, port: 0.003, starboard: 0.005 },
    });
    expect(r.verticalGapDiffIn).toBeCloseTo(0.004, 12);
    expect(r.horizontalGapDiffIn).toBeCloseTo(0.002, 12);
    expect(r.verticalSlope).toBeCloseTo(0.001, 12);
    expect(r.horizontalSlope).toBeCloseTo(0.0005, 12);
  });

  it("defaults to 0.001 in per inch of coupling diameter (common practice: 'no more than one thousandth per inch of coupling diameter')", () => {
    const onLimit = couplingFace({
      diameterIn: 4,
      gapsIn: { top: 0.006, bottom: 0.002, port: 0.004, starboard: 0.004 },
    });
    expect(onLimit.limitInPerInDiameter).toBe(0.001);
    expect(onLimit.pass).toBe(true);
    const over = couplingFace({
      diameterIn: 4,
      gapsIn: { top: 0.007, bottom: 0.002, port: 0.004, starboard: 0.004 },
    });
    expect(over.pass).toBe(false);
    // sideways counts as much as up and down
    expect(
      couplingFace({ diameterIn: 4, gapsIn: { top: 0.004, bottom: 0.004, port: 0.001, starboard: 0.0061 } })
        .pass,
    ).toBe(false);
  });

  it("applies a total gap-difference limit when one is given (0.003 in, common practice for small couplings)", () => {
    const r = couplingFace({
      diameterIn: 3,
      gapsIn: { top: 0.004, bottom: 0.001, port: 0.002, starboard: 0.002 },
      maxGapDiffIn: 0.003,
    });
    expect(r.limitInPerInDiameter).toBeUndefined();
    expect(r.pass).toBe(true);
    expect(
      couplingFace({
        diameterIn: 3,
        gapsIn: { top: 0.0045, bottom: 0.001, port: 0.002, starboard: 0.002 },
        maxGapDiffIn: 0.003,
      }).pass,
    ).toBe(false);
  });

  it("names the field of bad input", () => {
    const gaps = { top: 0.001, bottom: 0.001, port: 0.001, starboard: 0.001 };
    expect(fieldOf(() => couplingFace({ diameterIn: 0, gapsIn: gaps }))).toBe("diameterIn");
    expect(fieldOf(() => couplingFace({ diameterIn: -4, gapsIn: gaps }))).toBe("diameterIn");
    expect(fieldOf(() => couplingFace({ diameterIn: 4, gapsIn: { ...gaps, top: -0.001 } }))).toBe(
      "gapsIn.top",
    );
    expect(fieldOf(() => couplingFace({ diameterIn: 4, gapsIn: { ...gaps, port: Number.NaN } }))).toBe(
      "gapsIn.port",
    );
  });
});

describe("couplingRim", () => {
  it("offset is half the difference of opposite rim readings", () => {
    // Published rim-alignment practice: "divide the total indicator reading by two to obtain the
    // exact amount of shaft offset". By hand: dial zeroed at top, bottom −0.012 → TIR 0.012,
    // offset 0.006 (engine centre high); port −0.004, starboard −0.008 → offset 0.002 to port.
    const r = couplingRim({ readingsIn: { top: 0, bottom: -0.012, port: -0.004, starboard: -0.008 } });
    expect(r.verticalOffsetIn).toBeCloseTo(0.006, 12);
    expect(r.horizontalOffsetIn).toBeCloseTo(-0.002, 12);
    // Validity rule of rim readings (millwright practice, from memory): top + bottom = port + starboard.
    expect(r.validityIn).toBeCloseTo(0, 12);
  });

  it("judges against a limit when given, and flags an inconsistent set", () => {
    expect(
      couplingRim({
        readingsIn: { top: 0, bottom: -0.004, port: -0.002, starboard: -0.002 },
        maxOffsetIn: 0.002,
      }).pass,
    ).toBe(true);
    expect(
      couplingRim({
        readingsIn: { top: 0, bottom: -0.006, port: -0.003, starboard: -0.003 },
        maxOffsetIn: 0.002,
      }).pass,
    ).toBe(false);
    expect(
      couplingRim({ readingsIn: { top: 0, bottom: -0.01, port: 0, starboard: 0 } }).validityIn,
    ).toBeCloseTo(-0.01, 12);
  });
});
