import { describe, expect, test } from "vitest";
import { mergeLog } from "~/lib/sync/merge";
import {
  describeValue,
  evaluate,
  liveAttempts,
  strikeOf,
  valueSchemaFor,
  type Strike,
} from "~/lib/templates";
import { itemOf, templateOf } from "./fixtures";

/** Issue 15 §1 and issue 13 §4: a mistaken attempt is struck through with a reason and counts for nothing. */
const A = "00000000-0000-4000-8000-00000000000a";
const B = "00000000-0000-4000-8000-00000000000b";
const C = "00000000-0000-4000-8000-00000000000c";
const at = (h: number) => `2026-05-01T${String(h).padStart(2, "0")}:00:00Z`;
const attempt = (id: string, h: number, value: number) => ({
  id,
  value,
  unit: "in" as const,
  at: at(h),
  by: "T",
});
const strike = (attemptId: string, h: number, reason: string, by = "T"): Strike => ({
  attempt: attemptId,
  reason,
  at: at(h),
  by,
});

const t = templateOf(
  {
    kind: "measure",
    key: "face-runout",
    label: "Face runout",
    unit: "in",
    accepts: ["in", "mm"],
    rule: { min: 0, max: 0.001, unit: "in" },
  },
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
const faceRunout = itemOf(t, "face-runout");

describe("struck attempts", () => {
  test("the verdict skips a struck attempt: the last attempt not struck is reported", () => {
    // 0.0009 in is within 0.001 in; the later 0.009 in was a slip of the finger, struck through.
    const value = {
      attempts: [attempt(A, 9, 0.0009), attempt(B, 10, 0.009)],
      strikes: [strike(B, 11, "typed 0.009 for 0.0009")],
    };
    expect(evaluate(faceRunout, { attempts: value.attempts }).status).toBe("out-of-range");
    expect(evaluate(faceRunout, value).status).toBe("ok");
    expect(liveAttempts(value).map((a) => a.id)).toEqual([A]);
    expect(strikeOf(value, value.attempts[1]!)?.reason).toBe("typed 0.009 for 0.0009");
    expect(strikeOf(value, value.attempts[0]!)).toBeUndefined();
  });

  test("every attempt struck: the item is unanswered again (and still required)", () => {
    const value = { attempts: [attempt(A, 9, 0.0009)], strikes: [strike(A, 10, "wrong shaft")] };
    expect(evaluate(faceRunout, value)).toMatchObject({ status: "unanswered", done: false });
  });

  test("calculation inputs skip a struck set of readings", () => {
    const angularity = itemOf(t, "angularity");
    // Common practice: 0.001 in of face-gap difference per inch of coupling diameter (see rules.test.ts).
    const good = { id: A, cells: [[0.006, 0.002, 0.003, 0.003]], unit: "in", at: at(9), by: "T" };
    const bad = { id: B, cells: [[0.06, 0.002, 0.003, 0.003]], unit: "in", at: at(10), by: "T" };
    const responses = {
      diameter: { attempts: [attempt(C, 8, 4)] },
      gaps: { attempts: [good, bad], strikes: [strike(B, 11, "misread the feeler")] },
    };
    expect(evaluate(angularity, undefined, { template: t, responses }).status).toBe("ok");
    const unstruck = { ...responses, gaps: { attempts: [good, bad] } };
    expect(evaluate(angularity, undefined, { template: t, responses: unstruck }).status).toBe("out-of-range");
  });

  test("a strike must name an attempt of the item, once, with a reason", () => {
    const schema = valueSchemaFor(faceRunout);
    const attempts = [attempt(A, 9, 0.0009)];
    expect(schema.safeParse({ attempts, strikes: [strike(A, 10, "slip")] }).success).toBe(true);
    expect(schema.safeParse({ attempts, strikes: [strike(B, 10, "slip")] }).success).toBe(false);
    expect(schema.safeParse({ attempts, strikes: [strike(A, 10, "  ")] }).success).toBe(false);
    expect(
      schema.safeParse({ attempts, strikes: [strike(A, 10, "slip"), strike(A, 11, "again")] }).success,
    ).toBe(false);
  });

  test("describes the struck attempt with its reason, who and when", () => {
    const value = {
      attempts: [attempt(A, 9, 0.0009), attempt(B, 10, 0.009)],
      strikes: [strike(B, 11, "typed 0.009 for 0.0009", "Ada Tern")],
    };
    expect(describeValue(faceRunout, value)).toBe(
      "0.0009 in (attempt 1, T); attempt 2 struck through by Ada Tern (1 May 2026, 11:00 UTC): typed 0.009 for 0.0009",
    );
  });
});

describe("strikes merge as an append-only set keyed by attempt", () => {
  const attempts = [attempt(A, 9, 1), attempt(B, 10, 2)];

  test("two tablets striking different attempts: both strikes kept, in the same order either way", () => {
    const mine = { attempts, strikes: [strike(B, 12, "mine")] };
    const theirs = { attempts, strikes: [strike(A, 11, "theirs")] };
    const one = mergeLog(theirs, mine, false);
    const other = mergeLog(mine, theirs, false);
    expect(one).toEqual(other);
    expect((one as { value: { strikes: Strike[] } }).value.strikes.map((s) => s.attempt)).toEqual([A, B]);
  });

  test("two tablets striking the same attempt never conflict; the first seen stays", () => {
    const server = { attempts, strikes: [strike(A, 11, "first")] };
    const merged = mergeLog(server, { attempts, strikes: [strike(A, 12, "second")] }, false);
    expect(merged).toEqual({ value: { attempts, strikes: [strike(A, 11, "first")] } });
  });

  test("a strike is never removed, even by an entry on the current revision that leaves it out", () => {
    const server = { attempts, strikes: [strike(A, 11, "slip")] };
    const merged = mergeLog(server, { attempts }, true) as { value: { strikes?: Strike[] } };
    expect(merged.value.strikes).toEqual([strike(A, 11, "slip")]);
  });

  test("no strikes field when there is none: older responses merge to the same value", () => {
    expect(mergeLog({ attempts }, { attempts }, false)).toEqual({ value: { attempts } });
  });
});
