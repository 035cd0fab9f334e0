/**
 * Checklist templates: the format (schema.ts), response values (values.ts), the one
 * acceptance-rule evaluator (rules.ts), progress (progress.ts) and reading template files
 * (load.ts). Plain modules, shared by the seed, the server and the browser.
 */
import { calculations } from "~/lib/calc/registry";
import { progressWith, type Progress } from "./progress";
import { evaluateAllWith, evaluateWith, type EvaluationContext, type Verdict } from "./rules";
import type { Item, Template } from "./schema";
import type { Responses } from "./values";

export {
  acceptedUnits,
  findItem,
  itemSchema,
  jobFactNames,
  phaseLabels,
  phases,
  placedItems,
  sectionSchema,
  templateSchema,
  unitSchema,
} from "./schema";
export type {
  CalcBinding,
  CalcItem,
  CalcRule,
  CheckItem,
  ChoiceItem,
  InitialsItem,
  Item,
  ItemKind,
  JobFact,
  MeasureItem,
  Phase,
  PhotoItem,
  PlacedItem,
  ReadingsItem,
  ReadingsRule,
  Rule,
  Section,
  Template,
  TemplateInput,
  TextItem,
} from "./schema";
export { liveAttempts, strikeOf, takesNegative, valueSchemaFor, valueSchemas } from "./values";
export type {
  CalcValue,
  CheckValue,
  ChoiceValue,
  InitialsValue,
  ItemValue,
  MeasureAttempt,
  MeasureValue,
  PhotoValue,
  ReadingsAttempt,
  ReadingsValue,
  Responses,
  Strike,
  TextValue,
  ValueFor,
} from "./values";
export { evaluateAllWith, evaluateWith } from "./rules";
export type { EvaluationContext, Finding, Verdict, VerdictStatus } from "./rules";
export { progressWith } from "./progress";
export type { Progress, SectionProgress, Tally } from "./progress";
export {
  checkedTemplateSchema,
  loadTemplateFile,
  parseTemplate,
  parseTemplateText,
  problemText,
  TemplateFormatError,
  templateFileName,
} from "./load";
export type { TemplateParse, TemplateProblem } from "./load";
export { formatPath } from "./path";
export { describeRule, formatQuantity, unitSymbol } from "./format";
export { gatherCalcInputs } from "./calc-inputs";
export { calcDefinition } from "./calc-bindings";
export { calculationsFor } from "./calculations-for";
export type { GatheredInputs } from "./calc-inputs";
export { describeValue } from "./describe-value";
export { byWorkOrder, workOrder, workOrderIndex } from "./work-order";
export { FROM_JOB, jobFacts, prefillResponses } from "./prefill";
export type { JobEquipment } from "./prefill";
export { diffTemplates } from "./diff";

// The evaluator with every calculation of the registry at hand: the server and every screen but
// the checklist one, which loads the registry only for a template with calc items.
export const evaluate = (item: Item, value: unknown, context?: EvaluationContext): Verdict =>
  evaluateWith(calculations, item, value, context);
export const evaluateAll = (template: Template, responses: Responses): Record<string, Verdict> =>
  evaluateAllWith(calculations, template, responses);
export const progress = (template: Template, responses: Responses): Progress =>
  progressWith(calculations, template, responses);
export type { ChangeStatus, FieldChange, ItemChange, ItemPlace, SectionChange, TemplateDiff } from "./diff";
