import { describe, expect, it } from "vitest";
import {
  can,
  canEditJob,
  canEditVessel,
  canOnJob,
  canReadRecord,
  canReadTemplateVersion,
  canViewJob,
  navigationFor,
  type JobAction,
} from "~/lib/permissions";
import { Refusal } from "~/lib/refusal";

const tech = { id: 1, role: "technician" as const };
const lead = { id: 2, role: "lead" as const };
const manager = { id: 3, role: "manager" as const };
const surveyor = { id: 4, role: "surveyor" as const };
const job = { leadId: 2, technicianIds: [1] };
const othersJob = { leadId: 9, technicianIds: [8] };

describe("permissions", () => {
  it("give each role its capabilities and nothing more", () => {
    expect(can(manager, "users:manage")).toBe(true);
    for (const who of [tech, lead, surveyor]) expect(can(who, "users:manage")).toBe(false);
    expect(can(lead, "jobs:create")).toBe(true);
    expect(can(tech, "jobs:create")).toBe(false);
    expect(can(tech, "vessels:view")).toBe(false);
    expect(can(surveyor, "jobs:view")).toBe(false);
    expect(can(null, "jobs:view")).toBe(false);
    expect(can(manager, "audit:read")).toBe(true);
    for (const who of [tech, lead, surveyor]) expect(can(who, "audit:read")).toBe(false);
  });

  it("let a technician see only assigned jobs, a lead only led jobs, a manager all, a surveyor none", () => {
    expect(canViewJob(tech, job)).toBe(true);
    expect(canViewJob(tech, othersJob)).toBe(false);
    expect(canViewJob(lead, job)).toBe(true);
    expect(canViewJob(lead, othersJob)).toBe(false);
    expect(canViewJob(manager, othersJob)).toBe(true);
    expect(canViewJob(surveyor, job)).toBe(false);
  });

  it("let only the manager and the job's lead edit a job", () => {
    expect(canEditJob(manager, othersJob)).toBe(true);
    expect(canEditJob(lead, job)).toBe(true);
    expect(canEditJob(lead, othersJob)).toBe(false);
    expect(canEditJob(tech, job)).toBe(false);
  });

  it("let a lead edit vessels they registered or lead a job on", () => {
    expect(canEditVessel(lead, { createdBy: 2, leadIds: [] })).toBe(true);
    expect(canEditVessel(lead, { createdBy: 3, leadIds: [2] })).toBe(true);
    expect(canEditVessel(lead, { createdBy: 3, leadIds: [9] })).toBe(false);
    expect(canEditVessel(tech, { createdBy: 1, leadIds: [1] })).toBe(false);
    expect(canEditVessel(manager, { createdBy: null, leadIds: [] })).toBe(true);
  });

  it("derive each role's navigation from the same capabilities", () => {
    const labels = (who: Parameters<typeof navigationFor>[0]) => navigationFor(who).map((i) => i.label);
    expect(labels(manager)).toEqual([
      "Today",
      "Jobs",
      "Vessels",
      "Calculators",
      "Library",
      "People",
      "Audit log",
      "Yard settings",
    ]);
    expect(labels(lead)).toEqual(["Today", "Jobs", "Vessels", "Calculators", "Library"]);
    expect(labels(tech)).toEqual(["Today", "Jobs", "Calculators", "Library"]);
    expect(labels(surveyor)).toEqual(["Today"]);
  });

  it("say who may take each action on a job, from one table", () => {
    const otherTech = { id: 8, role: "technician" as const };
    const otherLead = { id: 9, role: "lead" as const };
    const who = { tech, lead, manager, surveyor, otherTech, otherLead };
    // Each row: the people (of `who`) allowed on `job` (lead 2, technician 1).
    const expected: Record<JobAction, (keyof typeof who)[]> = {
      view: ["tech", "lead", "manager"],
      edit: ["lead", "manager"],
      fill: ["tech", "lead"],
      oversee: ["lead", "manager"],
      countersign: ["lead"],
      amend: ["lead", "manager"],
      "issue-record": ["lead", "manager"],
    };
    for (const [action, allowed] of Object.entries(expected) as [JobAction, (keyof typeof who)[]][]) {
      const actual = (Object.keys(who) as (keyof typeof who)[]).filter((k) => canOnJob(who[k], action, job));
      expect(actual, action).toEqual(allowed);
    }
    expect(canOnJob(null, "view", job)).toBe(false);
  });

  it("let a surveyor read only the records issued to them, and staff by their place on the job", () => {
    const record = { job, recipientIds: [4] };
    expect(canReadRecord(surveyor, record)).toBe(true);
    expect(canReadRecord({ id: 5, role: "surveyor" }, record)).toBe(false);
    expect(canReadRecord(manager, record)).toBe(true);
    expect(canReadRecord(lead, record)).toBe(true);
    expect(canReadRecord(lead, { job: othersJob, recipientIds: [] })).toBe(false);
    expect(canReadRecord(tech, record)).toBe(false);
  });

  it("show drafts only to those who edit the library", () => {
    expect(canReadTemplateVersion(manager, { status: "draft" })).toBe(true);
    expect(canReadTemplateVersion(lead, { status: "draft" })).toBe(false);
    expect(canReadTemplateVersion(tech, { status: "retired" })).toBe(true);
    expect(canReadTemplateVersion(surveyor, { status: "published" })).toBe(false);
  });

  it("refuse with one type whose status follows the reason: a wrong state is 409", () => {
    expect(new Refusal("wrong-state", "Already submitted.").status).toBe(409);
    expect(new Refusal("forbidden", "Not yours.").status).toBe(403);
    expect(new Refusal("not-found", "No such checklist.").status).toBe(404);
    const refusal = new Refusal("invalid", "That password is not right.", "password");
    expect(refusal).toMatchObject({ status: 400, field: "password", message: "That password is not right." });
    expect(refusal).toBeInstanceOf(Error);
  });
});
