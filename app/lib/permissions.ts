import type { Role } from "./roles.ts";

/**
 * The one vocabulary of what each role may do. The server checks it in every loader and
 * action; the screens call the same functions to decide what to show, so a hidden button
 * and a refused request never disagree.
 */
export interface Actor {
  id: number;
  role: Role;
}

/** What a job needs to be judged: who leads it and who works on it. */
export interface JobAccess {
  leadId: number;
  technicianIds: number[];
}

export type Capability =
  | "users:manage"
  | "vessels:view"
  | "vessels:create"
  | "jobs:view"
  | "jobs:create"
  | "calculators:use"
  | "library:view"
  | "library:edit"
  | "audit:read";

const capabilities: Record<Role, Capability[]> = {
  technician: ["jobs:view", "calculators:use", "library:view"],
  lead: ["jobs:view", "jobs:create", "vessels:view", "vessels:create", "calculators:use", "library:view"],
  manager: [
    "users:manage",
    "jobs:view",
    "jobs:create",
    "vessels:view",
    "vessels:create",
    "calculators:use",
    "library:view",
    "library:edit",
    "audit:read",
  ],
  surveyor: [],
};

export function can(actor: Actor | null | undefined, capability: Capability): boolean {
  return !!actor && capabilities[actor.role].includes(capability);
}

export function canViewJob(actor: Actor, job: JobAccess): boolean {
  switch (actor.role) {
    case "manager":
      return true;
    case "lead":
      return job.leadId === actor.id;
    case "technician":
      return job.technicianIds.includes(actor.id);
    case "surveyor":
      return false;
  }
}

/** Managers edit any job; a lead edits the jobs they lead (and assigns their technicians). */
export function canEditJob(actor: Actor, job: JobAccess): boolean {
  return actor.role === "manager" || (actor.role === "lead" && job.leadId === actor.id);
}

/** Who records entries on a job's checklists: its technicians and its lead. */
export function canFillJob(actor: Actor, job: JobAccess): boolean {
  return (
    (actor.role === "technician" && job.technicianIds.includes(actor.id)) ||
    (actor.role === "lead" && job.leadId === actor.id)
  );
}

/** A lead edits a vessel they registered or one that has a job they lead. */
export function canEditVessel(
  actor: Actor,
  vessel: { createdBy: number | null; leadIds: number[] },
): boolean {
  if (actor.role === "manager") return true;
  return actor.role === "lead" && (vessel.createdBy === actor.id || vessel.leadIds.includes(actor.id));
}

/** The navigation each role sees, derived from the same capabilities. */
export function navigationFor(actor: Actor): { to: string; label: string }[] {
  const items: { to: string; label: string }[] = [{ to: "/", label: "Today" }];
  if (can(actor, "jobs:view")) items.push({ to: "/jobs", label: "Jobs" });
  if (can(actor, "vessels:view")) items.push({ to: "/vessels", label: "Vessels" });
  if (can(actor, "calculators:use")) items.push({ to: "/calculators", label: "Calculators" });
  if (can(actor, "library:view")) items.push({ to: "/library", label: "Library" });
  if (can(actor, "users:manage")) items.push({ to: "/people", label: "People" });
  if (can(actor, "audit:read")) items.push({ to: "/audit", label: "Audit log" });
  return items;
}
