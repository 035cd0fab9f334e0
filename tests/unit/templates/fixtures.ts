import { readdirSync, readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import type { Unit } from "~/lib/calc/units";
import {
  loadTemplateFile,
  parseTemplate,
  type Item,
  type Template,
  type TemplateInput,
} from "~/lib/templates";

/** Builders for the template tests: small templates, responses as the tablet stores them. */

export const libraryDir = fileURLToPath(new URL("../../../checklists/", import.meta.url));

export function libraryFiles(): string[] {
  return readdirSync(libraryDir)
    .filter((name) => name.endsWith(".json"))
    .sort();
}

export function loadLibrary(): Template[] {
  return libraryFiles().map((name) => loadTemplateFile(name, readFileSync(libraryDir + name, "utf8")));
}

type ItemInput = TemplateInput["sections"][number]["items"][number];

/** A one-section template around the given items, parsed (so defaults apply). */
export function templateOf(...items: ItemInput[]): Template {
  const parsed = parseTemplate({
    key: "test-template",
    version: 1,
    title: "Test",
    purpose: "For the tests.",
    sections: [{ key: "only", title: "Only section", items }],
  });
  if (!parsed.ok) throw new Error(parsed.problems.map((p) => `${p.path}: ${p.message}`).join("; "));
  return parsed.template;
}

export function itemOf(template: Template, key: string): Item {
  const item = template.sections.flatMap((s) => s.items).find((i) => i.key === key);
  if (!item) throw new Error(`no item ${key}`);
  return item;
}

const AT = "2025-05-14T09:30:00Z";
const BY = "tech-7";

export function measured(...attempts: [number, Unit][]) {
  return { attempts: attempts.map(([value, unit]) => ({ value, unit, at: AT, by: BY })) };
}

export function grid(unit: Unit, ...attempts: (number | null)[][][]) {
  return { attempts: attempts.map((cells) => ({ cells, unit, at: AT, by: BY })) };
}

export const signed = { initials: "RK", at: AT, by: BY };
