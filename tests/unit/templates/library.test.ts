import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { calculations } from "~/lib/calc/registry";
import type { Unit } from "~/lib/calc/units";
import {
  evaluate,
  findItem,
  parseTemplateText,
  placedItems,
  progress,
  problemText,
  templateFileName,
  type Item,
  type Template,
  workOrder,
} from "~/lib/templates";
import { grid, libraryDir, libraryFiles, loadLibrary, measured, signed } from "./fixtures";

const library = loadLibrary();
const byKey = (key: string, version = 1): Template =>
  library.find((t) => t.key === key && t.version === version)!;
const newest = (key: string): Template =>
  library.filter((t) => t.key === key).reduce((a, b) => (b.version > a.version ? b : a));
const current = [...new Set(library.map((t) => t.key))].map(newest);

describe("the starter library in checklists/", () => {
  test("holds the six starter templates at versions 1 and 2, and fuel and ventilation at version 1", () => {
    expect(library.map((t) => `${t.key}.v${t.version}`).sort()).toEqual([
      "cooling.v1",
      "cooling.v2",
      "engine-alignment.v1",
      "engine-alignment.v2",
      "exhaust.v1",
      "exhaust.v2",
      "fuel-system.v1",
      "instruments-and-electrical.v1",
      "instruments-and-electrical.v2",
      "propeller-shaft-and-coupling.v1",
      "propeller-shaft-and-coupling.v2",
      "sea-trial.v1",
      "sea-trial.v2",
      "ventilation.v1",
    ]);
  });

  test("the order of work names every template of the library", () => {
    expect([...workOrder].sort()).toEqual(current.map((t) => t.key).sort());
  });

  test.each(libraryFiles())("%s validates and is named after its key and version", (name) => {
    const parsed = parseTemplateText(readFileSync(libraryDir + name, "utf8"));
    expect(parsed.ok ? [] : parsed.problems.map(problemText)).toEqual([]);
    if (parsed.ok) expect(templateFileName(parsed.template)).toBe(name);
  });

  test("every item a technician works through says how, and on whose authority", () => {
    const missing = library.flatMap((t) =>
      placedItems(t)
        .map(({ item }) => item)
        .filter((item) => !["photo", "initials", "text"].includes(item.kind))
        .filter((item) => !item.hint || !item.reference)
        .map((item) => `${t.key}.v${t.version}/${item.key}`),
    );
    expect(missing).toEqual([]);
  });

  test("every source is labelled: a standard, a maker, a handbook, or common practice", () => {
    const labelled =
      /common practice|ABYC|ISO|ASME|SAE|DIN|CFR|maker|Gerr|Machinery's Handbook|designer|local regulations/i;
    const unlabelled = current.flatMap((t) =>
      placedItems(t)
        .map(({ item }) => item)
        .filter((item) => item.reference !== undefined && !labelled.test(item.reference))
        .map((item) => `${t.key}/${item.key}: ${item.reference}`),
    );
    expect(unlabelled).toEqual([]);
  });

  test("every numeric acceptance rule names its source: a standard, the maker, or common practice", () => {
    const unsourced = library.flatMap((t) =>
      placedItems(t)
        .map(({ item }) => item)
        .filter(
          (item) => (item.kind === "measure" || item.kind === "readings") && item.rule && item.rule.min !== 0,
        )
        .filter((item) => !/common practice|ABYC|ISO|ASME|SAE|maker/i.test(item.reference ?? ""))
        .map((item) => `${t.key}.v${t.version}/${item.key}`),
    );
    expect(unsourced).toEqual([]);
  });

  test("the hazards of DESIGN §8 carry a caution at the step (version 1)", () => {
    const caution = (template: string, item: string) => findItem(byKey(template), item)?.caution ?? "";
    expect(caution("propeller-shaft-and-coupling", "straightening")).toMatch(/hot work/i);
    expect(caution("propeller-shaft-and-coupling", "straightening")).toMatch(/fire watch/i);
    expect(caution("propeller-shaft-and-coupling", "runout-readings")).toMatch(
      /by hand only.*isolate the engine/i,
    );
    expect(caution("engine-alignment", "face-gaps")).toMatch(/isolate the engine/i);
    expect(caution("engine-alignment", "engine-set")).toMatch(/lift/i);
    expect(caution("exhaust", "co-alarm")).toMatch(/carbon monoxide/i);
    expect(caution("exhaust", "no-exhaust-leaks")).toMatch(/carbon monoxide/i);
    expect(caution("instruments-and-electrical", "batteries-secured")).toMatch(/negative first/i);
    expect(caution("sea-trial", "trial-safety")).toMatch(/lookout/i);
  });
});

describe("calc items and the calculation registry", () => {
  const calcItems = library.flatMap((t) =>
    placedItems(t).flatMap(({ item }) => (item.kind === "calc" ? [{ template: t, item }] : [])),
  );

  const used = (templates: Template[]) =>
    new Set(
      templates.flatMap((t) =>
        placedItems(t).flatMap(({ item }) => (item.kind === "calc" ? [item.calc] : [])),
      ),
    );

  test("version 1 uses the calculations it was written with", () => {
    expect(
      used(library.filter((t) => t.version === 1 && !["fuel-system", "ventilation"].includes(t.key))),
    ).toEqual(
      new Set([
        "shaftRunout",
        "couplingFit",
        "keyForShaft",
        "propellerTaper",
        "couplingFace",
        "couplingRim",
        "mountMoves",
        "exhaustInjection",
        "exhaustBackPressure",
        "wireSize",
        "seaTrialLoading",
        "propSlip",
      ]),
    );
  });

  test("the current library also uses the calculations issue 12 found done by hand", () => {
    // Issue 12 §2: shaft size and bearing spacing (in the library, used by no template), and the
    // calculations of §3; the conductor check replaces voltage drop alone (§1.8).
    expect(used(current)).toEqual(
      new Set([
        "shaftDiameter",
        "bearingSpacing",
        "shaftRunout",
        "couplingFit",
        "keyForShaft",
        "propellerTaper",
        "installationAngle",
        "couplingFace",
        "couplingRim",
        "mountMoves",
        "exhaustInjection",
        "heeledHeight",
        "exhaustBackPressure",
        "rawWaterFlow",
        "conductorCheck",
        "tachPulses",
        "seaTrialLoading",
        "speedRuns",
        "propSlip",
      ]),
    );
  });

  test.each(
    calcItems.map(
      ({ template, item }) => [`${template.key}.v${template.version}/${item.key}`, template, item] as const,
    ),
  )(
    "%s names a registered calculation and binds its required inputs to items that exist",
    (_, template, item) => {
      const definition = calculations[item.calc];
      expect(definition, `calculation ${item.calc}`).toBeDefined();
      const required = Object.entries(definition.inputs)
        .filter(([, spec]) => !spec.optional)
        .map(([name]) => name);
      for (const name of required) expect(Object.keys(item.inputs)).toContain(name);
      for (const [name, binding] of Object.entries(item.inputs)) {
        expect(Object.keys(definition.inputs)).toContain(name);
        if ("item" in binding) expect(findItem(template, binding.item), binding.item).toBeDefined();
      }
    },
  );
});

/**
 * A sound installation as a technician would record it. The numbers that feed calculations are
 * set here; everything else is filled from its own rule (the middle of min–max, the nominal, or a
 * little inside a one-sided limit).
 */
const sound: Record<string, [number, Unit] | (number | null)[][] | string> = {
  "shaft-diameter": [1.25, "in"],
  "coupling-bore": [1.2504, "in"],
  "seat-roundness": [
    [1.2502, 1.2501],
    [1.2502, 1.2502],
  ],
  "runout-readings": [
    [0, 0.0005, 0.001, 0.0005],
    [0, 0.001, 0.002, 0.001],
    [0, 0.001, 0.0025, 0.001],
    [0, 0.001, 0.002, 0.001],
    [0, 0.0005, 0.001, 0.0005],
  ],
  "coupling-diameter": [4, "in"],
  "face-gaps": [[0.004, 0.003, 0.0035, 0.0035]],
  "recheck-gaps": [[0.0042, 0.003, 0.0035, 0.0036]],
  "rim-readings": [[0, 0.002, 0.001, 0.001]],
  "front-mount-distance": [30, "in"],
  "rear-mount-distance": [8, "in"],
  "adjuster-tpi": [11, "tpi"],
  "injection-height": [10, "in"],
  "injection-minimum": [6, "in"],
  "back-pressure": [1.5, "inHg"],
  "back-pressure-limit": [3, "inHg"],
  "panel-current": [10, "A"],
  "panel-run-length": [20, "ft"],
  "panel-conductor-installed": "10",
  "tachometer-check": [
    [750, 760],
    [2400, 2430],
  ],
  "temperature-gauge-check": [[182, 178]],
  "rated-rpm-low": [3000, "rpm"],
  "rated-rpm-high": [3200, "rpm"],
  "wot-rpm": [3100, "rpm"],
  "wot-speed": [8.2, "kn"],
  "propeller-pitch": [14, "in"],
  "gear-ratio": [2.5, "1"],
  // version 2 and the new templates
  "bore-readings": [
    [1.2504, 1.2505],
    [1.2504, 1.2506],
  ],
  "rated-power": [75, "hp"],
  "shaft-rpm": [1280, "rpm"],
  "shaft-torsional-yield": [60000, "psi"],
  "shaft-safety-factor": [2, "1"],
  "longest-span": [4.5, "ft"],
  "shaft-modulus": [28e6, "psi"],
  "shaft-density": [0.29, "lb/in3"],
  "engine-angle": [4, "deg"],
  "running-trim": [3, "deg"],
  "engine-max-angle": [15, "deg"],
  "face-gaps-180": [[0.0038, 0.0032, 0.0035, 0.0035]],
  "recheck-gaps-180": [[0.004, 0.0032, 0.0035, 0.0036]],
  "injection-off-centre": [3, "in"],
  "heel-angle": [20, "deg"],
  "raw-water-flow": [10, "L"],
  "flow-time": [20, "s"],
  "flow-minimum": [25, "L/min"],
  "system-voltage": [12, "V"],
  "panel-insulation": "105",
  "panel-in-engine-space": "no",
  "panel-fuse": [15, "A"],
  "alternator-output": [60, "A"],
  "alternator-run-length": [6, "ft"],
  "alternator-conductor": "4",
  "alternator-insulation": "105",
  "alternator-fuse": [100, "A"],
  "crank-pulley": [6, "in"],
  "alternator-pulley": [2.5, "in"],
  "alternator-poles": [12, "1"],
  "run-distance": [1, "nmi"],
  "run-times": [[430], [450]],
};

function insideRule(rule: { min?: number; max?: number; nominal?: number }): number {
  if (rule.nominal !== undefined) return rule.nominal;
  if (rule.min !== undefined && rule.max !== undefined) return (rule.min + rule.max) / 2;
  if (rule.min !== undefined) return rule.min + Math.abs(rule.min) * 0.1;
  return rule.max! - Math.abs(rule.max!) * 0.1;
}

function soundValue(item: Item): unknown {
  const given = sound[item.key];
  switch (item.kind) {
    case "check":
      return { result: "pass" };
    case "measure":
      if (Array.isArray(given)) return measured(given as [number, Unit]);
      return measured([item.rule ? insideRule(item.rule) : 1, item.unit]);
    case "readings": {
      if (Array.isArray(given)) return grid(item.unit, given as number[][]);
      const value = item.rule ? insideRule(item.rule) : 1;
      return grid(
        item.unit,
        item.rows.map(() => item.columns.map(() => value)),
      );
    }
    case "choice":
      return { option: typeof given === "string" ? given : item.options.find((o) => !o.needsNote)!.key };
    case "text":
      return { text: "Calm, two aboard, half tanks, clean bottom." };
    case "photo":
      return {
        photos: Array.from({ length: item.minPhotos }, (_, i) => ({
          id: `3b7e5c1a-9d2f-4e8b-a6c4-00000000000${i}`,
        })),
      };
    case "initials":
      return signed;
    case "calc":
      return undefined;
  }
}

function soundResponses(template: Template): Record<string, unknown> {
  return Object.fromEntries(placedItems(template).map(({ item }) => [item.key, soundValue(item)]));
}

describe("each template filled in for a sound installation", () => {
  test.each(library.map((t) => [`${t.key}.v${t.version}`, t] as const))(
    "%s: every calc computes, nothing asks for attention, complete",
    (_, template) => {
      const responses = soundResponses(template);
      const result = progress(template, responses);
      // An item that applies only after another answer may not apply to this boat.
      const conditional = new Set(
        placedItems(template).flatMap(({ item }) => (item.appliesWhen ? [item.key] : [])),
      );
      const notOk = Object.entries(result.verdicts)
        .filter(([key, v]) => v.status !== "ok" && !(conditional.has(key) && v.status === "noted"))
        .map(([key, v]) => `${key}: ${v.status} ${v.message}`);
      expect(notOk).toEqual([]);
      expect(result.complete).toBe(true);
      for (const { item } of placedItems(template)) {
        if (item.kind === "calc" && result.verdicts[item.key].status === "ok")
          expect(result.verdicts[item.key].outcome, item.key).toBeDefined();
      }
    },
  );

  test("a shaft 0.008 in out at mid-length is caught by the runout calculation", () => {
    // Common practice: 0.003 in TIR is the usual limit and 0.008 in is far out.
    const template = byKey("propeller-shaft-and-coupling");
    const responses = {
      ...soundResponses(template),
      "runout-readings": grid("in", [
        [0, 0.001, 0.001, 0.0005],
        [0, 0.003, 0.005, 0.003],
        [0, 0.004, 0.008, 0.004],
        [0, 0.003, 0.005, 0.002],
        [0, 0.001, 0.001, 0.0005],
      ]),
    };
    const v = evaluate(findItem(template, "runout-result")!, undefined, { template, responses });
    expect(v.status).toBe("out-of-range");
    expect(v.message).toMatch(/worst at middle, high spot at 180°/);
    expect(progress(template, responses).overall.attention).toEqual(["runout-result"]);
  });

  test("an engine that cannot reach its rated band at full throttle is over-propped", () => {
    const template = byKey("sea-trial");
    const responses = { ...soundResponses(template), "wot-rpm": measured([2750, "rpm"]) };
    const v = evaluate(findItem(template, "propeller-loading")!, undefined, { template, responses });
    expect(v.status).toBe("out-of-range");
    expect(v.message).toMatch(/over-propped/);
  });
});
