import { convert } from "~/lib/calc/units";
import { Refusal } from "~/lib/refusal";
import type { VesselInput } from "~/lib/validation/vessels";
import { db } from "./db.server.ts";
import type { VesselRow } from "./tables.server.ts";

export interface Vessel extends VesselInput {
  id: number;
  lengthM: number;
  createdBy: number | null;
  leadIds: number[];
}

function toVessel(row: VesselRow, leadIds: number[] = []): Vessel {
  return {
    id: row.id,
    name: row.name,
    hin: row.hin ?? undefined,
    lengthValue: Number(row.length_value),
    lengthUnit: row.length_unit,
    lengthM: Number(row.length_m),
    hullType: row.hull_type,
    ownerName: row.owner_name,
    ownerEmail: row.owner_email ?? undefined,
    ownerPhone: row.owner_phone ?? undefined,
    waterlineNotes: row.waterline_notes ?? undefined,
    createdBy: row.created_by,
    leadIds,
  };
}

function toRow(v: VesselInput) {
  return {
    name: v.name,
    hin: v.hin ?? null,
    length_value: v.lengthValue,
    length_unit: v.lengthUnit,
    length_m: v.lengthUnit === "m" ? v.lengthValue : convert(v.lengthValue, "ft", "m"),
    hull_type: v.hullType,
    owner_name: v.ownerName,
    owner_email: v.ownerEmail ?? null,
    owner_phone: v.ownerPhone ?? null,
    waterline_notes: v.waterlineNotes ?? null,
  };
}

export async function listVessels(): Promise<Vessel[]> {
  const [rows, leads] = await Promise.all([
    db()("vessels").orderBy("name"),
    db()("jobs").select("vessel_id", "lead_id"),
  ]);
  return rows.map((r) =>
    toVessel(
      r,
      leads.filter((l) => l.vessel_id === r.id).map((l) => l.lead_id),
    ),
  );
}

export async function findVessel(id: number): Promise<Vessel | undefined> {
  const row = await db()("vessels").where({ id }).first();
  if (!row) return undefined;
  const leads = await db()("jobs").where({ vessel_id: id }).pluck("lead_id");
  return toVessel(row, leads);
}

async function guardHin<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    if ((error as { code?: string } | null)?.code === "ER_DUP_ENTRY")
      throw new Refusal("invalid", "Another vessel already has this hull identification number.", "hin");
    throw error;
  }
}

export function createVessel(input: VesselInput, createdBy: number) {
  return guardHin(async () => {
    const [id] = await db()("vessels").insert({ ...toRow(input), created_by: createdBy });
    return id as number;
  });
}

export function updateVessel(id: number, input: VesselInput) {
  return guardHin(() =>
    db()("vessels")
      .where({ id })
      .update({ ...toRow(input), updated_at: db().fn.now(3) }),
  );
}
