/**
 * Checklist templates: the format (schema.ts), response values (values.ts), the one
 * acceptance-rule evaluator (rules.ts), progress (progress.ts) and reading template files
 * (load.ts). Plain modules, shared by the seed, the server and the browser.
 */
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
export { evaluate, evaluateAll } from "./rules";
export type { EvaluationContext, Finding, Verdict, VerdictStatus } from "./rules";
export { progress } from "./progress";
export type { Progress, SectionProgress, Tally } from "./progress";
export {
  checkedTemplateSchema,
  formatPath,
  loadTemplateFile,
  parseTemplate,
  parseTemplateText,
  problemText,
  TemplateFormatError,
  templateFileName,
} from "./load";
export type { TemplateParse, TemplateProblem } from "./load";
export { describeRule, formatQuantity, unitSymbol } from "./format";
export { calcDefinition, gatherCalcInputs } from "./calc-inputs";
export type { GatheredInputs } from "./calc-inputs";
export { describeValue } from "./describe-value";
export { byWorkOrder, workOrder, workOrderIndex } from "./work-order";
export { FROM_JOB, jobFacts, prefillResponses } from "./prefill";
export type { JobEquipment } from "./prefill";
export { diffTemplates } from "./diff";
export type { ChangeStatus, FieldChange, ItemChange, ItemPlace, SectionChange, TemplateDiff } from "./diff";
