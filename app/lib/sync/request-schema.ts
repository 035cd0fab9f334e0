import { z } from "zod";
import type { JsonValue } from "./protocol.ts";
import { isWellFormed, MAX_OPS_PER_REQUEST, MAX_UINT32, unstorableJson } from "./storable.ts";

/** The zod schemas of a sync request (protocol.ts describes the protocol); the server parses with them. */

const wellFormedString = (min: number, max: number) =>
  z
    .string({ error: "must be a string" })
    .min(min)
    .max(max)
    .refine(isWellFormed, { error: "holds a lone UTF-16 surrogate" });
const uint32 = z
  .number({ error: "must be a number" })
  .int()
  .nonnegative()
  .max(MAX_UINT32, { error: `must be at most ${MAX_UINT32}` });

export const operationSchema = z.strictObject({
  opId: z.uuid({ error: "must be a UUID" }),
  seq: uint32,
  checklistId: z.uuid({ error: "must be a UUID" }),
  itemKey: wellFormedString(1, 80),
  value: z.unknown().superRefine((v, ctx) => {
    const problem = v === undefined ? "is missing" : unstorableJson(v);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  }),
  baseRev: uint32,
  /** The device's clock, kept as sent (however wrong) and never used to decide anything. */
  at: z.iso.datetime({ offset: true, error: "must be an ISO 8601 date and time" }).max(40),
  /** Conflict ids this operation decides (a resolution is an ordinary operation). */
  resolves: z.array(uint32.positive()).max(50).optional(),
});
export type Operation = z.infer<typeof operationSchema> & { value: JsonValue };

/** What the envelope needs of each operation before it is read on its own: a UUID to answer to. */
const envelopeOpSchema = z.looseObject({ opId: z.uuid({ error: "must be a UUID" }) });

export const syncRequestSchema = z.strictObject({
  deviceId: wellFormedString(8, 64),
  cursor: z.string().max(32).nullable(),
  ops: z
    .array(envelopeOpSchema)
    .max(MAX_OPS_PER_REQUEST)
    .superRefine((ops, ctx) => {
      // The same opId twice in one request has no single answer: the whole batch is malformed.
      const seen = new Set<string>();
      ops.forEach((o, i) => {
        if (seen.has(o.opId))
          ctx.addIssue({ code: "custom", path: [i, "opId"], message: "repeats an earlier operation's id" });
        seen.add(o.opId);
      });
    }),
});
export type SyncRequest = z.infer<typeof syncRequestSchema>;
