import { z } from "zod";

/**
 * The sync protocol between a tablet and POST /api/sync, shared by both sides.
 * One request pushes a batch of operations (in outbox order) and pulls what changed after the
 * device's cursor. The server decides by revisions, never by device clocks.
 */

/** The most operations one request may carry; a bigger batch is answered 413. */
export const MAX_OPS_PER_REQUEST = 1000;
/** The largest request body the route reads, in bytes (413 beyond it). */
export const MAX_SYNC_BODY_BYTES = 4 * 1024 * 1024;

export const operationSchema = z.strictObject({
  opId: z.uuid({ error: "must be a UUID" }),
  seq: z.number({ error: "must be a number" }).int().nonnegative(),
  checklistId: z.uuid({ error: "must be a UUID" }),
  itemKey: z.string({ error: "must be a string" }).min(1).max(80),
  value: z.json({ error: "must be a JSON value" }),
  baseRev: z.number({ error: "must be a number" }).int().nonnegative(),
  at: z.iso.datetime({ offset: true, error: "must be an ISO 8601 date and time" }),
  /** Conflict ids this operation decides (a resolution is an ordinary operation). */
  resolves: z.array(z.number().int().positive()).max(50).optional(),
});
export type Operation = z.infer<typeof operationSchema>;

export const syncRequestSchema = z.strictObject({
  deviceId: z.string({ error: "must be a string" }).min(8).max(64),
  cursor: z.string().max(32).nullable(),
  ops: z.array(operationSchema).max(MAX_OPS_PER_REQUEST),
});
export type SyncRequest = z.infer<typeof syncRequestSchema>;

export type OpStatus = "applied" | "conflict" | "rejected";

export interface OpResult {
  opId: string;
  status: OpStatus;
  rev?: number;
  serverValue?: unknown;
  reason?: string;
  conflictId?: number;
}

export interface Change {
  checklistId: string;
  itemKey: string;
  value: unknown;
  rev: number;
  by: string;
  at: string;
}

export interface SyncResponse {
  results: OpResult[];
  changes: Change[];
  cursor: string;
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
  const ka = Object.keys(a as object).filter((k) => (a as any)[k] !== undefined);
  const kb = Object.keys(b as object).filter((k) => (b as any)[k] !== undefined);
  return ka.length === kb.length && ka.every((k) => sameJson((a as any)[k], (b as any)[k]));
}
