import { canonicalJson } from "./canonical";
import type { RecordRevision } from "./types";
import type { Item } from "~/lib/templates";

/** Append-only kinds show their history as attempts (or photos); a calc item has no entry of its own. */
const SHOWN_AS_ATTEMPTS = new Set<Item["kind"]>(["measure", "readings", "photo", "calc"]);

function split(value: unknown): { answer: string; note?: string } {
  if (value && typeof value === "object" && "note" in value) {
    const { note, ...answer } = value as { note?: unknown };
    return {
      answer: canonicalJson(answer),
      note: typeof note === "string" && note.trim() ? note.trim() : undefined,
    };
  }
  return { answer: canonicalJson(value ?? null) };
}

/**
 * The earlier entries worth printing under an item's current value, oldest first: a revision that
 * says nothing the current entry does not (the same answer, with no note or the same note — e.g.
 * "Failed" before its note was written) is left out, and so is a repeat of the revision before it.
 */
export function earlierRevisions(item: Item, history: RecordRevision[] | undefined, currentRev: number) {
  if (SHOWN_AS_ATTEMPTS.has(item.kind) || !history) return [];
  const sorted = history.filter((r) => r.rev <= currentRev).sort((a, b) => a.rev - b.rev);
  const current = sorted.at(-1);
  if (!current) return [];
  const now = split(current.value);
  const shown: RecordRevision[] = [];
  let previous: string | undefined;
  for (const revision of sorted.slice(0, -1)) {
    const then = split(revision.value);
    const key = `${then.answer}\n${then.note ?? ""}`;
    const repeatsCurrent = then.answer === now.answer && (!then.note || then.note === now.note);
    if (!repeatsCurrent && key !== previous) shown.push(revision);
    previous = key;
  }
  return shown;
}
