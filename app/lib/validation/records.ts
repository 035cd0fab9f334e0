import { z } from "zod";

/** Surveyors' addresses, one per line or separated by commas. */
export const issueRecordSchema = z.object({
  intent: z.literal("issue-record"),
  emails: z
    .string({ error: "Enter the surveyor's e-mail address." })
    .transform((text) => [
      ...new Set(
        text
          .split(/[\s,;]+/)
          .map((e) => e.trim().toLowerCase())
          .filter(Boolean),
      ),
    ])
    .pipe(
      z
        .array(z.email({ error: "That is not an e-mail address." }))
        .min(1, "Enter the surveyor's e-mail address.")
        .max(10, "Issue to at most ten surveyors at a time."),
    ),
});
