import { describe, expect, it } from "vitest";
import { mergeLog, mergeRuleFor } from "~/lib/sync/merge";

/** Issue 13 §4: the merge rule of each item kind, as the server applies it. */
const attempt = (id: string | undefined, at: string, value: number) => ({
  ...(id ? { id } : {}),
  value,
  unit: "in",
  at,
  by: "T",
});
const A = "00000000-0000-4000-8000-00000000000a";
const B = "00000000-0000-4000-8000-00000000000b";
const C = "00000000-0000-4000-8000-00000000000c";

describe("merge rules by kind", () => {
  it("makes attempts and photos logs, and every other kind a scalar", () => {
    expect(["measure", "readings", "photo"].map((k) => mergeRuleFor(k as any))).toEqual([
      "log",
      "log",
      "log",
    ]);
    expect(["check", "choice", "text", "initials", "calc"].map((k) => mergeRuleFor(k as any))).toEqual([
      "scalar",
      "scalar",
      "scalar",
      "scalar",
      "scalar",
    ]);
  });

  it("adds both tablets' attempts, once each, ordered by time taken then id — whichever arrives first", () => {
    const old = attempt(undefined, "2026-05-01T08:00:00Z", 0.004); // recorded before ids existed
    const server = { attempts: [old, attempt(A, "2026-05-01T09:00:00Z", 0.003)] };
    const mine = {
      attempts: [
        old,
        attempt(B, "2026-05-01T09:00:00Z", 0.002),
        attempt(C, "2026-05-01T08:30:00+00:00", 0.0025),
      ],
    };
    const one = mergeLog(server, mine, false);
    const other = mergeLog(mine, server, false);
    expect(one).toEqual(other);
    expect((one as any).value.attempts.map((a: any) => a.id ?? "old")).toEqual(["old", C, A, B]);
  });

  it("never removes an attempt, even when an entry on the current revision leaves one out", () => {
    const server = {
      attempts: [attempt(A, "2026-05-01T09:00:00Z", 1), attempt(B, "2026-05-01T10:00:00Z", 2)],
    };
    const merged = mergeLog(server, { attempts: [attempt(A, "2026-05-01T09:00:00Z", 1)] }, true);
    expect((merged as any).value.attempts).toHaveLength(2);
  });

  it("keeps a different note on both sides as a conflict, but takes an edit made on the current value", () => {
    const server = { attempts: [attempt(A, "2026-05-01T09:00:00Z", 1)], note: "Lead's note" };
    const mine = { attempts: [attempt(B, "2026-05-01T10:00:00Z", 2)], note: "My note" };
    expect(mergeLog(server, mine, false)).toEqual({ conflict: true });
    expect((mergeLog(server, mine, true) as any).value.note).toBe("My note");
    expect((mergeLog(server, { attempts: mine.attempts }, false) as any).value.note).toBe("Lead's note");
  });

  it("adds photos to the server's, each once, in the server's order with new ones after", () => {
    const p = (id: string) => ({ id });
    expect(mergeLog({ photos: [p(B), p(A)] }, { photos: [p(C), p(A)] }, false)).toEqual({
      value: { photos: [p(B), p(A), p(C)] },
    });
  });

  it("lets someone who saw the server's photos remove one taken by mistake", () => {
    const p = (id: string) => ({ id });
    expect(mergeLog({ photos: [p(A), p(B)] }, { photos: [p(A)] }, true)).toEqual({
      value: { photos: [p(A)] },
    });
  });
});
