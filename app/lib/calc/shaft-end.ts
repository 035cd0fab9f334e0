import { CalcError } from "./errors";
import { defineCalc, type CalcInputSpec, type CalcOutcome, type Reader } from "./define";
import { keyForShaft, keyForShaftMm } from "./keys";
import { propellerTaper, propellerTaperMm } from "./taper";

/*
 * The registry definitions of the shaft-end look-ups, which consult both the key tables and
 * the taper tables: inch shafts go to ASME B17.1 and SAE J755, metric shafts to DIN 6885-1 and
 * ISO 4566 (issue 12, item 4), chosen by the shaft's system or, without it, by its unit.
 */

const systemInput: CalcInputSpec = {
  label: "Shaft system (inch or metric)",
  accepts: ["text"],
  optional: true,
};

function isMetric(read: Reader, diameter: string): boolean {
  const system = read.text("system")?.trim().toLowerCase();
  if (system === undefined) {
    const unit = read.unitOf(diameter);
    return unit === "mm" || unit === "m";
  }
  if (/^(metric|mm|iso|din)$/.test(system)) return true;
  if (/^(inch|in|imperial|sae|asme)$/.test(system)) return false;
  throw new CalcError("system", `The shaft system is "inch" or "metric", not "${system}".`);
}

/** Which standard the coupling's keyway is cut to, when the template asks. */
function readCutTo(read: Reader): "sae-j755" | "asme-b17.1" | undefined {
  const text = read.text("cutTo")?.trim().toLowerCase().replace(/\s+/g, "-");
  if (text === undefined) return undefined;
  if (/j755/.test(text)) return "sae-j755";
  if (/b17/.test(text)) return "asme-b17.1";
  throw new CalcError("cutTo", `The keyway is cut to "sae-j755" or "asme-b17.1", not "${text}".`);
}

/** The SAE J755 keyway width of a standard propeller shaft size, when it is one. */
function j755KeywayIn(nominalIn: number): number | undefined {
  try {
    return propellerTaper({ shaftDiameterIn: nominalIn }).keywayWidthIn;
  } catch {
    return undefined; // not a J755 size: the B17.1 key stands alone
  }
}

export const keyForShaftCalc = defineCalc({
  name: "keyForShaft",
  title: "Key for the shaft",
  summary:
    "Parallel key and keyseat depth for the shaft diameter: ASME B17.1 (with the SAE J755 propeller keyway beside it) for an inch shaft, DIN 6885-1 for a metric one.",
  source: "ASME B17.1 Table 1; SAE J755 keyway widths; DIN 6885-1",
  inputs: {
    diameter: {
      label: "Shaft diameter",
      accepts: ["number"],
      unit: "in",
      field: ["diameterIn", "diameterMm"],
    },
    system: systemInput,
    cutTo: {
      label: "Keyway the coupling is cut to (sae-j755 or asme-b17.1)",
      accepts: ["text"],
      optional: true,
    },
  },
  run(read, show): CalcOutcome {
    if (isMetric(read, "diameter")) {
      const result = keyForShaftMm({ diameterMm: read.number("diameter", "mm")! });
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
        rule: "DIN 6885-1 parallel key for the shaft diameter (metric shaft)",
        detail: result,
      };
    }
    const result = keyForShaft({ diameterIn: read.number("diameter", "in")! });
    const j755 = j755KeywayIn(result.nominalIn);
    const values: Record<string, number> = {
      "nominal size": result.nominalIn,
      "key width": result.widthIn,
      "key height": result.heightIn,
      "keyseat depth": result.shaftDepthIn,
    };
    const units: Record<string, string> = {
      "nominal size": "in",
      "key width": "in",
      "key height": "in",
      "keyseat depth": "in",
    };
    let rule = `ASME B17.1 key for a ${show.q(result.nominalIn, "in")} shaft`;
    const cutTo = readCutTo(read);
    if (j755 !== undefined && j755 !== result.widthIn) {
      values["SAE J755 keyway width"] = j755;
      units["SAE J755 keyway width"] = "in";
      rule +=
        cutTo === "sae-j755"
          ? `; the coupling is cut to SAE J755: key width ${show.q(j755, "in")}`
          : cutTo === "asme-b17.1"
            ? "; the coupling is cut to ASME B17.1"
            : `; a propeller or coupling cut to SAE J755 has a ${show.q(j755, "in")} keyway: fit the key to the keyway the part is cut to`;
    } else if (cutTo !== undefined) {
      rule += "; SAE J755 and ASME B17.1 agree for this size";
    }
    return { values, units, verdict: "info", rule, detail: { ...result, j755KeywayWidthIn: j755 } };
  },
});

export const keyForShaftMmCalc = defineCalc({
  name: "keyForShaftMm",
  title: "Key for a metric shaft",
  summary: "Parallel key and keyway depths for the shaft diameter.",
  source: "DIN 6885-1",
  inputs: { diameter: { label: "Shaft diameter", accepts: ["number"], unit: "mm", field: "diameterMm" } },
  run(read) {
    const result = keyForShaftMm({ diameterMm: read.number("diameter", "mm")! });
    return {
      values: {
        "key width": result.widthMm,
        "key height": result.heightMm,
        "shaft keyway depth": result.shaftDepthMm,
        "hub keyway depth": result.hubDepthMm,
      },
      units: { "key width": "mm", "key height": "mm", "shaft keyway depth": "mm", "hub keyway depth": "mm" },
      verdict: "info",
      rule: "DIN 6885-1 parallel key for the shaft diameter",
      detail: result,
    };
  },
});

export const propellerTaperCalc = defineCalc({
  name: "propellerTaper",
  title: "Propeller shaft taper",
  summary:
    "Taper and keyway of a standard propeller-shaft end: SAE J755 (1:16) for an inch shaft, ISO 4566 (1:10) for a metric one.",
  source: "SAE J755; ISO 4566:1992 with DIN 6885-1 keys",
  inputs: {
    shaftDiameter: {
      label: "Shaft diameter",
      accepts: ["number"],
      unit: "in",
      field: ["shaftDiameterIn", "shaftDiameterMm"],
    },
    system: systemInput,
  },
  run(read): CalcOutcome {
    if (isMetric(read, "shaftDiameter")) {
      const result = propellerTaperMm({ shaftDiameterMm: read.number("shaftDiameter", "mm")! });
      return {
        values: {
          taper: "1:10 on the diameter",
          "key width": result.keyWidthMm,
          "key height": result.keyHeightMm,
          "shaft keyway depth": result.shaftKeywayDepthMm,
          "hub keyway depth": result.hubKeywayDepthMm,
        },
        units: {
          "key width": "mm",
          "key height": "mm",
          "shaft keyway depth": "mm",
          "hub keyway depth": "mm",
        },
        verdict: "info",
        rule: `ISO 4566 1:10 taper for a ${result.shaftDiameterMm} mm shaft, DIN 6885-1 key; taper length and nut thread from ISO 4566 Table 1 or the propeller maker's drawing`,
        detail: result,
      };
    }
    const result = propellerTaper({ shaftDiameterIn: read.number("shaftDiameter", "in")! });
    const values: Record<string, number | string> = {
      taper: "3/4 in per foot (1:16) on the diameter",
      "taper length": result.taperLengthIn,
      "small end": result.smallEndIn,
      "keyway width": result.keywayWidthIn,
    };
    if (result.nutThread) values["nut thread"] = `${result.nutThread.nominalIn} in-${result.nutThread.tpi}`;
    return {
      values,
      units: { "taper length": "in", "small end": "in", "keyway width": "in" },
      verdict: "info",
      rule: "SAE J755 dimensions for the nominal shaft size",
      detail: result,
    };
  },
});
