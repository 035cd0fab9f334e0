import type { ReactNode } from "react";
import { presentOutcome, type CalcDefinition, type CalcOutcome } from "~/lib/calc";
import type { LengthSystem } from "./calc-entries";
import { OutcomeValues } from "./outcome-values";

const verdictClass: Record<CalcOutcome["verdict"], string> = {
  pass: "border-sound bg-sound-light text-sound",
  fail: "border-fault bg-fault-light text-fault",
  info: "border-rule bg-paper text-ink",
};

export function Caution({ children }: { children: ReactNode }) {
  return (
    <p
      className="flex gap-2 rounded-md border-2 border-brass bg-brass-light p-2"
      role="note"
      aria-label="Caution"
    >
      <span aria-hidden="true" className="font-bold">
        ⚠
      </span>
      <span>
        <strong>Caution: </strong>
        {children}
      </span>
    </p>
  );
}

/** The outcome: its verdict in a word and a shape, each value with its unit, the rule applied and its source. */
export function CalcResult({
  definition,
  outcome,
  system,
}: {
  definition: CalcDefinition;
  outcome: CalcOutcome;
  system: LengthSystem;
}) {
  const look = presentOutcome(outcome, { unitSystem: system });
  return (
    <div className="flex flex-col gap-3" data-testid="calc-result" data-verdict={outcome.verdict}>
      <p
        className={`flex items-center gap-3 rounded-md border-2 p-3 text-lg font-bold ${verdictClass[outcome.verdict]}`}
      >
        <span aria-hidden="true" className="text-2xl leading-none">
          {look.mark}
        </span>
        <span>{look.word}</span>
      </p>
      <OutcomeValues outcome={outcome} unitSystem={system} alsoIn={system === "metric" ? "inch" : "metric"} />
      <p>
        <strong>Rule: </strong>
        <span className="num">{outcome.rule}</span>
      </p>
      <p className="text-sm text-ink-soft">
        <strong className="text-ink">Source: </strong>
        {definition.source}
      </p>
    </div>
  );
}
