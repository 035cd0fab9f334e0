import type { z } from "zod";
import { dimensionOf, type Unit } from "~/lib/calc/units";
import { calcBindingProblems } from "./calc-bindings";
import { formatPath } from "./path";
import { prefillProblems } from "./prefill";
import {
  findItem,
  placedItems,
  templateSchema,
  type CalcRule,
  type Item,
  type ReadingsRule,
  type Rule,
  type Template,
} from "./schema";

/**
 * Reading a template: the zod structure plus the checks between fields that a structure alone
 * cannot state. Every problem carries the path of the bad field in the file, written the way a
 * person would point at it: `sections[2].items[4].rule.max: expected a number`.
 */

export interface TemplateProblem {
  path: string;
  message: string;
}

interface RawProblem {
  path: (string | number)[];
  message: string;
}

export function problemText(problem: TemplateProblem): string {
  return problem.path ? `${problem.path}: ${problem.message}` : problem.message;
}

const expectedWords: Record<string, string> = {
  number: "a number",
  int: "a whole number",
  string: "a string",
  boolean: "true or false",
  array: "a list",
  object: "an object",
  record: "an object",
  null: "null",
};

function describeIssue(issue: z.core.$ZodIssue): TemplateProblem[] {
  const path = formatPath(issue.path);
  switch (issue.code) {
    case "invalid_type": {
      const expected = `expected ${expectedWords[issue.expected] ?? issue.expected}`;
      if (issue.input === undefined) return [{ path, message: `missing, ${expected}` }];
      // The field's own words ("the minimum must be a number") where the format gives some.
      return [{ path, message: issue.message.startsWith("Invalid input") ? expected : issue.message }];
    }
    case "unrecognized_keys":
      return issue.keys.map((key) => ({ path: formatPath([...issue.path, key]), message: "unknown field" }));
    case "invalid_union":
      if ("discriminator" in issue && issue.discriminator) {
        const kinds = ((issue as { options?: unknown[] }).options ?? []).map((o) => String(o)).join(", ");
        return [{ path, message: `expected ${issue.discriminator} to be one of ${kinds}` }];
      }
      return [{ path, message: issue.message }];
    case "invalid_key":
      return [{ path, message: `bad name: ${issue.issues[0]?.message ?? issue.message}` }];
    case "invalid_value":
      return [{ path, message: `expected one of ${issue.values.map((v) => JSON.stringify(v)).join(", ")}` }];
    default:
      return [{ path, message: issue.message }];
  }
}

/** The checks between fields, on a template whose structure is already valid. */
export function crossCheck(template: Template): RawProblem[] {
  const problems: RawProblem[] = [];
  const firstSection = new Map<string, number>();
  template.sections.forEach((section, s) => {
    const earlier = firstSection.get(section.key);
    if (earlier === undefined) firstSection.set(section.key, s);
    else
      problems.push({
        path: ["sections", s, "key"],
        message: `section key "${section.key}" is already used at sections[${earlier}]`,
      });
  });

  const firstItem = new Map<string, string>();
  for (const { item, sectionIndex, itemIndex } of placedItems(template)) {
    const at: (string | number)[] = ["sections", sectionIndex, "items", itemIndex];
    const earlier = firstItem.get(item.key);
    if (earlier === undefined) firstItem.set(item.key, formatPath(at));
    else
      problems.push({
        path: [...at, "key"],
        message: `item key "${item.key}" is already used at ${earlier}`,
      });
    for (const problem of [...itemProblems(item, template), ...conditionProblems(item, template)])
      problems.push({ path: [...at, ...problem.path], message: problem.message });
  }
  return problems;
}

function itemProblems(item: Item, template: Template): RawProblem[] {
  switch (item.kind) {
    case "measure":
      return [
        ...unitProblems(item.unit, item.accepts),
        ...(item.rule ? ruleProblems(item.rule, item.unit) : []),
        ...prefillProblems(item),
      ];
    case "readings": {
      const problems = [
        ...uniqueKeys(item.rows, "rows"),
        ...uniqueKeys(item.columns, "columns"),
        ...unitProblems(item.unit, item.accepts),
      ];
      if (item.rule) {
        problems.push(...ruleProblems(item.rule, item.unit));
        if (item.rule.appliesTo === "row-spread" && item.columns.length < 2) {
          problems.push({ path: ["rule", "appliesTo"], message: "a row spread needs at least two columns" });
        }
      }
      return problems;
    }
    case "choice":
      return [...uniqueKeys(item.options, "options"), ...prefillProblems(item)];
    case "calc":
      return [...calcBindingProblems(item, template), ...(item.rule ? ruleProblems(item.rule) : [])];
    default:
      return [];
  }
}

function conditionProblems(item: Item, template: Template): RawProblem[] {
  const when = item.appliesWhen;
  if (!when) return [];
  const at = (...rest: (string | number)[]) => ["appliesWhen", ...rest];
  const source = findItem(template, when.item);
  if (!source) return [{ path: at("item"), message: `no item "${when.item}" in this template` }];
  if (source.key === item.key) return [{ path: at("item"), message: "an item cannot depend on itself" }];
  if (source.appliesWhen)
    return [{ path: at("item"), message: `"${source.key}" itself applies only sometimes` }];
  if (source.kind === "choice") {
    if (!when.options || when.values)
      return [{ path: at(), message: `"${source.key}" is a choice: give its options` }];
    return when.options.flatMap((option, i) =>
      source.options.some((o) => o.key === option)
        ? []
        : [{ path: at("options", i), message: `"${source.key}" has no option "${option}"` }],
    );
  }
  if (source.kind === "measure") {
    if (!when.values || when.options)
      return [{ path: at(), message: `"${source.key}" is a measure: give its values` }];
    return [];
  }
  return [
    {
      path: at("item"),
      message: `"${source.key}" is a ${source.kind} item; a condition takes a choice or a measure`,
    },
  ];
}

function uniqueKeys(list: readonly { key: string }[], field: string): RawProblem[] {
  return list.flatMap((entry, i) =>
    list.findIndex((other) => other.key === entry.key) === i
      ? []
      : [{ path: [field, i, "key"], message: `"${entry.key}" is already used in ${field}` }],
  );
}

function unitProblems(unit: Unit, accepts: readonly Unit[] | undefined): RawProblem[] {
  if (!accepts) return [];
  const problems: RawProblem[] = accepts.flatMap((other, i) =>
    dimensionOf(other) === dimensionOf(unit)
      ? []
      : [
          {
            path: ["accepts", i],
            message: `${other} is a ${dimensionOf(other)} unit but the item's unit ${unit} is a ${dimensionOf(unit)} unit`,
          },
        ],
  );
  if (!accepts.includes(unit))
    problems.push({ path: ["accepts"], message: `should include the item's own unit ${unit}` });
  return problems;
}

/** A calc rule has no item unit to match: the result's unit is only known when it runs. */
function ruleProblems(rule: Rule | ReadingsRule | CalcRule, itemUnit?: Unit): RawProblem[] {
  const problems: RawProblem[] = [];
  if (itemUnit !== undefined && dimensionOf(rule.unit) !== dimensionOf(itemUnit)) {
    problems.push({
      path: ["rule", "unit"],
      message: `${rule.unit} is a ${dimensionOf(rule.unit)} unit but the item is measured in ${itemUnit} (${dimensionOf(itemUnit)})`,
    });
  }
  const { min, max, nominal, tolerance } = rule;
  if (min === undefined && max === undefined && nominal === undefined) {
    problems.push({ path: ["rule"], message: "a rule needs a min, a max, or a nominal with a tolerance" });
  }
  if (nominal !== undefined && tolerance === undefined)
    problems.push({ path: ["rule", "tolerance"], message: "a nominal needs a tolerance (plus or minus)" });
  if (tolerance !== undefined && nominal === undefined)
    problems.push({ path: ["rule", "nominal"], message: "a tolerance needs a nominal" });
  if (min !== undefined && max !== undefined && min > max) {
    problems.push({ path: ["rule", "min"], message: `the minimum (${min}) is above the maximum (${max})` });
  }
  if (
    nominal !== undefined &&
    ((min !== undefined && nominal < min) || (max !== undefined && nominal > max))
  ) {
    problems.push({
      path: ["rule", "nominal"],
      message: `the nominal (${nominal}) is outside the min–max range`,
    });
  }
  return problems;
}

/** The template schema with the cross-checks: the one schema the seed, server and browser use. */
export const checkedTemplateSchema = templateSchema.superRefine((template, ctx) => {
  for (const problem of crossCheck(template))
    ctx.addIssue({ code: "custom", path: problem.path, message: problem.message });
});

export type TemplateParse = { ok: true; template: Template } | { ok: false; problems: TemplateProblem[] };

export function parseTemplate(input: unknown): TemplateParse {
  const result = checkedTemplateSchema.safeParse(input, { reportInput: true });
  if (result.success) return { ok: true, template: result.data };
  return { ok: false, problems: result.error.issues.flatMap(describeIssue) };
}

/** Parses the text of a template file; a JSON syntax error is a problem like any other. */
export function parseTemplateText(text: string): TemplateParse {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return { ok: false, problems: [{ path: "", message: `not valid JSON: ${(error as Error).message}` }] };
  }
  return parseTemplate(json);
}

/** `<key>.v<version>.json`: the file a template version lives in under checklists/. */
export function templateFileName(template: Pick<Template, "key" | "version">): string {
  return `${template.key}.v${template.version}.json`;
}

export class TemplateFormatError extends Error {
  readonly source: string;
  readonly problems: TemplateProblem[];

  constructor(source: string, problems: TemplateProblem[]) {
    super(`${source}: ${problems.map(problemText).join("; ")}`);
    this.name = "TemplateFormatError";
    this.source = source;
    this.problems = problems;
  }
}

/**
 * Reads one file of the library, or throws with every problem found, so a loader stops
 * instead of loading half a library. The file name must match the key and version inside.
 */
export function loadTemplateFile(fileName: string, text: string): Template {
  const parsed = parseTemplateText(text);
  if (!parsed.ok) throw new TemplateFormatError(fileName, parsed.problems);
  const expected = templateFileName(parsed.template);
  const baseName = fileName.split(/[\\/]/).pop();
  if (baseName !== expected) {
    throw new TemplateFormatError(fileName, [
      { path: "", message: `the file should be named ${expected} after the key and version inside it` },
    ]);
  }
  return parsed.template;
}
