import { z } from "zod";
import { formNumber } from "./form-number";

export const jobScopes = ["repower", "new-installation", "realignment", "shaft-replacement"] as const;
export const jobScopeLabels: Record<(typeof jobScopes)[number], string> = {
  repower: "Repower",
  "new-installation": "New installation",
  realignment: "Realignment",
  "shaft-replacement": "Shaft replacement",
};
export const jobStatuses = ["planned", "underway", "completed"] as const;
export const jobStatusLabels: Record<(typeof jobStatuses)[number], string> = {
  planned: "Planned",
  underway: "Underway",
  completed: "Completed",
};

/** Inch shafts take ASME B17.1 keys and SAE J755 tapers; metric ones DIN 6885-1 and ISO 4566. */
export const shaftSystems = ["inch", "metric"] as const;
export type ShaftSystem = (typeof shaftSystems)[number];
export const shaftSystemLabels: Record<ShaftSystem, string> = {
  inch: "Inch (SAE J755 taper, ASME B17.1 key)",
  metric: "Metric (ISO 4566 taper, DIN 6885-1 key)",
};
/** The DC system voltages the electrical checks are written for. */
export const systemVoltages = [12, 24] as const;

const text = (label: string, max = 120) =>
  z
    .string({ error: `Enter ${label}.` })
    .trim()
    .min(1, `Enter ${label}.`)
    .max(max);
const date = z
  .string()
  .optional()
  .transform((v) => (v ? v : undefined))
  .pipe(z.iso.date({ error: "Enter a date as YYYY-MM-DD." }).optional());

const MM_PER_IN = 25.4; // exact, by definition

/** The job form, on both sides: the installed equipment and who works on it. */
export const jobSchema = z
  .object({
    vesselId: z.coerce.number({ error: "Choose the vessel." }).int().positive("Choose the vessel."),
    scope: z.enum(jobScopes, { error: "Choose the scope of work." }),
    status: z.enum(jobStatuses, { error: "Choose a status." }).default("planned"),
    engineModel: text("the engine model"),
    engineSerial: text("the engine serial number", 60),
    ratedPowerHp: formNumber("the rated power", { min: 1, max: 5000, unit: "hp" }),
    ratedRpmMin: formNumber("the lowest rated rpm", { min: 1, max: 10000, unit: "rpm", whole: true }),
    ratedRpmMax: formNumber("the highest rated rpm", { min: 1, max: 10000, unit: "rpm", whole: true }),
    gearRatio: formNumber("the gear ratio", {
      min: 1,
      max: 10,
      note: "a marine gear is 1:1 or more; 2.0 for 2:1",
    }),
    propDiameterIn: formNumber("the propeller diameter", { min: 0, above: true, max: 120, unit: "in" }),
    propPitchIn: formNumber("the propeller pitch", { min: 0, above: true, max: 120, unit: "in" }),
    propBlades: formNumber("the number of blades", { min: 2, max: 7, whole: true }),
    shaftSystem: z.enum(shaftSystems, { error: "Choose inch or metric." }).default("inch"),
    // Entered in the shaft's own system; an inch figure is kept for both (the record and the
    // older screens read it), a metric shaft also keeps its millimetres as entered.
    shaftDiameterIn: formNumber("the shaft diameter", {
      min: 0,
      above: true,
      max: 12,
      unit: "in",
    }).optional(),
    shaftDiameterMm: formNumber("the shaft diameter", {
      min: 0,
      above: true,
      max: 300,
      unit: "mm",
    }).optional(),
    systemVolts: z.coerce
      .number({ error: "Choose 12 V or 24 V." })
      .pipe(z.union([z.literal(12), z.literal(24)], { error: "Choose 12 V or 24 V." }))
      .default(12),
    shaftMaterial: text("the shaft material", 60),
    couplingType: text("the coupling type", 60),
    startDate: date,
    dueDate: date,
    leadId: z.coerce.number({ error: "Choose the lead." }).int().positive("Choose the lead."),
    technicianIds: z
      .union([z.array(z.coerce.number().int().positive()), z.coerce.number().int().positive()])
      .optional()
      .transform((v) => (v === undefined ? [] : Array.isArray(v) ? v : [v])),
  })
  .refine((j) => j.ratedRpmMax >= j.ratedRpmMin, {
    path: ["ratedRpmMax"],
    message: "The highest rated rpm must not be below the lowest.",
  })
  .refine((j) => !j.startDate || !j.dueDate || j.dueDate >= j.startDate, {
    path: ["dueDate"],
    message: "The due date is before the start date.",
  })
  .refine((j) => j.shaftSystem !== "inch" || j.shaftDiameterIn !== undefined, {
    path: ["shaftDiameterIn"],
    message: "Enter the shaft diameter in inches.",
  })
  .refine((j) => j.shaftSystem !== "metric" || j.shaftDiameterMm !== undefined, {
    path: ["shaftDiameterMm"],
    message: "Enter the metric shaft's diameter in millimetres.",
  })
  .transform((j) => ({
    ...j,
    shaftDiameterIn:
      j.shaftSystem === "metric" ? Number((j.shaftDiameterMm! / MM_PER_IN).toFixed(4)) : j.shaftDiameterIn!,
    shaftDiameterMm: j.shaftSystem === "metric" ? j.shaftDiameterMm : undefined,
  }));

export type JobInput = z.output<typeof jobSchema>;
