import { describe, expect, test } from "vitest";
import {
  evaluate,
  findItem,
  placedItems,
  prefillResponses,
  type Item,
  type JobEquipment,
  type Template,
} from "~/lib/templates";
import { grid, loadLibrary, measured } from "./fixtures";

/**
 * Version 2 of the starter library against the findings of issue 12 §1 and the additions of §2.
 * Each finding is shown on version 1 (which stays as it was for the jobs pinned to it) and fixed
 * on version 2.
 */
const library = loadLibrary();
const template = (key: string, version: number): Template =>
  library.find((t) => t.key === key && t.version === version)!;
const item = (t: Template, key: string): Item => {
  const found = findItem(t, key);
  if (!found) throw new Error(`${t.key}.v${t.version} has no item ${key}`);
  return found;
};
const current = library.filter(
  (t) => t.version === Math.max(...library.filter((o) => o.key === t.key).map((o) => o.version)),
);
const allItems = (templates: Template[]) =>
  templates.flatMap((t) => placedItems(t).map(({ item }) => ({ t, item })));
const text = (i: Item) => [i.label, i.hint, i.caution, i.reference].join(" ");

const shaftV1 = template("propeller-shaft-and-coupling", 1);
const shaftV2 = template("propeller-shaft-and-coupling", 2);
const alignV2 = template("engine-alignment", 2);
const exhaustV1 = template("exhaust", 1);
const exhaustV2 = template("exhaust", 2);
const electricalV2 = template("instruments-and-electrical", 2);

describe("issue 12 §1, fixed in version 2", () => {
  test("§1.1 coupling fit: largest shaft reading against smallest bore, judged by the item's limits", () => {
    // Reproduced with shaft 1.4993 in and bore 1.5010 in: clearance 0.0017 in (bore − shaft,
    // Machinery's Handbook, allowances and tolerances for fits) against the item's own
    // 0 to 0.001 in (common practice). Version 1 said Good.
    const v1 = evaluate(item(shaftV1, "coupling-fit-result"), undefined, {
      template: shaftV1,
      responses: { "shaft-diameter": measured([1.4993, "in"]), "coupling-bore": measured([1.501, "in"]) },
    });
    expect(v1.status).toBe("ok");
    const responses = {
      "coupling-type": { option: "keyed-straight" },
      // The tightest place: the largest of the shaft readings, the smallest of the bore readings.
      "seat-roundness": grid("in", [
        [1.4985, 1.4993],
        [1.4988, 1.499],
      ]),
      "bore-readings": grid("in", [
        [1.5016, 1.501],
        [1.5014, 1.5012],
      ]),
    };
    const v2 = evaluate(item(shaftV2, "coupling-fit-result"), undefined, { template: shaftV2, responses });
    expect(v2.status).toBe("out-of-range");
    expect(v2.outcome?.values.clearance).toBeCloseTo(0.0017, 10);
    expect(v2.outcome?.verdict).toBe("fail");
  });

  test("§1.2 propeller nuts: thin (jam) nut first against the hub, full nut after, cotter pin aft of the nuts; torque recorded", () => {
    expect(text(item(shaftV1, "propeller-nuts"))).toMatch(/Full nut first/);
    const nuts = text(item(shaftV2, "propeller-nuts"));
    expect(nuts).toMatch(/thin \(jam\) nut on first against the hub, full nut after it/i);
    expect(nuts).toMatch(/cotter pin through the hole in the shaft end aft of the nuts/i);
    expect(nuts).not.toMatch(/full nut first/i);
    const torque = item(shaftV2, "propeller-nut-torque");
    expect(torque).toMatchObject({ kind: "measure", unit: "lbfFt", accepts: ["lbfFt", "Nm"] });
    expect(torque.reference).toMatch(/propeller maker/i);
  });

  test("§1.3 back pressure: under way at full throttle and rated rpm only, never against the lines", () => {
    expect(text(item(exhaustV1, "back-pressure"))).toMatch(/against the lines/);
    const back = item(exhaustV2, "back-pressure");
    expect(text(back)).not.toMatch(/against the lines|at the dock puts/i);
    expect(back.hint).toMatch(/under way only: at full throttle and rated rpm, once the reading is steady/i);
    expect(back.phase).toBe("sea-trial");
    expect(back.kind === "measure" && back.accepts).toEqual(["inHg", "inH2O", "kPa", "psi", "mbar", "mmH2O"]);
  });

  test("§1.4 a metric shaft gets DIN 6885-1 keys and the ISO 4566 taper", () => {
    // DIN 6885-1: shafts over 30 up to 38 mm take a 10 × 8 key, shaft keyway 5.0 mm deep, hub
    // 3.3 mm (DIN 6885-1 table, from memory).
    const responses = { "shaft-system": { option: "metric" }, "shaft-diameter": measured([35, "mm"]) };
    const key = evaluate(item(shaftV2, "key-size"), undefined, { template: shaftV2, responses });
    expect(key.outcome?.rule).toMatch(/DIN 6885-1/);
    expect(key.outcome?.values["key width"]).toBe(10);
    const taper = evaluate(item(shaftV2, "taper-dimensions"), undefined, { template: shaftV2, responses });
    expect(taper.outcome?.rule).toMatch(/ISO 4566 1:10/);
    // v1 sent the same shaft through the inch tables: the key item has no system to go by.
    expect((item(shaftV1, "key-size") as { inputs: object }).inputs).not.toHaveProperty("system");
  });

  test("§1.5 the key is read for the nominal size, and against the keyway the coupling is cut to", () => {
    // ASME B17.1 Table 1: shafts over 1 1/8 up to 1 3/8 in take a 5/16 in square key, over 7/8 up
    // to 1 1/4 in a 1/4 in key; a measured 1.2503 in shaft is a 1 1/4 in nominal (from memory).
    const key = item(shaftV2, "key-size") as { inputs: Record<string, unknown> };
    expect(key.inputs.cutTo).toEqual({ item: "keyway-cut-to" });
    const v = evaluate(item(shaftV2, "key-size"), undefined, {
      template: shaftV2,
      responses: {
        "shaft-system": { option: "inch" },
        "keyway-cut-to": { option: "sae-j755" },
        "shaft-diameter": measured([1.2503, "in"]),
      },
    });
    expect(v.status).toBe("ok");
    expect(v.outcome?.values["key width"]).toBe(0.25);
  });

  test("§1.6 shaft and coupling in a yard's order: fit, key, spot-drill, lock, then face and read runout", () => {
    const order = placedItems(shaftV2).map(({ item }) => item.key);
    const at = (key: string) => order.indexOf(key);
    expect(at("coupling-fit-result")).toBeLessThan(at("key-size"));
    expect(at("key-size")).toBeLessThan(at("set-screws"));
    expect(at("set-screws")).toBeLessThan(at("coupling-retained"));
    expect(at("coupling-retained")).toBeLessThan(at("face-trued"));
    expect(at("face-trued")).toBeLessThan(at("face-runout"));
    expect(at("face-runout")).toBeLessThan(at("rim-runout"));
    expect(item(shaftV2, "set-screws").label).toMatch(/spot-drilled/);
  });

  test("§1.7 rim read with the spigot just clear (or the spigot entering as the check); face gaps at 0° and 180°", () => {
    expect(item(alignV2, "rim-readings").hint).toMatch(/spigot just clear/i);
    expect(item(alignV2, "face-gaps").hint).toMatch(/spigot just clear \(not engaged/i);
    expect(item(alignV2, "spigot-enters").appliesWhen).toEqual({
      item: "offset-method",
      options: ["spigot-enters"],
    });
    for (const key of ["face-angularity", "recheck-angularity", "mount-moves"]) {
      const calc = item(alignV2, key) as { inputs: Record<string, unknown> };
      expect(Object.keys(calc.inputs)).toEqual(expect.arrayContaining(["gaps", "gaps180"]));
    }
  });

  test("§1.9 engine and gear temperature limits are the maker's figures, not hard-coded", () => {
    for (const [key, t] of [
      ["coolant-temperature-cruise", template("cooling", 2)],
      ["coolant-temperature-wot", template("sea-trial", 2)],
      ["transmission-temperature", template("sea-trial", 2)],
    ] as const) {
      const reading = item(t, key);
      expect(reading.kind === "measure" && reading.rule, key).toBeUndefined();
      expect(reading.reference, key).toMatch(/maker's figures/);
    }
    expect(item(template("cooling", 2), "coolant-temperature-verdict").kind).toBe("choice");
    expect(item(template("sea-trial", 2), "transmission-temperature-verdict").kind).toBe("choice");
  });

  test("§1.10 sources and choices: P-1 cited, the wet-exhaust alarm required, battery type, planing boats, seen from aft, system voltage", () => {
    expect(item(exhaustV2, "dry-surface-temperature").reference).toMatch(/^ABYC P-1: .*200 °F/);
    expect(item(exhaustV2, "dry-surface-temperature").reference).not.toMatch(/common practice/i);
    const alarm = item(exhaustV2, "wet-exhaust-alarm");
    expect(alarm).toMatchObject({ required: true, reference: "ABYC P-1" });
    expect(alarm.label).not.toMatch(/where fitted/);
    expect(item(template("sea-trial", 2), "propeller-loading").reference).toMatch(
      /planing boats: about 200 rpm per inch of pitch/,
    );
    // Clock positions say where they are seen from.
    const sides = allItems(current).flatMap(({ item }) =>
      item.kind === "readings" ? item.columns.filter((c) => c.key === "port" || c.key === "starboard") : [],
    );
    expect(sides.length).toBeGreaterThan(0);
    for (const side of sides) expect(side.label).toMatch(/seen from aft/);
  });

  test("§1.10 the battery's rest voltage follows its type", () => {
    // Common practice (from memory), for a charged 12 V battery at rest: 12.8 V is good for a
    // flooded or AGM battery, low for lithium iron phosphate (about 13.0–13.6 V).
    const run = (type: string, key: string, volts: number) =>
      evaluate(item(electricalV2, key), measured([volts, "V"]), {
        template: electricalV2,
        responses: { "battery-type": { option: type } },
      }).status;
    expect(run("flooded", "rest-volts-flooded", 12.8)).toBe("ok");
    expect(run("agm", "rest-volts-agm", 12.8)).toBe("ok");
    expect(run("lithium", "rest-volts-lithium", 12.8)).toBe("out-of-range");
    expect(run("lithium", "rest-volts-flooded", 12.8)).toBe("noted");
  });

  test("§1.10 the electrical checks take the system voltage: 24 V is as normal as 12 V", () => {
    const charging24 = (volts: number) =>
      evaluate(item(electricalV2, "volts-idle-24"), measured([volts, "V"]), {
        template: electricalV2,
        responses: { "system-voltage": measured([24, "V"]) },
      }).status;
    expect(charging24(28.2)).toBe("ok");
    expect(charging24(14.2)).toBe("out-of-range");
    for (const key of ["panel-conductor", "alternator-conductor-check"]) {
      const calc = item(electricalV2, key) as { calc: string; inputs: Record<string, unknown> };
      expect(calc.calc).toBe("conductorCheck");
      expect(calc.inputs.systemVoltage).toEqual({ item: "system-voltage" });
    }
  });

  test("§1.8 the conductor is checked for ampacity and its fuse, not voltage drop alone", () => {
    // Reproduced with 40 A on 16 AWG: ABYC E-11 allowable amperage of 16 AWG is far below 40 A at
    // any insulation rating (E-11 ampacity table, as quoted in the calculation).
    const responses = {
      "system-voltage": measured([12, "V"]),
      "panel-current": measured([40, "A"]),
      "panel-run-length": measured([2, "ft"]),
      "panel-conductor-installed": { option: "16" },
      "panel-insulation": { option: "105" },
      "panel-in-engine-space": { option: "no" },
      "panel-fuse": measured([50, "A"]),
    };
    const v = evaluate(item(electricalV2, "panel-conductor"), undefined, {
      template: electricalV2,
      responses,
    });
    expect(v.status).toBe("out-of-range");
  });

  test("§1.11 cautions where the hazard is: hot work only at heat straightening", () => {
    const hotWork = allItems(current).filter(({ item }) => /is hot work/i.test(item.caution ?? ""));
    expect(hotWork.map(({ t, item }) => `${t.key}/${item.key}`)).toEqual([
      "propeller-shaft-and-coupling/straightening",
    ]);
  });
});

describe("issue 12 §2, the additions", () => {
  const keys = (t: Template) => placedItems(t).map(({ item }) => item.key);

  test.each([
    [
      "propeller-shaft-and-coupling",
      [
        "shaft-size-result",
        "bearing-spacing-result",
        "gear-flange-runout",
        "shaft-centred-in-tube",
        "stern-bearing-verdict",
        "propeller-diameter",
        "propeller-hand",
        "blade-condition",
        "tip-clearance",
        "shaft-anode",
        "shaft-withdrawable",
        "propeller-nut-torque",
        "taper-coupling-contact",
        "taper-coupling-advance",
      ],
    ],
    [
      "engine-alignment",
      [
        "shaft-centred",
        "shaft-droop",
        "installation-angle",
        "flexible-coupling-tolerance",
        "coupling-bolt-torque",
      ],
    ],
    [
      "exhaust",
      ["cranking-limit", "exhaust-hose-bore", "exhaust-bore-verdict", "muffler-volume", "injection-heeled"],
    ],
    ["cooling", ["water-at-outlet", "pump-drive", "flow-result", "thermostat-settles"]],
    [
      "instruments-and-electrical",
      [
        "stop-control",
        "cranking-volts-12",
        "cranking-volts-24",
        "battery-cca-verdict",
        "alternator-conductor-check",
        "engine-negative",
        "ignition-protection",
        "tach-pulses",
      ],
    ],
    [
      "sea-trial",
      [
        "hot-restart",
        "idle-in-gear",
        "blow-by",
        "fuel-rate-wot",
        "fuel-rate-cruise",
        "engine-room-temperature",
        "gland-drip",
        "run-speed",
        "alignment-rechecked",
      ],
    ],
  ] as const)("%s version 2 has the steps a yard expects", (key, expected) => {
    expect(keys(template(key, 2))).toEqual(expect.arrayContaining([...expected]));
  });

  test("the fuel-system template covers the supply from tank to engine", () => {
    expect(keys(template("fuel-system", 1))).toEqual(
      expect.arrayContaining([
        "tank-valve",
        "hose-type",
        "anti-siphon",
        "primary-filter",
        "supply-restriction",
        "supply-restriction-verdict",
        "return-line",
        "line-support",
        "bled",
        "fill-grounded",
        "no-fuel-leaks",
      ]),
    );
    expect(item(template("fuel-system", 1), "anti-siphon").appliesWhen).toEqual({
      item: "fuel-type",
      options: ["petrol"],
    });
  });

  test("the ventilation template covers combustion air, the temperature rise and petrol-boat blowers", () => {
    const t = template("ventilation", 1);
    expect(keys(t)).toEqual(
      expect.arrayContaining([
        "air-openings",
        "engine-room-air-temperature",
        "temperature-rise-verdict",
        "blower-fitted",
        "natural-ducts",
      ]),
    );
    for (const key of ["natural-ducts", "blower-fitted", "blower-label", "blower-runs"])
      expect(item(t, key).appliesWhen, key).toEqual({ item: "fuel-type", options: ["petrol"] });
  });

  test("the hazards carry their caution at the step in the current library", () => {
    const caution = (key: string, version: number, itemKey: string) =>
      item(template(key, version), itemKey).caution ?? "";
    expect(caution("propeller-shaft-and-coupling", 2, "straightening")).toMatch(/hot work.*fire watch/i);
    expect(caution("propeller-shaft-and-coupling", 2, "straightening")).toMatch(/press/i);
    expect(caution("propeller-shaft-and-coupling", 2, "face-trued")).toMatch(/lathe/i);
    expect(caution("propeller-shaft-and-coupling", 2, "runout-readings")).toMatch(
      /by hand only.*isolate the engine/i,
    );
    expect(caution("engine-alignment", 2, "face-gaps")).toMatch(/isolate the engine/i);
    expect(caution("engine-alignment", 2, "engine-set")).toMatch(/lift/i);
    expect(caution("exhaust", 2, "no-exhaust-leaks")).toMatch(/carbon monoxide/i);
    expect(caution("exhaust", 2, "cranking-limit")).toMatch(/carbon monoxide/i);
    expect(caution("instruments-and-electrical", 2, "batteries-secured")).toMatch(/negative first/i);
    expect(caution("sea-trial", 2, "wot-rpm")).toMatch(/lookout/i);
    expect(caution("fuel-system", 1, "bled")).toMatch(/pierces skin/i);
    expect(caution("ventilation", 1, "blower-runs")).toMatch(/petrol vapour/i);
  });

  test("what the job knows is filled from it: rpm band, gear ratio, propeller, shaft size and system, voltage", () => {
    const facts = new Set(
      allItems(current).flatMap(({ item }) => ("fromJob" in item && item.fromJob ? [item.fromJob] : [])),
    );
    expect([...facts].sort()).toEqual([
      "gearRatio",
      "propellerDiameter",
      "propellerPitch",
      "ratedRpmMax",
      "ratedRpmMin",
      "shaftDiameter",
      "shaftSystem",
      "systemVoltage",
    ]);
    const metric: JobEquipment = {
      ratedRpmMin: 3000,
      ratedRpmMax: 3200,
      gearRatio: 2.5,
      propDiameterIn: 18,
      propPitchIn: 14,
      shaftSystem: "metric",
      shaftDiameterIn: 1.378,
      shaftDiameterMm: 35,
      systemVolts: 24,
    };
    const filled = prefillResponses(shaftV2, metric, {}, "2026-12-02T08:00:00Z");
    expect(filled["shaft-system"]).toEqual({ option: "metric" });
    expect(filled["shaft-diameter"]).toMatchObject({ attempts: [{ value: 35, unit: "mm" }] });
  });
});
