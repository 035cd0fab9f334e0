import { z } from "zod";
import { formNumber } from "./form-number";
import { validateHin } from "../calc/hin.ts";

export const hullTypes = ["displacement", "semi-displacement", "planing", "catamaran", "other"] as const;
export const hullTypeLabels: Record<(typeof hullTypes)[number], string> = {
  displacement: "Displacement",
  "semi-displacement": "Semi-displacement",
  planing: "Planing",
  catamaran: "Catamaran",
  other: "Other",
};

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .optional()
    .transform((v) => (v ? v : undefined));

/** The vessel form, on both sides. An empty HIN is allowed (older or home-built hulls). */
export const vesselSchema = z.object({
  name: z.string({ error: "Enter the vessel's name." }).trim().min(1, "Enter the vessel's name.").max(120),
  hin: z
    .string()
    .optional()
    .transform((v, ctx) => {
      if (!v?.trim()) return undefined;
      // People copy HINs off paperwork with spaces or hyphens; the number itself has none.
      const check = validateHin(v.replace(/[\s\-/]/g, ""));
      if (!check.valid) {
        ctx.addIssue({ code: "custom", message: check.problems.join(" ") });
        return z.NEVER;
      }
      return check.hin;
    }),
  // 200 covers a yard's largest boat in feet or metres; more is a unit slip.
  lengthValue: formNumber("the length overall", { min: 0, above: true, max: 200 }),
  lengthUnit: z.enum(["ft", "m"], { error: "Choose feet or metres." }),
  hullType: z.enum(hullTypes, { error: "Choose a hull type." }),
  ownerName: z.string({ error: "Enter the owner's name." }).trim().min(1, "Enter the owner's name.").max(120),
  ownerEmail: z
    .string()
    .trim()
    .optional()
    .transform((v) => (v ? v : undefined))
    .pipe(z.email({ error: "Enter a valid e-mail address." }).optional()),
  ownerPhone: optionalText(40),
  waterlineNotes: optionalText(2000),
});

export type VesselInput = z.infer<typeof vesselSchema>;
