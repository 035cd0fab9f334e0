export const roles = ["technician", "lead", "manager", "surveyor"] as const;
export type Role = (typeof roles)[number];

export const roleLabels: Record<Role, string> = {
  technician: "Technician",
  lead: "Lead",
  manager: "Manager",
  surveyor: "Surveyor",
};
