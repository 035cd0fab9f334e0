import { z } from "zod";
import type { ChecklistState } from "../checklist-sets.ts";

/**
 * The sync protocol between a tablet and POST /api/sync, shared by both sides.
 * One request pushes a batch of operations (in outbox order) and pulls what changed after the
 * device's cursor. The server decides by revisions, never by device clocks.
 *
 * The request's envelope (device, cursor, a list of operations each with a distinct UUID) is
 * checked as a whole: a malformed envelope is a 400 and nothing is applied. Each operation is
 * then checked on its own, so one operation the database could not store (a lone UTF-16
 * surrogate, a number too big for its column, a value nested too deep) is that operation's
 * rejection with a code, and the rest of the batch goes on.
 *
 * An operation carries an item's whole value; how the server combines it with what it holds is
 * the item kind's merge rule (app/lib/sync/merge.ts, docs/sync-merge-rules.md): attempts, sets
 * of readings, photos and strikes (an attempt struck through with a reason, keyed by the
 * attempt's id) are append-only sets that merge; every other answer is a scalar that conflicts.
 */

/** The most operations one request may carry; a bigger batch is answered 413. */
export const MAX_OPS_PER_REQUEST = 1000;
/** The largest request body the route reads, in bytes (413 beyond it). */
export const MAX_SYNC_BODY_BYTES = 4 * 1024 * 1024;
/** About how many changes one pull answers (a page ends between change numbers); `more` asks for the next. */
export const MAX_CHANGES_PER_PULL = 500;
/** The largest number the unsigned INT columns (seq, revisions, conflict ids) hold. */
export const MAX_UINT32 = 4_294_967_295;
/** How deep a value may nest; the deepest item kind (readings: attempts → cells → row) needs 5. */
export const MAX_VALUE_DEPTH = 16;

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** A string MariaDB's utf8mb4 columns and JSON check accept: no lone UTF-16 surrogate. */
export const isWellFormed = (s: string) => !LONE_SURROGATE.test(s);

/**
 * Why a value could not be stored as JSON in MariaDB, or null if it can. Walks the value without
 * recursion, so a value nested thousands of levels deep is refused instead of overflowing the stack.
 */
export function unstorableJson(value: unknown): string | null {
  const stack: { v: unknown; depth: number }[] = [{ v: value, depth: 0 }];
  while (stack.length) {
    const { v, depth } = stack.pop()!;
    if (v === null || typeof v === "boolean") continue;
    if (typeof v === "number") {
      if (!Number.isFinite(v)) return "holds a number JSON cannot carry";
      continue;
    }
    if (typeof v === "string") {
      if (!isWellFormed(v)) return "holds text cut in the middle of a character (a lone UTF-16 surrogate)";
      continue;
    }
    if (typeof v !== "object") return "is not a JSON value";
    if (depth >= MAX_VALUE_DEPTH) return `is nested more than ${MAX_VALUE_DEPTH} levels deep`;
    if (Array.isArray(v)) {
      for (const x of v) stack.push({ v: x, depth: depth + 1 });
      continue;
    }
    if (Object.getPrototypeOf(v) !== Object.prototype && Object.getPrototypeOf(v) !== null)
      return "is not a JSON value";
    for (const [k, x] of Object.entries(v)) {
      if (!isWellFormed(k)) return "has a key cut in the middle of a character (a lone UTF-16 surrogate)";
      stack.push({ v: x, depth: depth + 1 });
    }
  }
  return null;
}

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
export type JsonValue = string | number | boolean | null | JsonValue[] | { [key: string]: JsonValue };

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

export type OpStatus = "applied" | "conflict" | "rejected";

/** Why an operation was refused, for the tablet to act on (the sentence beside it is for people). */
export const REFUSAL_CODES = [
  /** The operation itself is malformed or holds what cannot be stored. */
  "invalid-operation",
  /** The checklist is not on one of this person's jobs (or does not exist). */
  "not-on-your-job",
  /** The person may see the job but not record entries on it. */
  "not-allowed",
  /** The checklist is submitted or countersigned. */
  "locked",
  /** The checklist's template has no such item. */
  "unknown-item",
  /** The value does not fit the item's kind. */
  "invalid-value",
  /** The operation id was used by someone else. */
  "op-id-taken",
  /** A submission refused: items left or needing attention. */
  "incomplete",
  /** A submission refused: a conflict on the checklist is waiting to be decided. */
  "conflict-undecided",
] as const;
export type RefusalCode = (typeof REFUSAL_CODES)[number];

export interface OpResult {
  opId: string;
  status: OpStatus;
  rev?: number;
  serverValue?: unknown;
  reason?: string;
  code?: RefusalCode;
  conflictId?: number;
  /** For a conflict: who set the value the server holds, and when (the server's clock). */
  serverBy?: string;
  serverAt?: string;
  /**
   * Set when this answer was given before (a repeated operation): it describes the server as it
   * was then, so its revision is no news — the tablet never lowers a revision it knows for it.
   */
  repeat?: true;
}

export interface Change {
  checklistId: string;
  itemKey: string;
  value: unknown;
  rev: number;
  by: string;
  at: string;
}

/** A checklist whose state changed after the cursor (submitted, returned, countersigned). */
export interface ChecklistStateChange {
  id: string;
  state: ChecklistState;
}

export interface SyncResponse {
  results: OpResult[];
  changes: Change[];
  checklists: ChecklistStateChange[];
  cursor: string;
  /** More changes wait after this cursor: pull again (the tablet does, until this is absent). */
  more?: true;
}

/** Field paths and messages of a malformed request, as the 400 body lists them. */
export function describeProblems(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((i) => ({
    path: i.path
      .map((p) => (typeof p === "number" ? `[${p}]` : `.${String(p)}`))
      .join("")
      .replace(/^\./, ""),
    message: i.message,
  }));
}

/** Structural equality of two JSON values, key order ignored ("same value as the server's"). */
export function sameJson(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== typeof b || a === null || b === null || typeof a !== "object") return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a)) {
    const bb = b as unknown[];
    return a.length === bb.length && a.every((v, i) => sameJson(v, bb[i]));
  }
  const ra = a as Record<string, unknown>;
  const rb = b as Record<string, unknown>;
  const ka = Object.keys(ra).filter((k) => ra[k] !== undefined);
  const kb = Object.keys(rb).filter((k) => rb[k] !== undefined);
  return ka.length === kb.length && ka.every((k) => sameJson(ra[k], rb[k]));
}
