import { z } from "zod";

const intent = <T extends string>(value: T) => z.object({ intent: z.literal(value) });

/** The buttons of a template version's page, told apart by their intent. */
export const versionActionSchema = z.discriminatedUnion(
  "intent",
  [intent("publish"), intent("retire"), intent("discard"), intent("new-draft")],
  { error: "That request was not understood." },
);
