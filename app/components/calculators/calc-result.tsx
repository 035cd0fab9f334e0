import type { ReactNode } from "react";
import { convert, isUnit, type CalcDefinition, type CalcOutcome } from "~/lib/calc";
import { formatNumber } from "~/lib/templates/format";
import { unitText, type LengthSystem } from "./calc-entries";

const verdictLooks: Record<CalcOutcome["verdict"], { mark: string; word: string; className: string }> = {
  pass: { mark: "✓", word: "Pass: meets the rule", className: "border-sound bg-sound-light text-sound" },
  fail: {
    mark: "▲",
    word: "Fail: does not meet the rule",
    className: "border-fault bg-fault-light text-fault",
  },
  info: { mark: "●", word: "Result: no limit to check against", className: "border-rule bg-paper text-ink" },
};

/** A value with its unit; lengths also in the other system's unit, the shop's own first. */
function Quantity({ value, unit, system }: { value: number | string; unit?: string; system: LengthSystem }) {
  if (typeof value === "string") return <>{unit ? `${value} ${unitText(unit)}` : value}</>;
  const tight = unit === "%" || unit === "1" || !unit;
  const write = (n: number, u?: string) =>
    tight ? `${formatNumber(n)}${u === "%" ? "%" : ""}` : `${formatNumber(n)} ${unitText(u!)}`;
  if (unit && isUnit(unit) && (unit === "in" || unit === "ft")) {
    const other = unit === "in" ? "mm" : "m";
    const [first, second] =
      system === "metric"
        ? [write(convert(value, unit, other), other), write(value, unit)]
        : [write(value, unit), write(convert(value, unit, other), other)];
    return (
      <>
        {first} <span className="text-base font-normal text-ink-soft">({second})</span>
      </>
    );
  }
  return <>{write(value, unit)}</>;
}

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
  const look = verdictLooks[outcome.verdict];
  return (
    <div className="flex flex-col gap-3" data-testid="calc-result" data-verdict={outcome.verdict}>
      <p className={`flex items-center gap-3 rounded-md border-2 p-3 text-lg font-bold ${look.className}`}>
        <span aria-hidden="true" className="text-2xl leading-none">
          {look.mark}
        </span>
        <span>{look.word}</span>
      </p>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
        {Object.entries(outcome.values).map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-ink-soft">{label.charAt(0).toUpperCase() + label.slice(1)}</dt>
            <dd className="num text-xl font-bold" data-result={label}>
              <Quantity value={value} unit={outcome.units[label]} system={system} />
            </dd>
          </div>
        ))}
      </dl>
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
