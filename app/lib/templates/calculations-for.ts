import type { Calculations } from "~/lib/calc/define";
import type { Template } from "./schema";

const none: Calculations = {};

/**
 * The calculation registry, fetched only when the template has a calc item: most checklists
 * (exhaust, cooling, instruments) need none, and the registry is a seventh of the checklist
 * screen's weight.
 */
export async function calculationsFor(template: Template): Promise<Calculations> {
  if (!template.sections.some((section) => section.items.some((item) => item.kind === "calc"))) return none;
  return (await import("~/lib/calc/registry")).calculations;
}
