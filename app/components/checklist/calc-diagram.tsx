import { diagramFor } from "~/components/diagrams/for-calc";
import {
  calcDefinition,
  gatherCalcInputs,
  type Item,
  type Responses,
  type Template,
  type Verdict,
} from "~/lib/templates";

/** The diagram of a calc item from the same inputs its verdict used, or nothing when it has none yet. */
export function CalcDiagram({
  item,
  template,
  responses,
  verdict,
}: {
  item: Item;
  template: Template;
  responses: Responses;
  verdict: Verdict;
}) {
  if (item.kind !== "calc" || !verdict.outcome) return null;
  const definition = calcDefinition(item.calc);
  if (!definition) return null;
  const gathered = gatherCalcInputs(item, definition, template, responses);
  if (!gathered.ready) return null;
  const diagram = diagramFor(item.calc, verdict.outcome.detail, gathered.inputs);
  return diagram ? (
    <div className="max-w-2xl overflow-x-auto" data-testid="diagram">
      {diagram}
    </div>
  ) : null;
}
