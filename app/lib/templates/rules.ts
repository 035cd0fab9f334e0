import type { CalcOutcome, Calculations } from "~/lib/calc/define";
import { runDefinition } from "~/lib/calc/run";
import { atLeast, atMost } from "~/lib/calc/numbers";
import { convert, dimensionOf, isUnit, type Unit } from "~/lib/calc/units";
import { gatherCalcInputs } from "./calc-inputs";
import { describeRule, formatEntered, formatNumber, formatQuantity } from "./format";
import { formatPath } from "./path";
import { FROM_JOB } from "./prefill";
import { findItem } from "./items";
import type {
  AppliesWhen,
  CalcItem,
  CalcRule,
  ChoiceItem,
  Item,
  MeasureItem,
  ReadingsItem,
  ReadingsRule,
  Rule,
  Template,
} from "./schema";
import {
  liveAttempts,
  valueSchemaFor,
  type CheckValue,
  type ChoiceValue,
  type InitialsValue,
  type MeasureValue,
  type PhotoValue,
  type ReadingsValue,
  type Responses,
  type TextValue,
} from "./values";

/**
 * The one acceptance-rule evaluator, run by the tablet as the technician types and by the server
 * before it stores anything. A verdict is always computed from the response, never stored in it.
 */

export type VerdictStatus =
  /** nothing entered yet (a calc item: its inputs are not all in) */
  | "unanswered"
  /** started but not finished: empty cells in a grid, fewer photos than asked */
  | "incomplete"
  /** the entry does not fit the item: a unit it does not take, a grid of the wrong shape */
  | "invalid"
  | "ok"
  /** outside the acceptance rule and no corrective-action note yet */
  | "out-of-range"
  /** failed, not applicable, or a choice that is a finding, and no note yet */
  | "needs-note"
  /** not applicable, with the reason why: done */
  | "noted"
  /**
   * a finding (a fail, a reading outside its limit, a flagged choice) that carries its
   * corrective-action note: done, but still a finding for the reviewer, never a pass
   */
  | "action-noted";

export type Finding = "fail" | "not-applicable" | "out-of-range" | "flagged-option" | "changed-from-job";

export interface Verdict {
  status: VerdictStatus;
  /** Counts as done: answered, and the note a finding needs is there. */
  done: boolean;
  /** Plain words for the person at the item. */
  message: string;
  /**
   * A finding's account on its own, without what the message asks of the person at the item
   * ("0.0016 in is above the upper limit of 0.001 in."): what the record prints.
   */
  account?: string;
  /** Why a note was (or is) needed; kept once the note is written so a reviewer sees it. */
  finding?: Finding;
  /** Readings outside the rule: a cell, or a whole row when the rule is on the row's spread. */
  offending?: { row: number; column?: number }[];
  /** A calc item's result, for its panel and diagram. */
  outcome?: CalcOutcome;
}

export interface EvaluationContext {
  template: Template;
  responses: Responses;
}

const NOTE_FOR_RANGE = "Write the corrective action in the note, or correct it and enter a new attempt.";

const DONE = new Set<VerdictStatus>(["ok", "noted", "action-noted"]);

function hasNote(note: string | undefined): boolean {
  return typeof note === "string" && note.trim().length > 0;
}

function verdict(status: VerdictStatus, message: string, extra: Partial<Verdict> = {}): Verdict {
  return { status, done: DONE.has(status), message, ...extra };
}

/**
 * A finding with its note is `action-noted` (`noted` for a reason why it does not apply);
 * without it, `needs-note` (or `out-of-range` for a reading).
 */
function finding(
  kind: Finding,
  note: string | undefined,
  what: string,
  ask: string,
  extra: Partial<Verdict> = {},
): Verdict {
  if (hasNote(note))
    return verdict(kind === "not-applicable" ? "noted" : "action-noted", `${what} Noted.`, {
      finding: kind,
      account: what,
      ...extra,
    });
  return verdict(kind === "out-of-range" ? "out-of-range" : "needs-note", `${what} ${ask}`, {
    finding: kind,
    account: what,
    ...extra,
  });
}

/**
 * The verdict on one item's response. `value` is the stored response (absent when none); it is
 * validated against the item first. A calc item needs the context: its inputs are other items;
 * and the calculations at hand (the barrel's `evaluate` passes the whole registry; the checklist
 * screen passes what it loaded on demand).
 */
export function evaluateWith(
  calculations: Calculations,
  item: Item,
  value: unknown,
  context?: EvaluationContext,
): Verdict {
  if (context && item.appliesWhen) {
    const condition = appliesNow(item.appliesWhen, context);
    if (!condition.applies) return condition.verdict;
  }
  if (item.kind === "calc") return evaluateCalc(calculations, item, value, context);
  if (value === undefined || value === null) return verdict("unanswered", "Not answered yet.");
  const parsed = valueSchemaFor(item).safeParse(value);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const where = formatPath(issue.path);
    return verdict(
      "invalid",
      `This entry does not fit the item${where ? ` (${where})` : ""}: ${issue.message}.`,
    );
  }
  switch (item.kind) {
    case "check":
      return evaluateCheck(parsed.data as CheckValue);
    case "measure":
    case "readings": {
      // Struck attempts stay in the record but never count.
      const logged = parsed.data as MeasureValue | ReadingsValue;
      const live = liveAttempts<MeasureValue["attempts"][number] | ReadingsValue["attempts"][number]>(logged);
      if (live.length === 0)
        return verdict("unanswered", "Every attempt is struck through: enter a new one.");
      return item.kind === "measure"
        ? evaluateMeasure(item, { ...(logged as MeasureValue), attempts: live as MeasureValue["attempts"] })
        : evaluateReadings(item, {
            ...(logged as ReadingsValue),
            attempts: live as ReadingsValue["attempts"],
          });
    }
    case "choice":
      return evaluateChoice(item, parsed.data as ChoiceValue);
    case "text":
      return (parsed.data as TextValue).text.trim()
        ? verdict("ok", "Written.")
        : verdict("unanswered", "Not written yet.");
    case "photo":
      return evaluatePhotos((parsed.data as PhotoValue).photos.length, item.minPhotos);
    case "initials":
      return verdict("ok", `Confirmed by ${(parsed.data as InitialsValue).initials.trim()}.`);
  }
}

/** Whether an item with a condition applies, from the answer to the item it depends on. */
function appliesNow(
  when: AppliesWhen,
  context: EvaluationContext,
): { applies: true } | { applies: false; verdict: Verdict } {
  const source = findItem(context.template, when.item);
  const raw = context.responses[when.item];
  if (!source || raw === undefined || raw === null)
    return { applies: false, verdict: verdict("unanswered", `Waits for: ${source?.label ?? when.item}.`) };
  const parsed = valueSchemaFor(source).safeParse(raw);
  if (!parsed.success)
    return { applies: false, verdict: verdict("unanswered", `Waits for: ${source.label}.`) };
  let answer: string | undefined;
  if (source.kind === "choice") {
    const option = (parsed.data as ChoiceValue).option;
    if (when.options?.includes(option)) return { applies: true };
    answer = source.options.find((o) => o.key === option)?.label;
  } else if (source.kind === "measure") {
    const last = liveAttempts(parsed.data as MeasureValue).at(-1);
    if (!last) return { applies: false, verdict: verdict("unanswered", `Waits for: ${source.label}.`) };
    const inUnit = convert(last.value, last.unit, source.unit);
    if (when.values?.some((v) => atLeast(inUnit, v) && atMost(inUnit, v))) return { applies: true };
    answer = formatEntered(last.value, last.unit);
  } else return { applies: true };
  return {
    applies: false,
    verdict: verdict("noted", `Does not apply: ${source.label}: ${answer}.`, { finding: "not-applicable" }),
  };
}

/** Every item of a template, keyed by item key. */
export function evaluateAllWith(
  calculations: Calculations,
  template: Template,
  responses: Responses,
): Record<string, Verdict> {
  const verdicts: Record<string, Verdict> = {};
  for (const section of template.sections) {
    for (const item of section.items)
      verdicts[item.key] = evaluateWith(calculations, item, responses[item.key], { template, responses });
  }
  return verdicts;
}

function evaluateCheck(value: CheckValue): Verdict {
  switch (value.result) {
    case "pass":
      return verdict("ok", "Passed.");
    case "fail":
      return finding(
        "fail",
        value.note,
        "Failed.",
        "Write what is wrong and what was done about it in the note.",
      );
    case "na":
      return finding("not-applicable", value.note, "Marked not applicable.", "Say why in the note.");
  }
}

interface Bounds {
  low?: number;
  high?: number;
}

/** min/max narrowed by nominal ± tolerance. */
function boundsOf(rule: Rule | ReadingsRule | CalcRule): Bounds {
  let { min: low, max: high } = rule;
  if (rule.nominal !== undefined && rule.tolerance !== undefined) {
    const lo = rule.nominal - rule.tolerance;
    const hi = rule.nominal + rule.tolerance;
    low = low === undefined ? lo : Math.max(low, lo);
    high = high === undefined ? hi : Math.min(high, hi);
  }
  return { low, high };
}

/** Where a value in the rule's unit falls: undefined when within, else which limit it crossed. */
function crossing(value: number, bounds: Bounds): { side: "below" | "above"; limit: number } | undefined {
  if (bounds.low !== undefined && !atLeast(value, bounds.low)) return { side: "below", limit: bounds.low };
  if (bounds.high !== undefined && !atMost(value, bounds.high)) return { side: "above", limit: bounds.high };
  return undefined;
}

/** "0.1 mm (0.003937 in)": as entered, and in the rule's unit when that differs. */
function asEntered(value: number, unit: Unit, ruleUnit: Unit): string {
  const entered = formatEntered(value, unit);
  return unit === ruleUnit
    ? entered
    : `${entered} (${formatQuantity(convert(value, unit, ruleUnit), ruleUnit)})`;
}

/** A later attempt that differs from the figure the job gave: an override, which says why. */
function overridesJob(value: MeasureValue): boolean {
  const [first] = value.attempts;
  const last = value.attempts[value.attempts.length - 1];
  return (
    first.by === FROM_JOB && last !== first && !sameQuantity(last.value, last.unit, first.value, first.unit)
  );
}

function sameQuantity(a: number, aUnit: Unit, b: number, bUnit: Unit): boolean {
  if (dimensionOf(aUnit) !== dimensionOf(bUnit)) return false;
  const converted = convert(a, aUnit, bUnit);
  return atLeast(converted, b) && atMost(converted, b);
}

function evaluateMeasure(item: MeasureItem, value: MeasureValue): Verdict {
  const last = value.attempts[value.attempts.length - 1];
  if (overridesJob(value) && !hasNote(value.note)) {
    const job = value.attempts[0];
    return verdict(
      "needs-note",
      `Changed from the job's equipment (${formatEntered(job.value, job.unit)}) to ${formatEntered(last.value, last.unit)}: say why in the note.`,
      { finding: "changed-from-job" },
    );
  }
  const tries = value.attempts.length > 1 ? ` (attempt ${value.attempts.length})` : "";
  const rule = item.rule;
  if (!rule) return verdict("ok", `${asEntered(last.value, last.unit, last.unit)} recorded${tries}.`);
  const shown = asEntered(last.value, last.unit, rule.unit);
  const crossed = crossing(convert(last.value, last.unit, rule.unit), boundsOf(rule));
  if (!crossed) return verdict("ok", `${shown}${tries} is within the rule: ${describeRule(rule)}.`);
  const what = `${shown}${tries} is ${crossed.side} the ${crossed.side === "below" ? "lower" : "upper"} limit of ${formatQuantity(crossed.limit, rule.unit)}.`;
  return finding("out-of-range", value.note, what, NOTE_FOR_RANGE);
}

function evaluateReadings(item: ReadingsItem, value: ReadingsValue): Verdict {
  const last = value.attempts[value.attempts.length - 1];
  const empty = last.cells.flat().filter((cell) => cell === null).length;
  if (empty > 0) {
    const total = item.rows.length * item.columns.length;
    return verdict("incomplete", `${empty} of ${total} readings still to enter.`);
  }
  const tries = value.attempts.length > 1 ? ` (attempt ${value.attempts.length})` : "";
  const rule = item.rule;
  if (!rule) return verdict("ok", `All ${item.rows.length * item.columns.length} readings entered${tries}.`);
  const bounds = boundsOf(rule);
  const cells = last.cells.map((row) => row.map((cell) => convert(cell as number, last.unit, rule.unit)));
  const outside: string[] = [];
  const offending: { row: number; column?: number }[] = [];
  cells.forEach((row, r) => {
    const rowLabel = item.rows[r].label;
    if (rule.appliesTo === "row-spread") {
      const spread = Math.max(...row) - Math.min(...row);
      const crossed = crossing(spread, bounds);
      if (crossed) {
        offending.push({ row: r });
        outside.push(
          `${rowLabel}: spread ${formatQuantity(spread, rule.unit)} is ${crossed.side} ${formatQuantity(crossed.limit, rule.unit)}`,
        );
      }
      return;
    }
    row.forEach((cell, c) => {
      const crossed = crossing(cell, bounds);
      if (crossed) {
        offending.push({ row: r, column: c });
        outside.push(
          `${rowLabel}, ${item.columns[c].label}: ${formatQuantity(cell, rule.unit)} is ${crossed.side} ${formatQuantity(crossed.limit, rule.unit)}`,
        );
      }
    });
  });
  if (!outside.length) return verdict("ok", `All readings${tries} within the rule: ${describeRule(rule)}.`);
  return finding(
    "out-of-range",
    value.note,
    `Outside the rule${tries}: ${outside.join("; ")}.`,
    NOTE_FOR_RANGE,
    { offending },
  );
}

function evaluateChoice(item: ChoiceItem, value: ChoiceValue): Verdict {
  const option = item.options.find((o) => o.key === value.option)!;
  if (!option.needsNote) return verdict("ok", `${option.label}.`);
  return finding(
    "flagged-option",
    value.note,
    `${option.label}.`,
    "This choice needs a note: say what was found and what was done.",
  );
}

function evaluatePhotos(count: number, minPhotos: number): Verdict {
  if (count === 0)
    return verdict("unanswered", minPhotos > 1 ? `No photos yet; ${minPhotos} needed.` : "No photo yet.");
  if (count < minPhotos) return verdict("incomplete", `${count} of ${minPhotos} photos taken.`);
  return verdict("ok", count === 1 ? "1 photo." : `${count} photos.`);
}

function evaluateCalc(
  calculations: Calculations,
  item: CalcItem,
  value: unknown,
  context: EvaluationContext | undefined,
): Verdict {
  let note: string | undefined;
  if (value !== undefined && value !== null) {
    const parsed = valueSchemaFor(item).safeParse(value);
    if (!parsed.success)
      return verdict("invalid", `This entry does not fit the item: ${parsed.error.issues[0].message}.`);
    note = parsed.data.note;
  }
  const definition = Object.hasOwn(calculations, item.calc) ? calculations[item.calc] : undefined;
  if (!definition) return verdict("invalid", `There is no calculation named "${item.calc}".`);
  if (!context) return verdict("unanswered", "Computed from other items of the checklist.");
  const gathered = gatherCalcInputs(item, definition, context.template, context.responses);
  if (!gathered.ready)
    return verdict(
      "unanswered",
      `Waits for: ${gathered.waitingFor.map((source) => source.label).join("; ")}.`,
    );
  const outcome = runDefinition(definition, gathered.inputs);
  if ("error" in outcome) {
    // The error names the registry input; say which item of the checklist fed it.
    const binding = Object.hasOwn(item.inputs, outcome.error.field)
      ? item.inputs[outcome.error.field]
      : undefined;
    const source = binding && "item" in binding ? findItem(context.template, binding.item) : undefined;
    return verdict("invalid", `${source ? `${source.label}: ` : ""}${outcome.error.message}`);
  }
  const summary = calcSummary(outcome);
  if (item.rule) return judgeCalcByRule(item.rule, outcome, summary, note);
  if (outcome.verdict === "fail")
    return finding("out-of-range", note, `${summary} Outside the rule: ${outcome.rule}.`, NOTE_FOR_RANGE, {
      outcome,
    });
  if (outcome.verdict === "pass")
    return verdict("ok", `${summary} Within the rule: ${outcome.rule}.`, { outcome });
  return verdict("ok", summary, { outcome });
}

/** The item's own acceptance rule on one value of the result decides, not the calculation. */
function judgeCalcByRule(rule: CalcRule, outcome: CalcOutcome, summary: string, note?: string): Verdict {
  const value = Object.hasOwn(outcome.values, rule.output) ? outcome.values[rule.output] : undefined;
  if (typeof value !== "number")
    return verdict(
      "invalid",
      `The rule is on "${rule.output}", which this calculation does not give as a number.`,
      {
        outcome,
      },
    );
  const from = outcome.units[rule.output] ?? "1";
  if (!isUnit(from) || dimensionOf(from) !== dimensionOf(rule.unit))
    return verdict("invalid", `The rule in ${rule.unit} cannot be applied to "${rule.output}" in ${from}.`, {
      outcome,
    });
  const judged = { ...outcome, verdict: "pass" as CalcOutcome["verdict"], rule: describeRule(rule) };
  const shown = asEntered(value, from, rule.unit);
  const crossed = crossing(convert(value, from, rule.unit), boundsOf(rule));
  if (!crossed) return verdict("ok", `${summary} Within the rule: ${judged.rule}.`, { outcome: judged });
  judged.verdict = "fail";
  const what = `${summary} ${rule.output} ${shown} is ${crossed.side} the ${crossed.side === "below" ? "lower" : "upper"} limit of ${formatQuantity(crossed.limit, rule.unit)}.`;
  return finding("out-of-range", note, what, NOTE_FOR_RANGE, { outcome: judged });
}
function calcSummary(outcome: CalcOutcome): string {
  const parts = Object.entries(outcome.values).map(([name, v]) => {
    const unit = outcome.units[name];
    return typeof v === "number" ? `${name} ${formatNumber(v)}${unit ? ` ${unit}` : ""}` : `${name} ${v}`;
  });
  return parts.length ? `${parts.join(", ")}.` : "";
}
