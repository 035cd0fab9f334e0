import { calculations, type CalcDefinition, type CalcInput, type CalcInputSpec } from "~/lib/calc/registry";
import { dimensionOf, type Unit } from "~/lib/calc/units";
import { findItem, type CalcBinding, type CalcItem, type Item, type Template } from "./schema";
import { liveAttempts, valueSchemaFor, type Responses } from "./values";

/**
 * The link between a template's calc item and the calculation registry: which item feeds which
 * input (checked when a template is read), and turning the responses of those items into the
 * registry's inputs (when a checklist is evaluated).
 */

type InputKind = CalcInput["kind"];

/** Which registry input kind each item kind produces; other kinds cannot feed a calculation. */
const kindFedBy: Partial<Record<Item["kind"], InputKind>> = {
  measure: "number",
  readings: "grid",
  choice: "text",
};

const kindWords: Record<InputKind, string> = {
  number: "a number (a measure item or a numeric constant)",
  grid: "a grid (a readings item)",
  numbers: "a list of numbers",
  text: "text (a choice item or a string)",
};

function constantKind(value: number | number[] | string): InputKind {
  if (typeof value === "number") return "number";
  return typeof value === "string" ? "text" : "numbers";
}

export function calcDefinition(name: string): CalcDefinition | undefined {
  return Object.hasOwn(calculations, name) ? calculations[name] : undefined;
}

function inputSpec(definition: CalcDefinition, name: string): CalcInputSpec | undefined {
  return Object.hasOwn(definition.inputs, name) ? definition.inputs[name] : undefined;
}

interface BindingProblem {
  path: (string | number)[];
  message: string;
}

/** What is wrong with a calc item's calculation name and bindings, paths relative to the item. */
export function calcBindingProblems(item: CalcItem, template: Template): BindingProblem[] {
  const definition = calcDefinition(item.calc);
  if (!definition) {
    return [
      {
        path: ["calc"],
        message: `no calculation named "${item.calc}"; known: ${Object.keys(calculations).join(", ")}`,
      },
    ];
  }
  const problems: BindingProblem[] = [];
  for (const [name, spec] of Object.entries(definition.inputs)) {
    if (!spec.optional && !Object.hasOwn(item.inputs, name)) {
      problems.push({ path: ["inputs"], message: `${item.calc} needs the input "${name}" (${spec.label})` });
    }
  }
  for (const [name, binding] of Object.entries(item.inputs)) {
    const spec = inputSpec(definition, name);
    if (!spec) {
      problems.push({
        path: ["inputs", name],
        message: `${item.calc} has no input "${name}"; it takes ${Object.keys(definition.inputs).join(", ")}`,
      });
      continue;
    }
    const message = bindingProblem(item, binding, spec, template);
    if (message) problems.push({ path: ["inputs", name, "item" in binding ? "item" : "value"], message });
  }
  return problems;
}

function bindingProblem(
  item: CalcItem,
  binding: CalcBinding,
  spec: CalcInputSpec,
  template: Template,
): string | undefined {
  const takes = spec.accepts.map((kind) => kindWords[kind]).join(" or ");
  if ("value" in binding)
    return spec.accepts.includes(constantKind(binding.value)) ? undefined : `expected ${takes}`;
  const source = findItem(template, binding.item);
  if (!source) return `no item "${binding.item}" in this template`;
  if (source.key === item.key) return "a calculation cannot take its own result";
  const kind = kindFedBy[source.kind];
  if (!kind)
    return `"${source.key}" is a ${source.kind} item; a calculation takes measure, readings or choice items`;
  if (!spec.accepts.includes(kind))
    return `"${source.key}" is a ${source.kind} item but this input takes ${takes}`;
  if (
    spec.unit &&
    (source.kind === "measure" || source.kind === "readings") &&
    dimensionOf(source.unit) !== dimensionOf(spec.unit)
  ) {
    return `"${source.key}" is measured in ${source.unit} (${dimensionOf(source.unit)}) but this input takes ${spec.unit} (${dimensionOf(spec.unit)})`;
  }
  return undefined;
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
