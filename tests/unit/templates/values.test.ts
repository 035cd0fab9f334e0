import { describe, expect, test } from "vitest";
import { valueSchemaFor, valueSchemas } from "~/lib/templates";
import { grid, measured, templateOf } from "./fixtures";

const t = templateOf(
  { kind: "measure", key: "gap", label: "Gap", unit: "in", accepts: ["in", "mm"] },
  {
    kind: "readings",
    key: "gaps",
    label: "Gaps",
    rows: [{ key: "gap", label: "Gap" }],
    columns: ["top", "bottom"].map((key) => ({ key, label: key })),
    unit: "thou",
  },
  {
    kind: "choice",
    key: "seal",
    label: "Seal",
    options: [
      { key: "gland", label: "Gland" },
      { key: "face", label: "Face" },
    ],
  },
  { kind: "photo", key: "photos", label: "Photos" },
);
const [gap, gaps, seal, photos] = t.sections[0].items;

function issues(
  schema: {
    safeParse(v: unknown): {
      success: boolean;
      error?: { issues: { path: PropertyKey[]; message: string }[] };
    };
  },
  value: unknown,
) {
  const result = schema.safeParse(value);
  return result.success ? [] : result.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
}

describe("response values are refused at the field", () => {
  test("a measure in a unit the item does not take", () => {
    expect(issues(valueSchemaFor(gap), measured([0.1, "mm"]))).toEqual([]);
    expect(issues(valueSchemaFor(gap), measured([0.1, "mm"], [3, "thou"]))).toEqual([
      "attempts.1.unit: this item takes in or mm, not thou",
    ]);
  });

  test("a reading that is not a number, a time that is not ISO 8601, nobody named", () => {
    expect(
      issues(valueSchemas.measure, {
        attempts: [{ value: "0.003", unit: "in", at: "2025-05-14T09:30:00Z", by: "tech-7" }],
      }),
    ).toEqual(["attempts.0.value: expected a number"]);
    expect(
      issues(valueSchemas.measure, { attempts: [{ value: 0.003, unit: "in", at: "14/05/2025", by: "" }] }),
    ).toEqual([
      "attempts.0.at: expected a date and time in ISO 8601, like 2025-05-14T09:30:00Z",
      "attempts.0.by: cannot be empty",
    ]);
    expect(
      issues(valueSchemas.measure, {
        attempts: [{ value: Infinity, unit: "in", at: "2025-05-14T09:30:00+02:00", by: "t" }],
      }),
    ).toEqual(["attempts.0.value: expected a number"]);
  });

  test("a grid with a missing cell, or a row too many", () => {
    expect(issues(valueSchemaFor(gaps), grid("thou", [[4, null]]))).toEqual([]);
    expect(issues(valueSchemaFor(gaps), grid("thou", [[4]]))).toEqual([
      'attempts.0.cells.0: expected 2 readings in row "Gap", got 1',
    ]);
    expect(
      issues(
        valueSchemaFor(gaps),
        grid("thou", [
          [4, 3],
          [1, 1],
        ]),
      ),
    ).toEqual(["attempts.0.cells: expected 1 rows, got 2"]);
  });

  test("an option that is not offered", () => {
    expect(issues(valueSchemaFor(seal), { option: "lip" })).toEqual(["option: expected one of gland, face"]);
  });

  test("a photo that is not a UUID, or the same photo twice", () => {
    const id = "0b0e7f6c-5a3d-4c2b-9e1f-7a6b5c4d3e2f";
    expect(issues(valueSchemaFor(photos), { photos: [{ id, sha256: "a".repeat(64) }] })).toEqual([]);
    expect(issues(valueSchemaFor(photos), { photos: [{ id: "IMG_0042" }] })).toEqual([
      "photos.0.id: expected a UUID",
    ]);
    expect(issues(valueSchemaFor(photos), { photos: [{ id }, { id }] })).toEqual([
      "photos.1.id: the same photo twice",
    ]);
  });

  test("unknown fields are refused rather than silently kept", () => {
    expect(issues(valueSchemas.check, { result: "pass", verdict: "ok" })).toEqual([
      ': Unrecognized key: "verdict"',
    ]);
  });
});
