import { describe, expect, it } from "vitest";
import {
  CalcError,
  keyForShaft,
  propellerTaperMm,
  runCalc,
  type CalcInput,
  type CalcOutcome,
  type Unit,
} from "~/lib/calc";

const num = (value: number, unit: Unit): CalcInput => ({ kind: "number", value, unit });
const text = (value: string): CalcInput => ({ kind: "text", value });
function outcome(name: string, inputs: Record<string, CalcInput | undefined>): CalcOutcome {
  const r = runCalc(name, inputs);
  if ("error" in r) throw new Error(`${r.error.field}: ${r.error.message}`);
  return r;
}

describe("keyForShaft reads the nominal size (issue 12, item 5)", () => {
  it("a measured 1.2503 in shaft is a 1 1/4 in shaft: 1/4 in key, not 5/16 (ASME B17.1 Table 1, over 7/8 to 1 1/4 in)", () => {
    const r = keyForShaft({ diameterIn: 1.2503 });
    expect(r.nominalIn).toBe(1.25);
    expect(r.widthIn).toBe(0.25);
    // The chordal height still uses the measured diameter: (D − √(D² − W²)) / 2.
    expect(r.chordalHeightIn).toBeCloseTo((1.2503 - Math.sqrt(1.2503 ** 2 - 0.0625)) / 2, 10);
  });

  it("the slack is 0.005 in: 1.2451 in snaps to 1 1/4, 1.256 in does not", () => {
    expect(keyForShaft({ diameterIn: 1.2451 }).nominalIn).toBe(1.25);
    expect(keyForShaft({ diameterIn: 1.256 })).toMatchObject({ nominalIn: 1.256, widthIn: 0.3125 });
  });

  it("shows the SAE J755 keyway beside the B17.1 key where they differ: 1 1/4 in shaft, 5/16 in keyway", () => {
    // SAE J755 keyway for a 1 1/4 in shaft: 0.3125 in; the Kiwiprop shaft-end addendum
    // (kiwiprop.com/order/addendum.html) lists "the square keyway of 0.313 in for an 1 1/4 shaft".
    const r = outcome("keyForShaft", { diameter: num(1.2503, "in") });
    expect(r.values).toMatchObject({
      "nominal size": 1.25,
      "key width": 0.25,
      "SAE J755 keyway width": 0.3125,
    });
    expect(r.rule).toMatch(
      /cut to SAE J755 has a 0.3125 in keyway: fit the key to the keyway the part is cut to/,
    );
    // Says which one the coupling is cut to when the template asks.
    expect(outcome("keyForShaft", { diameter: num(1.25, "in"), cutTo: text("sae-j755") }).rule).toMatch(
      /the coupling is cut to SAE J755: key width 0.3125 in$/,
    );
    expect(runCalc("keyForShaft", { diameter: num(1.25, "in"), cutTo: text("din") })).toMatchObject({
      error: { field: "cutTo" },
    });
    // 1 in: B17.1 1/4 in and J755 1/4 in agree, so no second figure.
    expect(
      outcome("keyForShaft", { diameter: num(1, "in") }).values["SAE J755 keyway width"],
    ).toBeUndefined();
  });
});

describe("metric shafts use DIN 6885-1 and ISO 4566, not inch tables (issue 12, item 4)", () => {
  it("a 35 mm shaft gets a 10 × 8 mm key (DIN 6885-1: over 30 up to 38 mm), not a 3/8 in key", () => {
    const r = outcome("keyForShaft", { diameter: num(35, "mm") });
    expect(r.values).toMatchObject({ "key width": 10, "key height": 8, "shaft keyway depth": 5 });
    expect(r.units["key width"]).toBe("mm");
    expect(r.rule).toMatch(/DIN 6885-1/);
  });

  it("a 35 mm shaft gets the ISO 4566 1:10 taper, not SAE J755", () => {
    const r = outcome("propellerTaper", { shaftDiameter: num(35, "mm") });
    expect(r.values.taper).toBe("1:10 on the diameter");
    expect(r.values["key width"]).toBe(10);
    expect(r.rule).toMatch(/^ISO 4566 1:10 taper for a 35 mm shaft/);
  });

  it("the system chosen overrides the unit: an inch shaft measured in millimetres stays inch", () => {
    const r = outcome("propellerTaper", { shaftDiameter: num(25.4, "mm"), system: text("inch") });
    expect(r.values["keyway width"]).toBe(6.35); // 1/4 in = 6.35 mm, shown in the shop's millimetres
    expect(
      runCalc("propellerTaper", { shaftDiameter: num(25, "mm"), system: text("sideways") }),
    ).toMatchObject({
      error: { field: "system" },
    });
  });

  it("propellerTaperMm: rate of taper C = (D − d) / L = 1/10 (ISO 1119; Kiwiprop addendum: 'ISO by 1 mm every 10 mm')", () => {
    const r = propellerTaperMm({ shaftDiameterMm: 30 });
    expect(r).toMatchObject({ standard: "ISO 4566", taperRatio: 0.1, keyWidthMm: 8, keyHeightMm: 7 });
    // 30 mm, 8 × 7 mm key: as the Kiwiprop addendum lists for an ISO 1:10 30 mm shaft.
    expect(r.halfAngleDeg).toBeCloseTo((Math.atan(0.05) * 180) / Math.PI, 10); // 2.862°
  });

  it("ISO 4566 covers 20 mm to 160 mm shafts (ISO 4566:1992, Scope, as the ISO catalogue states)", () => {
    expect(propellerTaperMm({ shaftDiameterMm: 20 }).shaftDiameterMm).toBe(20);
    expect(propellerTaperMm({ shaftDiameterMm: 160 }).shaftDiameterMm).toBe(160);
    expect(propellerTaperMm({ shaftDiameterMm: 34.98 }).shaftDiameterMm).toBe(35); // within 0.127 mm = 0.005 in
    expect(() => propellerTaperMm({ shaftDiameterMm: 19 })).toThrow(CalcError);
    expect(() => propellerTaperMm({ shaftDiameterMm: 170 })).toThrow(CalcError);
  });
});
