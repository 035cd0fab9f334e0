import { diagramFor } from "~/components/diagrams/for-calc";
import {
  StraighteningFromReadings,
  straighteningFromReadings,
  type RunoutAttempt,
} from "~/components/diagrams/straightening-from-readings";
import type { LengthUnit } from "~/components/diagrams/svg-kit";
import { CAUTION_HOT_WORK, convert, dimensionOf, type CalcInput } from "~/lib/calc";
import {
  calcDefinition,
  findItem,
  gatherCalcInputs,
  liveAttempts,
  valueSchemaFor,
  type Item,
  type ReadingsValue,
  type Responses,
  type Template,
  type Verdict,
} from "~/lib/templates";

/** Every set of readings a readings item keeps and counts, oldest first (its straightening attempts). */
function readingsAttempts(template: Template, responses: Responses, key: string): RunoutAttempt[] {
  const source = findItem(template, key);
  if (!source || source.kind !== "readings") return [];
  const parsed = valueSchemaFor(source).safeParse(responses[key]);
  if (!parsed.success || !parsed.data || !("attempts" in parsed.data)) return [];
  return liveAttempts(parsed.data as ReadingsValue).map((a) => ({
    cells: a.cells,
    unit: a.unit,
  }));
}

function limitIn(input: CalcInput | undefined): number | undefined {
  if (input?.kind !== "number" || dimensionOf(input.unit) !== "length") return undefined;
  return convert(input.value, input.unit, "in");
}

/**
 * The diagram of a calc item from the same inputs its verdict used, or nothing when it has none
 * yet. A runout calculation also draws the straightening history when its readings item holds
 * more than one set of readings, with the hot-work caution that belongs to straightening.
 */
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
  const lengthUnit: LengthUnit = verdict.outcome.unitSystem === "metric" ? "mm" : "in";
  const diagram = diagramFor(item.calc, verdict.outcome.detail, gathered.inputs, { lengthUnit });
  const readings = item.calc === "shaftRunout" ? item.inputs.readings : undefined;
  const limit = limitIn(gathered.inputs.limitTir);
  const attempts = readings && "item" in readings ? readingsAttempts(template, responses, readings.item) : [];
  const history =
    limit !== undefined && straighteningFromReadings(attempts, limit) ? (
      <StraighteningFromReadings attempts={attempts} limitTirIn={limit} lengthUnit={lengthUnit} />
    ) : null;
  if (!diagram && !history) return null;
  return (
    <div className="flex max-w-2xl flex-col gap-2 overflow-x-auto" data-testid="diagram">
      {diagram}
      {history ? (
        <div data-testid="straightening-history" className="flex flex-col gap-1">
          {history}
          <p className="text-sm" role="note">
            <strong>Caution (straightening): </strong>
            {CAUTION_HOT_WORK}
          </p>
        </div>
      ) : null}
    </div>
  );
}
