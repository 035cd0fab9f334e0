import type { Calculations } from "~/lib/calc/define";
import { presentOutcome } from "~/lib/calc/present";
import {
  evaluateWith,
  formatQuantity,
  type CalcItem,
  type MeasureAttempt,
  type MeasureItem,
  type ReadingsAttempt,
  type ReadingsItem,
  type Responses,
  type Template,
  type Verdict,
} from "~/lib/templates";

/** One attempt in a line: the figure that matters and its verdict, as the item's rule or its calculation judges it. */
export interface AttemptFigure {
  figure: string;
  verdict: Verdict;
}

/** The calc item that reads this item (a runout calculation reads the dial readings), if any. */
export function calcReading(template: Template, itemKey: string): CalcItem | undefined {
  for (const section of template.sections)
    for (const item of section.items)
      if (
        item.kind === "calc" &&
        Object.values(item.inputs).some((binding) => "item" in binding && binding.item === itemKey)
      )
        return item;
  return undefined;
}

/**
 * A measure attempt is its value and the rule's verdict on it. A set of readings read by a
 * calculation (straightening attempts: the runout calculation) is that calculation's main figure
 * on this set alone — the worst-station TIR — and its verdict; otherwise the set's own verdict.
 */
export function attemptFigure(
  item: MeasureItem | ReadingsItem,
  attempt: MeasureAttempt | ReadingsAttempt,
  template: Template,
  responses: Responses,
  calculations: Calculations,
): AttemptFigure {
  if (item.kind === "measure") {
    const a = attempt as MeasureAttempt;
    return {
      figure: formatQuantity(a.value, a.unit),
      verdict: evaluateWith(calculations, item, { attempts: [a] }),
    };
  }
  const own = evaluateWith(calculations, item, { attempts: [attempt] });
  const calc = calcReading(template, item.key);
  if (calc) {
    const verdict = evaluateWith(calculations, calc, undefined, {
      template,
      responses: { ...responses, [item.key]: { attempts: [attempt] } },
    });
    const primary = verdict.outcome && presentOutcome(verdict.outcome).primary;
    if (primary) return { figure: `${primary.label} ${primary.text}`, verdict };
  }
  return { figure: own.message, verdict: own };
}
