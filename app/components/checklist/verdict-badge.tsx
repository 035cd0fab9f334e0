import type { Verdict, VerdictStatus } from "~/lib/templates";

/** Each verdict has a word and a shape, with colour only as a third cue (sunlight, colour blindness). */
const looks: Record<VerdictStatus, { shape: string; word: string; className: string }> = {
  unanswered: { shape: "○", word: "Not answered", className: "border-rule text-ink-soft" },
  incomplete: { shape: "◐", word: "Incomplete", className: "border-brass text-ink" },
  invalid: { shape: "✕", word: "Does not fit", className: "border-fault bg-fault-light text-fault" },
  ok: { shape: "✓", word: "Good", className: "border-sound bg-sound-light text-sound" },
  "out-of-range": { shape: "▲", word: "Outside limit", className: "border-fault bg-fault-light text-fault" },
  "needs-note": { shape: "✎", word: "Needs a note", className: "border-brass bg-brass-light text-ink" },
  noted: { shape: "–", word: "Not applicable, reason given", className: "border-rule text-ink-soft" },
  // A finding with its corrective action written down is still a finding: never a green tick.
  "action-noted": {
    shape: "⚑",
    word: "Finding, action noted",
    className: "border-brass bg-brass-light text-ink",
  },
};

export function VerdictBadge({ verdict }: { verdict: Verdict }) {
  const look = looks[verdict.status];
  return (
    <div
      className={`flex items-start gap-2 rounded-md border-2 px-3 py-2 ${look.className}`}
      data-verdict={verdict.status}
    >
      <span aria-hidden="true" className="text-xl leading-none font-bold">
        {look.shape}
      </span>
      <span>
        <strong>{look.word}.</strong> <span className="text-ink">{verdict.message}</span>
      </span>
    </div>
  );
}
