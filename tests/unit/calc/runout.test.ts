import { describe, expect, it } from "vitest";
import { fieldOf } from "../../support/calc.ts";
import { runoutGrade, shaftRunout, straighteningHistory } from "~/lib/calc";

describe("shaftRunout", () => {
  it("TIR is the largest minus the smallest reading of one revolution", () => {
    // Total indicator reading as defined in ASME Y14.5 (full indicator movement, formerly TIR;
    // from memory): difference between the maximum and minimum readings over a full turn.
    // Readings at 0°, 90°, 180°, 270°: 0, +0.001, +0.003, +0.001 → TIR 0.003 in, high spot at 180°.
    const r = shaftRunout({
      stations: [{ positionIn: 6, readingsIn: [0, 0.001, 0.003, 0.001] }],
      limitTirIn: 0.003,
    });
    expect(r.stations[0].tirIn).toBeCloseTo(0.003, 12);
    expect(r.stations[0].highSpotIndex).toBe(2);
    expect(r.stations[0].highSpotAngleDeg).toBe(180);
  });

  it("finds the worst station and judges it against the limit", () => {
    const stations = [
      { positionIn: 0, readingsIn: [0, 0.0005, 0.001, 0.0005] }, // TIR 0.001
      { positionIn: 12, readingsIn: [-0.002, 0, 0.002, 0.0005] }, // TIR 0.004
      { positionIn: 24, readingsIn: [0.001, 0.003, 0.002, 0] }, // TIR 0.003
    ];
    const r = shaftRunout({ stations, limitTirIn: 0.003 });
    expect(r.worstStation).toBe(1);
    expect(r.maxTirIn).toBeCloseTo(0.004, 12);
    expect(r.pass).toBe(false);
  });

  it("passes a reading exactly on the limit despite binary noise", () => {
    // 0.010 − 0.009 is 0.0010000000000000009 in binary floating point; against a 0.001 in limit
    // (a good straightened shaft — common practice) it must count as on the limit.
    const r = shaftRunout({
      stations: [{ positionIn: 0, readingsIn: [0.009, 0.01, 0.0095] }],
      limitTirIn: 0.001,
    });
    expect(r.maxTirIn).toBe(0.001);
    expect(r.pass).toBe(true);
    expect(
      shaftRunout({ stations: [{ positionIn: 0, readingsIn: [0, 0.0031] }], limitTirIn: 0.003 }).pass,
    ).toBe(false);
  });

  it("names the field of bad input", () => {
    expect(fieldOf(() => shaftRunout({ stations: [], limitTirIn: 0.003 }))).toBe("stations");
    expect(
      fieldOf(() =>
        shaftRunout({
          stations: [
            { positionIn: 0, readingsIn: [0, 0.001] },
            { positionIn: 6, readingsIn: [0, Number.NaN, 0.002] },
          ],
          limitTirIn: 0.003,
        }),
      ),
    ).toBe("stations[1].readingsIn");
    expect(
      fieldOf(() => shaftRunout({ stations: [{ positionIn: 0, readingsIn: [0.001] }], limitTirIn: 0.003 })),
    ).toBe("stations[0].readingsIn");
    expect(
      fieldOf(() => shaftRunout({ stations: [{ positionIn: 0, readingsIn: [0, 1] }], limitTirIn: -1 })),
    ).toBe("limitTirIn");
  });
});

describe("runoutGrade — shop rules of thumb (common practice)", () => {
  it("0.001 in TIR is good, 0.002–0.003 in the usual limit, 0.008 in far out", () => {
    expect(runoutGrade(0.001)).toBe("good");
    expect(runoutGrade(0.002)).toBe("within usual limit");
    expect(runoutGrade(0.003)).toBe("within usual limit");
    expect(runoutGrade(0.005)).toBe("over usual limit");
    expect(runoutGrade(0.008)).toBe("far out");
  });
});

describe("straighteningHistory", () => {
  it("follows attempts toward the limit (common practice: straighten to about 0.001–0.003 in)", () => {
    const h = straighteningHistory({ attemptsTirIn: [0.008, 0.005, 0.0025, 0.003], limitTirIn: 0.003 });
    expect(h.attempts.map((a) => a.withinLimit)).toEqual([false, false, true, true]);
    expect(h.attempts[1].changeIn).toBeCloseTo(-0.003, 12); // 0.005 − 0.008, by hand
    expect(h.reachedLimitAt).toBe(2);
    expect(h.bestAttempt).toBe(2);
    expect(h.bestTirIn).toBe(0.0025);
    expect(straighteningHistory({ attemptsTirIn: [0.01], limitTirIn: 0.003 }).reachedLimitAt).toBeUndefined();
  });
});
