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
  | "audit:read"
  /** Take one's jobs onto a tablet to work without a connection. */
  | "offline:take";

const capabilities: Record<Role, Capability[]> = {
  technician: ["jobs:view", "calculators:use", "library:view", "offline:take"],
  lead: [
    "jobs:view",
    "jobs:create",
    "vessels:view",
    "vessels:create",
    "calculators:use",
    "library:view",
    "offline:take",
  ],
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
    "offline:take",
  ],
  surveyor: [],
};

export function can(actor: Actor | null | undefined, capability: Capability): boolean {
  return !!actor && capabilities[actor.role].includes(capability);
}

/**
 * What a person may do with one job's work. Each action names who may take it, and every guard
 * (pages, API routes, the sync, photos, review, the record) asks here.
 */
export type JobAction =
  /** Open the job, its checklists and their photos. */
  | "view"
  /** Change the job, start its checklists. */
  | "edit"
  /** Record entries and photos on its checklists, and submit them. */
  | "fill"
  /** Open a checklist's review page and see the job's issued records. */
  | "oversee"
  /** Comment on, return and countersign a submitted checklist. */
  | "countersign"
  /** Start the amendment of a countersigned checklist. */
  | "amend"
  /** Issue the job's commissioning record to surveyors. */
  | "issue-record";

type Crew = "manager" | "job's lead" | "job's technicians";

const jobActions: Record<JobAction, Crew[]> = {
  view: ["manager", "job's lead", "job's technicians"],
  edit: ["manager", "job's lead"],
  fill: ["job's lead", "job's technicians"],
  oversee: ["manager", "job's lead"],
  countersign: ["job's lead"],
  amend: ["manager", "job's lead"],
  "issue-record": ["manager", "job's lead"],
};

function crewOf(actor: Actor, job: JobAccess): Crew | null {
  if (actor.role === "manager") return "manager";
  if (actor.role === "lead" && job.leadId === actor.id) return "job's lead";
  if (actor.role === "technician" && job.technicianIds.includes(actor.id)) return "job's technicians";
  return null;
}

export function canOnJob(actor: Actor | null | undefined, action: JobAction, job: JobAccess): boolean {
  const crew = actor ? crewOf(actor, job) : null;
  return crew !== null && jobActions[action].includes(crew);
}

export const canViewJob = (actor: Actor, job: JobAccess) => canOnJob(actor, "view", job);
export const canEditJob = (actor: Actor, job: JobAccess) => canOnJob(actor, "edit", job);
export const canFillJob = (actor: Actor, job: JobAccess) => canOnJob(actor, "fill", job);

/**
 * An issued record: the manager and the job's lead read the job's records; a surveyor reads the
 * ones issued to them.
 */
export function canReadRecord(actor: Actor, record: { job: JobAccess; recipientIds: number[] }): boolean {
  if (actor.role === "surveyor") return record.recipientIds.includes(actor.id);
  return canOnJob(actor, "oversee", record.job);
}

/** Template versions: published and retired ones for the yard's staff, drafts for library editors. */
export function canReadTemplateVersion(actor: Actor, version: { status: string }): boolean {
  return can(actor, version.status === "draft" ? "library:edit" : "library:view");
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
  if (can(actor, "users:manage")) items.push({ to: "/yard", label: "Yard settings" });
  return items;
}
