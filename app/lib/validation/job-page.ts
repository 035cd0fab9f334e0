import { z } from "zod";
import { startChecklistsSchema } from "./checklists.ts";
import { issueRecordSchema } from "./records.ts";
import { amendSchema } from "./review.ts";

/** The job page's three forms, told apart by their intent. */
export const jobPageActionSchema = z.discriminatedUnion("intent", [
  startChecklistsSchema,
  issueRecordSchema,
  amendSchema,
]);
