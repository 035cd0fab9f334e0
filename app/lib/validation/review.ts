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

/** Discarding an amendment opened by mistake, from the job's page. */
export const discardAmendmentSchema = z.object({
  intent: z.literal("discard-amendment"),
  checklistId: z.uuid({ error: "That checklist is not one of this job's." }),
});

/** Countersigning several submitted checklists of one job with one password entry. */
export const countersignSeveralSchema = z.object({
  intent: z.literal("countersign-several"),
  checklistIds: z
    .array(z.uuid({ error: "That checklist is not one of this job's." }), {
      error: "Tick the checklists to countersign.",
    })
    .min(1, "Tick the checklists to countersign.")
    .max(40, "Countersign at most 40 checklists at once."),
  password: z
    .string({ error: "Enter your password to countersign." })
    .min(1, "Enter your password to countersign."),
});

/** What became of one checklist countersigned with others: its digest, or the reason it was not. */
export type SealOutcome =
  | { checklistId: string; title: string; digest: string }
  | { checklistId: string; title: string; refused: string };

/** A technician's answer to a lead's comment, posted from the fill screen. */
export const commentReplySchema = z.object({
  commentId: z.coerce.number().int().positive(),
  text: z
    .string({ error: "Write the answer first." })
    .trim()
    .min(1, "Write the answer first.")
    .max(2000, "Keep an answer under 2,000 characters."),
});
