import type { Role } from "../../app/lib/roles.ts";

/** The invented yard's staff. Shared by the seed, the start message and the tests. */
export const DEMO_PASSWORD = "slipway-demo-2026";

export const demoPeople: { email: string; name: string; role: Role }[] = [
  { email: "manager@kittiwake-slip.example", name: "Maren Holloway", role: "manager" },
  { email: "lead@kittiwake-slip.example", name: "Idris Penhale", role: "lead" },
  { email: "lead2@kittiwake-slip.example", name: "Sunniva Craddock", role: "lead" },
  { email: "tech@kittiwake-slip.example", name: "Tobin Aske", role: "technician" },
  { email: "tech2@kittiwake-slip.example", name: "Wren Malloch", role: "technician" },
  { email: "surveyor@harbourmark-survey.example", name: "Cato Ferrand", role: "surveyor" },
];
