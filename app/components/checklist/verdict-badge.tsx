import { verdictWords } from "~/lib/format/verdicts";
import type { Verdict, VerdictStatus } from "~/lib/templates";

/** The colour is the third cue, after the shape and the word (sunlight, colour blindness). */
const colours: Record<VerdictStatus, string> = {
  unanswered: "border-rule text-ink-soft",
  incomplete: "border-brass text-ink",
  invalid: "border-fault bg-fault-light text-fault",
  ok: "border-sound bg-sound-light text-sound",
  "out-of-range": "border-fault bg-fault-light text-fault",
  "needs-note": "border-brass bg-brass-light text-ink",
  noted: "border-rule text-ink-soft",
  "action-noted": "border-brass bg-brass-light text-ink",
};

export function VerdictBadge({ verdict }: { verdict: Verdict }) {
  const look = verdictWords[verdict.status];
  return (
    <div
      className={`flex items-start gap-2 rounded-md border-2 px-3 py-2 ${colours[verdict.status]}`}
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
