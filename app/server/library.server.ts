import type { Knex } from "knex";
import { canViewJob, can, type Actor } from "~/lib/permissions";
import { Refusal } from "~/lib/refusal";
import { parseTemplate, parseTemplateText, type Template, type TemplateProblem } from "~/lib/templates";
import { sha256, templateBody } from "../../db/seeds/library.ts";
import { audit } from "./audit.server.ts";
import { db } from "./db.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import type { TemplateStatus, TemplateVersionRow } from "./tables.server.ts";

/**
 * The template library as the manager keeps it: every version of every template with the jobs
 * that use it, drafts (always valid: a draft is saved only when the schema passes, see
 * docs/decisions/003-template-drafts.md), publishing, retiring, import and export. A published
 * version never changes; MariaDB's trigger refuses it even if this code tried.
 */

export type VersionStatus = TemplateStatus;

export interface VersionUse {
  checklistId: string;
  jobId: number;
  vesselName: string;
  state: string;
}

export interface LibraryVersion {
  id: number;
  key: string;
  version: number;
  status: VersionStatus;
  title: string;
  publishedAt: Date | null;
  retiredAt: Date | null;
  createdAt: Date;
  createdByName: string | null;
  /** Every job checklist pinned to this version. */
  jobCount: number;
  /** The ones this person may open. */
  jobs: VersionUse[];
}

export interface LibraryTemplate {
  key: string;
  /** The title of the newest version this person can see. */
  title: string;
  /** What a new job starts from; null when no version is published. */
  newestPublished: number | null;
  draft: number | null;
  /** Newest first. */
  versions: LibraryVersion[];
}

const mayEdit = (actor: Actor) => can(actor, "library:edit");

interface UseRow {
  checklist_id: string;
  template_version_id: number;
  state: string;
  job_id: number;
  lead_id: number;
  vessel_name: string;
}

type Uses = Map<number, { count: number; visible: VersionUse[] }>;

async function uses(knex: Knex, actor: Actor, versionIds?: number[]): Promise<Uses> {
  let query = knex("job_checklists as c")
    .join("jobs as j", "j.id", "c.job_id")
    .join("vessels as v", "v.id", "j.vessel_id")
    .orderBy("v.name")
    .select(
      "c.id as checklist_id",
      "c.template_version_id",
      "c.state",
      "j.id as job_id",
      "j.lead_id",
      "v.name as vessel_name",
    );
  if (versionIds) query = query.whereIn("c.template_version_id", versionIds);
  const rows: UseRow[] = await query;
  const crew = rows.length
    ? await knex("job_technicians")
        .whereIn("job_id", [...new Set(rows.map((r) => r.job_id))])
        .select("job_id", "user_id")
    : [];
  const byVersion: Uses = new Map();
  for (const r of rows) {
    const entry = byVersion.get(r.template_version_id) ?? { count: 0, visible: [] };
    entry.count++;
    const technicianIds = crew.filter((c) => c.job_id === r.job_id).map((c) => c.user_id);
    if (canViewJob(actor, { leadId: r.lead_id, technicianIds })) {
      entry.visible.push({
        checklistId: r.checklist_id,
        jobId: r.job_id,
        vesselName: r.vessel_name,
        state: r.state,
      });
    }
    byVersion.set(r.template_version_id, entry);
  }
  return byVersion;
}

type VersionListRow = Pick<
  TemplateVersionRow,
  "id" | "template_key" | "version" | "status" | "title" | "published_at" | "retired_at" | "created_at"
> & { created_by_name: string | null };

function versionQuery(knex: Knex) {
  return knex("template_versions as t")
    .leftJoin("users as u", "u.id", "t.created_by")
    .select(
      "t.id",
      "t.template_key",
      "t.version",
      "t.status",
      "t.title",
      "t.published_at",
      "t.retired_at",
      "t.created_at",
      "u.name as created_by_name",
    );
}

function toVersion(row: VersionListRow, used: Uses): LibraryVersion {
  const use = used.get(row.id);
  return {
    id: row.id,
    key: row.template_key,
    version: row.version,
    status: row.status,
    title: row.title,
    publishedAt: row.published_at,
    retiredAt: row.retired_at,
    createdAt: row.created_at,
    createdByName: row.created_by_name,
    jobCount: use?.count ?? 0,
    jobs: use?.visible ?? [],
  };
}

function groupByKey(versions: LibraryVersion[]): LibraryTemplate[] {
  const keys = [...new Set(versions.map((v) => v.key))];
  return keys
    .map((key) => {
      const own = versions.filter((v) => v.key === key).sort((a, b) => b.version - a.version);
      return {
        key,
        title: own[0].title,
        newestPublished: own.find((v) => v.status === "published")?.version ?? null,
        draft: own.find((v) => v.status === "draft")?.version ?? null,
        versions: own,
      };
    })
    .sort((a, b) => a.title.localeCompare(b.title));
}

/** Every template this person may read: drafts for those who edit the library, the rest for all. */
export async function listLibrary(actor: Actor, knex: Knex = db()): Promise<LibraryTemplate[]> {
  let query = versionQuery(knex);
  if (!mayEdit(actor)) query = query.whereNot("t.status", "draft");
  const [rows, used]: [VersionListRow[], Uses] = await Promise.all([query, uses(knex, actor)]);
  return groupByKey(rows.map((r) => toVersion(r, used)));
}

/** One template's versions as this person may see them, or undefined when there is none to show. */
export async function templateHistory(
  actor: Actor,
  key: string,
  knex: Knex = db(),
): Promise<LibraryTemplate | undefined> {
  let query = versionQuery(knex).where("t.template_key", key);
  if (!mayEdit(actor)) query = query.whereNot("t.status", "draft");
  const rows: VersionListRow[] = await query;
  if (!rows.length) return undefined;
  const used = await uses(
    knex,
    actor,
    rows.map((r) => r.id),
  );
  return groupByKey(rows.map((r) => toVersion(r, used)))[0];
}

/** A version's template, if this person may read it (drafts only for those who edit the library). */
export async function readableVersion(actor: Actor, key: string, version: number, knex: Knex = db()) {
  if (!Number.isInteger(version) || version < 1) return undefined;
  const row = await knex("template_versions").where({ template_key: key, version }).first();
  if (!row || (row.status === "draft" && !mayEdit(actor))) return undefined;
  return { id: row.id, status: row.status, template: parseJsonColumn<Template>(row.body) };
}

// ---- changes ---------------------------------------------------------------------------------

type VersionRow = Pick<TemplateVersionRow, "id" | "version" | "status" | "body" | "body_sha256">;

/** The key's versions, locked for the rest of the transaction so two managers cannot race. */
async function lockedVersions(trx: Knex.Transaction, key: string): Promise<VersionRow[]> {
  return trx("template_versions")
    .where({ template_key: key })
    .orderBy("version")
    .forUpdate()
    .select("id", "version", "status", "body", "body_sha256");
}

function isDuplicate(error: unknown) {
  return (error as { code?: string })?.code === "ER_DUP_ENTRY";
}

async function insertDraft(trx: Knex.Transaction, template: Template, userId: number) {
  const body = templateBody(template);
  try {
    const [id] = await trx("template_versions").insert({
      template_key: template.key,
      version: template.version,
      status: "draft",
      title: template.title,
      body,
      body_sha256: sha256(body),
      created_by: userId,
    });
    return id as number;
  } catch (error) {
    if (isDuplicate(error))
      throw new Refusal(
        "wrong-state",
        "Someone else has just made this version. Reload the library and try again.",
      );
    throw error;
  }
}

function mustParse(input: unknown): Template {
  const parsed = parseTemplate(input);
  if (!parsed.ok)
    throw new Refusal(
      "invalid",
      `The template does not load: ${parsed.problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`,
    );
  return parsed.template;
}

/** A new template: version 1, a draft with one section and one item to start from. */
export async function createTemplate(
  fields: { key: string; title: string; purpose: string },
  userId: number,
): Promise<{ key: string; version: number }> {
  const template = mustParse({
    key: fields.key,
    version: 1,
    title: fields.title,
    purpose: fields.purpose,
    sections: [
      {
        key: "first-section",
        title: "First section",
        items: [{ kind: "check", key: "first-check", label: "First check" }],
      },
    ],
  });
  return db().transaction(async (trx) => {
    if ((await lockedVersions(trx, template.key)).length)
      throw new Refusal("wrong-state", `There is already a template with the key ${template.key}.`, "key");
    const id = await insertDraft(trx, template, userId);
    await audit(
      {
        userId,
        action: "template.created",
        entity: "template_version",
        entityId: id,
        detail: { key: template.key, version: 1 },
      },
      trx,
    );
    return { key: template.key, version: 1 };
  });
}

/** A new draft copied from any version of the key; a key has at most one draft at a time. */
export async function createDraftFrom(
  key: string,
  version: number,
  userId: number,
): Promise<{ key: string; version: number }> {
  return db().transaction(async (trx) => {
    const versions = await lockedVersions(trx, key);
    const source = versions.find((v) => v.version === version);
    if (!source) throw new Refusal("not-found", "There is no such template version.");
    const draft = versions.find((v) => v.status === "draft");
    if (draft)
      throw new Refusal(
        "wrong-state",
        `Version ${draft.version} is already a draft: edit it, publish it or discard it first.`,
      );
    const next = Math.max(...versions.map((v) => v.version)) + 1;
    const template = mustParse({ ...parseJsonColumn<object>(source.body), version: next });
    const id = await insertDraft(trx, template, userId);
    await audit(
      {
        userId,
        action: "template.draft-created",
        entity: "template_version",
        entityId: id,
        detail: { key, version: next, from: version },
      },
      trx,
    );
    return { key, version: next };
  });
}

export type SaveResult = { ok: true } | { ok: false; problems: TemplateProblem[] };

/** Saves the editor's draft if, and only if, it passes the schema; nothing is written otherwise. */
export async function saveDraft(
  key: string,
  version: number,
  input: unknown,
  userId: number,
): Promise<SaveResult> {
  const parsed = parseTemplate(input);
  if (!parsed.ok) return parsed;
  const template = parsed.template;
  const misplaced: TemplateProblem[] = [];
  if (template.key !== key) misplaced.push({ path: "key", message: `stays ${key} in this draft` });
  if (template.version !== version)
    misplaced.push({ path: "version", message: `stays ${version} in this draft` });
  if (misplaced.length) return { ok: false, problems: misplaced };
  await db().transaction(async (trx) => {
    const row = (await lockedVersions(trx, key)).find((v) => v.version === version);
    if (!row) throw new Refusal("not-found", "There is no such template version.");
    if (row.status !== "draft")
      throw new Refusal(
        "wrong-state",
        `Version ${version} is ${row.status} and never changes; make a new draft from it.`,
      );
    const body = templateBody(template);
    if (body === row.body) return;
    await trx("template_versions")
      .where({ id: row.id })
      .update({ body, body_sha256: sha256(body), title: template.title });
    await audit(
      {
        userId,
        action: "template.draft-saved",
        entity: "template_version",
        entityId: row.id,
        detail: { key, version },
      },
      trx,
    );
  });
  return { ok: true };
}

/**
 * Publishes a draft: from now on it never changes, and new jobs start from it. The versions
 * published before it stay as they are for the jobs that use them.
 */
export async function publishDraft(
  key: string,
  version: number,
  userId: number,
): Promise<{ supersedes: number | null }> {
  return db().transaction(async (trx) => {
    const versions = await lockedVersions(trx, key);
    const row = versions.find((v) => v.version === version);
    if (!row) throw new Refusal("not-found", "There is no such template version.");
    if (row.status !== "draft")
      throw new Refusal("wrong-state", `Version ${version} is already ${row.status}.`);
    mustParse(parseJsonColumn(row.body));
    if (versions.some((v) => v.version > version && v.status !== "draft")) {
      throw new Refusal(
        "wrong-state",
        `A later version of this template is already published; make a new draft from it instead.`,
      );
    }
    const previous = versions.filter((v) => v.status === "published").at(-1)?.version ?? null;
    await trx("template_versions")
      .where({ id: row.id })
      .update({ status: "published", published_at: new Date() });
    await audit(
      {
        userId,
        action: "template.published",
        entity: "template_version",
        entityId: row.id,
        detail: { key, version, supersedes: previous },
      },
      trx,
    );
    return { supersedes: previous };
  });
}

/** Retires a published version: jobs that use it keep it, no new job starts from it. */
export async function retireVersion(key: string, version: number, userId: number): Promise<void> {
  await db().transaction(async (trx) => {
    const row = (await lockedVersions(trx, key)).find((v) => v.version === version);
    if (!row) throw new Refusal("not-found", "There is no such template version.");
    if (row.status !== "published")
      throw new Refusal(
        "wrong-state",
        `Only a published version can be retired; version ${version} is ${row.status}.`,
      );
    await trx("template_versions")
      .where({ id: row.id })
      .update({ status: "retired", retired_at: new Date() });
    await audit(
      {
        userId,
        action: "template.retired",
        entity: "template_version",
        entityId: row.id,
        detail: { key, version },
      },
      trx,
    );
  });
}

/** Throws a draft away (no job can use a draft, so nothing else is touched). */
export async function discardDraft(key: string, version: number, userId: number): Promise<void> {
  await db().transaction(async (trx) => {
    const row = (await lockedVersions(trx, key)).find((v) => v.version === version);
    if (!row) throw new Refusal("not-found", "There is no such template version.");
    if (row.status !== "draft")
      throw new Refusal("wrong-state", `Version ${version} is ${row.status}; only a draft can be discarded.`);
    await trx("template_versions").where({ id: row.id }).delete();
    await audit(
      {
        userId,
        action: "template.draft-discarded",
        entity: "template_version",
        entityId: row.id,
        detail: { key, version },
      },
      trx,
    );
  });
}

/** What new jobs would start from once `version` is retired: the newest other published version. */
export function fallbackAfterRetiring(
  versions: readonly { version: number; status: VersionStatus }[],
  version: number,
): number | null {
  return versions
    .filter((v) => v.status === "published" && v.version !== version)
    .reduce<number | null>((best, v) => (best === null || v.version > best ? v.version : best), null);
}

// ---- import ------------------------------------------------------------------------------------

export interface ImportOptions {
  /** Take the key's next version number, whatever the file says. */
  renumber?: boolean;
  /** Overwrite the key's current draft. */
  replaceDraft?: boolean;
}

export type ImportResult =
  | { ok: true; action: "created" | "replaced" | "unchanged"; key: string; version: number }
  | { ok: false; problems: TemplateProblem[] };

type ImportPlan =
  | { action: "created" | "replaced"; version: number }
  | { action: "unchanged"; version: number }
  | { problem: TemplateProblem };

/**
 * Where an imported file goes. It always lands as a draft — the next version of its key, or the
 * key's draft when asked to replace it — and never on a published or retired version.
 */
export function planImport(
  versions: readonly Pick<VersionRow, "version" | "status" | "body_sha256">[],
  template: Template,
  options: ImportOptions,
): ImportPlan {
  const same = versions.find((v) => v.version === template.version);
  if (
    same &&
    same.status !== "draft" &&
    !options.renumber &&
    same.body_sha256 === sha256(templateBody(template))
  ) {
    return { action: "unchanged", version: same.version };
  }
  const draft = versions.find((v) => v.status === "draft");
  const next = versions.length ? Math.max(...versions.map((v) => v.version)) + (draft ? 0 : 1) : 1;
  const target = options.renumber ? next : template.version;
  const renumberHint = `tick “take the next version number” to import it as version ${next}`;
  if (same && same.status !== "draft" && !options.renumber) {
    return {
      problem: {
        path: "version",
        message: `version ${template.version} of ${template.key} is ${same.status} and never changes; ${renumberHint}`,
      },
    };
  }
  if (target !== next)
    return {
      problem: {
        path: "version",
        message: `the next version of ${template.key} is ${next}; ${renumberHint}`,
      },
    };
  if (draft) {
    if (!options.replaceDraft) {
      return {
        problem: {
          path: "version",
          message: `version ${draft.version} of ${template.key} is a draft already; tick “replace the draft” to overwrite it, or publish or discard it first`,
        },
      };
    }
    return { action: "replaced", version: draft.version };
  }
  return { action: "created", version: next };
}

/** Imports a template file's text as a draft, or says what is wrong with the path of each problem. */
export async function importTemplate(
  text: string,
  options: ImportOptions,
  userId: number,
): Promise<ImportResult> {
  const parsed = parseTemplateText(text);
  if (!parsed.ok) return parsed;
  const file = parsed.template;
  return db().transaction(async (trx): Promise<ImportResult> => {
    const versions = await lockedVersions(trx, file.key);
    const plan = planImport(versions, file, options);
    if ("problem" in plan) return { ok: false, problems: [plan.problem] };
    if (plan.action === "unchanged")
      return { ok: true, action: "unchanged", key: file.key, version: plan.version };
    const template = mustParse({ ...file, version: plan.version });
    let id: number;
    if (plan.action === "replaced") {
      const draft = versions.find((v) => v.version === plan.version)!;
      const body = templateBody(template);
      await trx("template_versions")
        .where({ id: draft.id })
        .update({ body, body_sha256: sha256(body), title: template.title });
      id = draft.id;
    } else {
      id = await insertDraft(trx, template, userId);
    }
    await audit(
      {
        userId,
        action: "template.imported",
        entity: "template_version",
        entityId: id,
        detail: { key: file.key, version: plan.version, action: plan.action },
      },
      trx,
    );
    return { ok: true, action: plan.action, key: file.key, version: plan.version };
  });
}

// ---- export ------------------------------------------------------------------------------------

/** The defaults the schema fills in, left out again so an exported file reads like a written one. */
function withoutDefaults(template: Template) {
  return {
    ...template,
    sections: template.sections.map((section) => ({
      ...section,
      items: section.items.map((item) => {
        const { required, ...rest } = item;
        const out: Record<string, unknown> = required ? { ...rest } : { ...item };
        if (item.kind === "photo" && item.minPhotos === 1) delete out.minPhotos;
        if (item.kind === "readings" && item.rule?.appliesTo === "each-cell") {
          const { appliesTo: _, ...rule } = item.rule;
          out.rule = rule;
        }
        return out;
      }),
    })),
  };
}

const WIDTH = 120;
const isScalar = (v: unknown) => v === null || typeof v !== "object";
const isFlat = (v: unknown) => !isScalar(v) && Object.values(v as object).every(isScalar);
/** Small leaves go on one line ({ "min": 0, "unit": "in" }), as the files in checklists/ are written. */
const fitsOneLine = (v: unknown): boolean =>
  isScalar(v) ||
  isFlat(v) ||
  (!isScalar(v) && Object.values(v as object).length === 1 && fitsOneLine(Object.values(v as object)[0]));

function oneLine(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(oneLine).join(", ")}]`;
  if (!isScalar(v)) {
    const entries = Object.entries(v as object);
    return entries.length
      ? `{ ${entries.map(([k, x]) => `${JSON.stringify(k)}: ${oneLine(x)}`).join(", ")} }`
      : "{}";
  }
  return JSON.stringify(v);
}

/** Sections and items are always written out, one field a line. */
const isStructural = (v: unknown) =>
  Array.isArray(v) && v.some((x) => !isScalar(x) && ("items" in (x as object) || "kind" in (x as object)));

function written(v: unknown, indent: string, lead: number, expand = false): string {
  if (!expand && !isStructural(v) && fitsOneLine(v)) {
    const line = oneLine(v);
    if (isScalar(v) || indent.length + lead + line.length + 1 <= WIDTH) return line;
  }
  const inner = `${indent}  `;
  if (Array.isArray(v)) {
    const expandEach = isStructural(v);
    return `[\n${v.map((x) => inner + written(x, inner, 0, expandEach)).join(",\n")}\n${indent}]`;
  }
  return `{\n${Object.entries(v as object)
    .map(([k, x]) => `${inner}${JSON.stringify(k)}: ${written(x, inner, JSON.stringify(k).length + 2)}`)
    .join(",\n")}\n${indent}}`;
}

/** A version as a file for checklists/, in the same layout as the files there. */
export function templateFileText(template: Template): string {
  return `${written(withoutDefaults(template), "", 0, true)}\n`;
}
