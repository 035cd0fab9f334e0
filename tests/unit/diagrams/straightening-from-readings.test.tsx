import { describe, expect, it } from "vitest";
import { StraighteningFromReadings, straighteningFromReadings } from "~/components/diagrams";
import { render, texts } from "./markup";

// A shaft found 0.008 in out at mid-length, pressed twice (common practice: 0.003 in TIR the
// usual limit). TIR = largest − smallest dial reading over one turn (ASME Y14.5 full indicator
// movement); each set below is three stations × four angles, worked by hand.
const asFound = [
  [0, 0.001, 0.002, 0.001],
  [0, 0.004, 0.008, 0.004], // 0.008
  [0, 0.001, 0.001, 0.0005],
];
const afterFirst = [
  [0, 0.001, 0.002, 0.001],
  [0, 0.002, 0.004, 0.002], // 0.004
  [0, 0.001, 0.001, 0.0005],
];
const afterSecond = [
  [0, 0.001, 0.0015, 0.001], // 0.0015
  [0, 0.001, 0.0025, 0.001], // 0.0025
  [0, 0.001, 0.001, 0.0005],
];

describe("straightening history from a runout readings item (issue 12, section 3)", () => {
  it("the worst TIR of each complete set, in order, converging on the limit", () => {
    const found = straighteningFromReadings(
      [
        { cells: asFound, unit: "in" },
        { cells: [[0, null, 0, 0]], unit: "in" }, // an unfinished set is left out
        { cells: afterFirst, unit: "in" },
        { cells: afterSecond, unit: "in" },
      ],
      0.003,
    )!;
    expect(found.history.attempts.map((a) => a.tirIn)).toEqual([0.008, 0.004, 0.0025]);
    expect(found.history.reachedLimitAt).toBe(2);
    expect(found.attempt).toEqual([0, 2, 3]);
  });

  it("readings in millimetres: 0.2032 mm is 0.008 in (1 in = 25.4 mm)", () => {
    const mm = (cells: number[][]) => cells.map((row) => row.map((v) => v * 25.4));
    const found = straighteningFromReadings(
      [
        { cells: mm(asFound), unit: "mm" },
        { cells: mm(afterSecond), unit: "mm" },
      ],
      0.003,
    )!;
    expect(found.history.attempts[0].tirIn).toBeCloseTo(0.008, 12);
  });

  it("one set is a reading, not a history: nothing is drawn", () => {
    expect(straighteningFromReadings([{ cells: asFound, unit: "in" }], 0.003)).toBeUndefined();
  });

  it("draws the diagram with the sets named", () => {
    const svg = render(
      <StraighteningFromReadings
        attempts={[
          { cells: asFound, unit: "in" },
          { cells: afterFirst, unit: "in" },
          { cells: afterSecond, unit: "in" },
        ]}
        limitTirIn={0.003}
      />,
    );
    expect(texts(svg)).toEqual(
      expect.arrayContaining(["As found", "Set 2", "Set 3", "0.008 in", "limit 0.003 in"]),
    );
  });
});
