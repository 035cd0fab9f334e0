import { z } from "zod";

export const startChecklistsSchema = z.object({
  intent: z.literal("start-checklists"),
  templates: z
    .union([z.array(z.string()), z.string()], { error: "Tick at least one checklist." })
    .transform((v) => (Array.isArray(v) ? v : [v]))
    .pipe(
      z.array(z.string().regex(/^[a-z0-9-]+$/, "Unknown template.")).min(1, "Tick at least one checklist."),
    ),
});
