import { describe, expect, test } from "vitest";
import { describeRule, evaluate, type MeasureItem, type ReadingsItem } from "~/lib/templates";
import { grid, itemOf, measured, signed, templateOf } from "./fixtures";

const rules = templateOf(
  {
    kind: "measure",
    key: "face-runout",
    label: "Face runout",
    unit: "in",
    accepts: ["in", "thou", "mm"],
    rule: { min: 0, max: 0.001, unit: "in" },
  },
  {
    kind: "measure",
    key: "gap-thou",
    label: "Gap",
    unit: "thou",
    accepts: ["thou", "in", "mm"],
    rule: { max: 3, unit: "thou" },
  },
  {
    kind: "measure",
    key: "bore",
    label: "Bore",
    unit: "in",
    accepts: ["in", "mm"],
    rule: { nominal: 1.25, tolerance: 0.0005, unit: "in" },
  },
  {
    kind: "measure",
    key: "coolant",
    label: "Coolant",
    unit: "degF",
    accepts: ["degF", "degC"],
    rule: { min: 160, max: 200, unit: "degF" },
  },
  {
    kind: "measure",
    key: "oil",
    label: "Oil pressure",
    unit: "psi",
    accepts: ["psi", "kPa"],
    rule: { min: 10, unit: "psi" },
  },
  { kind: "measure", key: "length", label: "Length", unit: "in" },
);
const measure = (key: string) => itemOf(rules, key) as MeasureItem;

describe("measure: verdicts at, below and above each limit", () => {
  test("a maximum: at it is within, above it is out of range", () => {
    expect(evaluate(measure("face-runout"), measured([0.001, "in"])).status).toBe("ok");
    expect(evaluate(measure("face-runout"), measured([0.0009, "in"])).status).toBe("ok");
    const over = evaluate(measure("face-runout"), measured([0.0011, "in"]));
    expect(over).toMatchObject({ status: "out-of-range", done: false, finding: "out-of-range" });
    expect(over.message).toBe(
      "0.0011 in is above the upper limit of 0.001 in. Write the corrective action in the note, or correct it and enter a new attempt.",
    );
  });

  test("a minimum: at it is within, below it is out of range", () => {
    expect(evaluate(measure("face-runout"), measured([0, "in"])).status).toBe("ok");
    expect(evaluate(measure("face-runout"), measured([-0.0001, "in"])).message).toMatch(
      /^-0.0001 in is below the lower limit of 0 in\./,
    );
    expect(evaluate(measure("coolant"), measured([160, "degF"])).status).toBe("ok");
    expect(evaluate(measure("coolant"), measured([159, "degF"])).status).toBe("out-of-range");
    expect(evaluate(measure("coolant"), measured([200, "degF"])).status).toBe("ok");
    expect(evaluate(measure("coolant"), measured([201, "degF"])).status).toBe("out-of-range");
  });

  test("nominal ± tolerance: both ends are within, beyond either is out", () => {
    // 1.25 ± 0.0005 in → 1.2495 to 1.2505 in.
    for (const v of [1.2495, 1.25, 1.2505])
      expect(evaluate(measure("bore"), measured([v, "in"])).status).toBe("ok");
    expect(evaluate(measure("bore"), measured([1.2494, "in"])).message).toMatch(
      /below the lower limit of 1.2495 in/,
    );
    expect(evaluate(measure("bore"), measured([1.2506, "in"])).message).toMatch(
      /above the upper limit of 1.2505 in/,
    );
    expect(describeRule(measure("bore").rule!)).toBe("1.25 ± 0.0005 in");
  });

  test("no rule: any number is recorded", () => {
    expect(evaluate(measure("length"), measured([41.5, "in"]))).toMatchObject({
      status: "ok",
      message: "41.5 in recorded.",
    });
  });
});

describe("measure: units", () => {
  // 1 in = 25.4 mm exactly (NIST SP 811, 2008, Appendix B.8), so 3 thou = 0.0762 mm exactly.
  test("a limit in thousandths of an inch against a reading in millimetres", () => {
    expect(evaluate(measure("gap-thou"), measured([0.0762, "mm"])).status).toBe("ok");
    expect(evaluate(measure("gap-thou"), measured([0.0761, "mm"])).status).toBe("ok");
    const over = evaluate(measure("gap-thou"), measured([0.0763, "mm"]));
    expect(over.status).toBe("out-of-range");
    expect(over.message).toMatch(/^0.0763 mm \(3.00394 thou\) is above the upper limit of 3 thou\./);
  });

  test("a limit in inches against a reading in millimetres or in thou", () => {
    // 0.001 in = 0.0254 mm = 1 thou (NIST SP 811, Appendix B.8).
    expect(evaluate(measure("face-runout"), measured([0.0254, "mm"])).status).toBe("ok");
    expect(evaluate(measure("face-runout"), measured([0.0255, "mm"])).status).toBe("out-of-range");
    expect(evaluate(measure("face-runout"), measured([1, "thou"])).status).toBe("ok");
    expect(evaluate(measure("face-runout"), measured([1.1, "thou"])).status).toBe("out-of-range");
  });

  test("a limit in °F against a reading in °C", () => {
    // t/°C = (t/°F − 32) / 1.8 (NIST SP 811, Appendix B.9): 200 °F = 93.33 °C, 160 °F = 71.11 °C.
    expect(evaluate(measure("coolant"), measured([93.3, "degC"])).status).toBe("ok");
    expect(evaluate(measure("coolant"), measured([93.4, "degC"])).status).toBe("out-of-range");
    expect(evaluate(measure("coolant"), measured([71.2, "degC"])).status).toBe("ok");
    expect(evaluate(measure("coolant"), measured([71.1, "degC"])).status).toBe("out-of-range");
  });

  test("a limit in psi against a reading in kPa", () => {
    // 1 psi = 6.894757 kPa (NIST SP 811, Appendix B.8): 10 psi = 68.95 kPa.
    expect(evaluate(measure("oil"), measured([69, "kPa"])).status).toBe("ok");
    expect(evaluate(measure("oil"), measured([68.9, "kPa"])).status).toBe("out-of-range");
  });

  test("a unit the item does not take is refused, not converted", () => {
    const v = evaluate(measure("bore"), measured([1.25, "thou"]));
    expect(v.status).toBe("invalid");
    expect(v.message).toBe(
      "This entry does not fit the item (attempts[0].unit): this item takes in or mm, not thou.",
    );
  });
});

describe("measure: attempts and notes", () => {
  test("the last attempt is the one judged", () => {
    const straightened = measured([0.004, "in"], [0.002, "in"], [0.0008, "in"]);
    expect(evaluate(measure("face-runout"), straightened)).toMatchObject({ status: "ok" });
    expect(evaluate(measure("face-runout"), straightened).message).toMatch(/\(attempt 3\)/);
    expect(evaluate(measure("face-runout"), measured([0.0008, "in"], [0.004, "in"])).status).toBe(
      "out-of-range",
    );
  });

  test("out of range with a corrective-action note is done, and still a finding, never ok", () => {
    // Issue 12 §1.13: a reading outside its limit with an action note is "finding, action noted".
    const v = evaluate(measure("face-runout"), {
      ...measured([0.0015, "in"]),
      note: "Faced again; limit agreed with the lead.",
    });
    expect(v).toMatchObject({ status: "action-noted", done: true, finding: "out-of-range" });
  });

  test("a blank note is no note", () => {
    expect(evaluate(measure("face-runout"), { ...measured([0.0015, "in"]), note: "   " }).status).toBe(
      "out-of-range",
    );
  });
});

describe("missing values", () => {
  test("nothing entered is unanswered, for every kind", () => {
    const t = templateOf(
      { kind: "check", key: "c", label: "C" },
      { kind: "measure", key: "m", label: "M", unit: "in" },
      {
        kind: "readings",
        key: "r",
        label: "R",
        rows: [{ key: "a", label: "A" }],
        columns: [{ key: "x", label: "X" }],
        unit: "in",
      },
      {
        kind: "choice",
        key: "ch",
        label: "Ch",
        options: [
          { key: "a", label: "A" },
          { key: "b", label: "B" },
        ],
      },
      { kind: "text", key: "t", label: "T" },
      { kind: "photo", key: "p", label: "P" },
      { kind: "initials", key: "i", label: "I" },
    );
    for (const item of t.sections[0].items) {
      expect(evaluate(item, undefined)).toMatchObject({ status: "unanswered", done: false });
      expect(evaluate(item, null).status).toBe("unanswered");
    }
  });

  test("a grid with cells still empty is incomplete", () => {
    const t = templateOf({
      kind: "readings",
      key: "gaps",
      label: "Gaps",
      rows: [{ key: "gap", label: "Gap" }],
      columns: ["top", "bottom", "port", "starboard"].map((key) => ({ key, label: key })),
      unit: "in",
    });
    const v = evaluate(t.sections[0].items[0], grid("in", [[0.004, null, 0.003, null]]));
    expect(v).toMatchObject({
      status: "incomplete",
      done: false,
      message: "2 of 4 readings still to enter.",
    });
  });

  test("a value of another kind's shape is invalid", () => {
    expect(evaluate(measure("bore"), { result: "pass" }).status).toBe("invalid");
    expect(evaluate(measure("bore"), { attempts: [] }).message).toMatch(/needs at least one attempt/);
  });
});

describe("readings", () => {
  const t = templateOf(
    {
      kind: "readings",
      key: "seat",
      label: "Seat diameter",
      rows: [
        { key: "forward", label: "Forward end" },
        { key: "aft", label: "Aft end" },
      ],
      columns: [
        { key: "a", label: "First" },
        { key: "b", label: "Turned 90°" },
      ],
      unit: "in",
      accepts: ["in", "mm"],
      rule: { max: 0.0005, unit: "in", appliesTo: "row-spread" },
    },
    {
      kind: "readings",
      key: "gaps",
      label: "Gaps",
      rows: [{ key: "gap", label: "Gap" }],
      columns: ["top", "bottom", "port", "starboard"].map((key) => ({ key, label: key })),
      unit: "thou",
      accepts: ["thou", "mm"],
      rule: { min: 0, max: 0.01, unit: "in" },
    },
  );
  const seat = t.sections[0].items[0] as ReadingsItem;
  const gaps = t.sections[0].items[1] as ReadingsItem;

  test("a rule on each row's spread: at the limit, under it, over it", () => {
    expect(
      evaluate(
        seat,
        grid("in", [
          [1.25, 1.2505],
          [1.2501, 1.25],
        ]),
      ).status,
    ).toBe("ok");
    const v = evaluate(
      seat,
      grid("in", [
        [1.25, 1.2506],
        [1.2501, 1.25],
      ]),
    );
    expect(v).toMatchObject({ status: "out-of-range", offending: [{ row: 0 }] });
    expect(v.message).toMatch(/^Outside the rule: Forward end: spread 0.0006 in is above 0.0005 in\./);
    expect(describeRule(seat.rule!)).toBe("largest minus smallest in each row at most 0.0005 in");
  });

  test("a row spread read in millimetres against a limit in inches", () => {
    // 0.0005 in = 0.0127 mm exactly (1 in = 25.4 mm, NIST SP 811 Appendix B.8).
    expect(
      evaluate(
        seat,
        grid("mm", [
          [31.75, 31.7627],
          [31.75, 31.75],
        ]),
      ).status,
    ).toBe("ok");
    expect(
      evaluate(
        seat,
        grid("mm", [
          [31.75, 31.7628],
          [31.75, 31.75],
        ]),
      ).status,
    ).toBe("out-of-range");
  });

  test("a rule on each cell, readings in thou against a limit in inches, points at the cells", () => {
    expect(evaluate(gaps, grid("thou", [[10, 0, 4, 4]])).status).toBe("ok");
    const v = evaluate(gaps, grid("thou", [[10.5, 0, 4, -1]]));
    expect(v.status).toBe("out-of-range");
    expect(v.offending).toEqual([
      { row: 0, column: 0 },
      { row: 0, column: 3 },
    ]);
    expect(v.message).toMatch(
      /Gap, top: 0.0105 in is above 0.01 in; Gap, starboard: -0.001 in is below 0 in/,
    );
  });

  test("every attempt is kept and the last is judged", () => {
    expect(evaluate(gaps, grid("thou", [[12, 0, 4, 4]], [[8, 2, 4, 4]])).status).toBe("ok");
  });

  test("a grid of the wrong shape is refused", () => {
    expect(evaluate(gaps, grid("thou", [[10, 0, 4]])).message).toMatch(
      /expected 4 readings in row "Gap", got 3/,
    );
    expect(evaluate(seat, grid("in", [[1.25, 1.25]])).message).toMatch(/expected 2 rows, got 1/);
  });
});

describe("check, choice, text, photo, initials", () => {
  const t = templateOf(
    { kind: "check", key: "c", label: "Seal fitted" },
    {
      kind: "choice",
      key: "vibration",
      label: "Vibration",
      options: [
        { key: "smooth", label: "Smooth throughout" },
        { key: "objectionable", label: "Objectionable", needsNote: true },
      ],
    },
    { kind: "text", key: "t", label: "Remarks" },
    { kind: "photo", key: "p", label: "Photos", minPhotos: 2 },
    { kind: "initials", key: "i", label: "Confirmed" },
  );
  const [check, choice, text, photo, initials] = t.sections[0].items;

  test("a check: pass is done; fail and n/a need a note", () => {
    expect(evaluate(check, { result: "pass" })).toMatchObject({ status: "ok", done: true });
    expect(evaluate(check, { result: "fail" })).toMatchObject({
      status: "needs-note",
      done: false,
      finding: "fail",
    });
    expect(evaluate(check, { result: "na" })).toMatchObject({
      status: "needs-note",
      finding: "not-applicable",
    });
    expect(evaluate(check, { result: "fail", note: "Hose clamp replaced." })).toMatchObject({
      status: "action-noted",
      done: true,
      finding: "fail",
    });
    expect(evaluate(check, { result: "na", note: "Diesel: no blower needed." })).toMatchObject({
      status: "noted",
      done: true,
    });
    expect(evaluate(check, { result: "maybe" }).status).toBe("invalid");
  });

  test("a choice that is a finding needs a note; an unknown option is refused", () => {
    expect(evaluate(choice, { option: "smooth" })).toMatchObject({
      status: "ok",
      message: "Smooth throughout.",
    });
    expect(evaluate(choice, { option: "objectionable" })).toMatchObject({
      status: "needs-note",
      finding: "flagged-option",
    });
    expect(
      evaluate(choice, { option: "objectionable", note: "At 2,200 rpm; mount re-torqued." }).status,
    ).toBe("action-noted");
    expect(evaluate(choice, { option: "rough" }).status).toBe("invalid");
  });

  test("text must say something", () => {
    expect(evaluate(text, { text: "  " }).status).toBe("unanswered");
    expect(evaluate(text, { text: "Calm, half tanks." }).status).toBe("ok");
  });

  test("photos count against the minimum", () => {
    const photos = (n: number) => ({
      photos: Array.from({ length: n }, (_, i) => ({ id: `7f1c2a3e-0000-4000-8000-00000000000${i}` })),
    });
    expect(evaluate(photo, photos(0)).status).toBe("unanswered");
    expect(evaluate(photo, photos(1))).toMatchObject({
      status: "incomplete",
      message: "1 of 2 photos taken.",
    });
    expect(evaluate(photo, photos(2)).status).toBe("ok");
    expect(evaluate(photo, { photos: [{ id: "not-a-uuid" }] }).status).toBe("invalid");
  });

  test("initials confirm", () => {
    expect(evaluate(initials, signed)).toMatchObject({ status: "ok", message: "Confirmed by RK." });
    expect(evaluate(initials, { ...signed, initials: "" }).status).toBe("invalid");
  });
});

describe("calc items", () => {
  const t = templateOf(
    {
      kind: "measure",
      key: "diameter",
      label: "Coupling flange diameter",
      unit: "in",
      accepts: ["in", "mm"],
    },
    {
      kind: "readings",
      key: "gaps",
      label: "Face gaps",
      rows: [{ key: "gap", label: "Gap" }],
      columns: ["top", "bottom", "port", "starboard"].map((key) => ({ key, label: key })),
      unit: "in",
      accepts: ["in", "mm"],
    },
    {
      kind: "calc",
      key: "angularity",
      label: "Angularity",
      calc: "couplingFace",
      inputs: {
        diameter: { item: "diameter" },
        gaps: { item: "gaps" },
        maxInPerInDiameter: { value: 0.001 },
      },
    },
  );
  const angularity = itemOf(t, "angularity");
  const run = (responses: Record<string, unknown>, note?: string) =>
    evaluate(angularity, note === undefined ? undefined : { note }, { template: t, responses });

  // Common practice limit: face gap difference at most 0.001 in per inch of coupling diameter;
  // the slope is the gap difference over the diameter (similar triangles, straightedge-and-feeler
  // alignment). For a 4 in coupling: 0.004 in of gap difference is the limit.
  test("at the limit it passes, over it is out of range until a note is written", () => {
    expect(
      run({ diameter: measured([4, "in"]), gaps: grid("in", [[0.006, 0.002, 0.003, 0.003]]) }).status,
    ).toBe("ok");
    const over = { diameter: measured([4, "in"]), gaps: grid("in", [[0.0062, 0.002, 0.003, 0.003]]) };
    const v = run(over);
    expect(v).toMatchObject({ status: "out-of-range", finding: "out-of-range" });
    expect(v.outcome?.verdict).toBe("fail");
    expect(run(over, "Engine lowered at the front; see the next attempt.").status).toBe("action-noted");
  });

  test("millimetre readings against the inch-per-inch rule", () => {
    // 101.6 mm = 4 in and 0.1016 mm = 0.004 in exactly (NIST SP 811 Appendix B.8).
    expect(
      run({ diameter: measured([101.6, "mm"]), gaps: grid("mm", [[0.1524, 0.0508, 0.08, 0.08]]) }).status,
    ).toBe("ok");
    expect(
      run({ diameter: measured([101.6, "mm"]), gaps: grid("mm", [[0.153, 0.0508, 0.08, 0.08]]) }).status,
    ).toBe("out-of-range");
  });

  test("waits for the items it needs, and for a grid with every cell", () => {
    expect(run({}).message).toBe("Waits for: Coupling flange diameter; Face gaps.");
    expect(
      run({ diameter: measured([4, "in"]), gaps: grid("in", [[0.006, null, 0.003, 0.003]]) }),
    ).toMatchObject({
      status: "unanswered",
      message: "Waits for: Face gaps.",
    });
    expect(evaluate(angularity, undefined).status).toBe("unanswered");
  });

  test("an input the calculation refuses names the item that fed it", () => {
    const v = run({ diameter: measured([-4, "in"]), gaps: grid("in", [[0.006, 0.002, 0.003, 0.003]]) });
    expect(v.status).toBe("invalid");
    expect(v.message).toMatch(/^Coupling flange diameter: /);
  });
});

describe("a calc item's own acceptance rule", () => {
  const fit = (rule: Record<string, unknown>) =>
    templateOf(
      { kind: "measure", key: "shaft", label: "Shaft, largest reading", unit: "in", accepts: ["in", "mm"] },
      { kind: "measure", key: "bore", label: "Bore, smallest reading", unit: "in", accepts: ["in", "mm"] },
      {
        kind: "calc",
        key: "fit",
        label: "Coupling fit",
        calc: "couplingFit",
        inputs: { shaft: { item: "shaft" }, bore: { item: "bore" } },
        rule: rule as never,
      },
    );
  const run = (template: ReturnType<typeof fit>, responses: Record<string, unknown>, note?: string) =>
    evaluate(itemOf(template, "fit"), note === undefined ? undefined : { note }, { template, responses });

  // Issue 12 §1.1, reproduced with shaft 1.4993 in and bore 1.5010 in: clearance = bore − shaft
  // = 0.0017 in (Machinery's Handbook, allowances and tolerances for fits: clearance on the
  // diameter), against the item's own limit of 0 to 0.001 in (common practice). It was "Good".
  const inch = fit({ output: "clearance", min: 0, max: 0.001, unit: "in" });
  const loose = { shaft: measured([1.4993, "in"]), bore: measured([1.501, "in"]) };

  test("a clearance over the item's limit is outside it, not Good", () => {
    const v = run(inch, loose);
    expect(v).toMatchObject({ status: "out-of-range", finding: "out-of-range", done: false });
    expect(v.outcome?.verdict).toBe("fail");
    expect(v.message).toMatch(/clearance 0\.0017 in is above the upper limit of 0\.001 in/);
    expect(run(inch, loose, "Bore sleeved and re-bored; see new readings.").status).toBe("action-noted");
  });

  test("within the limit it passes, and the rule is said in words", () => {
    const v = run(inch, { shaft: measured([1.5002, "in"]), bore: measured([1.501, "in"]) });
    expect(v.status).toBe("ok");
    expect(v.outcome?.rule).toBe("clearance between 0 in and 0.001 in");
  });

  test("interference is below a minimum clearance of 0", () => {
    expect(run(inch, { shaft: measured([1.5012, "in"]), bore: measured([1.501, "in"]) }).status).toBe(
      "out-of-range",
    );
  });

  test("a rule in millimetres is applied to a result in inches by conversion", () => {
    // 0.0017 in = 0.04318 mm exactly (1 in = 25.4 mm); limit 0.025 mm.
    const metric = fit({ output: "clearance", max: 0.025, unit: "mm" });
    expect(run(metric, loose).message).toMatch(/0\.04318 mm/);
    expect(run(metric, loose).status).toBe("out-of-range");
    expect(run(metric, { shaft: measured([1.5002, "in"]), bore: measured([1.501, "in"]) }).status).toBe("ok");
  });

  test("a rule on a value the calculation does not give, or in another dimension, does not fit", () => {
    expect(run(fit({ output: "gap", max: 1, unit: "in" }), loose).status).toBe("invalid");
    expect(run(fit({ output: "clearance", max: 1, unit: "psi" }), loose).status).toBe("invalid");
  });
});

describe("an item that applies only after a given answer", () => {
  const t = templateOf(
    {
      kind: "choice",
      key: "fuel",
      label: "Fuel",
      options: [
        { key: "diesel", label: "Diesel" },
        { key: "petrol", label: "Petrol" },
      ],
    },
    { kind: "measure", key: "volts", label: "System voltage", unit: "V" },
    {
      kind: "check",
      key: "blower",
      label: "Blower runs",
      appliesWhen: { item: "fuel", options: ["petrol"] },
    },
    {
      kind: "measure",
      key: "charge-24",
      label: "Charging voltage, 24 V system",
      unit: "V",
      rule: { min: 26.4, max: 29.6, unit: "V" },
      appliesWhen: { item: "volts", values: [24] },
    },
  );
  const [, , blower, charge24] = t.sections[0].items;
  const run = (item: typeof blower, value: unknown, responses: Record<string, unknown>) =>
    evaluate(item, value, { template: t, responses });

  test("waits for the answer it depends on, then applies or does not", () => {
    expect(run(blower, undefined, {})).toMatchObject({ status: "unanswered", message: "Waits for: Fuel." });
    expect(run(blower, undefined, { fuel: { option: "diesel" } })).toMatchObject({
      status: "noted",
      done: true,
      finding: "not-applicable",
      message: "Does not apply: Fuel: Diesel.",
    });
    expect(run(blower, undefined, { fuel: { option: "petrol" } }).status).toBe("unanswered");
    expect(run(blower, { result: "pass" }, { fuel: { option: "petrol" } }).status).toBe("ok");
  });

  test("a condition on a measured value, in the measure's unit", () => {
    expect(run(charge24, undefined, { volts: measured([12, "V"]) }).status).toBe("noted");
    expect(run(charge24, measured([28.2, "V"]), { volts: measured([24, "V"]) }).status).toBe("ok");
    expect(run(charge24, measured([14.2, "V"]), { volts: measured([24, "V"]) }).status).toBe("out-of-range");
  });
});
