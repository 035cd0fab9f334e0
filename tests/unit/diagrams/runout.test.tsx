import { describe, expect, it } from "vitest";
import { shaftRunout } from "~/lib/calc";
import { RunoutDiagram } from "~/components/diagrams";
import { elements, render, texts, titleOf } from "./markup";

// Dial readings at 0°, 90°, 180°, 270°. TIR = largest − smallest reading over one turn
// (ASME Y14.5 full indicator movement, formerly TIR), worked by hand:
//   station 1: 0.002 − 0 = 0.002 in; station 2: 0.0045 − 0.0005 = 0.004 in, high at 180°;
//   station 3: 0.001 − 0 = 0.001 in, high at 90°.
// Limit 0.003 in TIR: the usual shop limit (common practice).
const stations = [
  { positionIn: 6, readingsIn: [0, 0.001, 0.002, 0.001] },
  { positionIn: 24, readingsIn: [0.0005, 0.0025, 0.0045, 0.002] },
  { positionIn: 48, readingsIn: [0, 0.001, 0.0005, 0] },
];
const result = shaftRunout({ stations, limitTirIn: 0.003 });

/** The station bars: 22 wide, one per station, in order. */
const bars = (svg: string) => elements(svg, "rect").filter((r) => r.width === "22");

describe("RunoutDiagram", () => {
  it("names the worst station's TIR, the limit, and the verdict in words", () => {
    const svg = render(<RunoutDiagram result={result} limitTirIn={0.003} />);
    const words = texts(svg);
    expect(words).toContain("0.004 in");
    expect(words).toContain("0.002 in");
    expect(words).toContain("0.001 in");
    expect(words).toContain("limit 0.003 in");
    expect(words).toContain("worst");
    expect(words).toContain("high spot 180°");
    expect(words).toContain("at 24 in");
    expect(words).toContain("Over the limit: worst TIR 0.004 in at Station 2, limit 0.003 in");
    expect(titleOf(svg)).toMatch(/Station 2: 0\.004 in at 24 in, high spot 180°/);
  });

  it("draws each bar in proportion to its TIR, from the same baseline", () => {
    const svg = render(<RunoutDiagram result={result} limitTirIn={0.003} />);
    const [a, b, c] = bars(svg).map((r) => ({
      height: Number(r.height),
      bottom: Number(r.y) + Number(r.height),
    }));
    // 0.004 : 0.002 : 0.001, as worked above.
    expect(b.height / a.height).toBeCloseTo(2, 1);
    expect(a.height / c.height).toBeCloseTo(2, 1);
    expect(new Set([a.bottom, b.bottom, c.bottom]).size).toBe(1);
  });

  it("places the stations along the shaft by their measured positions", () => {
    const svg = render(<RunoutDiagram result={result} limitTirIn={0.003} />);
    const centres = bars(svg).map((r) => Number(r.x) + 11);
    // Positions 6, 24 and 48 in: the first gap is 18/42 of the whole span.
    expect((centres[1] - centres[0]) / (centres[2] - centres[0])).toBeCloseTo(18 / 42, 2);
  });

  it("passes when every station is within the limit, and says so", () => {
    const within = shaftRunout({ stations, limitTirIn: 0.004 });
    const svg = render(
      <RunoutDiagram
        result={within}
        limitTirIn={0.004}
        stationLabels={["Coupling end", "Mid-length", "Propeller end"]}
      />,
    );
    expect(texts(svg)).toContain("Within the limit: worst TIR 0.004 in at Mid-length, limit 0.004 in");
    expect(texts(svg)).not.toContain("Over the limit");
  });

  it("writes thousandths and millimetres when the shop reads in them", () => {
    // 1 in = 25.4 mm exactly (NIST SP 811, Appendix B): 0.004 in = 0.1016 mm, 0.003 in = 0.0762 mm.
    const mm = render(<RunoutDiagram result={result} limitTirIn={0.003} lengthUnit="mm" />);
    expect(texts(mm)).toContain("0.102 mm");
    expect(texts(mm)).toContain("limit 0.076 mm");
    const thou = render(<RunoutDiagram result={result} limitTirIn={0.003} lengthUnit="thou" />);
    expect(texts(thou)).toContain("4 thou");
    expect(texts(thou)).toContain("limit 3 thou");
  });

  it("leaves out positions that are only station numbers", () => {
    const svg = render(<RunoutDiagram result={result} limitTirIn={0.003} showPositions={false} />);
    expect(texts(svg).some((t) => t.startsWith("at "))).toBe(false);
  });
});
