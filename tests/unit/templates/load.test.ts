import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import {
  loadTemplateFile,
  parseTemplate,
  parseTemplateText,
  problemText,
  TemplateFormatError,
  templateFileName,
} from "~/lib/templates";

/** A small valid template; each test breaks one field of a fresh copy. */
function base(): any {
  const filler = (key: string) => ({ kind: "check", key, label: `Check ${key}` });
  return {
    key: "small-template",
    version: 1,
    title: "Small",
    purpose: "A template for the format tests.",
    sections: [
      {
        key: "first",
        title: "First",
        items: [
          { kind: "measure", key: "diameter", label: "Coupling diameter", unit: "in", accepts: ["in", "mm"] },
          {
            kind: "readings",
            key: "gaps",
            label: "Face gaps",
            rows: [{ key: "gap", label: "Gap" }],
            columns: ["top", "bottom", "port", "starboard"].map((key) => ({ key, label: key })),
            unit: "in",
            accepts: ["in", "thou", "mm"],
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
        ],
      },
      { key: "second", title: "Second", items: [filler("a"), filler("b")] },
      {
        key: "third",
        title: "Third",
        items: [
          filler("c"),
          filler("d"),
          {
            kind: "choice",
            key: "seal",
            label: "Seal",
            options: [
              { key: "gland", label: "Gland" },
              { key: "face", label: "Face seal" },
            ],
          },
          { kind: "photo", key: "photo", label: "Photo" },
          {
            kind: "measure",
            key: "runout",
            label: "Face runout",
            unit: "in",
            accepts: ["in", "thou", "mm"],
            rule: { min: 0, max: 0.001, unit: "in" },
          },
        ],
      },
    ],
  };
}

function problemsOf(input: unknown): string[] {
  const parsed = parseTemplate(input);
  return parsed.ok ? [] : parsed.problems.map(problemText);
}

describe("a valid template", () => {
  test("parses, with the defaults filled in", () => {
    const parsed = parseTemplate(base());
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    const photo = parsed.template.sections[2].items[3];
    expect(photo).toMatchObject({ kind: "photo", required: true, minPhotos: 1 });
    expect(parsed.template.sections[0].items[0].required).toBe(true);
  });

  test("its file name comes from its key and version", () => {
    expect(templateFileName({ key: "engine-alignment", version: 3 })).toBe("engine-alignment.v3.json");
  });
});

describe("structure problems carry the path of the bad field", () => {
  test("a limit written as a string (the example of the issue)", () => {
    const t = base();
    t.sections[2].items[4].rule.max = "0.001";
    expect(problemsOf(t)).toEqual(["sections[2].items[4].rule.max: the maximum must be a number"]);
  });

  test("a missing title", () => {
    const t = base();
    delete t.title;
    expect(problemsOf(t)).toEqual(["title: missing, expected a string"]);
  });

  test("an unknown item kind", () => {
    const t = base();
    t.sections[1].items[0].kind = "slider";
    expect(problemsOf(t)).toEqual([
      "sections[1].items[0].kind: expected kind to be one of check, measure, readings, calc, choice, text, photo, initials",
    ]);
  });

  test("a misspelt field", () => {
    const t = base();
    t.sections[2].items[4].rule.tolerence = 0.001;
    expect(problemsOf(t)).toEqual(["sections[2].items[4].rule.tolerence: unknown field"]);
  });

  test("a key that is not kebab-case", () => {
    const t = base();
    t.sections[1].items[0].key = "Check_A";
    expect(problemsOf(t)).toEqual([
      "sections[1].items[0].key: expected a key in lower-case words joined by hyphens, like face-gaps",
    ]);
  });

  test("versions are whole numbers from 1", () => {
    for (const [version, message] of [
      [0, "must be 1 or more"],
      [1.5, "expected a whole number"],
      [-2, "must be 1 or more"],
    ] as const) {
      const t = base();
      t.version = version;
      expect(problemsOf(t)).toEqual([`version: ${message}`]);
    }
  });

  test("a unit Sternpost does not know", () => {
    const t = base();
    t.sections[0].items[0].unit = "furlong";
    expect(problemsOf(t)[0]).toMatch(/^sections\[0\]\.items\[0\]\.unit: expected a unit Sternpost knows/);
  });

  test("a choice with one option, an empty label, a photo count of zero", () => {
    const t = base();
    t.sections[2].items[2].options = [{ key: "only", label: "Only" }];
    t.sections[2].items[0].label = "  ";
    t.sections[2].items[3].minPhotos = 0;
    expect(problemsOf(t)).toEqual([
      "sections[2].items[0].label: cannot be empty",
      "sections[2].items[2].options: needs at least two options",
      "sections[2].items[3].minPhotos: must be at least 1",
    ]);
  });

  test("a section without items", () => {
    const t = base();
    t.sections[1].items = [];
    expect(problemsOf(t)).toEqual(["sections[1].items: needs at least one item"]);
  });

  test("a calc binding that is neither an item nor a value", () => {
    const t = base();
    t.sections[0].items[2].inputs.diameter = { from: "diameter" };
    expect(problemsOf(t)).toEqual([
      'sections[0].items[2].inputs.diameter: expected { "item": "<item key>" } or { "value": <constant> }',
    ]);
  });

  test("text that is not JSON", () => {
    const parsed = parseTemplateText('{ "key": "x", ');
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.problems[0].message).toMatch(/^not valid JSON/);
  });
});

describe("cross-checks between fields", () => {
  test("the same item key twice in a template, even in different sections", () => {
    const t = base();
    t.sections[2].items[1].key = "a";
    expect(problemsOf(t)).toEqual([
      'sections[2].items[1].key: item key "a" is already used at sections[1].items[0]',
    ]);
  });

  test("the same section key twice", () => {
    const t = base();
    t.sections[2].key = "first";
    expect(problemsOf(t)).toEqual(['sections[2].key: section key "first" is already used at sections[0]']);
  });

  test("a minimum above the maximum", () => {
    const t = base();
    t.sections[2].items[4].rule = { min: 0.002, max: 0.001, unit: "in" };
    expect(problemsOf(t)).toEqual([
      "sections[2].items[4].rule.min: the minimum (0.002) is above the maximum (0.001)",
    ]);
  });

  test("a rule with no limit, a nominal without tolerance, a tolerance without nominal", () => {
    const t = base();
    t.sections[2].items[4].rule = { unit: "in" };
    expect(problemsOf(t)).toEqual([
      "sections[2].items[4].rule: a rule needs a min, a max, or a nominal with a tolerance",
    ]);
    t.sections[2].items[4].rule = { nominal: 1, unit: "in" };
    expect(problemsOf(t)).toEqual([
      "sections[2].items[4].rule.tolerance: a nominal needs a tolerance (plus or minus)",
    ]);
    t.sections[2].items[4].rule = { max: 1, tolerance: 0.1, unit: "in" };
    expect(problemsOf(t)).toEqual(["sections[2].items[4].rule.nominal: a tolerance needs a nominal"]);
  });

  test("a rule in a unit of another dimension, and accepted units of another dimension", () => {
    const t = base();
    t.sections[2].items[4].rule = { max: 10, unit: "psi" };
    t.sections[0].items[0].accepts = ["in", "degF"];
    expect(problemsOf(t)).toEqual([
      "sections[0].items[0].accepts[1]: degF is a temperature unit but the item's unit in is a length unit",
      "sections[2].items[4].rule.unit: psi is a pressure unit but the item is measured in in (length)",
    ]);
  });

  test("accepted units that leave out the item's own unit", () => {
    const t = base();
    t.sections[0].items[0].accepts = ["mm"];
    expect(problemsOf(t)).toEqual(["sections[0].items[0].accepts: should include the item's own unit in"]);
  });

  test("grid shape: repeated column keys, a row spread over a single column", () => {
    const t = base();
    t.sections[0].items[1].columns[3].key = "port";
    expect(problemsOf(t)).toContain('sections[0].items[1].columns[3].key: "port" is already used in columns');
    const u = base();
    u.sections[0].items[1].columns = [{ key: "only", label: "Only" }];
    u.sections[0].items[1].rule = { max: 0.003, unit: "in", appliesTo: "row-spread" };
    expect(problemsOf(u)).toEqual([
      "sections[0].items[1].rule.appliesTo: a row spread needs at least two columns",
    ]);
  });

  test("repeated option keys", () => {
    const t = base();
    t.sections[2].items[2].options[1].key = "gland";
    expect(problemsOf(t)).toEqual([
      'sections[2].items[2].options[1].key: "gland" is already used in options',
    ]);
  });

  test("a calc bound to an item that does not exist", () => {
    const t = base();
    t.sections[0].items[2].inputs.diameter = { item: "flange-diameter" };
    expect(problemsOf(t)).toEqual([
      'sections[0].items[2].inputs.diameter.item: no item "flange-diameter" in this template',
    ]);
  });

  test("a calc bound to an item of the wrong kind", () => {
    const t = base();
    t.sections[0].items[2].inputs.diameter = { item: "a" };
    expect(problemsOf(t)).toEqual([
      'sections[0].items[2].inputs.diameter.item: "a" is a check item; a calculation takes measure, readings or choice items',
    ]);
    t.sections[0].items[2].inputs.diameter = { item: "gaps" };
    expect(problemsOf(t)).toEqual([
      'sections[0].items[2].inputs.diameter.item: "gaps" is a readings item but this input takes a number (a measure item or a numeric constant)',
    ]);
  });

  test("a calc bound to an item in the wrong unit", () => {
    const t = base();
    t.sections[0].items[0] = { kind: "measure", key: "diameter", label: "Pressure by mistake", unit: "psi" };
    expect(problemsOf(t)).toEqual([
      'sections[0].items[2].inputs.diameter.item: "diameter" is measured in psi (pressure) but this input takes in (length)',
    ]);
  });

  test("a calc item's rule: limits in order, a known unit, no unknown field", () => {
    const t = base();
    t.sections[0].items[2].rule = { output: "slope", min: 0.002, max: 0.001, unit: "in" };
    expect(problemsOf(t)).toEqual([
      "sections[0].items[2].rule.min: the minimum (0.002) is above the maximum (0.001)",
    ]);
    t.sections[0].items[2].rule = { output: "slope", max: 0.001, unit: "furlong", limit: 1 };
    expect(problemsOf(t)).toEqual([
      expect.stringMatching(/^sections\[0\]\.items\[2\]\.rule\.unit: expected a unit Sternpost knows/),
      "sections[0].items[2].rule.limit: unknown field",
    ]);
    t.sections[0].items[2].rule = { output: "slope", max: 0.001, unit: "in" };
    expect(problemsOf(t)).toEqual([]);
  });

  test("a condition on an item that is missing, of the wrong kind, or without that option", () => {
    const t = base();
    t.sections[0].items[1].appliesWhen = { item: "nowhere", options: ["x"] };
    expect(problemsOf(t)).toEqual([
      'sections[0].items[1].appliesWhen.item: no item "nowhere" in this template',
    ]);
    t.sections[0].items[1].appliesWhen = { item: "gaps", options: ["x"] };
    expect(problemsOf(t)).toEqual(["sections[0].items[1].appliesWhen.item: an item cannot depend on itself"]);
    t.sections[0].items[1].appliesWhen = { item: "a", options: ["x"] };
    expect(problemsOf(t)).toEqual([
      'sections[0].items[1].appliesWhen.item: "a" is a check item; a condition takes a choice or a measure',
    ]);
    t.sections[0].items[1].appliesWhen = { item: "seal", options: ["gland", "bellows"] };
    expect(problemsOf(t)).toEqual([
      'sections[0].items[1].appliesWhen.options[1]: "seal" has no option "bellows"',
    ]);
    t.sections[0].items[1].appliesWhen = { item: "diameter", options: ["x"] };
    expect(problemsOf(t)).toEqual([
      'sections[0].items[1].appliesWhen: "diameter" is a measure: give its values',
    ]);
  });

  test("an unknown calculation, an unknown input, a missing input, a constant of the wrong kind", () => {
    const t = base();
    t.sections[0].items[2].calc = "couplingSquareness";
    expect(problemsOf(t)[0]).toMatch(
      /^sections\[0\]\.items\[2\]\.calc: no calculation named "couplingSquareness"; known: .*couplingFace/,
    );
    const u = base();
    delete u.sections[0].items[2].inputs.gaps;
    u.sections[0].items[2].inputs.gapz = { item: "gaps" };
    u.sections[0].items[2].inputs.maxInPerInDiameter = { value: "tight" };
    expect(problemsOf(u)).toEqual([
      'sections[0].items[2].inputs: couplingFace needs the input "gaps" (Face gaps (top, bottom, port, starboard))',
      "sections[0].items[2].inputs.maxInPerInDiameter.value: expected a number (a measure item or a numeric constant)",
      expect.stringMatching(
        /^sections\[0\]\.items\[2\]\.inputs\.gapz: couplingFace has no input "gapz"; it takes diameter, gaps/,
      ),
    ]);
  });
});

describe("any input", () => {
  test("is answered with problems, never an exception", () => {
    fc.assert(fc.property(fc.jsonValue(), (json) => parseTemplate(json).ok === false));
  });

  test("a valid template with one field of one item replaced by anything is still answered", () => {
    const fields = [
      "kind",
      "key",
      "unit",
      "accepts",
      "rule",
      "rows",
      "columns",
      "inputs",
      "options",
      "calc",
      "required",
      "minPhotos",
    ];
    fc.assert(
      fc.property(fc.nat(2), fc.nat(4), fc.constantFrom(...fields), fc.jsonValue(), (s, i, field, value) => {
        const t = base();
        const items = t.sections[s].items;
        items[i % items.length][field] = value;
        const parsed = parseTemplate(t);
        return (
          parsed.ok || parsed.problems.every((p) => p.path.startsWith("sections[") && p.message.length > 0)
        );
      }),
      { numRuns: 500 },
    );
  });
});

describe("the documented format", () => {
  test("the example in docs/template-format.md is a valid template", () => {
    const doc = readFileSync(
      fileURLToPath(new URL("../../../docs/template-format.md", import.meta.url)),
      "utf8",
    );
    const example = /```json\n([\s\S]*?)```/.exec(doc)?.[1];
    expect(example).toBeDefined();
    const parsed = parseTemplateText(example!);
    expect(parsed.ok ? [] : parsed.problems.map(problemText)).toEqual([]);
  });
});

describe("loading a library file", () => {
  test("a good file loads", () => {
    expect(loadTemplateFile("checklists/small-template.v1.json", JSON.stringify(base())).key).toBe(
      "small-template",
    );
  });

  test("a file named after another version is refused", () => {
    expect(() => loadTemplateFile("small-template.v2.json", JSON.stringify(base()))).toThrow(
      "small-template.v2.json: the file should be named small-template.v1.json after the key and version inside it",
    );
  });

  test("a bad file stops the load with every problem and its path", () => {
    const t = base();
    t.sections[2].items[4].rule.max = "0.001";
    t.sections[2].items[0].label = "";
    let error: unknown;
    try {
      loadTemplateFile("small-template.v1.json", JSON.stringify(t));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(TemplateFormatError);
    expect((error as TemplateFormatError).problems.map((p) => p.path)).toEqual([
      "sections[2].items[0].label",
      "sections[2].items[4].rule.max",
    ]);
    expect((error as Error).message).toBe(
      "small-template.v1.json: sections[2].items[0].label: cannot be empty; sections[2].items[4].rule.max: the maximum must be a number",
    );
  });
});
