import type { CalcOutcome, UnitSystem } from "./define";
import { formatQuantity } from "./precision";
import { convert, isUnit, type Unit } from "./units";

/**
 * One way to write a calculation's result for a person, used by the fill screen, the
 * calculators, the review, the record page and the PDF: values by the one precision rule
 * (./precision), value names with a capital, and the verdict in a word and a shape. A
 * calculation that gives instructions (mount moves, shims, key sizes) has no pass/fail mark.
 */
export interface PresentedValue {
  /** The value's key in the outcome. */
  key: string;
  label: string;
  text: string;
}

export interface PresentedOutcome {
  verdict: CalcOutcome["verdict"];
  mark: string;
  word: string;
  values: PresentedValue[];
  /** The value the acceptance rule applies to, when the calculation names one. */
  primary?: PresentedValue;
  rule: string;
}

const VERDICTS: Record<CalcOutcome["verdict"], { mark: string; word: string }> = {
  pass: { mark: "✓", word: "Meets the rule" },
  fail: { mark: "▲", word: "Outside the rule" },
  info: { mark: "●", word: "Figures and instructions, no pass or fail" },
};

const TO_METRIC: Partial<Record<Unit, Unit>> = { in: "mm", thou: "mm", ft: "m", "in/in": "mm/m" };
const TO_INCH: Partial<Record<Unit, Unit>> = { mm: "in", m: "ft", "mm/m": "in/in" };

export function verdictLook(verdict: CalcOutcome["verdict"]) {
  return VERDICTS[verdict];
}

/** A value name for a person: "worst TIR" → "Worst TIR". */
function labelOf(key: string): string {
  return key.charAt(0).toUpperCase() + key.slice(1);
}

export function presentValue(
  key: string,
  value: number | string,
  unit: string | undefined,
  system?: UnitSystem,
) {
  if (typeof value === "string") return { key, label: labelOf(key), text: value };
  const known = unit !== undefined && isUnit(unit) ? unit : undefined;
  const to = known && system ? (system === "metric" ? TO_METRIC : TO_INCH)[known] : undefined;
  const text = to && known ? formatQuantity(convert(value, known, to), to) : formatQuantity(value, unit);
  return { key, label: labelOf(key), text };
}

/**
 * The outcome written for a person. Values come in the units the technician entered (the
 * calculation chose them); pass `unitSystem` to write lengths in the other system instead.
 */
export function presentOutcome(
  outcome: CalcOutcome,
  options: { unitSystem?: UnitSystem } = {},
): PresentedOutcome {
  const system =
    options.unitSystem && options.unitSystem !== outcome.unitSystem ? options.unitSystem : undefined;
  const values = Object.entries(outcome.values).map(([key, value]) =>
    presentValue(key, value, outcome.units[key], system),
  );
  return {
    verdict: outcome.verdict,
    ...VERDICTS[outcome.verdict],
    values,
    primary: values.find((v) => v.key === outcome.primary),
    rule: outcome.rule,
  };
}
