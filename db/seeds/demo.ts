import bcrypt from "bcryptjs";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { DEMO_PASSWORD, demoPeople } from "./demo-people.ts";

/**
 * The demo: Kittiwake Slip, an invented boatyard, with its people, three boats and jobs in
 * different states. Idempotent: rows are found by natural keys and only added when missing.
 */
const STARTED_ON_VERSION_1 = [
  "cooling",
  "engine-alignment",
  "exhaust",
  "instruments-and-electrical",
  "propeller-shaft-and-coupling",
  "sea-trial",
];

export async function seedDemo(knex: Knex): Promise<string> {
  const hash = await bcrypt.hash(DEMO_PASSWORD, 10);
  const ids: Record<string, number> = {};
  let added = 0;
  for (const p of demoPeople) {
    const row = await knex("users").where({ email: p.email }).first();
    if (row) ids[p.email] = row.id;
    else {
      [ids[p.email]] = await knex("users").insert({ ...p, password_hash: hash, active: true });
      added++;
    }
  }
  const manager = ids["manager@kittiwake-slip.example"]!;
  const vessels = [
    {
      name: "Tern of Helvick",
      hin: "KSB4C017J526",
      length_value: 34,
      length_unit: "ft",
      length_m: 10.363,
      hull_type: "semi-displacement",
      owner_name: "Aoife Varga",
      owner_email: "aoife.varga@owners.example",
      waterline_notes: "Sits 2 in down by the stern with full tanks.",
    },
    {
      name: "Merrow",
      hin: "KSB22318H425",
      length_value: 12.2,
      length_unit: "m",
      length_m: 12.2,
      hull_type: "displacement",
      owner_name: "Piet Lindqvist",
      owner_email: "piet@owners.example",
      waterline_notes: "Boot top repainted 2025; loaded waterline at the lower edge.",
    },
    {
      name: "Little Auk",
      hin: null,
      length_value: 26,
      length_unit: "ft",
      length_m: 7.925,
      hull_type: "planing",
      owner_name: "Hester Quayle",
      owner_email: null,
      waterline_notes: null,
    },
  ] as const;
  const vesselIds: Record<string, number> = {};
  for (const v of vessels) {
    const row = await knex("vessels").where({ name: v.name }).first();
    if (row) vesselIds[v.name] = row.id;
    else {
      [vesselIds[v.name]] = await knex("vessels").insert({ ...v, created_by: manager });
      added++;
    }
  }
  const jobs = [
    {
      vessel: "Tern of Helvick",
      scope: "repower",
      status: "underway",
      engine_model: "K6-250 turbo diesel",
      engine_serial: "K6T-0048213",
      rated_power_hp: 250,
      rated_rpm_min: 2700,
      rated_rpm_max: 2800,
      gear_ratio: 1.96,
      prop_diameter_in: 22,
      prop_pitch_in: 24,
      prop_blades: 4,
      shaft_diameter_in: 1.5,
      shaft_material: "Duplex stainless (grade 2205)",
      coupling_type: "Split clamp, keyed",
      start_date: "2026-11-16",
      due_date: "2026-12-18",
      lead: "lead@kittiwake-slip.example",
      techs: ["tech@kittiwake-slip.example"],
    },
    {
      vessel: "Merrow",
      scope: "realignment",
      status: "planned",
      engine_model: "R4-110 diesel",
      engine_serial: "R4N-7731",
      rated_power_hp: 110,
      rated_rpm_min: 2500,
      rated_rpm_max: 2600,
      gear_ratio: 2.5,
      prop_diameter_in: 20,
      prop_pitch_in: 14,
      prop_blades: 3,
      shaft_diameter_in: 1.25,
      shaft_material: "316 stainless",
      coupling_type: "Solid, keyed and pinned",
      start_date: "2027-01-11",
      due_date: "2027-01-22",
      lead: "lead2@kittiwake-slip.example",
      techs: ["tech2@kittiwake-slip.example"],
    },
    {
      vessel: "Little Auk",
      scope: "new-installation",
      status: "completed",
      engine_model: "K4-150 diesel",
      engine_serial: "K4T-0011907",
      rated_power_hp: 150,
      rated_rpm_min: 3800,
      rated_rpm_max: 4000,
      gear_ratio: 1.5,
      prop_diameter_in: 15,
      prop_pitch_in: 17,
      prop_blades: 3,
      shaft_diameter_in: 1,
      shaft_material: "316 stainless",
      coupling_type: "Split clamp, keyed",
      start_date: "2026-09-01",
      due_date: "2026-10-02",
      lead: "lead@kittiwake-slip.example",
      techs: ["tech@kittiwake-slip.example", "tech2@kittiwake-slip.example"],
    },
  ] as const;
  for (const j of jobs) {
    const vesselId = vesselIds[j.vessel]!;
    if (await knex("jobs").where({ vessel_id: vesselId, engine_serial: j.engine_serial }).first()) continue;
    const { vessel: _, lead, techs, ...fields } = j;
    const [jobId] = await knex("jobs").insert({
      ...fields,
      vessel_id: vesselId,
      lead_id: ids[lead],
      created_by: manager,
    });
    await knex("job_technicians").insert(techs.map((t) => ({ job_id: jobId, user_id: ids[t] })));
    added++;
  }
  // The repower under way was started before version 2 of the starter library was published:
  // its six checklists stay on version 1, as a yard's jobs already in progress do (a job started
  // now takes version 2, and the new fuel and ventilation templates).
  const underway = await knex("jobs").where({ status: "underway" }).first();
  if (underway && !(await knex("job_checklists").where({ job_id: underway.id }).first())) {
    const versions = await knex("template_versions")
      .where({ status: "published", version: 1 })
      .whereIn("template_key", STARTED_ON_VERSION_1)
      .orderBy("id");
    for (const v of versions) {
      await knex("job_checklists").insert({
        id: randomUUID(),
        job_id: underway.id,
        template_version_id: v.id,
        template_key: v.template_key,
        started_by: underway.lead_id,
      });
      added++;
    }
  }
  return added ? `${added} rows added` : "already present";
}
