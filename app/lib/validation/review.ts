import { z } from "zod";

export const reviewActionSchema = z.discriminatedUnion("intent", [
  z.object({
    intent: z.literal("comment"),
    itemKey: z.string().min(1).max(80),
    text: z
      .string({ error: "Write the comment first." })
      .trim()
      .min(1, "Write the comment first.")
      .max(2000, "Keep a comment under 2,000 characters."),
  }),
  z.object({ intent: z.literal("return") }),
  z.object({
    intent: z.literal("countersign"),
    password: z
      .string({ error: "Enter your password to countersign." })
      .min(1, "Enter your password to countersign."),
  }),
]);

/** Starting the amendment of a countersigned checklist, from the job's page. */
export const amendSchema = z.object({
  intent: z.literal("amend"),
  checklistId: z.uuid({ error: "That checklist is not one of this job's." }),
});
