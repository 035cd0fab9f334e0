import * as z from "zod/mini";
import { dimensionOf } from "~/lib/calc/units";
import { acceptedUnits } from "./items";
import type { Item, ItemKind, MeasureItem, ReadingsItem } from "./schema";
import { unitSchema } from "./unit-schema";

/**
 * What a response to an item holds, per kind. A response is stored as entered; its verdict is
 * always recomputed from it by rules.ts, never stored in it. `valueSchemaFor(item)` adds what
 * depends on the item (accepted units, grid shape, known options) so a bad entry is refused at
 * the field before it is kept. Written with zod/mini: the tablet checks every entry with these and
 * should not carry full zod for it.
 */

const note = z.optional(
  z
    .string({ error: "expected a string" })
    .check(z.maxLength(4000, { error: "is longer than 4000 characters" })),
);
const at = z.iso.datetime({
  offset: true,
  error: "expected a date and time in ISO 8601, like 2025-05-14T09:30:00Z",
});
const by = z
  .string({ error: "expected a string" })
  .check(z.trim(), z.minLength(1, { error: "cannot be empty" }));
const reading = z.number({ error: "expected a number" });

export const checkValueSchema = z.strictObject({
  result: z.enum(["pass", "fail", "na"], { error: 'expected "pass", "fail" or "na"' }),
  note,
});

/**
 * An attempt's own id, made on the tablet: two tablets' attempts on one item merge by it (see
 * app/lib/sync/merge.ts). Attempts recorded before ids existed have none and are left as stored,
 * so countersigned records keep their digests; the merge knows them by their content.
 */
const attemptId = z.optional(z.uuid({ error: "expected a UUID" }));

/**
 * A mistaken attempt struck through with a reason: the attempt stays in the record, shown struck,
 * and no verdict or calculation counts it. Strikes are their own append-only set keyed by the
 * attempt's id (app/lib/sync/merge.ts), so two tablets never conflict over one; an attempt
 * recorded before ids existed cannot be struck. A response with no strike has no `strikes` field,
 * so older responses and countersigned digests are unchanged.
 */
export const strikeSchema = z.strictObject({
  attempt: z.uuid({ error: "expected the struck attempt's id" }),
  reason: z
    .string({ error: "expected a string" })
    .check(
      z.trim(),
      z.minLength(1, { error: "needs a reason" }),
      z.maxLength(500, { error: "is longer than 500 characters" }),
    ),
  at,
  by,
});
const strikes = z.optional(z.array(strikeSchema));

export const measureAttemptSchema = z.strictObject({
  id: attemptId,
  value: reading,
  unit: unitSchema,
  at,
  by,
});

/** Every attempt is kept (a shaft straightened three times has three); the last one is reported. */
export const measureValueSchema = z.strictObject({
  attempts: z.array(measureAttemptSchema).check(z.minLength(1, { error: "needs at least one attempt" })),
  strikes,
  note,
});

/** cells[row][column] in the item's row and column order; null = not read yet. */
export const readingsAttemptSchema = z.strictObject({
  id: attemptId,
  cells: z.array(z.array(z.union([reading, z.null()], { error: "expected a number or null" }))),
  unit: unitSchema,
  at,
  by,
});

export const readingsValueSchema = z.strictObject({
  attempts: z.array(readingsAttemptSchema).check(z.minLength(1, { error: "needs at least one attempt" })),
  strikes,
  note,
});

export const choiceValueSchema = z.strictObject({ option: z.string({ error: "expected a string" }), note });

export const textValueSchema = z.strictObject({ text: z.string({ error: "expected a string" }) });

export const initialsValueSchema = z.strictObject({
  initials: z
    .string({ error: "expected a string" })
    .check(
      z.trim(),
      z.minLength(1, { error: "cannot be empty" }),
      z.maxLength(8, { error: "is longer than 8 characters" }),
    ),
  at,
  by,
});

export const photoValueSchema = z.strictObject({
  photos: z.array(
    z.strictObject({
      id: z.uuid({ error: "expected a UUID" }),
      sha256: z.optional(
        z.string().check(z.regex(/^[0-9a-f]{64}$/, { error: "expected 64 lower-case hexadecimal digits" })),
      ),
    }),
  ),
});

/** A calc item's result is computed from other items; the response only carries the note. */
export const calcValueSchema = z.strictObject({ note });

export const valueSchemas = {
  check: checkValueSchema,
  measure: measureValueSchema,
  readings: readingsValueSchema,
  calc: calcValueSchema,
  choice: choiceValueSchema,
  text: textValueSchema,
  photo: photoValueSchema,
  initials: initialsValueSchema,
} as const satisfies Record<ItemKind, z.ZodMiniType>;

export type CheckValue = z.output<typeof checkValueSchema>;
export type Strike = z.output<typeof strikeSchema>;
export type MeasureAttempt = z.output<typeof measureAttemptSchema>;
export type MeasureValue = z.output<typeof measureValueSchema>;
export type ReadingsAttempt = z.output<typeof readingsAttemptSchema>;
export type ReadingsValue = z.output<typeof readingsValueSchema>;
export type ChoiceValue = z.output<typeof choiceValueSchema>;
export type TextValue = z.output<typeof textValueSchema>;
export type InitialsValue = z.output<typeof initialsValueSchema>;
export type PhotoValue = z.output<typeof photoValueSchema>;
export type CalcValue = z.output<typeof calcValueSchema>;
export type ValueFor<K extends ItemKind> = z.output<(typeof valueSchemas)[K]>;
export type ItemValue = ValueFor<ItemKind>;
/** A checklist's responses by item key; an item with no entry yet is absent. */
export type Responses = Readonly<Record<string, unknown>>;

type Logged<A> = { attempts: A[]; strikes?: Strike[] };

/** The strike on an attempt, if it was struck through. */
export function strikeOf(value: { strikes?: Strike[] }, attempt: { id?: string }): Strike | undefined {
  return attempt.id === undefined ? undefined : value.strikes?.find((s) => s.attempt === attempt.id);
}

/** The attempts that count (every one not struck through), in their order; the last is reported. */
export function liveAttempts<A extends { id?: string }>(value: Logged<A>): A[] {
  return value.strikes?.length ? value.attempts.filter((a) => !strikeOf(value, a)) : value.attempts;
}

/**
 * Whether an entry of this item may be negative, so its field gets a ± toggle (many tablets'
 * decimal keypads have no minus key): dial readings (a length grid, not a spread of diameters),
 * temperatures and angles, unless the item's rule sets a lower limit of zero or more.
 */
export function takesNegative(item: MeasureItem | ReadingsItem): boolean {
  if (item.rule?.min !== undefined && item.rule.min >= 0) return false;
  const dimension = dimensionOf(item.unit);
  if (dimension === "temperature" || dimension === "angle") return true;
  return item.kind === "readings" && dimension === "length" && item.rule?.appliesTo !== "row-spread";
}

const schemaCache = new WeakMap<Item, z.ZodMiniType>();

/** The schema of a response to this particular item (built once per item: a sync batch checks many). */
export function valueSchemaFor<I extends Item>(item: I): z.ZodMiniType<ValueFor<I["kind"]>> {
  let schema = schemaCache.get(item);
  if (!schema) {
    schema = (valueSchemas[item.kind] as z.ZodMiniType).check(
      z.superRefine((value, ctx) => {
        for (const problem of fitProblems(item, value as ItemValue))
          ctx.addIssue({ code: "custom", ...problem });
      }),
    );
    schemaCache.set(item, schema);
  }
  return schema as z.ZodMiniType<ValueFor<I["kind"]>>;
}

interface FitProblem {
  path: (string | number)[];
  message: string;
}

/** A strike names an attempt the item holds, once. */
function strikeProblems(value: Logged<{ id?: string }>): FitProblem[] {
  const ids = new Set(value.attempts.map((a) => a.id));
  return (value.strikes ?? []).flatMap((strike, i, all) =>
    !ids.has(strike.attempt)
      ? [{ path: ["strikes", i, "attempt"], message: "strikes an attempt this item does not hold" }]
      : all.findIndex((s) => s.attempt === strike.attempt) !== i
        ? [{ path: ["strikes", i, "attempt"], message: "the same attempt struck twice" }]
        : [],
  );
}

function fitProblems(item: Item, value: ItemValue): FitProblem[] {
  switch (item.kind) {
    case "measure": {
      const units = acceptedUnits(item);
      return (value as MeasureValue).attempts
        .flatMap((attempt, i) =>
          units.includes(attempt.unit)
            ? []
            : [
                {
                  path: ["attempts", i, "unit"],
                  message: `this item takes ${units.join(" or ")}, not ${attempt.unit}`,
                },
              ],
        )
        .concat(strikeProblems(value as MeasureValue));
    }
    case "readings": {
      const units = acceptedUnits(item);
      return (value as ReadingsValue).attempts
        .flatMap((attempt, i) => {
          const problems: FitProblem[] = [];
          if (!units.includes(attempt.unit)) {
            problems.push({
              path: ["attempts", i, "unit"],
              message: `this item takes ${units.join(" or ")}, not ${attempt.unit}`,
            });
          }
          if (attempt.cells.length !== item.rows.length) {
            problems.push({
              path: ["attempts", i, "cells"],
              message: `expected ${item.rows.length} rows, got ${attempt.cells.length}`,
            });
          }
          attempt.cells.forEach((row, r) => {
            if (r < item.rows.length && row.length !== item.columns.length) {
              problems.push({
                path: ["attempts", i, "cells", r],
                message: `expected ${item.columns.length} readings in row "${item.rows[r].label}", got ${row.length}`,
              });
            }
          });
          return problems;
        })
        .concat(strikeProblems(value as ReadingsValue));
    }
    case "choice": {
      const { option } = value as ChoiceValue;
      return item.options.some((o) => o.key === option)
        ? []
        : [{ path: ["option"], message: `expected one of ${item.options.map((o) => o.key).join(", ")}` }];
    }
    case "photo": {
      const ids = (value as PhotoValue).photos.map((p) => p.id);
      return ids.flatMap((id, i) =>
        ids.indexOf(id) === i ? [] : [{ path: ["photos", i, "id"], message: "the same photo twice" }],
      );
    }
    default:
      return [];
  }
}
