import { describe, expect, it } from "vitest";
import { mountMoves } from "~/lib/calc";
import { MountMovesDiagram } from "~/components/diagrams";
import { elements, render, texts, titleOf } from "./markup";

// Worked by hand by similar triangles (rim-and-face alignment, millwright practice: move at a
// foot = face slope × distance − offset). Coupling 5 in; top − bottom = 0.009 − 0.004 = +0.005 in
// → slope 0.001 (nose low); engine centre 0.004 in below the shaft's. Rear mounts 12 in, front
// 30 in forward of the coupling face:
//   front raise = 0.001 × 30 + 0.004 = 0.034 in; rear raise = 0.001 × 12 + 0.004 = 0.016 in.
// starboard − port = 0.005 − 0.0075 = −0.0025 → slope −0.0005; centre 0.003 in to starboard:
//   front = −0.0005 × 30 − 0.003 = −0.018 in (to port); rear = −0.0005 × 12 − 0.003 = −0.009 in.
// Adjusters 1/2-13 UNC, 13 threads per inch (ASME B1.1): 0.034 × 13 = 0.442 turns, 0.016 × 13 = 0.208.
const moves = mountMoves({
  diameterIn: 5,
  gapsIn: { top: 0.009, bottom: 0.004, port: 0.0075, starboard: 0.005 },
  offsetIn: { vertical: -0.004, horizontal: 0.003 },
  frontMountIn: 30,
  rearMountIn: 12,
  adjusterTpi: 13,
});

/** Arrow heads (the filled paths of Arrow): their tip is the path's first point. */
const arrowTips = (svg: string) =>
  elements(svg, "path")
    .filter((p) => p.fill === "#1e4e79")
    .map((p) => p.d.split(" ").slice(1, 3).map(Number));

/** Arrow shafts, same order as the heads. */
const arrowShafts = (svg: string) => elements(svg, "line").filter((l) => l.stroke === "#1e4e79");

describe("MountMovesDiagram", () => {
  it("labels each pair of mounts with its move, its nut turns and its distance from the coupling", () => {
    const svg = render(<MountMovesDiagram moves={moves} frontMountIn={30} rearMountIn={12} />);
    const words = texts(svg);
    expect(words).toEqual(
      expect.arrayContaining([
        "Front mounts",
        "raise 0.034 in",
        "0.44 turns to raise",
        "Rear mounts",
        "raise 0.016 in",
        "0.21 turns to raise",
        "0.018 in to port",
        "0.009 in to port",
        "front: 30 in forward",
        "rear: 12 in forward",
      ]),
    );
    expect(titleOf(svg)).toContain(
      "Front mounts, 30 in forward of the coupling face: raise 0.034 in (0.44 turns to raise), 0.018 in to port",
    );
    expect(titleOf(svg)).toContain("The engine moves, the shaft stays.");
  });

  it("points raise arrows up in the side view and to-port arrows down in the plan view (port at the bottom, bow left)", () => {
    const svg = render(<MountMovesDiagram moves={moves} frontMountIn={30} rearMountIn={12} />);
    const shafts = arrowShafts(svg);
    const tips = arrowTips(svg);
    expect(tips).toHaveLength(4);
    // Side view first (front, rear), then the plan view (front, rear).
    for (const i of [0, 1]) expect(tips[i][1]).toBeLessThan(Number(shafts[i].y1));
    for (const i of [2, 3]) expect(tips[i][1]).toBeGreaterThan(Number(shafts[i].y1));
    // The bigger move gets the longer arrow: 0.034 in at the front against 0.016 in at the rear.
    const length = (i: number) => Math.abs(tips[i][1] - Number(shafts[i].y1));
    expect(length(0)).toBeGreaterThan(length(1));
    // The front mounts are farther from the coupling (drawn on the right), so left of the rear ones.
    expect(Number(shafts[0].x1)).toBeLessThan(Number(shafts[1].x1));
  });

  it("says lower, turns to lower and the shims to take out for an engine sitting high", () => {
    // Faces parallel, engine centre 0.010 in high: lower both pairs 0.010 in (a pure offset is
    // corrected by the same amount at every mount, as the published parallel correction says).
    // 0.010 × 13 = 0.13 turns. Stock 0.005 and 0.010 in: one 0.010 in shim out.
    const high = mountMoves({
      diameterIn: 5,
      gapsIn: { top: 0.004, bottom: 0.004, port: 0.004, starboard: 0.004 },
      offsetIn: { vertical: 0.01, horizontal: 0 },
      frontMountIn: 26,
      rearMountIn: 8,
      adjusterTpi: 13,
      shimStockIn: [0.005, 0.01],
    });
    const svg = render(<MountMovesDiagram moves={high} frontMountIn={26} rearMountIn={8} />);
    const words = texts(svg);
    expect(words.filter((t) => t === "lower 0.010 in")).toHaveLength(2);
    expect(words.filter((t) => t === "0.13 turns to lower")).toHaveLength(2);
    expect(words.filter((t) => t === "remove 1 shim:")).toHaveLength(2);
    expect(words).toContain("0.010 in");
    expect(words.filter((t) => t === "no move sideways")).toHaveLength(2);
  });
});
