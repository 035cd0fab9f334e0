import type { CalcDefinition, CalcInput, CalcInputSpec } from "~/lib/calc/define";
import type { Unit } from "~/lib/calc/units";
import { findItem } from "./items";
import type { CalcItem, Item, Template } from "./schema";
import { liveAttempts, valueSchemaFor, type Responses } from "./values";

/**
 * Turning the responses of a calc item's source items into the registry's inputs (when a
 * checklist is evaluated). Free of the registry itself, so the checklist screen can load the
 * calculations only when its template has calc items; calc-bindings.ts checks a template's
 * bindings against the registry.
 */

type InputKind = CalcInput["kind"];

/** Which registry input kind each item kind produces; other kinds cannot feed a calculation. */
export const kindFedBy: Partial<Record<Item["kind"], InputKind>> = {
  measure: "number",
  readings: "grid",
  choice: "text",
};

export const kindWords: Record<InputKind, string> = {
  number: "a number (a measure item or a numeric constant)",
  grid: "a grid (a readings item)",
  numbers: "a list of numbers",
  text: "text (a choice item or a string)",
};

export function constantKind(value: number | number[] | string): InputKind {
  if (typeof value === "number") return "number";
  return typeof value === "string" ? "text" : "numbers";
}

export function inputSpec(definition: CalcDefinition, name: string): CalcInputSpec | undefined {
  return Object.hasOwn(definition.inputs, name) ? definition.inputs[name] : undefined;
}

export type GatheredInputs =
  { ready: true; inputs: Record<string, CalcInput | undefined> } | { ready: false; waitingFor: Item[] };

/**
 * The registry inputs of a calc item from the responses: a measure gives its last attempt, a
 * readings item its last grid once every cell is in, a choice its option key; a constant is in
 * the input's declared unit. Required inputs whose items are not answered yet are listed instead.
 */
export function gatherCalcInputs(
  item: CalcItem,
  definition: CalcDefinition,
  template: Template,
  responses: Responses,
): GatheredInputs {
  const inputs: Record<string, CalcInput | undefined> = {};
  const waitingFor: Item[] = [];
  for (const [name, binding] of Object.entries(item.inputs)) {
    const spec = inputSpec(definition, name);
    if (!spec) continue;
    if ("value" in binding) {
      inputs[name] = constantInput(binding.value, spec.unit);
      continue;
    }
    const source = findItem(template, binding.item);
    if (!source) continue;
    const input = responseInput(source, responses[source.key]);
    if (input) inputs[name] = input;
    else if (!spec.optional) waitingFor.push(source);
  }
  return waitingFor.length ? { ready: false, waitingFor } : { ready: true, inputs };
}

/** A constant is written in the input's declared unit (a plain ratio when it declares none). */
function constantInput(value: number | number[] | string, unit: Unit = "1"): CalcInput {
  if (typeof value === "string") return { kind: "text", value };
  if (typeof value === "number") return { kind: "number", value, unit };
  return { kind: "numbers", values: value, unit };
}

function responseInput(source: Item, raw: unknown): CalcInput | undefined {
  if (raw === undefined || raw === null) return undefined;
  switch (source.kind) {
    case "measure": {
      const parsed = valueSchemaFor(source).safeParse(raw);
      const last = parsed.success ? liveAttempts(parsed.data).at(-1) : undefined;
      return last && { kind: "number", value: last.value, unit: last.unit };
    }
    case "readings": {
      const parsed = valueSchemaFor(source).safeParse(raw);
      const last = parsed.success ? liveAttempts(parsed.data).at(-1) : undefined;
      if (!last || last.cells.some((row) => row.some((cell) => cell === null))) return undefined;
      // Row and column keys, not labels: the calculations find "top", "port"... by them.
      return {
        kind: "grid",
        rows: source.rows.map((row) => row.key),
        columns: source.columns.map((column) => column.key),
        values: last.cells,
        unit: last.unit,
      };
    }
    case "choice": {
      const parsed = valueSchemaFor(source).safeParse(raw);
      return parsed.success ? { kind: "text", value: parsed.data.option } : undefined;
    }
    default:
      return undefined;
  }
}
