import { calculations, type CalcDefinition, type CalcInputSpec } from "~/lib/calc/registry";
import { dimensionOf } from "~/lib/calc/units";
import { constantKind, inputSpec, kindFedBy, kindWords } from "./calc-inputs";
import { findItem } from "./items";
import type { CalcBinding, CalcItem, Template } from "./schema";

/** Which item feeds which input of a calc item, checked against the registry when a template is read. */

export function calcDefinition(name: string): CalcDefinition | undefined {
  return Object.hasOwn(calculations, name) ? calculations[name] : undefined;
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
