import { describe, expect, it } from "vitest";
import { can, canEditJob, canEditVessel, canViewJob, navigationFor } from "~/lib/permissions";

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
    ]);
    expect(labels(lead)).toEqual(["Today", "Jobs", "Vessels", "Calculators", "Library"]);
    expect(labels(tech)).toEqual(["Today", "Jobs", "Calculators", "Library"]);
    expect(labels(surveyor)).toEqual(["Today"]);
  });
});
