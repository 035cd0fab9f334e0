import { describe, expect, test } from "vitest";
import { earlierRevisions } from "~/lib/record/earlier";
import { inWorkOrder } from "~/lib/record/order";
import { evaluate, type Item } from "~/lib/templates";
import { issueRecordSchema } from "~/lib/validation/records";
import { commissioningRecordFixture } from "../../support/record-fixture";

const check: Item = { kind: "check", key: "stern-bearing", label: "Stern bearing", required: true };
const revision = (rev: number, value: unknown) => ({
  rev,
  value,
  by: "Niamh Forde",
  at: "2025-05-12T08:00:00Z",
});

describe("earlier entries under an item's current value", () => {
  test("leave out a revision that says nothing the current one does not", () => {
    // "Failed" before its note was written, then "Failed" with the note: nothing earlier to show.
    const history = [
      revision(1, { result: "fail" }),
      revision(2, { result: "fail", note: "Bearing replaced." }),
    ];
    expect(earlierRevisions(check, history, 2)).toEqual([]);
  });

  test("keep a revision whose answer differs, once, however often it was saved", () => {
    const history = [
      revision(1, { result: "pass" }),
      revision(2, { result: "pass" }),
      revision(3, { result: "fail", note: "Play at the strut." }),
    ];
    expect(earlierRevisions(check, history, 3).map((r) => r.rev)).toEqual([1]);
  });

  test("leave attempts of a measure to the attempts table", () => {
    const measure: Item = { kind: "measure", key: "gap", label: "Gap", unit: "in", required: true };
    expect(earlierRevisions(measure, [revision(1, {}), revision(2, {})], 2)).toEqual([]);
  });
});

test("a finding's account comes apart from what it asks of the technician", () => {
  const item: Item = {
    kind: "measure",
    key: "face-runout",
    label: "Face runout",
    unit: "in",
    required: true,
    rule: { max: 0.001, unit: "in" },
  };
  const value = { attempts: [{ value: 0.0016, unit: "in", at: "2025-05-12T08:00:00Z", by: "Niamh Forde" }] };
  const verdict = evaluate(item, value);
  expect(verdict.message).toMatch(/Write the corrective action/);
  expect(verdict.account).toBe("0.0016 in is above the upper limit of 0.001 in.");
  expect(evaluate(item, { ...value, note: "Refaced." }).account).toBe(verdict.account);
});

test("a record's checklists come in the order the work is done", () => {
  const [shaft, alignment] = commissioningRecordFixture().checklists;
  expect(inWorkOrder([alignment!, shaft!]).map((c) => c.templateKey)).toEqual([
    "propeller-shaft-and-coupling",
    "engine-alignment",
  ]);
});

describe("the surveyors a record is issued to", () => {
  const read = (emails: string) => issueRecordSchema.safeParse({ intent: "issue-record", emails });

  test("take a name before the address, and bare addresses by comma, space or line", () => {
    expect(
      read("Nessa Quick <Nessa.Quick@survey.example>\na@survey.example, b@survey.example").data?.emails,
    ).toEqual([
      { email: "nessa.quick@survey.example", name: "Nessa Quick" },
      { email: "a@survey.example" },
      { email: "b@survey.example" },
    ]);
    expect(read("Quick, Nessa <nessa@survey.example>").data?.emails).toEqual([
      { email: "nessa@survey.example", name: "Quick, Nessa" },
    ]);
  });

  test("refuse what is not an address", () => {
    expect(read("Nessa Quick").success).toBe(false);
  });
});
