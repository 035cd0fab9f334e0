import { z } from "zod";
import { startChecklistsSchema } from "./checklists.ts";
import { issueRecordSchema } from "./records.ts";
import { amendSchema, countersignSeveralSchema, discardAmendmentSchema } from "./review.ts";

/** The job page's forms, told apart by their intent. */
export const jobPageActionSchema = z.discriminatedUnion("intent", [
  startChecklistsSchema,
  issueRecordSchema,
  amendSchema,
  discardAmendmentSchema,
  countersignSeveralSchema,
]);
