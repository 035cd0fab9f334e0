import type { Item } from "~/lib/templates/schema";
import type { Verdict, VerdictStatus } from "~/lib/templates/rules";

/**
 * The words and shapes of a verdict: every screen and the PDF say a verdict the same way, and never
 * by colour alone. A finding with its corrective action written down is still a finding: never a
 * tick.
 */
export const verdictWords: Record<VerdictStatus, { shape: string; word: string }> = {
  unanswered: { shape: "○", word: "Not answered" },
  incomplete: { shape: "◐", word: "Incomplete" },
  invalid: { shape: "✕", word: "Does not fit" },
  ok: { shape: "✓", word: "Good" },
  "out-of-range": { shape: "▲", word: "Outside limit" },
  "needs-note": { shape: "✎", word: "Needs a note" },
  noted: { shape: "–", word: "Not applicable, reason given" },
  "action-noted": { shape: "⚑", word: "Finding, action noted" },
};

/** A calculation's own verdict (pass / fail / figures only), as a result line says it. */
export const calcVerdictWords: Record<"pass" | "fail" | "info", string> = {
  pass: "Within the rule",
  fail: "Outside the rule",
  info: "Figures only",
};

export const verdictInWords = (status: VerdictStatus) => verdictWords[status].word;

/** The shape a verdict is drawn with in the record, never colour alone. */
export type RecordShape = "tick" | "triangle" | "circle" | "square" | "cross";

export interface RecordVerdict {
  shape: RecordShape;
  /** What the colour says, third after the shape and the words. */
  tone: "sound" | "finding" | "fault" | "quiet";
  words: string;
  /** What the note is, when the item carries one: "Corrective action", "Reason"… */
  noteLabel: string;
  /** The evaluator's account of what is out ("0.0016 in is above the upper limit of 0.001 in."). */
  detail?: string;
}

/** Whether an item is judged against a stated limit. */
function hasRule(item: Item): boolean {
  return (item.kind === "measure" || item.kind === "readings") && item.rule !== undefined;
}

/**
 * How a verdict reads in the record (the PDF and the record's web view), more fully than a badge
 * says it: what was found and what the note under it is. The verdict itself always comes from the
 * one evaluator (rules.ts).
 */
export function verdictOnRecord(item: Item, verdict: Verdict): RecordVerdict {
  // A finding's own account (rules.ts keeps it apart from what it asks of the technician).
  const detail = verdict.account ?? verdict.message;
  switch (verdict.status) {
    case "ok": {
      if (item.kind === "check") return { shape: "tick", tone: "sound", words: "Passed", noteLabel: "Note" };
      if (item.kind === "initials")
        return { shape: "tick", tone: "sound", words: "Confirmed", noteLabel: "Note" };
      if (item.kind === "calc") {
        return verdict.outcome?.verdict === "pass"
          ? { shape: "tick", tone: "sound", words: "Within limit", noteLabel: "Note" }
          : { shape: "square", tone: "quiet", words: "Computed (no limit applies)", noteLabel: "Note" };
      }
      if (hasRule(item)) return { shape: "tick", tone: "sound", words: "Within limit", noteLabel: "Note" };
      const words = {
        measure: "Recorded",
        readings: "Recorded",
        choice: "Recorded",
        text: "Written",
        photo: "Photographed",
      } as const;
      return {
        shape: "square",
        tone: "quiet",
        words: words[item.kind as keyof typeof words] ?? "Recorded",
        noteLabel: "Note",
      };
    }
    case "noted":
    case "action-noted":
      switch (verdict.finding) {
        case "fail":
          return {
            shape: "triangle",
            tone: "finding",
            words: "Failed, action recorded",
            noteLabel: "Action taken",
          };
        case "not-applicable":
          return { shape: "circle", tone: "quiet", words: "Not applicable", noteLabel: "Reason" };
        case "flagged-option":
          return { shape: "triangle", tone: "finding", words: "Finding recorded", noteLabel: "Note" };
        default:
          return {
            shape: "triangle",
            tone: "finding",
            words: "Outside limit, corrective action recorded",
            noteLabel: "Corrective action",
            detail,
          };
      }
    case "out-of-range":
      return {
        shape: "triangle",
        tone: "fault",
        words: "Outside limit, no corrective action recorded",
        noteLabel: "Note",
        detail,
      };
    case "needs-note":
      return { shape: "triangle", tone: "fault", words: "Finding without its note", noteLabel: "Note" };
    case "unanswered":
      return {
        shape: "circle",
        tone: "quiet",
        words: item.required ? "Not answered" : "Not answered (optional)",
        noteLabel: "Note",
      };
    case "incomplete":
      return { shape: "cross", tone: "fault", words: "Incomplete", noteLabel: "Note", detail };
    case "invalid":
      return {
        shape: "cross",
        tone: "fault",
        words: "Entry does not fit the item",
        noteLabel: "Note",
        detail,
      };
  }
}
