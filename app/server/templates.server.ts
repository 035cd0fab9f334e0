import type { Knex } from "knex";
import type { Template } from "~/lib/templates";
import { db } from "./db.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import type { TemplateVersionRow as TemplateVersionTableRow } from "./tables.server.ts";

export interface TemplateVersionRow {
  id: number;
  key: string;
  version: number;
  status: "draft" | "published" | "retired";
  title: string;
  publishedAt: Date | null;
}

const toRow = (r: TemplateVersionTableRow): TemplateVersionRow => ({
  id: r.id,
  key: r.template_key,
  version: r.version,
  status: r.status,
  title: r.title,
  publishedAt: r.published_at,
});

/** The newest published version of each template: what a new checklist starts from. */
export async function latestPublished(knex: Knex = db()): Promise<TemplateVersionRow[]> {
  const rows: TemplateVersionTableRow[] = await knex("template_versions as t")
    .where("t.status", "published")
    .whereNotExists(
      knex("template_versions as n")
        .whereRaw("n.template_key = t.template_key")
        .where("n.status", "published")
        .whereRaw("n.version > t.version"),
    )
    .orderBy("t.template_key");
  return rows.map(toRow);
}

export async function findTemplateVersion(key: string, version: number) {
  const row = await db()("template_versions").where({ template_key: key, version }).first();
  return row ? { ...toRow(row), template: parseJsonColumn<Template>(row.body) } : undefined;
}

export async function findTemplateVersionById(id: number, knex: Knex = db()) {
  const row = await knex("template_versions").where({ id }).first();
  return row ? { ...toRow(row), template: parseJsonColumn<Template>(row.body) } : undefined;
}
