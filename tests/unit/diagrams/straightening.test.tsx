import { describe, expect, it } from "vitest";
import { straighteningHistory } from "~/lib/calc";
import { StraighteningDiagram } from "~/components/diagrams";
import { elements, render, texts, titleOf } from "./markup";

// Common practice for shafts: 0.008 in TIR is far out, 0.002–0.003 in the usual limit, about
// 0.001 in a good straightened result. A shaft found at 0.012 in, pressed three times.
const attemptsTirIn = [0.012, 0.006, 0.0035, 0.002];

describe("StraighteningDiagram", () => {
  it("labels every attempt's TIR and change, the limit, and the attempt that met it", () => {
    const history = straighteningHistory({ attemptsTirIn, limitTirIn: 0.003 });
    const svg = render(
      <StraighteningDiagram history={history} limitTirIn={0.003} attemptLabels={["As found"]} />,
    );
    const words = texts(svg);
    expect(words).toEqual(
      expect.arrayContaining(["0.012 in", "0.006 in", "0.0035 in", "0.002 in", "limit 0.003 in"]),
    );
    expect(words).toEqual(expect.arrayContaining(["As found", "Attempt 2", "Attempt 3", "Attempt 4"]));
    // Changes by hand: 0.006 − 0.012 = −0.006, 0.0035 − 0.006 = −0.0025, 0.002 − 0.0035 = −0.0015.
    expect(words).toEqual(expect.arrayContaining(["down 0.006 in", "down 0.0025 in", "down 0.0015 in"]));
    expect(words).toContain("Within the 0.003 in limit: 0.002 in (Attempt 4)");
    expect(titleOf(svg)).toContain("As found: 0.012 in, Attempt 2: 0.006 in");
  });

  it("draws the attempts converging: each point lower than the one before, the last below the limit line", () => {
    const history = straighteningHistory({ attemptsTirIn, limitTirIn: 0.003 });
    const svg = render(<StraighteningDiagram history={history} limitTirIn={0.003} />);
    const [line] = elements(svg, "polyline");
    const ys = line.points.split(" ").map((p) => Number(p.split(",")[1]));
    expect(ys).toHaveLength(4);
    for (let i = 1; i < ys.length; i++) expect(ys[i]).toBeGreaterThan(ys[i - 1]); // screen y grows downward
    const limit = elements(svg, "line").find((l) => l["stroke-dasharray"]);
    expect(ys[3]).toBeGreaterThan(Number(limit!.y1));
    expect(ys[2]).toBeLessThan(Number(limit!.y1));
  });

  it("says when the limit has not been met yet, and the best so far", () => {
    const history = straighteningHistory({ attemptsTirIn: [0.008, 0.005, 0.0055], limitTirIn: 0.003 });
    const svg = render(<StraighteningDiagram history={history} limitTirIn={0.003} />);
    expect(texts(svg)).toContain("Not yet within the 0.003 in limit: best 0.005 in (Attempt 2)");
    expect(texts(svg)).toContain("up 0.0005 in");
  });
});
