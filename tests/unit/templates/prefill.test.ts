import { describe, expect, test } from "vitest";
import { evaluate, FROM_JOB, parseTemplate, prefillResponses, type JobEquipment } from "~/lib/templates";
import { measured, templateOf } from "./fixtures";

// Issue 12 §2: items the job already knows are filled from its equipment, and can be overridden
// with a note.
const inchJob: JobEquipment = {
  ratedRpmMin: 3000,
  ratedRpmMax: 3200,
  gearRatio: 2.5,
  propDiameterIn: 18,
  propPitchIn: 14,
  shaftSystem: "inch",
  shaftDiameterIn: 1.25,
  shaftDiameterMm: undefined,
  systemVolts: 24,
};
const metricJob: JobEquipment = {
  ...inchJob,
  shaftSystem: "metric",
  shaftDiameterIn: 1.378,
  shaftDiameterMm: 35,
};

const template = templateOf(
  { kind: "measure", key: "rpm-low", label: "Rated rpm, lowest", unit: "rpm", fromJob: "ratedRpmMin" },
  {
    kind: "measure",
    key: "shaft",
    label: "Shaft",
    unit: "in",
    accepts: ["in", "mm"],
    fromJob: "shaftDiameter",
  },
  { kind: "measure", key: "volts", label: "System voltage", unit: "V", fromJob: "systemVoltage" },
  {
    kind: "choice",
    key: "system",
    label: "Shaft system",
    fromJob: "shaftSystem",
    options: [
      { key: "inch", label: "Inch" },
      { key: "metric", label: "Metric" },
    ],
  },
  { kind: "measure", key: "typed", label: "Not from the job", unit: "in" },
);
const AT = "2026-12-02T08:00:00Z";

describe("prefill from the job's equipment", () => {
  test("fills every item that names a fact, in the shaft's own system, and nothing else", () => {
    const inch = prefillResponses(template, inchJob, {}, AT);
    expect(inch).toEqual({
      "rpm-low": { attempts: [{ value: 3000, unit: "rpm", at: AT, by: FROM_JOB }] },
      shaft: { attempts: [{ value: 1.25, unit: "in", at: AT, by: FROM_JOB }] },
      volts: { attempts: [{ value: 24, unit: "V", at: AT, by: FROM_JOB }] },
      system: { option: "inch" },
    });
    const metric = prefillResponses(template, metricJob, {}, AT);
    expect(metric.shaft).toEqual({ attempts: [{ value: 35, unit: "mm", at: AT, by: FROM_JOB }] });
    expect(metric.system).toEqual({ option: "metric" });
  });

  test("never overwrites an answer already given", () => {
    const given = { "rpm-low": measured([2900, "rpm"]) };
    expect(prefillResponses(template, inchJob, given, AT)["rpm-low"]).toBeUndefined();
  });

  test("a prefilled value is a good answer; an override needs a note saying why", () => {
    const item = template.sections[0].items[0];
    const fromJob = prefillResponses(template, inchJob, {}, AT)["rpm-low"] as ReturnType<typeof measured>;
    expect(evaluate(item, fromJob).status).toBe("ok");
    const overridden = { attempts: [...fromJob.attempts, ...measured([3100, "rpm"]).attempts] };
    expect(evaluate(item, overridden)).toMatchObject({ status: "needs-note", finding: "changed-from-job" });
    expect(evaluate(item, overridden).message).toMatch(
      /Changed from the job's equipment \(3000 rpm\) to 3100 rpm/,
    );
    expect(evaluate(item, { ...overridden, note: "Maker's sheet for this serial says 3100." }).status).toBe(
      "ok",
    );
    // The same figure entered again in another unit is no override (25.4 mm = 1 in exactly).
    const shaft = template.sections[0].items[1];
    const same = {
      attempts: [
        ...(prefillResponses(template, inchJob, {}, AT).shaft as ReturnType<typeof measured>).attempts,
        ...measured([31.75, "mm"]).attempts,
      ],
    };
    expect(evaluate(shaft, same).status).toBe("ok");
  });

  test("the loader refuses a fact an item cannot hold", () => {
    const problems = (item: object) => {
      const parsed = parseTemplate({
        key: "t",
        version: 1,
        title: "T",
        purpose: "P.",
        sections: [{ key: "s", title: "S", items: [item] }],
      });
      return parsed.ok ? [] : parsed.problems.map((p) => `${p.path}: ${p.message}`);
    };
    expect(problems({ kind: "measure", key: "a", label: "A", unit: "in", fromJob: "shaftDiameter" })).toEqual(
      [
        "sections[0].items[0].fromJob: the job gives its shaft diameter in mm, which this item does not accept",
      ],
    );
    expect(problems({ kind: "measure", key: "a", label: "A", unit: "in", fromJob: "shaftSystem" })).toEqual([
      "sections[0].items[0].fromJob: the job's shaft system is one of a list: only a choice item takes it",
    ]);
    expect(
      problems({
        kind: "choice",
        key: "a",
        label: "A",
        fromJob: "shaftSystem",
        options: [
          { key: "inch", label: "Inch" },
          { key: "sae", label: "SAE" },
        ],
      }),
    ).toEqual([
      "sections[0].items[0].fromJob: the job's shaft system can be metric, which this item has no option for",
    ]);
    expect(problems({ kind: "measure", key: "a", label: "A", unit: "in", fromJob: "hullColour" })[0]).toMatch(
      /^sections\[0\]\.items\[0\]\.fromJob: expected one of "ratedRpmMin"/,
    );
  });
});
