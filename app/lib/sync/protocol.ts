import type { z } from "zod";
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

export {
  isWellFormed,
  MAX_CHANGES_PER_PULL,
  MAX_OPS_PER_REQUEST,
  MAX_SYNC_BODY_BYTES,
  MAX_UINT32,
  MAX_VALUE_DEPTH,
  unstorableJson,
} from "./storable.ts";
// The request's zod schemas live in their own module so the tablet's store, which needs only the
// types and `unstorableJson`, does not carry zod (see docs/decisions/087-checklist-screen-weight.md).
export { operationSchema, syncRequestSchema } from "./request-schema.ts";
export type { Operation, SyncRequest } from "./request-schema.ts";
export type JsonValue = string | number | boolean | null | JsonValue[] | { [key: string]: JsonValue };

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
