import { describe, expect, it } from "vitest";
import { fieldOf } from "../../support/calc.ts";
import { mountMoves, shimStack, threadPitch } from "~/lib/calc";

const square = { top: 0.004, bottom: 0.004, port: 0.004, starboard: 0.004 };

describe("mountMoves", () => {
  it("matches a published worked example of the angular correction: S = L × M / D", () => {
    // Carrier 17/19EX Start-Up, Operation and Maintenance Instructions, coupling alignment,
    // "Adjustment" and Figure 40 "Alignment Formula" (p. 213 of the manual as published online):
    // face diameter D = 5 in, front and rear hold-down bolts L = 30 in
    // apart, net misalignment M = 0.012 in with the larger opening at the top →
    // S = 30 / 5 × 0.012 = 0.072 in of shim under the feet far from the coupling.
    const r = mountMoves({
      diameterIn: 5,
      gapsIn: { top: 0.016, bottom: 0.004, port: 0.01, starboard: 0.01 },
      offsetIn: { vertical: 0, horizontal: 0 },
      rearMountIn: 10,
      frontMountIn: 40,
    });
    expect(r.front.raiseIn - r.rear.raiseIn).toBeCloseTo(0.072, 12);
    // Pivoting about the coupling face itself, the far mounts take the whole 0.072 in.
    const pivot = mountMoves({
      diameterIn: 5,
      gapsIn: { top: 0.012, bottom: 0, port: 0, starboard: 0 },
      offsetIn: { vertical: 0, horizontal: 0 },
      rearMountIn: 0,
      frontMountIn: 30,
    });
    expect(pivot.front.raiseIn).toBeCloseTo(0.072, 12);
    expect(pivot.rear.raiseIn).toBe(0);
  });

  it("corrects a pure offset by the same amount at every mount", () => {
    // Same manual (Carrier 17/19EX instructions), parallel correction: "add or remove identical amounts of shims at all
    // footings". Engine centre 0.010 in high → lower both pairs 0.010 in.
    const r = mountMoves({
      diameterIn: 5,
      gapsIn: square,
      offsetIn: { vertical: 0.01, horizontal: -0.004 },
      rearMountIn: 8,
      frontMountIn: 26,
    });
    expect(r.front.raiseIn).toBeCloseTo(-0.01, 12);
    expect(r.rear.raiseIn).toBeCloseTo(-0.01, 12);
    expect(r.front.toStarboardIn).toBeCloseTo(0.004, 12);
    expect(r.rear.toStarboardIn).toBeCloseTo(0.004, 12);
  });

  it("combines slope and offset by similar triangles (hand-worked)", () => {
    // By hand: D = 5 in; top − bottom = +0.005 → nose low, slope 0.001 in/in; engine centre
    // 0.004 in below the shaft centre. Rear mounts 12 in, front 30 in forward of the face:
    //   front raise = 0.001 × 30 + 0.004 = 0.034 in; rear raise = 0.001 × 12 + 0.004 = 0.016 in.
    // starboard − port = −0.0025 → slope −0.0005 (nose to starboard); centre 0.003 in to starboard:
    //   front = −0.0005 × 30 − 0.003 = −0.018 in (to port); rear = −0.0005 × 12 − 0.003 = −0.009 in.
    // Adjuster studs 1/2-13 UNC (13 threads per inch, ASME B1.1): 0.034 × 13 = 0.442 turns, 0.016 × 13 = 0.208.
    const tpi = threadPitch({ nominalIn: 0.5, series: "UNC" }).tpi;
    const r = mountMoves({
      diameterIn: 5,
      gapsIn: { top: 0.007, bottom: 0.002, port: 0.0055, starboard: 0.003 },
      offsetIn: { vertical: -0.004, horizontal: 0.003 },
      rearMountIn: 12,
      frontMountIn: 30,
      adjusterTpi: tpi,
    });
    expect(r.front.raiseIn).toBeCloseTo(0.034, 12);
    expect(r.rear.raiseIn).toBeCloseTo(0.016, 12);
    expect(r.front.toStarboardIn).toBeCloseTo(-0.018, 12);
    expect(r.rear.toStarboardIn).toBeCloseTo(-0.009, 12);
    expect(r.front.nutTurns).toBeCloseTo(0.442, 12);
    expect(r.rear.nutTurns).toBeCloseTo(0.208, 12);
  });

  it("a gap larger at the top means the nose is low: the front mounts go up more", () => {
    const r = mountMoves({
      diameterIn: 4,
      gapsIn: { top: 0.006, bottom: 0.002, port: 0.004, starboard: 0.004 },
      offsetIn: { vertical: 0, horizontal: 0 },
      rearMountIn: 10,
      frontMountIn: 30,
    });
    expect(r.front.raiseIn).toBeGreaterThan(r.rear.raiseIn);
    expect(r.rear.raiseIn).toBeGreaterThan(0);
  });

  it("offers the shim stack for each vertical move from the shop's stock", () => {
    // By hand: 0.034 in from 0.002/0.003/0.005/0.010/0.020 needs four pieces (0.020 + 0.010 + 0.002 + 0.002);
    // no three of those sizes add up to 0.034.
    const r = mountMoves({
      diameterIn: 5,
      gapsIn: { top: 0.007, bottom: 0.002, port: 0.004, starboard: 0.004 },
      offsetIn: { vertical: -0.004, horizontal: 0 },
      rearMountIn: 12,
      frontMountIn: 30,
      shimStockIn: [0.002, 0.003, 0.005, 0.01, 0.02],
    });
    expect(r.front.shims?.action).toBe("add");
    expect(r.front.shims?.totalIn).toBeCloseTo(0.034, 12);
    expect(r.front.shims?.pieceCount).toBe(4);
    const down = mountMoves({
      diameterIn: 5,
      gapsIn: square,
      offsetIn: { vertical: 0.005, horizontal: 0 },
      rearMountIn: 12,
      frontMountIn: 30,
      shimStockIn: [0.005],
    });
    expect(down.rear.shims).toMatchObject({ action: "remove", totalIn: 0.005, pieceCount: 1 });
  });

  it("names the field of bad input", () => {
    const ok = {
      diameterIn: 5,
      gapsIn: square,
      offsetIn: { vertical: 0, horizontal: 0 },
      rearMountIn: 10,
      frontMountIn: 30,
    };
    expect(fieldOf(() => mountMoves({ ...ok, diameterIn: 0 }))).toBe("diameterIn");
    expect(fieldOf(() => mountMoves({ ...ok, frontMountIn: 10 }))).toBe("frontMountIn");
    expect(fieldOf(() => mountMoves({ ...ok, rearMountIn: -1 }))).toBe("rearMountIn");
    expect(fieldOf(() => mountMoves({ ...ok, offsetIn: { vertical: 0, horizontal: Number.NaN } }))).toBe(
      "offsetIn.horizontal",
    );
    expect(fieldOf(() => mountMoves({ ...ok, offsetIn: undefined as never }))).toBe("offsetIn");
    expect(fieldOf(() => mountMoves({ ...ok, adjusterTpi: 0 }))).toBe("adjusterTpi");
  });
});

describe("shimStack", () => {
  it("makes an exact thickness with the fewest pieces (hand count)", () => {
    // 0.017 = 0.010 + 0.005 + 0.002; no two of 0.002/0.005/0.010 make 0.017.
    const r = shimStack({ thicknessIn: 0.017, stockIn: [0.002, 0.005, 0.01] });
    expect(r.pieces).toEqual([
      { sizeIn: 0.01, count: 1 },
      { sizeIn: 0.005, count: 1 },
      { sizeIn: 0.002, count: 1 },
    ]);
    expect(r.differenceIn).toBe(0);
    expect(shimStack({ thicknessIn: 0.02, stockIn: [0.005, 0.01, 0.02] }).pieceCount).toBe(1);
  });

  it("comes as close as the stock allows when no stack is exact", () => {
    // 0.0123 from 0.005 and 0.010: 0.010 misses by 0.0023, 0.015 by 0.0027.
    const r = shimStack({ thicknessIn: 0.0123, stockIn: [0.005, 0.01] });
    expect(r.totalIn).toBe(0.01);
    expect(r.differenceIn).toBeCloseTo(-0.0023, 12);
  });

  it("keeps to at most five shims by default (common practice) or the number given", () => {
    expect(shimStack({ thicknessIn: 0.008, stockIn: [0.002], maxPieces: 3 }).totalIn).toBeCloseTo(0.006, 12);
    expect(shimStack({ thicknessIn: 0.014, stockIn: [0.002] }).pieceCount).toBe(5);
  });

  it("names the field of bad input", () => {
    expect(fieldOf(() => shimStack({ thicknessIn: 0, stockIn: [0.002] }))).toBe("thicknessIn");
    expect(fieldOf(() => shimStack({ thicknessIn: 0.01, stockIn: [] }))).toBe("stockIn");
    expect(fieldOf(() => shimStack({ thicknessIn: 0.01, stockIn: [0.002, -0.001] }))).toBe("stockIn[1]");
  });
});
