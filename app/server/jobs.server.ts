import type { Knex } from "knex";
import { canViewJob, type Actor } from "~/lib/permissions";
import type { JobInput } from "~/lib/validation/jobs";
import { db } from "./db.server.ts";
import type { JobRow } from "./tables.server.ts";

/** A job row with its vessel's name and HIN and its lead's name (baseQuery). */
type JobListRow = JobRow & { vessel_name: string; hin: string | null; lead_name: string };

export interface JobSummary {
  id: number;
  vesselId: number;
  vesselName: string;
  hin: string | null;
  scope: JobInput["scope"];
  status: JobInput["status"];
  engineModel: string;
  leadId: number;
  leadName: string;
  technicianIds: number[];
  technicianNames: string[];
  startDate: string | null;
  dueDate: string | null;
}

export interface Job extends JobSummary, Omit<JobInput, "technicianIds" | "startDate" | "dueDate"> {}

const isoDate = (d: Date | string | null) =>
  d === null
    ? null
    : typeof d === "string"
      ? d.slice(0, 10)
      : new Date(d.getTime() - d.getTimezoneOffset() * 60000).toISOString().slice(0, 10);

function baseQuery(knex: Knex) {
  return knex("jobs")
    .join("vessels", "vessels.id", "jobs.vessel_id")
    .join("users as lead", "lead.id", "jobs.lead_id")
    .select("jobs.*", "vessels.name as vessel_name", "vessels.hin as hin", "lead.name as lead_name");
}

async function crew(jobIds: number[]) {
  if (!jobIds.length) return new Map<number, { id: number; name: string }[]>();
  const rows = await db()("job_technicians")
    .join("users", "users.id", "job_technicians.user_id")
    .whereIn("job_id", jobIds)
    .orderBy("users.name")
    .select("job_id", "users.id", "users.name");
  const byJob = new Map<number, { id: number; name: string }[]>();
  for (const r of rows) byJob.set(r.job_id, [...(byJob.get(r.job_id) ?? []), { id: r.id, name: r.name }]);
  return byJob;
}

function toJob(row: JobListRow, techs: { id: number; name: string }[]): Job {
  return {
    id: row.id,
    vesselId: row.vessel_id,
    vesselName: row.vessel_name,
    hin: row.hin,
    scope: row.scope,
    status: row.status,
    engineModel: row.engine_model,
    engineSerial: row.engine_serial,
    ratedPowerHp: Number(row.rated_power_hp),
    ratedRpmMin: row.rated_rpm_min,
    ratedRpmMax: row.rated_rpm_max,
    gearRatio: Number(row.gear_ratio),
    propDiameterIn: Number(row.prop_diameter_in),
    propPitchIn: Number(row.prop_pitch_in),
    propBlades: row.prop_blades,
    shaftSystem: row.shaft_system,
    shaftDiameterIn: Number(row.shaft_diameter_in),
    shaftDiameterMm: row.shaft_diameter_mm == null ? undefined : Number(row.shaft_diameter_mm),
    systemVolts: row.system_volts,
    shaftMaterial: row.shaft_material,
    couplingType: row.coupling_type,
    startDate: isoDate(row.start_date),
    dueDate: isoDate(row.due_date),
    leadId: row.lead_id,
    leadName: row.lead_name,
    technicianIds: techs.map((t) => t.id),
    technicianNames: techs.map((t) => t.name),
  };
}

/** The jobs this person may see: managers all, leads theirs, technicians those assigned. */
export async function listVisibleJobs(actor: Actor): Promise<Job[]> {
  let query = baseQuery(db()).orderBy([
    { column: "jobs.status", order: "asc" },
    { column: "jobs.due_date", order: "asc" },
  ]);
  if (actor.role === "lead") query = query.where("jobs.lead_id", actor.id);
  else if (actor.role === "technician")
    query = query.whereIn("jobs.id", db()("job_technicians").where({ user_id: actor.id }).select("job_id"));
  else if (actor.role !== "manager") return [];
  const rows: JobListRow[] = await query;
  const techs = await crew(rows.map((r) => r.id));
  return rows.map((r) => toJob(r, techs.get(r.id) ?? [])).filter((j) => canViewJob(actor, j));
}

export async function findJob(id: number): Promise<Job | undefined> {
  const row: JobListRow | undefined = await baseQuery(db()).where("jobs.id", id).first();
  if (!row) return undefined;
  return toJob(row, (await crew([id])).get(id) ?? []);
}

function toRow(j: JobInput) {
  return {
    vessel_id: j.vesselId,
    scope: j.scope,
    status: j.status,
    engine_model: j.engineModel,
    engine_serial: j.engineSerial,
    rated_power_hp: j.ratedPowerHp,
    rated_rpm_min: j.ratedRpmMin,
    rated_rpm_max: j.ratedRpmMax,
    gear_ratio: j.gearRatio,
    prop_diameter_in: j.propDiameterIn,
    prop_pitch_in: j.propPitchIn,
    prop_blades: j.propBlades,
    shaft_system: j.shaftSystem,
    shaft_diameter_in: j.shaftDiameterIn,
    shaft_diameter_mm: j.shaftDiameterMm ?? null,
    system_volts: j.systemVolts,
    shaft_material: j.shaftMaterial,
    coupling_type: j.couplingType,
    start_date: j.startDate ?? null,
    due_date: j.dueDate ?? null,
    lead_id: j.leadId,
  };
}

export async function createJob(input: JobInput, createdBy: number): Promise<number> {
  return db().transaction(async (trx) => {
    const [id] = await trx("jobs").insert({ ...toRow(input), created_by: createdBy });
    if (input.technicianIds.length)
      await trx("job_technicians").insert(input.technicianIds.map((user_id) => ({ job_id: id, user_id })));
    return id as number;
  });
}

export async function updateJob(id: number, input: JobInput) {
  await db().transaction(async (trx) => {
    await trx("jobs")
      .where({ id })
      .update({ ...toRow(input), updated_at: trx.fn.now(3) });
    await trx("job_technicians").where({ job_id: id }).delete();
    if (input.technicianIds.length)
      await trx("job_technicians").insert(input.technicianIds.map((user_id) => ({ job_id: id, user_id })));
  });
}
