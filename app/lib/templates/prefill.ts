import type { Unit } from "~/lib/calc/units";
import type { JobInput } from "~/lib/validation/jobs";
import { acceptedUnits, placedItems, type JobFact } from "./items";
import type { Item, Template } from "./schema";
import type { MeasureValue, Responses } from "./values";

/**
 * Items the job already knows (its installed equipment) are filled from it instead of typed
 * again. An item names the fact it takes with `fromJob`; the first attempt of a prefilled measure
 * is marked as coming from the job, so a later attempt that differs is an override and needs a
 * note saying why (checked by rules.ts).
 */

export type JobEquipment = Pick<
  JobInput,
  | "ratedRpmMin"
  | "ratedRpmMax"
  | "gearRatio"
  | "propDiameterIn"
  | "propPitchIn"
  | "shaftSystem"
  | "shaftDiameterIn"
  | "shaftDiameterMm"
  | "systemVolts"
>;

/** The `by` of an attempt that came from the job's equipment rather than from a person. */
export const FROM_JOB = "job-equipment";

type Fact =
  | {
      kind: "number";
      label: string;
      units: readonly Unit[];
      read(job: JobEquipment): { value: number; unit: Unit };
    }
  | { kind: "option"; label: string; options: readonly string[]; read(job: JobEquipment): string };

export const jobFacts = {
  ratedRpmMin: {
    kind: "number",
    label: "rated rpm, lowest",
    units: ["rpm"],
    read: (job) => ({ value: job.ratedRpmMin, unit: "rpm" }),
  },
  ratedRpmMax: {
    kind: "number",
    label: "rated rpm, highest",
    units: ["rpm"],
    read: (job) => ({ value: job.ratedRpmMax, unit: "rpm" }),
  },
  gearRatio: {
    kind: "number",
    label: "gear ratio",
    units: ["1"],
    read: (job) => ({ value: job.gearRatio, unit: "1" }),
  },
  propellerDiameter: {
    kind: "number",
    label: "propeller diameter",
    units: ["in"],
    read: (job) => ({ value: job.propDiameterIn, unit: "in" }),
  },
  propellerPitch: {
    kind: "number",
    label: "propeller pitch",
    units: ["in"],
    read: (job) => ({ value: job.propPitchIn, unit: "in" }),
  },
  // In the shaft's own system: a metric shaft as its millimetres.
  shaftDiameter: {
    kind: "number",
    label: "shaft diameter",
    units: ["in", "mm"],
    read: (job) =>
      job.shaftSystem === "metric" && job.shaftDiameterMm !== undefined
        ? { value: job.shaftDiameterMm, unit: "mm" }
        : { value: job.shaftDiameterIn, unit: "in" },
  },
  shaftSystem: {
    kind: "option",
    label: "shaft system",
    options: ["inch", "metric"],
    read: (job) => job.shaftSystem,
  },
  systemVoltage: {
    kind: "number",
    label: "DC system voltage",
    units: ["V"],
    read: (job) => ({ value: job.systemVolts, unit: "V" }),
  },
} as const satisfies Record<JobFact, Fact>;

/** What is wrong with an item's `fromJob` (checked when a template is read), paths relative to the item. */
export function prefillProblems(item: Item): { path: string[]; message: string }[] {
  if (!("fromJob" in item) || item.fromJob === undefined) return [];
  const fact: Fact = jobFacts[item.fromJob];
  const at = ["fromJob"];
  if (fact.kind === "number") {
    if (item.kind !== "measure")
      return [{ path: at, message: `the job's ${fact.label} is a number: only a measure item takes it` }];
    const missing = fact.units.filter((unit) => !acceptedUnits(item).includes(unit));
    return missing.length
      ? [
          {
            path: at,
            message: `the job gives its ${fact.label} in ${missing.join(", ")}, which this item does not accept`,
          },
        ]
      : [];
  }
  if (item.kind !== "choice")
    return [{ path: at, message: `the job's ${fact.label} is one of a list: only a choice item takes it` }];
  const missing = fact.options.filter((key) => !item.options.some((o) => o.key === key));
  return missing.length
    ? [
        {
          path: at,
          message: `the job's ${fact.label} can be ${missing.join(", ")}, which this item has no option for`,
        },
      ]
    : [];
}

/**
 * Responses for the items that take a fact of the job, for those not answered yet. `at` is when
 * the checklist was started; the value stays the job's until someone enters another.
 */
export function prefillResponses(
  template: Template,
  job: JobEquipment,
  responses: Responses,
  at: string,
): Responses {
  const filled: Record<string, unknown> = {};
  for (const { item } of placedItems(template)) {
    if (!("fromJob" in item) || item.fromJob === undefined) continue;
    if (responses[item.key] !== undefined && responses[item.key] !== null) continue;
    const fact: Fact = jobFacts[item.fromJob];
    if (fact.kind === "number" && item.kind === "measure") {
      const { value, unit } = fact.read(job);
      filled[item.key] = { attempts: [{ value, unit, at, by: FROM_JOB }] } satisfies MeasureValue;
    } else if (fact.kind === "option" && item.kind === "choice") {
      filled[item.key] = { option: fact.read(job) };
    }
  }
  return filled;
}
