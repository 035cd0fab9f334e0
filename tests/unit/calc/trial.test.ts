import { describe, expect, it } from "vitest";
import {
  CalcError,
  heeledHeight,
  installationAngle,
  rawWaterFlow,
  runCalc,
  speedRuns,
  tachPulses,
  type CalcInput,
  type CalcOutcome,
  type Unit,
} from "~/lib/calc";

const num = (value: number, unit: Unit): CalcInput => ({ kind: "number", value, unit });
function outcome(name: string, inputs: Record<string, CalcInput | undefined>): CalcOutcome {
  const r = runCalc(name, inputs);
  if ("error" in r) throw new Error(`${r.error.field}: ${r.error.message}`);
  return r;
}

describe("rawWaterFlow — 1 US gal = 231 in³ = 3.785411784 L exactly (NIST SP 811 (2008), Appendix B.8, 'gallon [U.S.]')", () => {
  it("10 L caught in 30 s is 20 L/min, 5.2834 US gal/min", () => {
    const r = rawWaterFlow({ volumeL: 10, seconds: 30 });
    expect(r.litresPerMinute).toBe(20);
    expect(r.usGallonsPerMinute).toBeCloseTo(20 / 3.785411784, 10);
    expect(r.pass).toBeUndefined();
  });

  it("against the engine maker's minimum", () => {
    expect(rawWaterFlow({ volumeL: 10, seconds: 30, minLitresPerMinute: 20 }).pass).toBe(true);
    expect(rawWaterFlow({ volumeL: 10, seconds: 31, minLitresPerMinute: 20 }).pass).toBe(false);
    expect(() => rawWaterFlow({ volumeL: 10, seconds: 0 })).toThrow(CalcError);
  });

  it("a catch in US gallons reads in US gal/min, labelled so", () => {
    // 1 US gal in 15 s = 4 US gal/min = 15.1416 L/min.
    const r = outcome("rawWaterFlow", {
      volume: num(1, "gal"),
      time: num(15, "s"),
      minFlow: num(3, "gal/min"),
    });
    expect(r.values.flow).toBe(4);
    expect(r.units.flow).toBe("gal/min");
    expect(r.values["in L/min"]).toBe(15.1);
    expect(r.verdict).toBe("pass");
    expect(r.rule).toBe("flow ≥ 3 US gal/min (engine maker's minimum)");
  });
});

describe("speedRuns — 1 kn = 1852 m/h (BIPM SI Brochure, 9th ed., Table 8: nautical mile 1852 m, knot 1852/3600 m/s)", () => {
  it("1 nmi in 300 s over and 450 s back: 12 kn and 8 kn, speed 10 kn, current 2 kn", () => {
    const r = speedRuns({
      legs: [
        { distanceNm: 1, seconds: 300 },
        { distanceNm: 1, seconds: 450 },
      ],
    });
    expect(r.legKnots).toEqual([12, 8]);
    expect(r.meanKnots).toBe(10); // the mean of the times (375 s) would give 9.6 kn
    expect(r.currentKnots).toBe(2);
  });

  it("three or four legs: the mean of means cancels a steadily changing current (ITTC 7.5-04-01-01.1, from memory)", () => {
    // Boat 10 kn, current 2, 1, 0 kn along leg 1's direction: legs 12, 9, 10.
    expect(
      speedRuns({
        legs: [
          { distanceNm: 1, seconds: 300 },
          { distanceNm: 1, seconds: 400 },
          { distanceNm: 1, seconds: 360 },
        ],
      }).meanKnots,
    ).toBe(10); // (12 + 2 × 9 + 10) / 4
    expect(() => speedRuns({ legs: [{ distanceNm: 1, seconds: 300 }] })).toThrow(CalcError);
  });

  it("in the registry: one distance for every leg, times from a readings grid", () => {
    const r = outcome("speedRuns", {
      distance: num(1852, "m"),
      times: { kind: "grid", rows: ["north", "south"], columns: ["time"], values: [[300], [450]], unit: "s" },
    });
    expect(r.values).toMatchObject({ speed: 10, current: 2, "leg 1": 12, "leg 2": 8 });
    expect(r.units.speed).toBe("kn");
  });
});

describe("tachPulses — f = p × n / 120 (synchronous speed n = 120 f / p, IEC 60034-1 / any electrical machines text)", () => {
  it("a 12-pole alternator on a 2:1 drive gives 12 pulses per engine revolution", () => {
    expect(tachPulses({ crankPulleyDia: 6, alternatorPulleyDia: 3, alternatorPoles: 12 })).toEqual({
      pulsesPerRev: 12,
    });
    // 14 poles, 150 mm crank, 60 mm alternator: 7 × 2.5 = 17.5.
    expect(
      tachPulses({ crankPulleyDia: 150, alternatorPulleyDia: 60, alternatorPoles: 14 }).pulsesPerRev,
    ).toBe(17.5);
    expect(() => tachPulses({ crankPulleyDia: 6, alternatorPulleyDia: 3, alternatorPoles: 13 })).toThrow(
      CalcError,
    );
  });

  it("pulleys in millimetres give the same ratio", () => {
    const r = outcome("tachPulses", {
      crankPulley: num(150, "mm"),
      alternatorPulley: num(60, "mm"),
      alternatorPoles: num(14, "1"),
    });
    expect(r.values["pulses per revolution"]).toBe(17.5);
    expect(r.verdict).toBe("info");
  });
});

describe("heeledHeight — rotation of the point about the centreline at the waterline (common practice simplification)", () => {
  it("exact trigonometric values: cos 30° = √3/2, sin 30° = 1/2", () => {
    expect(heeledHeight({ heightIn: 10, offCentreIn: 0, heelDeg: 30 }).heightHeeledIn).toBeCloseTo(
      5 * Math.sqrt(3),
      10,
    );
    expect(heeledHeight({ heightIn: 10, offCentreIn: 12, heelDeg: 30 }).heightHeeledIn).toBeCloseTo(
      5 * Math.sqrt(3) - 6,
      10,
    );
    expect(heeledHeight({ heightIn: 10, offCentreIn: 12, heelDeg: 0 }).heightHeeledIn).toBe(10);
    expect(heeledHeight({ heightIn: 10, offCentreIn: 12, heelDeg: 90 }).heightHeeledIn).toBe(-12);
    expect(() => heeledHeight({ heightIn: 10, offCentreIn: 0, heelDeg: 120 })).toThrow(CalcError);
  });

  it("a riser 12 in up and 10 in off the centreline is 5.39 in up at 30° of heel: short of a 6 in minimum", () => {
    // 12 × 0.8660254 − 10 × 0.5 = 5.3923
    const r = outcome("heeledHeight", {
      height: num(12, "in"),
      offCentre: num(10, "in"),
      heel: num(30, "deg"),
      minHeight: num(6, "in"),
    });
    expect(r.values["height heeled"]).toBe(5.3923);
    expect(r.verdict).toBe("fail");
    expect(r.rule).toBe("at 30° of heel, height ≥ 6 in");
  });
});

describe("installationAngle — running angle = angle at rest + running trim (engine maker's installation instructions)", () => {
  it("10° at rest plus 4° of trim is 14°: within a 15° maximum, not within 12°", () => {
    expect(installationAngle({ measuredDeg: 10, runningTrimDeg: 4, makerMaxDeg: 15 })).toEqual({
      runningAngleDeg: 14,
      pass: true,
    });
    expect(installationAngle({ measuredDeg: 10, runningTrimDeg: 4, makerMaxDeg: 12 }).pass).toBe(false);
    expect(() => installationAngle({ measuredDeg: 10, runningTrimDeg: 4, makerMaxDeg: 0 })).toThrow(
      CalcError,
    );
  });
});
