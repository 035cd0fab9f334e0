import type { VerdictStatus } from "~/lib/templates/rules";

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
