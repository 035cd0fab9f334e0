import { describe, expect, it } from "vitest";
import { runCalc, type CalcInput, type CalcOutcome } from "~/lib/calc";
import { diagramFor } from "~/components/diagrams";
import { render, texts, titleOf } from "./markup";

type Inputs = Record<string, CalcInput>;

function outcome(name: string, inputs: Inputs): CalcOutcome {
  const result = runCalc(name, inputs);
  if ("error" in result) throw new Error(`${result.error.field}: ${result.error.message}`);
  return result;
}

function diagram(name: string, inputs: Inputs, options = {}) {
  const element = diagramFor(name, outcome(name, inputs).detail, inputs, options);
  expect(element, `a diagram for ${name}`).not.toBeNull();
  return render(element!);
}

// A face-gaps item as the engine-alignment template holds it: one row, four labelled columns.
const faceGaps: CalcInput = {
  kind: "grid",
  rows: ["Gap"],
  columns: ["Top (12 o'clock)", "Bottom (6 o'clock)", "Port", "Starboard"],
  values: [[16, 4, 12, 9]],
  unit: "thou",
};

describe("diagramFor", () => {
  it("draws the runout of a checklist's readings grid with its own station and angle names", () => {
    // TIR by hand (max − min, ASME Y14.5 full indicator movement): 2 thou and 4 thou; the limit is
    // given in mm: 0.0762 mm = 0.003 in exactly (1 in = 25.4 mm, NIST SP 811).
    const svg = diagram("shaftRunout", {
      readings: {
        kind: "grid",
        rows: ["Coupling end", "Mid-length"],
        columns: ["0° (keyway)", "90°", "180°", "270°"],
        values: [
          [0, 1, 2, 1],
          [0, 4, 1, 0],
        ],
        unit: "thou",
      },
      limitTir: { kind: "number", value: 0.0762, unit: "mm" },
    });
    const words = texts(svg);
    expect(words).toEqual(
      expect.arrayContaining(["Coupling end", "Mid-length", "0.004 in", "limit 0.003 in", "high spot 90°"]),
    );
    expect(words).toContain("Over the limit: worst TIR 0.004 in at Mid-length, limit 0.003 in");
    // Without station positions, the stations are not given distances.
    expect(words.some((t) => t.startsWith("at "))).toBe(false);
  });

  it("reads the four gaps from the template's grid by their labels for the coupling face", () => {
    const svg = diagram("couplingFace", {
      diameter: { kind: "number", value: 5, unit: "in" },
      gaps: faceGaps,
      maxInPerInDiameter: { kind: "number", value: 0.001, unit: "in/in" },
    });
    expect(texts(svg)).toEqual(
      expect.arrayContaining(["Top 0.016 in", "Bottom 0.004 in", "Port 0.012 in", "Starboard 0.009 in"]),
    );
    // (16 − 4) thou over 5 in = 2.4 thou per inch, over the 1 thou per inch limit (common practice).
    expect(texts(svg)).toContain("Faces out of parallel: more than 1 thou per inch of diameter");
  });

  it("draws the rim offset with its limit", () => {
    // (0 − (−8)) / 2 = 4 thou above; (−2 − (−6)) / 2 = 2 thou to starboard (rim-and-face alignment).
    const svg = diagram("couplingRim", {
      rim: { kind: "numbers", values: [0, -0.008, -0.006, -0.002], unit: "in" },
      maxOffset: { kind: "number", value: 0.005, unit: "in" },
    });
    expect(texts(svg)).toContain("Engine centre 0.004 in above, 0.002 in to starboard of the shaft centre");
    expect(texts(svg)).toContain("Offset within 0.005 in each way");
  });

  it("draws the mount moves from the mount distances, in the shop's unit", () => {
    // Faces parallel, engine centre 0.010 in high (given as 0.254 mm): lower both pairs 0.010 in
    // = 0.254 mm; mounts 660.4 mm (26 in) and 203.2 mm (8 in) forward of the face.
    const svg = diagram(
      "mountMoves",
      {
        diameter: { kind: "number", value: 5, unit: "in" },
        gaps: { kind: "numbers", values: [0.004, 0.004, 0.004, 0.004], unit: "in" },
        offsetVertical: { kind: "number", value: 0.254, unit: "mm" },
        offsetHorizontal: { kind: "number", value: 0, unit: "mm" },
        frontMount: { kind: "number", value: 660.4, unit: "mm" },
        rearMount: { kind: "number", value: 203.2, unit: "mm" },
      },
      { lengthUnit: "mm" },
    );
    expect(texts(svg).filter((t) => t === "lower 0.254 mm")).toHaveLength(2);
    expect(texts(svg)).toEqual(expect.arrayContaining(["front: 660.4 mm forward", "rear: 203.2 mm forward"]));
  });

  it("draws the sea-trial loading with the runs given, and propeller slip as one run against the pitch speed", () => {
    const loading = diagram(
      "seaTrialLoading",
      {
        wotRpm: { kind: "number", value: 3250, unit: "rpm" },
        ratedRpmMin: { kind: "number", value: 3400, unit: "rpm" },
        ratedRpmMax: { kind: "number", value: 3600, unit: "rpm" },
      },
      { speedRuns: [{ rpm: 3250, knots: 27 }] },
    );
    expect(texts(loading)).toEqual(
      expect.arrayContaining(["rated band 3400 rpm to 3600 rpm", "WOT 3250 rpm", "3250 rpm, 27 kn"]),
    );
    // 27 kn entered as 31.07 mph (1 kn = 1852 m/h, 1 mi = 1609.344 m, NIST SP 811): 31.0712 mph = 27.000 kn.
    const slip = diagram("propSlip", {
      pitch: { kind: "number", value: 24, unit: "in" },
      engineRpm: { kind: "number", value: 2800, unit: "rpm" },
      gearRatio: { kind: "number", value: 1.96, unit: "1" },
      speed: { kind: "number", value: 31.0712, unit: "mph" },
    });
    // Slip worked by hand in sea-trial.test.tsx (Gerr, Propeller Handbook): 4.3 %.
    expect(texts(slip)).toContain("2800 rpm, 27 kn, slip 4.3%");
    expect(titleOf(slip)).toContain("pitch speed line for 24 in pitch at 1.96 : 1");
  });

  it("has no diagram for calculations that are a table look-up, or for a detail that is not a result", () => {
    const key = outcome("keyForShaft", { diameter: { kind: "number", value: 1, unit: "in" } });
    expect(diagramFor("keyForShaft", key.detail, {})).toBeNull();
    expect(diagramFor("shaftRunout", undefined, {})).toBeNull();
  });
});
