import { describe, expect, test } from "vitest";
import { parseTemplate, progress, type Template } from "~/lib/templates";
import { grid, measured, signed } from "./fixtures";

const parsed = parseTemplate({
  key: "progress-test",
  version: 1,
  title: "Progress",
  purpose: "Counting what is left.",
  sections: [
    {
      key: "coupling",
      title: "Coupling",
      items: [
        { kind: "measure", key: "diameter", label: "Diameter", unit: "in" },
        {
          kind: "readings",
          key: "gaps",
          label: "Gaps",
          rows: [{ key: "gap", label: "Gap" }],
          columns: ["top", "bottom", "port", "starboard"].map((key) => ({ key, label: key })),
          unit: "in",
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
        { kind: "photo", key: "photo", label: "Photo", required: false },
      ],
    },
    {
      key: "finish",
      title: "Finish",
      items: [
        { kind: "check", key: "bolts", label: "Bolts" },
        { kind: "measure", key: "runout", label: "Runout", unit: "in", rule: { max: 0.001, unit: "in" } },
        { kind: "text", key: "remarks", label: "Remarks", required: false },
        { kind: "initials", key: "done", label: "Done" },
      ],
    },
  ],
});
const template = (parsed.ok ? parsed.template : undefined) as Template;

describe("progress", () => {
  test("an empty checklist: every required item is left, optional ones are not counted", () => {
    const p = progress(template, {});
    expect(p.sections.map((s) => [s.key, s.required, s.done, s.left])).toEqual([
      ["coupling", 3, 0, ["diameter", "gaps", "angularity"]],
      ["finish", 3, 0, ["bolts", "runout", "done"]],
    ]);
    expect(p.overall).toMatchObject({ required: 6, done: 0, attention: [] });
    expect(p.complete).toBe(false);
  });

  test("a calc item is done once the items it reads are in", () => {
    const p = progress(template, {
      diameter: measured([4, "in"]),
      gaps: grid("in", [[0.004, 0.003, 0.0035, 0.0035]]),
    });
    expect(p.sections[0]).toMatchObject({ required: 3, done: 3, left: [] });
    expect(p.overall.done).toBe(3);
  });

  test("findings without notes are left and want attention, optional items included", () => {
    const p = progress(template, {
      bolts: { result: "fail" },
      runout: measured([0.002, "in"]),
      photo: { photos: [{ id: "not-a-uuid" }] },
    });
    expect(p.sections[1].left).toEqual(["bolts", "runout", "done"]);
    expect(p.overall.attention).toEqual(["photo", "bolts", "runout"]);
    expect(p.verdicts.runout.status).toBe("out-of-range");
  });

  test("with the notes written and everything answered, the checklist is complete", () => {
    const p = progress(template, {
      diameter: measured([4, "in"]),
      gaps: grid("in", [[0.004, 0.003, 0.0035, 0.0035]]),
      bolts: { result: "fail", note: "One bolt replaced with the right grade." },
      runout: { ...measured([0.002, "in"]), note: "Accepted by the lead: flexible coupling." },
      done: signed,
    });
    expect(p.overall).toEqual({ required: 6, done: 6, left: [], attention: [] });
    expect(p.complete).toBe(true);
  });
});
