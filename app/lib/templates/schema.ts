import { z } from "zod";
import { jobFactNames, phases } from "./items";
import { unitSchema } from "./unit-schema";

export { acceptedUnits, findItem, jobFactNames, phaseLabels, phases, placedItems } from "./items";
export type { JobFact, Phase, PlacedItem } from "./items";
export { unitSchema };

/**
 * Sternpost's checklist template format (documented in docs/template-format.md). This is the
 * structure only; `checkedTemplateSchema` in load.ts adds the cross-checks between fields
 * (duplicate keys, calc bindings, limits in order) and is what the seed, the server and the
 * browser validate with.
 */

const KEBAB = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;
const CAMEL = /^[a-z][A-Za-z0-9]*$/;

const kebabKey = z
  .string({ error: "expected a string" })
  .regex(KEBAB, { error: "expected a key in lower-case words joined by hyphens, like face-gaps" });

const words = z.string({ error: "expected a string" }).trim().min(1, { error: "cannot be empty" });

export const phaseSchema = z.enum(phases);

/**
 * The item applies only when another item of the template has one of these answers: a choice one
 * of `options`, a measure one of `values` (in that item's unit). Otherwise it does not apply and
 * asks for nothing (petrol-only steps on a diesel boat, a tapered coupling's checks on a keyed one).
 */
export const appliesWhenSchema = z.strictObject({
  item: kebabKey,
  options: z.array(kebabKey).min(1, { error: "needs at least one option" }).optional(),
  values: z
    .array(z.number({ error: "expected a number" }))
    .min(1, { error: "needs at least one value" })
    .optional(),
});

const itemBase = {
  key: kebabKey,
  label: words,
  /** How to do or measure it. */
  hint: words.optional(),
  /** What can hurt someone at this step. */
  caution: words.optional(),
  /** The standard, handbook or practice the step and its limit come from. */
  reference: words.optional(),
  required: z.boolean({ error: "expected true or false" }).default(true),
  phase: phaseSchema.optional(),
  appliesWhen: appliesWhenSchema.optional(),
};

const limit = z.number({ error: "expected a number" });

/**
 * Acceptance limits in `unit`, which may differ from the unit a reading is entered in (a limit in
 * thousandths of an inch against a reading in millimetres). nominal ± tolerance narrows min/max.
 */
const namedLimit = (name: string) => z.number({ error: `the ${name} must be a number` });
const ruleFields = {
  // Said at the field in the library editor: "the minimum must be a number", not a path.
  min: namedLimit("minimum").optional(),
  max: namedLimit("maximum").optional(),
  nominal: namedLimit("nominal value").optional(),
  tolerance: namedLimit("tolerance").nonnegative({ error: "the tolerance cannot be negative" }).optional(),
  unit: unitSchema,
};

export const ruleSchema = z.strictObject(ruleFields);

export const readingsRuleSchema = z.strictObject({
  ...ruleFields,
  /** each-cell: every reading within the limits; row-spread: each row's largest minus smallest. */
  appliesTo: z.enum(["each-cell", "row-spread"]).default("each-cell"),
});

const gridLine = z.strictObject({ key: kebabKey, label: words });

export const checkItemSchema = z.strictObject({ kind: z.literal("check"), ...itemBase });

export const jobFactSchema = z.enum(jobFactNames);

export const measureItemSchema = z.strictObject({
  kind: z.literal("measure"),
  ...itemBase,
  fromJob: jobFactSchema.optional(),
  /** The unit offered first. */
  unit: unitSchema,
  /** Units a reading may be entered in (the same dimension as `unit`); only `unit` when absent. */
  accepts: z.array(unitSchema).min(1, { error: "needs at least one unit" }).optional(),
  rule: ruleSchema.optional(),
});

export const readingsItemSchema = z.strictObject({
  kind: z.literal("readings"),
  ...itemBase,
  rows: z.array(gridLine).min(1, { error: "needs at least one row" }),
  columns: z.array(gridLine).min(1, { error: "needs at least one column" }),
  unit: unitSchema,
  accepts: z.array(unitSchema).min(1, { error: "needs at least one unit" }).optional(),
  rule: readingsRuleSchema.optional(),
});

/** A calc input comes from another item of the template or is a constant in the input's unit. */
export const calcBindingSchema = z.union(
  [
    z.strictObject({ item: kebabKey }),
    z.strictObject({
      value: z.union([limit, z.array(limit).min(1), z.string()], {
        error: "expected a number, a list of numbers or a string",
      }),
    }),
  ],
  { error: 'expected { "item": "<item key>" } or { "value": <constant> }' },
);

/**
 * A calc item's acceptance rule: limits on one named value of the calculation's result
 * (`values[output]`), in `unit`; the result's own unit is converted. When present it decides the
 * item's verdict, whatever the calculation would say on its own.
 */
export const calcRuleSchema = z.strictObject({
  output: words,
  ...ruleFields,
});

export const calcItemSchema = z.strictObject({
  kind: z.literal("calc"),
  ...itemBase,
  /** A calculation name from the registry in ~/lib/calc/registry. */
  calc: z
    .string({ error: "expected a string" })
    .regex(CAMEL, { error: "expected a calculation name, like couplingFace" }),
  inputs: z.record(
    z.string().regex(CAMEL, { error: "expected an input name, like diameterIn" }),
    calcBindingSchema,
  ),
  rule: calcRuleSchema.optional(),
});

export const choiceItemSchema = z.strictObject({
  kind: z.literal("choice"),
  ...itemBase,
  fromJob: jobFactSchema.optional(),
  options: z
    .array(
      z.strictObject({
        key: kebabKey,
        label: words,
        /** Choosing this option is a finding: it needs a note, like a failed check. */
        needsNote: z.boolean({ error: "expected true or false" }).optional(),
      }),
    )
    .min(2, { error: "needs at least two options" }),
});

export const textItemSchema = z.strictObject({ kind: z.literal("text"), ...itemBase });

export const photoItemSchema = z.strictObject({
  kind: z.literal("photo"),
  ...itemBase,
  minPhotos: z
    .number({ error: "expected a number" })
    .int({ error: "expected a whole number" })
    .positive({ error: "must be at least 1" })
    .default(1),
});

export const initialsItemSchema = z.strictObject({ kind: z.literal("initials"), ...itemBase });

export const itemSchema = z.discriminatedUnion("kind", [
  checkItemSchema,
  measureItemSchema,
  readingsItemSchema,
  calcItemSchema,
  choiceItemSchema,
  textItemSchema,
  photoItemSchema,
  initialsItemSchema,
]);

export const sectionSchema = z.strictObject({
  key: kebabKey,
  title: words,
  items: z.array(itemSchema).min(1, { error: "needs at least one item" }),
});

export const templateSchema = z.strictObject({
  key: kebabKey,
  version: z
    .number({ error: "expected a number" })
    .int({ error: "expected a whole number" })
    .positive({ error: "must be 1 or more" }),
  title: words,
  /** What the checklist is for and when it is used, in a sentence or two. */
  purpose: words,
  sections: z.array(sectionSchema).min(1, { error: "needs at least one section" }),
});

export type Template = z.output<typeof templateSchema>;
/** A template as written in a file, before defaults (required: true, minPhotos: 1...) apply. */
export type TemplateInput = z.input<typeof templateSchema>;
export type Section = z.output<typeof sectionSchema>;
export type Item = z.output<typeof itemSchema>;
export type ItemKind = Item["kind"];
export type CheckItem = z.output<typeof checkItemSchema>;
export type MeasureItem = z.output<typeof measureItemSchema>;
export type ReadingsItem = z.output<typeof readingsItemSchema>;
export type CalcItem = z.output<typeof calcItemSchema>;
export type ChoiceItem = z.output<typeof choiceItemSchema>;
export type TextItem = z.output<typeof textItemSchema>;
export type PhotoItem = z.output<typeof photoItemSchema>;
export type InitialsItem = z.output<typeof initialsItemSchema>;
export type Rule = z.output<typeof ruleSchema>;
export type ReadingsRule = z.output<typeof readingsRuleSchema>;
export type CalcRule = z.output<typeof calcRuleSchema>;
export type AppliesWhen = z.output<typeof appliesWhenSchema>;
export type CalcBinding = z.output<typeof calcBindingSchema>;
