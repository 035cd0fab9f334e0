import { readdirSync, readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { loadTemplateFile, parseTemplate, type Template } from "~/lib/templates";

const libraryDir = fileURLToPath(new URL("../../../checklists/", import.meta.url));

/** The starter library exactly as the seed reads it. */
export function starterLibrary(): Template[] {
  return readdirSync(libraryDir)
    .filter((name) => name.endsWith(".json"))
    .sort()
    .map((name) => loadTemplateFile(name, readFileSync(libraryDir + name, "utf8")));
}

export function starter(key: string): Template {
  const found = starterLibrary().find((t) => t.key === key);
  if (!found) throw new Error(`no starter template ${key}`);
  return found;
}

/** A deep copy to edit by hand, parsed again so defaults apply. */
export function edited(template: Template, change: (copy: any) => void): Template {
  const copy = structuredClone(template) as any;
  change(copy);
  const parsed = parseTemplate(copy);
  if (!parsed.ok) throw new Error(parsed.problems.map((p) => `${p.path}: ${p.message}`).join("; "));
  return parsed.template;
}

/** A small template whose items are easy to follow: a, b, c in one section, d, e in another. */
export function small(): Template {
  const check = (key: string) => ({ kind: "check", key, label: `Check ${key}` });
  const parsed = parseTemplate({
    key: "small",
    version: 1,
    title: "Small",
    purpose: "For the diff tests.",
    sections: [
      { key: "one", title: "One", items: [check("a"), check("b"), check("c")] },
      { key: "two", title: "Two", items: [check("d"), check("e")] },
    ],
  });
  if (!parsed.ok) throw new Error("fixture does not parse");
  return parsed.template;
}
