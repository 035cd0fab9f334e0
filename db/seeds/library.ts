import { createHash } from "node:crypto";
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import type { Knex } from "knex";
import { loadTemplateFile, type Template } from "../../app/lib/templates/index.ts";

export const LIBRARY_DIR = path.resolve(import.meta.dirname, "../../checklists");

export const templateBody = (template: Template) => JSON.stringify(template);
export const sha256 = (text: string) => createHash("sha256").update(text).digest("hex");

/**
 * Loads checklists/ into template_versions as published versions. Every file is validated before
 * anything is written, so a bad file stops the seed with its path instead of loading half a
 * library. Versions already present are left alone; a file that differs from its published
 * version is an error (a change needs a new version file).
 */
export async function seedLibrary(knex: Knex, dir = LIBRARY_DIR): Promise<string> {
  const names = (await readdir(dir)).filter((n) => n.endsWith(".json")).sort();
  const templates = await Promise.all(
    names.map(async (n) => loadTemplateFile(n, await readFile(path.join(dir, n), "utf8"))),
  );
  let added = 0;
  await knex.transaction(async (trx) => {
    for (const template of templates) {
      const body = templateBody(template);
      const existing = await trx("template_versions")
        .where({ template_key: template.key, version: template.version })
        .first();
      if (existing) {
        if (existing.body_sha256 !== sha256(body) && existing.status !== "draft") {
          throw new Error(
            `checklists/${template.key}.v${template.version}.json differs from the published version ${template.version} in the database; save the change as version ${template.version + 1} instead.`,
          );
        }
        continue;
      }
      await trx("template_versions").insert({
        template_key: template.key,
        version: template.version,
        status: "published",
        title: template.title,
        body,
        body_sha256: sha256(body),
        published_at: new Date(),
      });
      added++;
    }
  });
  return added ? `${added} template versions added` : "template library up to date";
}
