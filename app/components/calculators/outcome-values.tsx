import { presentOutcome, type CalcOutcome, type UnitSystem } from "~/lib/calc";

/**
 * A calculation's values as a person reads them, written by the one formatter of the library
 * (presentOutcome): the same digits on the calculators, the fill screen, the review and the record.
 * With `alsoIn`, lengths are also given in the other system, smaller, for a second look.
 */
export function OutcomeValues({
  outcome,
  unitSystem,
  alsoIn,
  size = "large",
}: {
  outcome: CalcOutcome;
  unitSystem?: UnitSystem;
  alsoIn?: UnitSystem;
  size?: "large" | "small";
}) {
  const shown = presentOutcome(outcome, { unitSystem });
  const other = alsoIn ? presentOutcome(outcome, { unitSystem: alsoIn }) : undefined;
  const layout =
    size === "large" ? "grid grid-cols-[auto_1fr] gap-x-4 gap-y-1" : "grid grid-cols-2 gap-2 md:grid-cols-3";
  return (
    <dl className={layout} data-testid="calc-values">
      {shown.values.map((value, i) => {
        const second = other?.values[i].text;
        return (
          <div key={value.key} className={size === "large" ? "contents" : undefined}>
            <dt className={size === "large" ? "text-ink-soft" : "text-sm text-ink-soft"}>{value.label}</dt>
            <dd
              className={`num font-bold ${size === "large" ? "text-xl" : "text-lg"}`}
              data-result={value.key}
            >
              {value.text}
              {second && second !== value.text ? (
                <span className="text-base font-normal text-ink-soft"> ({second})</span>
              ) : null}
            </dd>
          </div>
        );
      })}
    </dl>
  );
}
