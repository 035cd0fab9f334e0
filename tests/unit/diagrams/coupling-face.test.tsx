import { describe, expect, it } from "vitest";
import { couplingFace, couplingRim } from "~/lib/calc";
import { CouplingFaceDiagram } from "~/components/diagrams";
import { elements, render, texts, titleOf } from "./markup";

// Feeler gaps on a 5 in coupling. By hand (gap difference ÷ diameter, straightedge-and-feeler
// alignment): top − bottom = 0.016 − 0.004 = +0.012 in → 0.0024 in per in = 2.4 thou per inch,
// open at the top, so the engine's nose is low; starboard − port = 0.009 − 0.012 = −0.003 in →
// 0.6 thou per inch, open to port. Limit 0.001 in per inch of diameter (common practice): over.
const gapsIn = { top: 0.016, bottom: 0.004, port: 0.012, starboard: 0.009 };
const face = couplingFace({ diameterIn: 5, gapsIn, maxInPerInDiameter: 0.001 });

// Rim readings, dial on the shaft's half (offset = half the difference of opposite readings,
// the rim-and-face method of millwright alignment practice): (0 − (−0.008)) / 2 = 0.004 in above;
// (−0.002 − (−0.006)) / 2 = 0.002 in to starboard. Limit 0.002 in each way (common practice).
const rim = couplingRim({
  readingsIn: { top: 0, bottom: -0.008, port: -0.006, starboard: -0.002 },
  maxOffsetIn: 0.002,
});
const offset = {
  verticalIn: rim.verticalOffsetIn,
  horizontalIn: rim.horizontalOffsetIn,
  pass: rim.pass,
  limitIn: 0.002,
};

describe("CouplingFaceDiagram", () => {
  it("labels the four gaps, the differences and what they mean", () => {
    const svg = render(<CouplingFaceDiagram gapsIn={gapsIn} diameterIn={5} face={face} />);
    const words = texts(svg);
    expect(words).toEqual(
      expect.arrayContaining([
        "Top 0.016 in",
        "Bottom 0.004 in",
        "Port 0.012 in",
        "Starboard 0.009 in",
        "diameter 5 in",
      ]),
    );
    expect(words).toContain(
      "Top minus bottom: +0.012 in, 2.4 thou per inch of diameter - open at the top (nose low)",
    );
    expect(words).toContain(
      "Starboard minus port: -0.003 in, 0.6 thou per inch of diameter - open to port (nose to starboard)",
    );
    expect(words).toContain("Faces out of parallel: more than 1 thou per inch of diameter");
    expect(titleOf(svg)).toMatch(/^Coupling seen from aft, looking forward/);
  });

  it("exaggerates the gaps: the widest gap gets the longest feeler, the narrowest the shortest", () => {
    const svg = render(<CouplingFaceDiagram gapsIn={gapsIn} diameterIn={5} face={face} />);
    const feelers = elements(svg, "rect").filter((r) => r.fill === "#fbefc8");
    // Drawn top, bottom, port, starboard; a feeler's length runs out from the rim (height at top and bottom, width at the sides).
    const [top, bottom, port, starboard] = feelers.map((r, i) => Number(i < 2 ? r.height : r.width));
    expect(top).toBeGreaterThan(port);
    expect(port).toBeGreaterThan(starboard);
    expect(starboard).toBeGreaterThan(bottom);
  });

  it("shows the engine's half shifted up and to starboard (the right, seen from aft) for a rim offset", () => {
    const svg = render(<CouplingFaceDiagram offset={offset} />);
    const [shaftSide] = elements(svg, "circle");
    const engineSide = elements(svg, "circle").find((c) => c["stroke-dasharray"]);
    expect(engineSide).toBeDefined();
    expect(Number(engineSide!.cx)).toBeGreaterThan(Number(shaftSide.cx));
    expect(Number(engineSide!.cy)).toBeLessThan(Number(shaftSide.cy));
    const words = texts(svg);
    expect(words).toContain("Engine centre 0.004 in above, 0.002 in to starboard of the shaft centre");
    expect(words).toContain("Offset more than 0.002 in each way");
    expect(words).toEqual(expect.arrayContaining(["Top", "Bottom", "Port", "Starboard"]));
  });

  it("passes faces within the limit and says so in words", () => {
    const square = couplingFace({
      diameterIn: 5,
      gapsIn: { top: 0.006, bottom: 0.004, port: 0.005, starboard: 0.005 },
    });
    // 0.002 in over 5 in = 0.4 thou per inch, within the 1 thou per inch default (common practice).
    const svg = render(
      <CouplingFaceDiagram
        gapsIn={{ top: 0.006, bottom: 0.004, port: 0.005, starboard: 0.005 }}
        diameterIn={5}
        face={square}
      />,
    );
    expect(texts(svg)).toContain("Faces parallel: within 1 thou per inch of diameter");
    expect(texts(svg)).toContain("Starboard minus port: 0.000 in, 0 thou per inch of diameter - level");
  });

  it("writes mm per metre when the shop works in millimetres", () => {
    // 0.0024 in per in is the same ratio as 2.4 mm per m; 0.016 in = 0.4064 mm (1 in = 25.4 mm, NIST SP 811).
    const svg = render(<CouplingFaceDiagram gapsIn={gapsIn} diameterIn={5} face={face} lengthUnit="mm" />);
    expect(texts(svg)).toContain("Top 0.406 mm");
    expect(texts(svg)).toContain(
      "Top minus bottom: +0.305 mm, 2.4 mm per m of diameter - open at the top (nose low)",
    );
  });
});
