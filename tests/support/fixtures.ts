import bcrypt from "bcryptjs";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { Role } from "../../app/lib/roles.ts";
import { sha256 } from "../../db/seeds/library.ts";

export const TEST_PASSWORD = "correct-horse-battery";
const hash = bcrypt.hashSync(TEST_PASSWORD, 4);
let counter = 0;

/**
 * A test's own template, published as version `version` (1 unless it says) unless that version is
 * there already; answers its template_versions id.
 */
export async function publishTemplate(
  knex: Knex,
  template: { key: string; version?: number; title: string },
): Promise<number> {
  const version = template.version ?? 1;
  const existing = await knex("template_versions").where({ template_key: template.key, version }).first("id");
  if (existing) return existing.id as number;
  const body = JSON.stringify(template);
  const [id] = await knex("template_versions").insert({
    template_key: template.key,
    version,
    status: "published",
    title: template.title,
    body,
    body_sha256: sha256(body),
    published_at: new Date(),
  });
  return id as number;
}

/** A person with a known password; e-mail addresses are unique per call. */
export async function makeUser(knex: Knex, role: Role, overrides: { active?: boolean; name?: string } = {}) {
  const email = `${role}-${Date.now()}-${++counter}@test.example`;
  const name = overrides.name ?? `Test ${role} ${counter}`;
  const [id] = await knex("users").insert({
    email,
    name,
    role,
    password_hash: hash,
    active: overrides.active ?? true,
  });
  return { id: id as number, email, role, name };
}

export async function makeVessel(knex: Knex, createdBy: number | null = null) {
  const [id] = await knex("vessels").insert({
    name: `Test hull ${++counter}`,
    length_value: 30,
    length_unit: "ft",
    length_m: 9.144,
    hull_type: "planing",
    owner_name: "Test owner",
    created_by: createdBy,
  });
  return id as number;
}

export async function makeJob(knex: Knex, leadId: number, technicianIds: number[] = [], vesselId?: number) {
  const vessel = vesselId ?? (await makeVessel(knex));
  const [id] = await knex("jobs").insert({
    vessel_id: vessel,
    scope: "repower",
    status: "underway",
    engine_model: "Test engine",
    engine_serial: `SN-${++counter}`,
    rated_power_hp: 200,
    rated_rpm_min: 2600,
    rated_rpm_max: 2800,
    gear_ratio: 2,
    prop_diameter_in: 20,
    prop_pitch_in: 18,
    prop_blades: 3,
    shaft_diameter_in: 1.25,
    shaft_material: "316 stainless",
    coupling_type: "Split clamp",
    lead_id: leadId,
  });
  if (technicianIds.length)
    await knex("job_technicians").insert(technicianIds.map((user_id) => ({ job_id: id, user_id })));
  return { id: id as number, vesselId: vessel };
}

/**
 * A job of a test file's own: a lead and a technician (password TEST_PASSWORD), a hull with a
 * unique name, and checklists pinned to version 1 of each template key (as the library seeds it,
 * whatever other files publish or retire meanwhile).
 * End-to-end files use it so that none depends on the demo's boats, people or entries.
 */
export async function makeCrewedJob(knex: Knex, hullName: string, templateKeys: string[]) {
  const lead = await makeUser(knex, "lead", { name: `${hullName} lead` });
  const technician = await makeUser(knex, "technician", { name: `${hullName} technician` });
  const vesselId = await makeVessel(knex, lead.id);
  await knex("vessels").where({ id: vesselId }).update({ name: hullName });
  const job = await makeJob(knex, lead.id, [technician.id], vesselId);
  const checklists: Record<string, string> = {};
  for (const key of templateKeys) {
    const version = await knex("template_versions").where({ template_key: key, version: 1 }).first("id");
    if (!version) throw new Error(`No version 1 of ${key} to start.`);
    checklists[key] = randomUUID();
    await knex("job_checklists").insert({
      id: checklists[key],
      job_id: job.id,
      template_version_id: version.id,
      template_key: key,
      started_by: lead.id,
    });
  }
  return { lead, technician, job, checklists };
}
