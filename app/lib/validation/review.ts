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
