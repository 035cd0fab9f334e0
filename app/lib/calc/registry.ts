import { couplingFace, couplingRim, type ClockGapsIn } from "./coupling";
import { CalcError, isCalcError } from "./errors";
import { exhaustBackPressure, exhaustInjection } from "./exhaust";
import { couplingFit, fitCheck } from "./fits";
import { validateHin } from "./hin";
import { keyForShaft, keyForShaftMm } from "./keys";
import { mountMoves } from "./mounts";
import { atLeast } from "./numbers";
import { propSlip, seaTrialLoading } from "./prop";
import { shaftRunout } from "./runout";
import { bearingSpacing, shaftDiameter } from "./shaft";
import { shimStack } from "./shims";
import { propellerTaper } from "./taper";
import { threadPitch } from "./threads";
import { convert, dimensionOf, type Unit } from "./units";
import { conductorCircularMils, wireSize } from "./wire";

/**
 * How a template's calc item feeds a calculation: each definition names its inputs (what kind
 * of value each takes and in which unit), converts what it is given, runs the calculation and
 * reports values, units, a verdict and the rule it applied. Errors come back naming the
 * definition's input, so a checklist can point at the item that fed it.
 */
export type CalcInput =
  | { kind: "number"; value: number; unit: Unit }
  | { kind: "grid"; rows: string[]; columns: string[]; values: (number | null)[][]; unit: Unit }
  | { kind: "numbers"; values: number[]; unit: Unit }
  | { kind: "text"; value: string };

export interface CalcInputSpec {
  label: string;
  accepts: CalcInput["kind"][];
  unit?: Unit;
  optional?: boolean;
}

export interface CalcOutcome {
  values: Record<string, number | string>;
  units: Record<string, string>;
  verdict: "pass" | "fail" | "info";
  rule: string;
  /** The calculation's full result, for diagrams. */
  detail: unknown;
}

export interface CalcDefinition {
  name: string;
  title: string;
  summary: string;
  /** The standard or handbook the rule comes from. */
  source: string;
  /** Said beside the result where the work can hurt someone. */
  caution?: string;
  inputs: Record<string, CalcInputSpec>;
  run(inputs: Record<string, CalcInput | undefined>): CalcOutcome;
}

type Inputs = Record<string, CalcInput | undefined>;

const CAUTION_ROTATING =
  "Isolate the engine so it cannot start while the shaft is turned by hand. Heat straightening is hot work: fuel vapours out, fire watch, hot metal.";
const CAUTION_ENGINE =
  "Support the engine before loosening its mounts and keep hands clear of a load on a hoist. The engine maker's installation instructions govern.";
const CAUTION_EXHAUST =
  "Exhaust leaks give off carbon monoxide: a tested CO alarm must be aboard. The engine maker's limits govern.";
const CAUTION_SEA_TRIAL =
  "Sea trials: life jackets, a second person on watch, and a plan for a stopped engine or a leak.";
const CAUTION_WIRING =
  "Voltage drop only: the conductor must also meet the ampacity tables and its overcurrent protection. Disconnect batteries before working on cables.";

// ---- reading the inputs --------------------------------------------------------------------

function present(inputs: Inputs, name: string, spec: CalcInputSpec): CalcInput | undefined {
  const input = inputs[name];
  if (input === undefined) {
    if (spec.optional) return undefined;
    throw new CalcError(name, `${spec.label} is missing.`);
  }
  if (!spec.accepts.includes(input.kind)) {
    throw new CalcError(name, `${spec.label} takes ${spec.accepts.join(" or ")}, not ${input.kind}.`);
  }
  return input;
}

function inUnit(name: string, label: string, value: number, from: Unit, to: Unit): number {
  if (dimensionOf(from) !== dimensionOf(to)) {
    throw new CalcError(name, `${label} is in ${from}, which cannot be read as ${to}.`);
  }
  return convert(value, from, to);
}

function reader(inputs: Inputs, specs: Record<string, CalcInputSpec>) {
  const spec = (name: string) => specs[name];
  return {
    number(name: string, unit: Unit): number | undefined {
      const input = present(inputs, name, spec(name));
      if (!input) return undefined;
      if (input.kind !== "number") throw new CalcError(name, `${spec(name).label} takes one number.`);
      return inUnit(name, spec(name).label, input.value, input.unit, unit);
    },
    numbers(name: string, unit: Unit): number[] | undefined {
      const input = present(inputs, name, spec(name));
      if (!input) return undefined;
      if (input.kind === "numbers")
        return input.values.map((v) => inUnit(name, spec(name).label, v, input.unit, unit));
      if (input.kind === "number") return [inUnit(name, spec(name).label, input.value, input.unit, unit)];
      throw new CalcError(name, `${spec(name).label} takes a list of numbers.`);
    },
    text(name: string): string | undefined {
      const input = present(inputs, name, spec(name));
      if (!input) return undefined;
      if (input.kind !== "text") throw new CalcError(name, `${spec(name).label} takes text.`);
      return input.value;
    },
    grid(name: string, unit: Unit): { rows: string[]; columns: string[]; values: number[][] } | undefined {
      const input = present(inputs, name, spec(name));
      if (!input) return undefined;
      if (input.kind !== "grid") throw new CalcError(name, `${spec(name).label} takes a table of readings.`);
      const values = input.values.map((row, r) =>
        row.map((cell, c) => {
          if (cell === null || !Number.isFinite(cell)) {
            throw new CalcError(
              name,
              `${spec(name).label}: ${input.rows[r] ?? r + 1} at ${input.columns[c] ?? c + 1} is missing.`,
            );
          }
          return inUnit(name, spec(name).label, cell, input.unit, unit);
        }),
      );
      return { rows: input.rows, columns: input.columns, values };
    },
    /** Top, bottom, port and starboard from a four-cell grid (by label) or four numbers in that order. */
    clock(name: string, unit: Unit): ClockGapsIn | undefined {
      const input = present(inputs, name, spec(name));
      if (!input) return undefined;
      if (input.kind === "numbers") {
        const v = this.numbers(name, unit)!;
        if (v.length !== 4)
          throw new CalcError(name, `${spec(name).label} takes four values: top, bottom, port, starboard.`);
        return { top: v[0], bottom: v[1], port: v[2], starboard: v[3] };
      }
      const grid = this.grid(name, unit);
      if (!grid) return undefined;
      const flat =
        grid.columns.length === 1
          ? grid.rows.map((label, i) => [label, grid.values[i][0]] as const)
          : grid.rows.length === 1
            ? grid.columns.map((label, i) => [label, grid.values[0][i]] as const)
            : [];
      const find = (pattern: RegExp) => flat.find(([label]) => pattern.test(label))?.[1];
      const gaps = {
        top: find(/top/i),
        bottom: find(/bottom/i),
        port: find(/port/i),
        starboard: find(/starboard|stbd/i),
      };
      if (Object.values(gaps).some((v) => v === undefined)) {
        throw new CalcError(
          name,
          `${spec(name).label} needs one reading each at top, bottom, port and starboard.`,
        );
      }
      return gaps as ClockGapsIn;
    },
  };
}

/** Runs a calculation, turning its field names (diameterIn, gapsIn.top…) into the definition's input names. */
function blame<T>(fields: Record<string, string>, run: () => T): T {
  try {
    return run();
  } catch (error) {
    if (!isCalcError(error)) throw error;
    const root = error.field.split(/[.[]/)[0];
    throw new CalcError(fields[error.field] ?? fields[root] ?? error.field, error.message);
  }
}

const fixed = (value: number, digits: number) => Number(value.toFixed(digits));

// ---- the calculations ----------------------------------------------------------------------

const runoutInputs: Record<string, CalcInputSpec> = {
  readings: { label: "Dial readings (stations × angles)", accepts: ["grid"], unit: "in" },
  positionsIn: {
    label: "Station positions along the shaft",
    accepts: ["numbers"],
    unit: "in",
    optional: true,
  },
  limitTir: { label: "TIR limit", accepts: ["number"], unit: "in" },
};

const faceInputs: Record<string, CalcInputSpec> = {
  diameter: { label: "Coupling diameter", accepts: ["number"], unit: "in" },
  gaps: { label: "Face gaps (top, bottom, port, starboard)", accepts: ["grid", "numbers"], unit: "in" },
  maxGapDiff: { label: "Largest gap difference", accepts: ["number"], unit: "in", optional: true },
  maxInPerInDiameter: {
    label: "Largest gap difference per inch of diameter",
    accepts: ["number"],
    unit: "in/in",
    optional: true,
  },
};

const rimInputs: Record<string, CalcInputSpec> = {
  rim: { label: "Rim readings (top, bottom, port, starboard)", accepts: ["grid", "numbers"], unit: "in" },
  maxOffset: { label: "Largest centre offset", accepts: ["number"], unit: "in", optional: true },
};

const mountInputs: Record<string, CalcInputSpec> = {
  diameter: faceInputs.diameter,
  gaps: faceInputs.gaps,
  offsetVertical: {
    label: "Engine centre above shaft centre",
    accepts: ["number"],
    unit: "in",
    optional: true,
  },
  offsetHorizontal: {
    label: "Engine centre to starboard of shaft centre",
    accepts: ["number"],
    unit: "in",
    optional: true,
  },
  rim: {
    label: "Rim readings (instead of the offsets)",
    accepts: ["grid", "numbers"],
    unit: "in",
    optional: true,
  },
  frontMount: { label: "Coupling face to front mounts", accepts: ["number"], unit: "in" },
  rearMount: { label: "Coupling face to rear mounts", accepts: ["number"], unit: "in" },
  adjusterThread: {
    label: "Mount adjuster threads per inch",
    accepts: ["number"],
    unit: "tpi",
    optional: true,
  },
  adjusterPitch: { label: "Mount adjuster thread pitch", accepts: ["number"], unit: "mm", optional: true },
  shimStock: { label: "Shim sizes in stock", accepts: ["numbers"], unit: "in", optional: true },
};

const isoFitInputs: Record<string, CalcInputSpec> = {
  nominal: { label: "Nominal size", accepts: ["number"], unit: "mm" },
  hole: { label: "Hole class (e.g. H7)", accepts: ["text"] },
  shaft: { label: "Shaft class (e.g. k6)", accepts: ["text"] },
  measuredBore: { label: "Measured bore", accepts: ["number"], unit: "mm", optional: true },
  measuredShaft: { label: "Measured shaft", accepts: ["number"], unit: "mm", optional: true },
};

export const calculations: Record<string, CalcDefinition> = {
  shaftRunout: {
    name: "shaftRunout",
    title: "Shaft runout",
    summary: "TIR at each station along the shaft, the worst station and its high spot.",
    source:
      "TIR = max − min over one turn (ASME Y14.5 full indicator movement, formerly TIR); limits: the job's, 0.002–0.003 in common practice",
    caution: CAUTION_ROTATING,
    inputs: runoutInputs,
    run(inputs) {
      const read = reader(inputs, runoutInputs);
      const grid = read.grid("readings", "in")!;
      const positions = read.numbers("positionsIn", "in");
      const limitTirIn = read.number("limitTir", "in")!;
      if (positions && positions.length !== grid.rows.length) {
        throw new CalcError("positionsIn", `Give one position per station (${grid.rows.length}).`);
      }
      const result = blame({ stations: "readings", limitTirIn: "limitTir" }, () =>
        shaftRunout({
          stations: grid.values.map((readingsIn, i) => ({
            positionIn: positions ? positions[i] : i,
            readingsIn,
          })),
          limitTirIn,
        }),
      );
      const worst = result.stations[result.worstStation];
      return {
        values: {
          "worst TIR": result.maxTirIn,
          "worst station": grid.rows[result.worstStation] ?? String(result.worstStation + 1),
          "high spot": grid.columns[worst.highSpotIndex] ?? worst.highSpotAngleDeg,
        },
        units: { "worst TIR": "in" },
        verdict: result.pass ? "pass" : "fail",
        rule: `TIR at every station ≤ ${limitTirIn} in`,
        detail: result,
      };
    },
  },

  couplingFace: {
    name: "couplingFace",
    title: "Coupling face gaps",
    summary: "Angularity between the coupling faces from feeler gaps at four clock positions.",
    source:
      "Gap difference ÷ coupling diameter (straightedge-and-feeler alignment); 0.001 in per inch of diameter common practice",
    caution: CAUTION_ROTATING,
    inputs: faceInputs,
    run(inputs) {
      const read = reader(inputs, faceInputs);
      const diameterIn = read.number("diameter", "in")!;
      const gapsIn = read.clock("gaps", "in")!;
      const maxGapDiffIn = read.number("maxGapDiff", "in");
      const maxInPerInDiameter = read.number("maxInPerInDiameter", "in/in");
      const result = blame(
        {
          diameterIn: "diameter",
          gapsIn: "gaps",
          maxGapDiffIn: "maxGapDiff",
          maxInPerInDiameter: "maxInPerInDiameter",
        },
        () => couplingFace({ diameterIn, gapsIn, maxGapDiffIn, maxInPerInDiameter }),
      );
      const limits = [
        result.limitGapDiffIn !== undefined ? `gap difference ≤ ${result.limitGapDiffIn} in` : "",
        result.limitInPerInDiameter !== undefined
          ? `≤ ${result.limitInPerInDiameter} in per inch of diameter`
          : "",
      ].filter(Boolean);
      return {
        values: {
          "top − bottom": result.verticalGapDiffIn,
          "starboard − port": result.horizontalGapDiffIn,
          "vertical slope": fixed(result.verticalSlope, 6),
          "horizontal slope": fixed(result.horizontalSlope, 6),
        },
        units: {
          "top − bottom": "in",
          "starboard − port": "in",
          "vertical slope": "in/in",
          "horizontal slope": "in/in",
        },
        verdict: result.pass ? "pass" : "fail",
        rule: `face gaps, top to bottom and side to side: ${limits.join(" and ")}`,
        detail: result,
      };
    },
  },

  couplingRim: {
    name: "couplingRim",
    title: "Coupling rim offset",
    summary: "How far the engine-side coupling centre sits from the shaft-side centre, from rim readings.",
    source: "Offset = difference of opposite rim readings ÷ 2 (rim-and-face alignment)",
    caution: CAUTION_ROTATING,
    inputs: rimInputs,
    run(inputs) {
      const read = reader(inputs, rimInputs);
      const readingsIn = read.clock("rim", "in")!;
      const maxOffsetIn = read.number("maxOffset", "in");
      const result = blame({ readingsIn: "rim", maxOffsetIn: "maxOffset" }, () =>
        couplingRim({ readingsIn, maxOffsetIn }),
      );
      return {
        values: {
          "offset up": result.verticalOffsetIn,
          "offset to starboard": result.horizontalOffsetIn,
          "validity check": result.validityIn,
        },
        units: { "offset up": "in", "offset to starboard": "in", "validity check": "in" },
        verdict: result.pass === undefined ? "info" : result.pass ? "pass" : "fail",
        rule:
          maxOffsetIn !== undefined
            ? `centre offset ≤ ${maxOffsetIn} in each way`
            : "offset only; no limit given",
        detail: result,
      };
    },
  },

  mountMoves: {
    name: "mountMoves",
    title: "Mount moves",
    summary:
      "How far to raise or shift each pair of mounts to bring the faces parallel and the centres in line.",
    source: "Similar triangles, rim-and-face alignment: move = face slope × distance − offset",
    caution: CAUTION_ENGINE,
    inputs: mountInputs,
    run(inputs) {
      const read = reader(inputs, mountInputs);
      const diameterIn = read.number("diameter", "in")!;
      const gapsIn = read.clock("gaps", "in")!;
      const rim = read.clock("rim", "in");
      const fromRim = rim ? blame({ readingsIn: "rim" }, () => couplingRim({ readingsIn: rim })) : undefined;
      const vertical = read.number("offsetVertical", "in") ?? fromRim?.verticalOffsetIn;
      const horizontal = read.number("offsetHorizontal", "in") ?? fromRim?.horizontalOffsetIn;
      if (vertical === undefined)
        throw new CalcError("offsetVertical", "Enter the vertical centre offset or the rim readings.");
      if (horizontal === undefined)
        throw new CalcError("offsetHorizontal", "Enter the sideways centre offset or the rim readings.");
      const frontMountIn = read.number("frontMount", "in")!;
      const rearMountIn = read.number("rearMount", "in")!;
      const tpi = read.number("adjusterThread", "tpi");
      const pitchIn = read.number("adjusterPitch", "in");
      if (pitchIn !== undefined && pitchIn <= 0)
        throw new CalcError("adjusterPitch", "The thread pitch must be greater than zero.");
      const adjusterTpi = tpi ?? (pitchIn !== undefined ? 1 / pitchIn : undefined);
      const shimStockIn = read.numbers("shimStock", "in");
      const result = blame(
        {
          diameterIn: "diameter",
          gapsIn: "gaps",
          "offsetIn.vertical": "offsetVertical",
          "offsetIn.horizontal": "offsetHorizontal",
          frontMountIn: "frontMount",
          rearMountIn: "rearMount",
          adjusterTpi: tpi !== undefined ? "adjusterThread" : "adjusterPitch",
          shimStockIn: "shimStock",
          thicknessIn: "shimStock",
          stockIn: "shimStock",
        },
        () =>
          mountMoves({
            diameterIn,
            gapsIn,
            offsetIn: { vertical, horizontal },
            frontMountIn,
            rearMountIn,
            adjusterTpi,
            shimStockIn,
          }),
      );
      const values: Record<string, number> = {
        "front raise": result.front.raiseIn,
        "front to starboard": result.front.toStarboardIn,
        "rear raise": result.rear.raiseIn,
        "rear to starboard": result.rear.toStarboardIn,
      };
      const units: Record<string, string> = {
        "front raise": "in",
        "front to starboard": "in",
        "rear raise": "in",
        "rear to starboard": "in",
      };
      if (result.front.nutTurns !== undefined && result.rear.nutTurns !== undefined) {
        values["front nut turns"] = fixed(result.front.nutTurns, 2);
        values["rear nut turns"] = fixed(result.rear.nutTurns, 2);
        units["front nut turns"] = "turns";
        units["rear nut turns"] = "turns";
      }
      return {
        values,
        units,
        verdict: "info",
        rule: "the engine moves, the shaft stays; + raise lifts a mount, + to starboard moves it to starboard; distances forward from the coupling face",
        detail: result,
      };
    },
  },

  couplingFit: {
    name: "couplingFit",
    title: "Coupling fit on the shaft",
    summary:
      "Clearance (or interference) between the coupling bore and the shaft, and what to take off the shaft.",
    source:
      "Clearance = bore − shaft, on the diameter (Machinery's Handbook, allowances and tolerances for fits)",
    inputs: {
      shaft: { label: "Shaft diameter", accepts: ["number"], unit: "in" },
      bore: { label: "Coupling bore", accepts: ["number"], unit: "in" },
      targetClearance: { label: "Clearance wanted", accepts: ["number"], unit: "in", optional: true },
    },
    run(inputs) {
      const read = reader(inputs, calculations.couplingFit.inputs);
      const result = blame({ shaftIn: "shaft", boreIn: "bore", targetClearanceIn: "targetClearance" }, () =>
        couplingFit({
          shaftIn: read.number("shaft", "in")!,
          boreIn: read.number("bore", "in")!,
          targetClearanceIn: read.number("targetClearance", "in"),
        }),
      );
      return {
        values: { clearance: result.clearanceIn, "remove from shaft": result.removeFromShaftIn },
        units: { clearance: "in", "remove from shaft": "in" },
        verdict: "info",
        rule: "negative clearance is interference; material to remove is on the diameter",
        detail: result,
      };
    },
  },

  isoFit: {
    name: "isoFit",
    title: "ISO 286 fit",
    summary: "Hole and shaft limits of an ISO fit, its kind, and measured parts against them.",
    source: "ISO 286-1:2010 and ISO 286-2:2010 tables",
    inputs: isoFitInputs,
    run(inputs) {
      const read = reader(inputs, isoFitInputs);
      const result = blame(
        {
          nominalMm: "nominal",
          hole: "hole",
          shaft: "shaft",
          measuredBoreMm: "measuredBore",
          measuredShaftMm: "measuredShaft",
        },
        () =>
          fitCheck({
            nominalMm: read.number("nominal", "mm")!,
            hole: read.text("hole")!,
            shaft: read.text("shaft")!,
            measuredBoreMm: read.number("measuredBore", "mm"),
            measuredShaftMm: read.number("measuredShaft", "mm"),
          }),
      );
      const values: Record<string, number | string> = {
        "hole upper": result.hole.upperMm,
        "hole lower": result.hole.lowerMm,
        "shaft upper": result.shaft.upperMm,
        "shaft lower": result.shaft.lowerMm,
        fit: result.kind,
      };
      if (result.measuredClearanceMm !== undefined) values["measured clearance"] = result.measuredClearanceMm;
      return {
        values,
        units: {
          "hole upper": "mm",
          "hole lower": "mm",
          "shaft upper": "mm",
          "shaft lower": "mm",
          "measured clearance": "mm",
        },
        verdict: result.pass === undefined ? "info" : result.pass ? "pass" : "fail",
        rule: `measured parts within the ISO 286 limits of ${read.text("hole")}/${read.text("shaft")}`,
        detail: result,
      };
    },
  },

  keyForShaft: {
    name: "keyForShaft",
    title: "Key for an inch shaft",
    summary: "Square key and keyseat depth for the shaft diameter.",
    source: "ASME B17.1 Table 1",
    inputs: { diameter: { label: "Shaft diameter", accepts: ["number"], unit: "in" } },
    run(inputs) {
      const read = reader(inputs, calculations.keyForShaft.inputs);
      const result = blame({ diameterIn: "diameter" }, () =>
        keyForShaft({ diameterIn: read.number("diameter", "in")! }),
      );
      return {
        values: {
          "key width": result.widthIn,
          "key height": result.heightIn,
          "keyseat depth": result.shaftDepthIn,
        },
        units: { "key width": "in", "key height": "in", "keyseat depth": "in" },
        verdict: "info",
        rule: "ASME B17.1 key size versus shaft diameter",
        detail: result,
      };
    },
  },

  keyForShaftMm: {
    name: "keyForShaftMm",
    title: "Key for a metric shaft",
    summary: "Parallel key and keyway depths for the shaft diameter.",
    source: "DIN 6885-1",
    inputs: { diameter: { label: "Shaft diameter", accepts: ["number"], unit: "mm" } },
    run(inputs) {
      const read = reader(inputs, calculations.keyForShaftMm.inputs);
      const result = blame({ diameterMm: "diameter" }, () =>
        keyForShaftMm({ diameterMm: read.number("diameter", "mm")! }),
      );
      return {
        values: {
          "key width": result.widthMm,
          "key height": result.heightMm,
          "shaft keyway depth": result.shaftDepthMm,
          "hub keyway depth": result.hubDepthMm,
        },
        units: {
          "key width": "mm",
          "key height": "mm",
          "shaft keyway depth": "mm",
          "hub keyway depth": "mm",
        },
        verdict: "info",
        rule: "DIN 6885-1 parallel key for the shaft diameter",
        detail: result,
      };
    },
  },

  propellerTaper: {
    name: "propellerTaper",
    title: "Propeller shaft taper",
    summary: "Taper, taper length, small end and keyway of a standard propeller-shaft end.",
    source: "SAE J755",
    inputs: { shaftDiameter: { label: "Shaft diameter", accepts: ["number"], unit: "in" } },
    run(inputs) {
      const read = reader(inputs, calculations.propellerTaper.inputs);
      const result = blame({ shaftDiameterIn: "shaftDiameter" }, () =>
        propellerTaper({ shaftDiameterIn: read.number("shaftDiameter", "in")! }),
      );
      return {
        values: {
          "taper per foot": result.taperPerFootIn,
          "taper length": result.taperLengthIn,
          "small end": result.smallEndIn,
          "keyway width": result.keywayWidthIn,
        },
        units: { "taper per foot": "in", "taper length": "in", "small end": "in", "keyway width": "in" },
        verdict: "info",
        rule: "SAE J755 dimensions for the nominal shaft size",
        detail: result,
      };
    },
  },

  threadPitch: {
    name: "threadPitch",
    title: "Unified thread pitch",
    summary: "Threads per inch and lead of a UNC or UNF thread.",
    source: "ASME B1.1",
    inputs: {
      nominal: { label: "Nominal diameter", accepts: ["number"], unit: "in" },
      series: { label: "Series (UNC or UNF)", accepts: ["text"] },
    },
    run(inputs) {
      const read = reader(inputs, calculations.threadPitch.inputs);
      const series = read.text("series")!.trim().toUpperCase();
      const result = blame({ nominalIn: "nominal", series: "series" }, () =>
        threadPitch({ nominalIn: read.number("nominal", "in")!, series: series as "UNC" | "UNF" }),
      );
      return {
        values: { "threads per inch": result.tpi, lead: result.leadIn },
        units: { "threads per inch": "tpi", lead: "in" },
        verdict: "info",
        rule: `ASME B1.1 ${series} series`,
        detail: result,
      };
    },
  },

  shaftDiameter: {
    name: "shaftDiameter",
    title: "Minimum shaft diameter",
    summary: "Smallest solid propeller shaft for the power, rpm, material and safety factor.",
    source: "Gerr, Propeller Handbook: D = ∛(321,000 × SHP × SF / (St × rpm))",
    inputs: {
      power: { label: "Shaft power", accepts: ["number"], unit: "hp" },
      shaftRpm: { label: "Shaft rpm", accepts: ["number"], unit: "rpm" },
      torsionalYield: { label: "Torsional yield strength", accepts: ["number"], unit: "psi" },
      safetyFactor: { label: "Safety factor", accepts: ["number"], unit: "1" },
      installedDiameter: { label: "Shaft fitted", accepts: ["number"], unit: "in", optional: true },
    },
    run(inputs) {
      const read = reader(inputs, calculations.shaftDiameter.inputs);
      const installed = read.number("installedDiameter", "in");
      const result = blame(
        {
          shp: "power",
          shaftRpm: "shaftRpm",
          torsionalYieldPsi: "torsionalYield",
          safetyFactor: "safetyFactor",
          installedDiameterIn: "installedDiameter",
        },
        () =>
          shaftDiameter({
            shp: read.number("power", "hp")!,
            shaftRpm: read.number("shaftRpm", "rpm")!,
            torsionalYieldPsi: read.number("torsionalYield", "psi")!,
            safetyFactor: read.number("safetyFactor", "1")!,
            installedDiameterIn: installed,
          }),
      );
      return {
        values: { "minimum diameter": fixed(result.diameterIn, 4) },
        units: { "minimum diameter": "in" },
        verdict: result.pass === undefined ? "info" : result.pass ? "pass" : "fail",
        rule: `shaft fitted ≥ ${fixed(result.diameterIn, 4)} in`,
        detail: result,
      };
    },
  },

  bearingSpacing: {
    name: "bearingSpacing",
    title: "Maximum bearing spacing",
    summary: "Longest unsupported shaft span before whirling.",
    source: "Gerr, Propeller Handbook: L = √(3.21 × D / rpm) × (E / density)^¼",
    inputs: {
      shaftDiameter: { label: "Shaft diameter", accepts: ["number"], unit: "in" },
      shaftRpm: { label: "Shaft rpm", accepts: ["number"], unit: "rpm" },
      elasticModulus: { label: "Modulus of elasticity", accepts: ["number"], unit: "psi" },
      density: { label: "Density of the shaft material", accepts: ["number"], unit: "lb/in3" },
      actualSpacing: { label: "Longest span fitted", accepts: ["number"], unit: "ft", optional: true },
    },
    run(inputs) {
      const read = reader(inputs, calculations.bearingSpacing.inputs);
      const result = blame(
        {
          shaftDiameterIn: "shaftDiameter",
          shaftRpm: "shaftRpm",
          elasticModulusPsi: "elasticModulus",
          densityLbPerIn3: "density",
          actualSpacingFt: "actualSpacing",
        },
        () =>
          bearingSpacing({
            shaftDiameterIn: read.number("shaftDiameter", "in")!,
            shaftRpm: read.number("shaftRpm", "rpm")!,
            elasticModulusPsi: read.number("elasticModulus", "psi")!,
            densityLbPerIn3: read.number("density", "lb/in3")!,
            actualSpacingFt: read.number("actualSpacing", "ft"),
          }),
      );
      return {
        values: { "maximum spacing": fixed(result.maxSpacingFt, 3) },
        units: { "maximum spacing": "ft" },
        verdict: result.pass === undefined ? "info" : result.pass ? "pass" : "fail",
        rule: `span between bearings ≤ ${fixed(result.maxSpacingFt, 3)} ft`,
        detail: result,
      };
    },
  },

  wireSize: {
    name: "wireSize",
    title: "Conductor size for voltage drop",
    summary: "Circular mils and the smallest AWG and metric conductor for the allowed voltage drop.",
    source: "ABYC E-11: CM = 10.75 × I × L / E; areas from NEC Chapter 9 Table 8",
    caution: CAUTION_WIRING,
    inputs: {
      current: { label: "Current", accepts: ["number"], unit: "A" },
      roundTripLength: { label: "Round-trip conductor length", accepts: ["number"], unit: "ft" },
      systemVoltage: { label: "System voltage", accepts: ["number"], unit: "V" },
      dropPercent: { label: "Allowed voltage drop", accepts: ["number"], unit: "%" },
      installed: { label: "Conductor fitted (AWG or mm²)", accepts: ["text"], optional: true },
    },
    run(inputs) {
      const read = reader(inputs, calculations.wireSize.inputs);
      const result = blame(
        {
          currentA: "current",
          roundTripFt: "roundTripLength",
          systemVolts: "systemVoltage",
          dropPercent: "dropPercent",
        },
        () =>
          wireSize({
            currentA: read.number("current", "A")!,
            roundTripFt: read.number("roundTripLength", "ft")!,
            systemVolts: read.number("systemVoltage", "V")!,
            dropPercent: read.number("dropPercent", "%")!,
          }),
      );
      const installed = read.text("installed");
      const installedCm =
        installed === undefined
          ? undefined
          : blame({ awg: "installed", mm2: "installed" }, () => conductorCircularMils(installed));
      const values: Record<string, number | string> = {
        "circular mils": Math.round(result.circularMils),
        AWG: result.awg,
      };
      if (result.metricMm2 !== undefined) values["metric"] = result.metricMm2;
      return {
        values,
        units: { "circular mils": "CM", metric: "mm²" },
        verdict:
          installedCm === undefined ? "info" : atLeast(installedCm, result.circularMils) ? "pass" : "fail",
        rule: `conductor of at least ${Math.round(result.circularMils)} circular mils for ${result.allowedDropV} V drop`,
        detail: { ...result, ...(installedCm !== undefined ? { installedCircularMils: installedCm } : {}) },
      };
    },
  },

  propSlip: {
    name: "propSlip",
    title: "Propeller slip",
    summary: "Shaft rpm, theoretical speed from pitch, and apparent slip.",
    source: "Gerr, Propeller Handbook, apparent slip",
    inputs: {
      pitch: { label: "Propeller pitch", accepts: ["number"], unit: "in" },
      engineRpm: { label: "Engine rpm", accepts: ["number"], unit: "rpm" },
      gearRatio: { label: "Gear ratio (e.g. 2.5 for 2.5 : 1)", accepts: ["number"], unit: "1" },
      speed: { label: "Speed through the water", accepts: ["number"], unit: "kn" },
    },
    run(inputs) {
      const read = reader(inputs, calculations.propSlip.inputs);
      const result = blame(
        { pitchIn: "pitch", engineRpm: "engineRpm", gearRatio: "gearRatio", speedKnots: "speed" },
        () =>
          propSlip({
            pitchIn: read.number("pitch", "in")!,
            engineRpm: read.number("engineRpm", "rpm")!,
            gearRatio: read.number("gearRatio", "1")!,
            speedKnots: read.number("speed", "kn")!,
          }),
      );
      return {
        values: {
          "shaft rpm": fixed(result.shaftRpm, 0),
          "theoretical speed": fixed(result.theoreticalKnots, 2),
          slip: fixed(result.slipPercent, 1),
        },
        units: { "shaft rpm": "rpm", "theoretical speed": "kn", slip: "%" },
        verdict: "info",
        rule: "slip = (pitch speed − actual speed) ÷ pitch speed",
        detail: result,
      };
    },
  },

  seaTrialLoading: {
    name: "seaTrialLoading",
    title: "Sea-trial propeller loading",
    summary:
      "Whether the engine reaches its rated rpm band at wide-open throttle, and an indicative pitch change.",
    source: "Engine maker's rated rpm band; about 200 rpm per inch of pitch, common practice",
    caution: CAUTION_SEA_TRIAL,
    inputs: {
      wotRpm: { label: "Wide-open-throttle rpm", accepts: ["number"], unit: "rpm" },
      ratedRpmMin: { label: "Rated band, lowest rpm", accepts: ["number"], unit: "rpm" },
      ratedRpmMax: { label: "Rated band, highest rpm", accepts: ["number"], unit: "rpm" },
      rpmPerPitchIn: {
        label: "Rpm change per inch of pitch",
        accepts: ["number"],
        unit: "rpm",
        optional: true,
      },
    },
    run(inputs) {
      const read = reader(inputs, calculations.seaTrialLoading.inputs);
      const min = read.number("ratedRpmMin", "rpm")!;
      const max = read.number("ratedRpmMax", "rpm")!;
      const result = blame({}, () =>
        seaTrialLoading({
          wotRpm: read.number("wotRpm", "rpm")!,
          ratedRpmMin: min,
          ratedRpmMax: max,
          rpmPerPitchIn: read.number("rpmPerPitchIn", "rpm"),
        }),
      );
      return {
        values: { loading: result.verdict, "pitch change": fixed(result.pitchChangeIn, 2) },
        units: { "pitch change": "in" },
        verdict: result.verdict === "in-range" ? "pass" : "fail",
        rule: `wide-open-throttle rpm within ${min}–${max} rpm`,
        detail: result,
      };
    },
  },

  exhaustInjection: {
    name: "exhaustInjection",
    title: "Exhaust water-injection height",
    summary: "Height of the water injection point above the waterline against the minimum.",
    source:
      "Engine maker's installation instructions; 6 in common practice (ABYC P-1, Gerr, Boat Mechanical Systems Handbook)",
    caution: CAUTION_EXHAUST,
    inputs: {
      injectionHeight: { label: "Injection point above the waterline", accepts: ["number"], unit: "in" },
      minimumHeight: { label: "Minimum height", accepts: ["number"], unit: "in", optional: true },
    },
    run(inputs) {
      const read = reader(inputs, calculations.exhaustInjection.inputs);
      const result = blame({ injectionHeightIn: "injectionHeight", minimumIn: "minimumHeight" }, () =>
        exhaustInjection({
          injectionHeightIn: read.number("injectionHeight", "in")!,
          minimumIn: read.number("minimumHeight", "in"),
        }),
      );
      return {
        values: { margin: result.marginIn },
        units: { margin: "in" },
        verdict: result.pass ? "pass" : "fail",
        rule: `injection point at least ${result.minimumIn} in above the waterline`,
        detail: result,
      };
    },
  },

  exhaustBackPressure: {
    name: "exhaustBackPressure",
    title: "Exhaust back pressure",
    summary: "Back pressure at full load against the engine maker's limit, in every common unit.",
    source: "Engine maker's limit; unit factors from NIST SP 811",
    caution: CAUTION_EXHAUST,
    inputs: {
      backPressure: { label: "Back pressure at full load", accepts: ["number"], unit: "kPa" },
      limit: { label: "Engine maker's limit", accepts: ["number"], unit: "kPa" },
    },
    run(inputs) {
      const read = reader(inputs, calculations.exhaustBackPressure.inputs);
      const limitKPa = read.number("limit", "kPa")!;
      const result = blame({ backPressureKPa: "backPressure", limitKPa: "limit" }, () =>
        exhaustBackPressure({ backPressureKPa: read.number("backPressure", "kPa")!, limitKPa }),
      );
      return {
        values: {
          "back pressure": fixed(result.backPressureKPa, 2),
          "in inHg": fixed(result.backPressureInHg, 2),
          "in inH2O": fixed(result.backPressureInH2O, 1),
          "of limit": fixed(result.percentOfLimit, 0),
        },
        units: { "back pressure": "kPa", "in inHg": "inHg", "in inH2O": "inH2O", "of limit": "%" },
        verdict: result.pass ? "pass" : "fail",
        rule: `back pressure ≤ ${fixed(limitKPa, 2)} kPa (${fixed(convert(limitKPa, "kPa", "inHg"), 2)} inHg)`,
        detail: result,
      };
    },
  },

  shimStack: {
    name: "shimStack",
    title: "Shim stack",
    summary: "The fewest stock shims that make up a thickness.",
    source: "Shop stock sizes; at most 5 shims under a foot, common practice",
    caution: CAUTION_ENGINE,
    inputs: {
      thickness: { label: "Thickness wanted", accepts: ["number"], unit: "in" },
      stock: { label: "Shim sizes in stock", accepts: ["numbers"], unit: "in" },
      maxPieces: { label: "Most shims in one stack", accepts: ["number"], unit: "1", optional: true },
    },
    run(inputs) {
      const read = reader(inputs, calculations.shimStack.inputs);
      const result = blame({ thicknessIn: "thickness", stockIn: "stock", maxPieces: "maxPieces" }, () =>
        shimStack({
          thicknessIn: read.number("thickness", "in")!,
          stockIn: read.numbers("stock", "in")!,
          maxPieces: read.number("maxPieces", "1"),
        }),
      );
      return {
        values: {
          stack: result.pieces.map((p) => `${p.count} × ${p.sizeIn}`).join(" + "),
          total: result.totalIn,
          difference: result.differenceIn,
        },
        units: { stack: "in", total: "in", difference: "in" },
        verdict: "info",
        rule: "closest total from the stock sizes, fewest pieces",
        detail: result,
      };
    },
  },

  validateHin: {
    name: "validateHin",
    title: "Hull identification number",
    summary: "Whether a HIN follows the 12-character layout, and why not.",
    source: "33 CFR 181.25",
    inputs: { hin: { label: "Hull identification number", accepts: ["text"] } },
    run(inputs) {
      const read = reader(inputs, calculations.validateHin.inputs);
      const result = validateHin(read.text("hin")!);
      const values: Record<string, string | number> = { HIN: result.hin };
      if (result.manufacturerCode) values["maker's code"] = result.manufacturerCode;
      if (result.modelYear !== undefined) values["model year"] = result.modelYear;
      if (result.problems.length) values.problems = result.problems.join(" ");
      return {
        values,
        units: {},
        verdict: result.valid ? "pass" : "fail",
        rule: "33 CFR 181.25 hull identification number format",
        detail: result,
      };
    },
  },
};

/** Runs a calculation by name; bad input comes back as an error naming the input. */
export function runCalc(
  name: string,
  inputs: Inputs,
): CalcOutcome | { error: { field: string; message: string } } {
  const definition = Object.hasOwn(calculations, name) ? calculations[name] : undefined;
  if (!definition) return { error: { field: "calc", message: `There is no calculation named "${name}".` } };
  try {
    return definition.run(inputs);
  } catch (error) {
    if (isCalcError(error)) return { error: { field: error.field, message: error.message } };
    throw error;
  }
}
