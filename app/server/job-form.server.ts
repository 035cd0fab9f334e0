import { parseWithZod } from "@conform-to/zod/v4";
import type { User } from "./users.server.ts";
import { jobSchema } from "~/lib/validation/jobs";
import { listUsersByRole } from "./users.server.ts";
import { db } from "./db.server.ts";

/** The choices the job form offers. */
export async function jobFormOptions() {
  const [vessels, leads, technicians] = await Promise.all([
    db()("vessels").orderBy("name").select("id", "name"),
    listUsersByRole("lead"),
    listUsersByRole("technician"),
  ]);
  return {
    vessels: vessels as { id: number; name: string }[],
    leads: leads.map(({ id, name }) => ({ id, name })),
    technicians: technicians.map(({ id, name }) => ({ id, name })),
  };
}

/** Parses the job form and checks the people and vessel against the database. */
export async function parseJobForm(formData: FormData, actor: User) {
  const options = await jobFormOptions();
  return parseWithZod(formData, {
    schema: jobSchema
      .refine((j) => options.vessels.some((v) => v.id === j.vesselId), {
        path: ["vesselId"],
        message: "Choose a vessel from the list.",
      })
      .refine(
        (j) => (actor.role === "lead" ? j.leadId === actor.id : options.leads.some((l) => l.id === j.leadId)),
        {
          path: ["leadId"],
          message:
            actor.role === "lead" ? "A lead creates and edits the jobs they lead." : "Choose an active lead.",
        },
      )
      .refine((j) => j.technicianIds.every((id) => options.technicians.some((t) => t.id === id)), {
        path: ["technicianIds"],
        message: "Only active technicians can be assigned.",
      }),
  });
}
