import type { Unit } from "~/lib/calc/units";
import type { Item, MeasureItem, ReadingsItem, Section, Template } from "./schema";

/**
 * The names and helpers of the template format that need no validation: the checklist screen
 * imports these without the format's zod schemas (schema.ts), which only the server, the seed
 * and the library editor parse with.
 */

/** Where the boat is when the step is done; the screens can filter and order by it. */
export const phases = ["in-the-shop", "on-the-hard", "afloat", "sea-trial", "after-sea-trial"] as const;
export type Phase = (typeof phases)[number];

export const phaseLabels: Record<Phase, string> = {
  "in-the-shop": "In the shop",
  "on-the-hard": "On the hard",
  afloat: "Afloat",
  "sea-trial": "Sea trial",
  "after-sea-trial": "After the sea trial",
};

/** A fact of the job's installed equipment an item is filled from (see prefill.ts). */
export const jobFactNames = [
  "ratedRpmMin",
  "ratedRpmMax",
  "gearRatio",
  "propellerDiameter",
  "propellerPitch",
  "shaftDiameter",
  "shaftSystem",
  "systemVoltage",
] as const;
export type JobFact = (typeof jobFactNames)[number];

/** The units a measure or readings item takes: its `accepts` list, or only its `unit`. */
export function acceptedUnits(item: MeasureItem | ReadingsItem): readonly Unit[] {
  return item.accepts ?? [item.unit];
}

export interface PlacedItem {
  item: Item;
  section: Section;
  sectionIndex: number;
  itemIndex: number;
}

/** Every item of a template in reading order, with where it sits. */
export function placedItems(template: Template): PlacedItem[] {
  return template.sections.flatMap((section, sectionIndex) =>
    section.items.map((item, itemIndex) => ({ item, section, sectionIndex, itemIndex })),
  );
}

export function findItem(template: Template, key: string): Item | undefined {
  for (const section of template.sections) {
    const item = section.items.find((candidate) => candidate.key === key);
    if (item) return item;
  }
  return undefined;
}
