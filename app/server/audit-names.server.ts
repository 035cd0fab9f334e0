import { roleLabels, type Role } from "~/lib/roles";
import { db } from "./db.server.ts";

/**
 * What the audit log calls the things its entries are about: a person's name, a vessel's name,
 * "the repower of Shag of Inishbofin", "Engine alignment, version 2"; looked up in bulk for a page
 * of entries. A thing deleted since keeps its kind and id.
 */
export type EntityNames = Map<string, string>;
export const nameKey = (entity: string, id: string) => `${entity}:${id}`;

const scopeWords: Record<string, string> = {
  repower: "repower",
  "new-installation": "new installation",
  realignment: "realignment",
  "shaft-replacement": "shaft replacement",
};
const jobName = (scope: string, vessel: string) => `the ${scopeWords[scope] ?? scope} of ${vessel}`;
const versionName = (title: string, version: number) => `${title}, version ${version}`;

interface Wanted {
  entity: string;
  entityId: string;
}

export async function entityNames(entries: Wanted[], extraUserIds: number[] = []): Promise<EntityNames> {
  const ids = (entity: string) => [
    ...new Set(entries.filter((e) => e.entity === entity).map((e) => e.entityId)),
  ];
  const numeric = (list: string[]) => list.map(Number).filter(Number.isInteger);
  const names: EntityNames = new Map();
  const knex = db();

  const userIds = [...numeric(ids("user")), ...extraUserIds];
  if (userIds.length)
    for (const u of await knex("users").whereIn("id", userIds).select("id", "name"))
      names.set(nameKey("user", String(u.id)), u.name);
  if (ids("vessel").length)
    for (const v of await knex("vessels")
      .whereIn("id", numeric(ids("vessel")))
      .select("id", "name"))
      names.set(nameKey("vessel", String(v.id)), v.name);
  if (ids("job").length)
    for (const j of await knex("jobs")
      .join("vessels", "vessels.id", "jobs.vessel_id")
      .whereIn("jobs.id", numeric(ids("job")))
      .select("jobs.id", "jobs.scope", "vessels.name as vessel"))
      names.set(nameKey("job", String(j.id)), jobName(j.scope, j.vessel));
  if (ids("template_version").length)
    for (const t of await knex("template_versions")
      .whereIn("id", numeric(ids("template_version")))
      .select("id", "title", "version"))
      names.set(nameKey("template_version", String(t.id)), versionName(t.title, t.version));
  if (ids("checklist").length)
    for (const c of (await knex("job_checklists")
      .join("template_versions", "template_versions.id", "job_checklists.template_version_id")
      .join("jobs", "jobs.id", "job_checklists.job_id")
      .join("vessels", "vessels.id", "jobs.vessel_id")
      .whereIn("job_checklists.id", ids("checklist"))
      .select(
        "job_checklists.id",
        "template_versions.title",
        "template_versions.version",
        "vessels.name as vessel",
      )) as { id: string; title: string; version: number; vessel: string }[])
      names.set(nameKey("checklist", c.id), `${versionName(c.title, c.version)} on ${c.vessel}`);
  if (ids("record").length)
    for (const r of await knex("records")
      .join("jobs", "jobs.id", "records.job_id")
      .join("vessels", "vessels.id", "jobs.vessel_id")
      .whereIn("records.id", ids("record"))
      .select("records.id", "vessels.name as vessel"))
      names.set(nameKey("record", r.id), `the commissioning record of ${r.vessel}`);
  return names;
}

export const roleInWords = (role: unknown) =>
  typeof role === "string" && role in roleLabels ? roleLabels[role as Role] : String(role);
