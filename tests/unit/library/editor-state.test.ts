import { describe, expect, test } from "vitest";
import { describeRule, parseTemplate, type MeasureItem } from "~/lib/templates";
import {
  allItems,
  checkDraft,
  editorReducer,
  fromTemplate,
  itemPath,
  itemsThatFit,
  numberFrom,
  problemsByPath,
  sameAsTemplate,
  sectionPath,
  slugKey,
  toTemplateInput,
  type EditorAction,
  type EditorState,
} from "~/lib/templates/editor-state";
import { small, starter, starterLibrary } from "./fixtures.ts";

const run = (state: EditorState, ...actions: EditorAction[]) => actions.reduce(editorReducer, state);
const itemByKey = (state: EditorState, key: string) => allItems(state).find((i) => i.key === key)!;
const sectionByKey = (state: EditorState, key: string) => state.sections.find((s) => s.key === key)!;

/** The problems the schema finds, by the path the editor's fields are named by. */
function problems(state: EditorState): Map<string, string[]> {
  const parsed = checkDraft(state);
  return parsed.ok ? new Map() : problemsByPath(parsed.problems);
}

describe("reading a template into the editor and writing it back", () => {
  test("every starter template comes back exactly as it was", () => {
    for (const template of starterLibrary()) {
      const state = fromTemplate(template);
      const parsed = checkDraft(state);
      expect(parsed.ok && parsed.template).toEqual(template);
      expect(sameAsTemplate(state, template)).toBe(true);
    }
  });

  test("fields a file may spell out or leave to the default come back as the file had them", () => {
    const parsed = parseTemplate({
      key: "spelled-out",
      version: 3,
      title: "Spelled out",
      purpose: "Explicit defaults.",
      sections: [
        {
          key: "only",
          title: "Only",
          items: [
            {
              kind: "choice",
              key: "c",
              label: "C",
              options: [
                { key: "a", label: "A", needsNote: false },
                { key: "b", label: "B" },
              ],
            },
            { kind: "measure", key: "m", label: "M", unit: "mm", accepts: ["mm"], required: false },
            {
              kind: "readings",
              key: "r",
              label: "R",
              rows: [{ key: "x", label: "X" }],
              columns: [{ key: "y", label: "Y" }],
              unit: "in",
              rule: { max: 1, unit: "in", appliesTo: "each-cell" },
            },
          ],
        },
      ],
    });
    if (!parsed.ok) throw new Error("fixture does not parse");
    const state = fromTemplate(parsed.template);
    expect(sameAsTemplate(state, parsed.template)).toBe(true);
    expect(checkDraft(state)).toEqual(parsed);
  });

  test("any edit makes it differ; undoing the edit makes it the same again", () => {
    const template = small();
    const state = fromTemplate(template);
    const a = itemByKey(state, "a");
    const changed = run(state, { type: "item/update", id: a.id, patch: { hint: "Look twice." } });
    expect(sameAsTemplate(changed, template)).toBe(false);
    expect(
      sameAsTemplate(run(changed, { type: "item/update", id: a.id, patch: { hint: "" } }), template),
    ).toBe(true);
  });
});

describe("adding and editing items", () => {
  test("a new measure item asks for its label at the field, and its key follows the label", () => {
    let state = fromTemplate(starter("engine-alignment"));
    const final = sectionByKey(state, "final-alignment");
    state = run(state, { type: "item/add", sectionId: final.id, kind: "measure" });
    const added = allItems(state).find((i) => i.id === state.lastAdded)!;
    const s = state.sections.indexOf(sectionByKey(state, "final-alignment"));
    const i = state.sections[s].items.length - 1;
    expect(state.sections[s].items[i].id).toBe(added.id);
    expect(added).toMatchObject({ kind: "measure", unit: "in", required: true, autoKey: true });
    expect(problems(state).get(itemPath(s, i, "label"))).toEqual(["cannot be empty"]);

    state = run(
      state,
      { type: "item/update", id: added.id, patch: { label: "Coupling bolt torque" } },
      { type: "item/unit", id: added.id, unit: "lbfFt" },
      { type: "item/rule", id: added.id, patch: { nominal: "40", tolerance: "2" } },
    );
    const parsed = checkDraft(state);
    expect(parsed.ok).toBe(true);
    const item = parsed.ok ? (parsed.template.sections[s].items[i] as MeasureItem) : undefined;
    expect(item).toMatchObject({
      key: "coupling-bolt-torque",
      unit: "lbfFt",
      rule: { nominal: 40, tolerance: 2, unit: "lbfFt" },
    });
    // The torque unit is written lbf·ft beside a number (format.ts).
    expect(describeRule(item!.rule!)).toBe("40 ± 2 lbf·ft");
  });

  test("a key typed by hand stops following the label; a taken key is refused at the key field", () => {
    let state = fromTemplate(starter("engine-alignment"));
    const last = state.sections.at(-1)!;
    state = run(state, { type: "item/add", sectionId: last.id, kind: "check" });
    const id = state.lastAdded!;
    state = run(
      state,
      { type: "item/update", id, patch: { key: "time-afloat" } },
      { type: "item/update", id, patch: { label: "Something else" } },
    );
    expect(allItems(state).find((i) => i.id === id)!.key).toBe("time-afloat");
    const s = state.sections.length - 1;
    const at = state.sections[s].items.length - 1;
    // The first in reading order keeps the key; the later one is told where it is taken.
    expect(problems(state).get(itemPath(s, at, "key"))).toEqual([
      'item key "time-afloat" is already used at sections[2].items[0]',
    ]);
  });

  test("a label whose key is taken gets a numbered key instead", () => {
    let state = fromTemplate(small());
    state = run(state, { type: "item/add", sectionId: state.sections[0].id, kind: "check" });
    state = run(state, { type: "item/update", id: state.lastAdded!, patch: { label: "A" } });
    expect(allItems(state).find((i) => i.id === state.lastAdded)!.key).toBe("a-2");
    expect(slugKey("Shaft turns freely — by hand, 360°")).toBe("shaft-turns-freely-by-hand-360");
  });

  test("an acceptance rule with its minimum above its maximum is refused at the minimum", () => {
    let state = fromTemplate(starter("engine-alignment"));
    const time = itemByKey(state, "time-afloat");
    state = run(state, { type: "item/rule", id: time.id, patch: { min: "48", max: "24" } });
    expect(problems(state).get(itemPath(2, 0, "rule", "min"))).toEqual([
      "the minimum (48) is above the maximum (24)",
    ]);
  });

  test("a limit that is not a number is refused at its field; a decimal comma is read as a point", () => {
    let state = fromTemplate(starter("engine-alignment"));
    const time = itemByKey(state, "time-afloat");
    state = run(state, { type: "item/rule", id: time.id, patch: { max: "two days" } });
    expect(problems(state).get(itemPath(2, 0, "rule", "max"))).toEqual(["the maximum must be a number"]);
    expect(numberFrom("0,5")).toBe(0.5);
    expect(numberFrom(" 1e-3 ")).toBe("1e-3"); // exponents are refused everywhere a person types a number
    expect(numberFrom("")).toBeUndefined();
    expect(numberFrom("1.2.3")).toBe("1.2.3");
  });

  test("changing the unit keeps a rule of the same dimension and moves one of another onto the new unit", () => {
    let state = fromTemplate(starter("engine-alignment"));
    const gaps = itemByKey(state, "face-gaps");
    expect(gaps.accepts).toEqual(["in", "thou", "mm"]);
    state = run(state, { type: "item/unit", id: gaps.id, unit: "mm" });
    expect(itemByKey(state, "face-gaps")).toMatchObject({
      unit: "mm",
      accepts: ["mm", "in", "thou"],
      rule: { unit: "in" },
    });
    state = run(state, { type: "item/unit", id: gaps.id, unit: "psi" });
    expect(itemByKey(state, "face-gaps")).toMatchObject({
      unit: "psi",
      accepts: null,
      rule: { unit: "psi" },
    });
    state = run(
      state,
      { type: "item/accept", id: gaps.id, unit: "kPa", accepted: true },
      { type: "item/accept", id: gaps.id, unit: "bar", accepted: true },
    );
    expect(itemByKey(state, "face-gaps").accepts).toEqual(["psi", "kPa", "bar"]);
    state = run(
      state,
      { type: "item/accept", id: gaps.id, unit: "kPa", accepted: false },
      { type: "item/accept", id: gaps.id, unit: "bar", accepted: false },
    );
    expect(itemByKey(state, "face-gaps").accepts).toBeNull();
  });

  test("grid rows and columns and choice options are added, renamed, reordered and removed", () => {
    let state = fromTemplate(small());
    state = run(state, { type: "item/add", sectionId: state.sections[0].id, kind: "readings" });
    const id = state.lastAdded!;
    state = run(
      state,
      { type: "item/update", id, patch: { label: "Runout" } },
      { type: "line/add", itemId: id, list: "columns" },
      { type: "line/add", itemId: id, list: "columns" },
    );
    const [c1, c2, c3] = allItems(state).find((i) => i.id === id)!.columns;
    state = run(
      state,
      { type: "line/update", itemId: id, list: "columns", lineId: c1.id, patch: { label: "0°" } },
      { type: "line/update", itemId: id, list: "columns", lineId: c2.id, patch: { label: "90°" } },
      { type: "line/update", itemId: id, list: "columns", lineId: c3.id, patch: { label: "Spare" } },
      { type: "line/remove", itemId: id, list: "columns", lineId: c3.id },
      { type: "line/step", itemId: id, list: "columns", lineId: c2.id, by: -1 },
    );
    expect(
      allItems(state)
        .find((i) => i.id === id)!
        .columns.map((c) => [c.key, c.label]),
    ).toEqual([
      ["90", "90°"],
      ["0", "0°"],
    ]);

    state = run(state, { type: "item/add", sectionId: state.sections[0].id, kind: "choice" });
    const choice = state.lastAdded!;
    const s = 0;
    const at = state.sections[0].items.length - 1;
    expect(problems(state).get(itemPath(s, at, "options", 0, "label"))).toEqual(["cannot be empty"]);
    const [o1, o2] = allItems(state).find((i) => i.id === choice)!.options;
    state = run(
      state,
      { type: "item/update", id: choice, patch: { label: "Hose clamp type" } },
      {
        type: "line/update",
        itemId: choice,
        list: "options",
        lineId: o1.id,
        patch: { label: "Double, all stainless" },
      },
      {
        type: "line/update",
        itemId: choice,
        list: "options",
        lineId: o2.id,
        patch: { label: "Single", needsNote: true },
      },
    );
    const parsed = checkDraft(state);
    expect(parsed.ok).toBe(true);
    expect(parsed.ok && parsed.template.sections[0].items[at]).toMatchObject({
      options: [
        { key: "double-all-stainless", label: "Double, all stainless" },
        { key: "single", label: "Single", needsNote: true },
      ],
    });
  });
});

describe("calculations and their inputs", () => {
  test("the inputs offered are the template's items of the right kind and dimension", () => {
    const state = fromTemplate(starter("engine-alignment"));
    const angularity = itemByKey(state, "face-angularity");
    const keys = (input: string) =>
      itemsThatFit(state, angularity.id, "couplingFace", input).map((i) => i.key);
    // Length measures only: not the hours afloat, not the adjuster's threads per inch.
    expect(keys("diameter")).toEqual(["coupling-diameter", "front-mount-distance", "rear-mount-distance"]);
    expect(keys("gaps")).toEqual(["face-gaps", "rim-readings", "recheck-gaps"]);
    expect(itemsThatFit(state, angularity.id, "noSuchCalculation", "gaps")).toEqual([]);
  });

  test("a calc bound to an item that is removed is refused at the binding", () => {
    let state = fromTemplate(starter("engine-alignment"));
    state = run(state, { type: "item/remove", id: itemByKey(state, "coupling-diameter").id });
    const p = problems(state);
    // face-angularity moved up one place with the diameter gone: sections[2].items[3].
    expect(p.get(itemPath(2, 3, "inputs", "diameter", "item"))).toEqual([
      'no item "coupling-diameter" in this template',
    ]);
  });

  test("a calc bound to an item of the wrong unit is refused at the binding", () => {
    let state = fromTemplate(starter("engine-alignment"));
    state = run(state, { type: "item/unit", id: itemByKey(state, "coupling-diameter").id, unit: "psi" });
    expect(problems(state).get(itemPath(2, 4, "inputs", "diameter", "item"))).toEqual([
      '"coupling-diameter" is measured in psi (pressure) but this input takes in (length)',
    ]);
  });

  test("renaming an item's key carries the calc bindings with it", () => {
    let state = fromTemplate(starter("engine-alignment"));
    state = run(state, {
      type: "item/update",
      id: itemByKey(state, "coupling-diameter").id,
      patch: { key: "flange-diameter" },
    });
    expect(itemByKey(state, "face-angularity").inputs.diameter).toEqual({
      from: "item",
      item: "flange-diameter",
    });
    expect(itemByKey(state, "mount-moves").inputs.diameter).toEqual({
      from: "item",
      item: "flange-diameter",
    });
    expect(checkDraft(state).ok).toBe(true);
  });

  test("choosing another calculation keeps the bindings it also takes; missing inputs are named", () => {
    let state = fromTemplate(starter("engine-alignment"));
    const angularity = itemByKey(state, "face-angularity");
    state = run(state, { type: "calc/set", id: angularity.id, calc: "mountMoves" });
    expect(Object.keys(itemByKey(state, "face-angularity").inputs)).toEqual(["diameter", "gaps"]);
    expect(problems(state).get(itemPath(2, 4, "inputs"))).toEqual([
      'mountMoves needs the input "frontMount" (Coupling face to front mounts)',
      'mountMoves needs the input "rearMount" (Coupling face to rear mounts)',
    ]);
    state = run(
      state,
      {
        type: "calc/bind",
        id: angularity.id,
        input: "frontMount",
        binding: { from: "item", item: "front-mount-distance" },
      },
      {
        type: "calc/bind",
        id: angularity.id,
        input: "rearMount",
        binding: { from: "item", item: "rear-mount-distance" },
      },
      {
        type: "calc/bind",
        id: angularity.id,
        input: "shimStock",
        binding: { from: "value", text: "0.002, 0.005 0.010", as: "numbers" },
      },
    );
    const parsed = checkDraft(state);
    expect(parsed.ok && (parsed.template.sections[2].items[4] as any).inputs.shimStock).toEqual({
      value: [0.002, 0.005, 0.01],
    });
    state = run(state, {
      type: "calc/bind",
      id: angularity.id,
      input: "shimStock",
      binding: { from: "value", text: "thin ones", as: "numbers" },
    });
    expect(problems(state).get(itemPath(2, 4, "inputs", "shimStock", "value"))).toEqual([
      "expected a list of numbers",
    ]);
    state = run(state, { type: "calc/bind", id: angularity.id, input: "shimStock", binding: null });
    expect(checkDraft(state).ok).toBe(true);
  });
});

describe("moving items and sections", () => {
  const order = (state: EditorState) => state.sections.map((s) => s.items.map((i) => i.key).join(""));

  test("moving by keyboard goes one place at a time, across into the next section at the ends", () => {
    let state = fromTemplate(small());
    const c = itemByKey(state, "c");
    const d = itemByKey(state, "d");
    state = run(state, { type: "item/step", id: c.id, by: -1 });
    expect(order(state)).toEqual(["acb", "de"]);
    state = run(state, { type: "item/step", id: c.id, by: 1 }, { type: "item/step", id: c.id, by: 1 });
    expect(order(state)).toEqual(["ab", "cde"]);
    state = run(state, { type: "item/step", id: d.id, by: 1 }, { type: "item/step", id: d.id, by: 1 });
    expect(order(state)).toEqual(["ab", "ced"]); // the last item of the last section stays put
    state = run(state, { type: "item/step", id: itemByKey(state, "a").id, by: -1 });
    expect(order(state)).toEqual(["ab", "ced"]);
  });

  test("a drop lands on the slot it was shown at, in its own section or another", () => {
    let state = fromTemplate(small());
    const [one, two] = state.sections;
    // Dropped between b and c (slot 2) with a still in place: a ends up where that gap was.
    state = run(state, { type: "item/move", id: itemByKey(state, "a").id, sectionId: one.id, index: 2 });
    expect(order(state)).toEqual(["bac", "de"]);
    state = run(state, { type: "item/move", id: itemByKey(state, "c").id, sectionId: one.id, index: 0 });
    expect(order(state)).toEqual(["cba", "de"]);
    state = run(state, { type: "item/move", id: itemByKey(state, "b").id, sectionId: two.id, index: 1 });
    expect(order(state)).toEqual(["ca", "dbe"]);
    state = run(state, { type: "item/move", id: itemByKey(state, "e").id, sectionId: one.id, index: 99 });
    expect(order(state)).toEqual(["cae", "db"]);
  });

  test("sections are added, renamed, reordered and removed; an empty one is refused until it has an item", () => {
    let state = fromTemplate(small());
    state = run(state, { type: "section/add" });
    const id = state.lastAdded!;
    state = run(state, { type: "section/update", id, patch: { title: "Paperwork" } });
    expect(state.sections[2]).toMatchObject({ key: "paperwork", title: "Paperwork", items: [] });
    expect(problems(state).get(sectionPath(2, "items"))).toEqual(["needs at least one item"]);
    state = run(state, { type: "item/add", sectionId: id, kind: "initials" });
    state = run(state, { type: "item/update", id: state.lastAdded!, patch: { label: "Handed over" } });
    expect(checkDraft(state).ok).toBe(true);
    state = run(
      state,
      { type: "section/step", id, by: -1 },
      { type: "section/step", id, by: -1 },
      { type: "section/step", id, by: -1 },
    );
    expect(state.sections.map((s) => s.key)).toEqual(["paperwork", "one", "two"]);
    state = run(state, { type: "section/update", id: state.sections[1].id, patch: { title: "" } });
    expect(problems(state).get(sectionPath(1, "title"))).toEqual(["cannot be empty"]);
    state = run(state, { type: "section/remove", id: state.sections[1].id });
    expect(state.sections.map((s) => s.key)).toEqual(["paperwork", "two"]);
  });

  test("the title and purpose are required", () => {
    const state = run(fromTemplate(small()), { type: "template/set", field: "purpose", value: "  " });
    expect(problems(state).get("purpose")).toEqual(["cannot be empty"]);
    expect((toTemplateInput(state) as any).key).toBe("small");
  });
});
