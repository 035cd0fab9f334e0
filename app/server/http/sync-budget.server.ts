import { db } from "../db.server.ts";
import { sessionStorage } from "../session.server.ts";
import type { Refusal } from "./guards.server.ts";

/**
 * Refused sync operations an account may leave behind per hour. Each one is a bookkeeping row
 * (sync_ops, so a repeated operation gets the same answer); without a bound one signed-in person
 * could make the server store 1,000 of them per request, without end. A tablet refuses far fewer:
 * it only sends what its screens allowed.
 */
export const REJECTED_OPS_PER_HOUR = 5_000;
export const SYNC_BUDGET_RETRY_S = 15 * 60;

/** How long one look at an account's refusals stands: sync stays as fast as without the bound. */
const FRESH_MS = 60_000;
const looked = new Map<string, { over: boolean; at: number }>();

/** A 429 when the signed-in person has used up the hour's refusals; null otherwise. */
export async function syncBudgetRefusal(cookieHeader: string | null): Promise<Refusal | null> {
  if (!cookieHeader) return null;
  const now = Date.now();
  let seen = looked.get(cookieHeader);
  if (!seen || now - seen.at > FRESH_MS) {
    seen = { over: await overBudget(cookieHeader), at: now };
    if (looked.size > 10_000) looked.clear();
    looked.set(cookieHeader, seen);
  }
  if (!seen.over) return null;
  return {
    status: 429,
    message: `More than ${REJECTED_OPS_PER_HOUR} of this account's operations were refused in the last hour; sync pauses for ${SYNC_BUDGET_RETRY_S / 60} minutes. Tell your manager if this keeps happening.`,
  };
}

async function overBudget(cookieHeader: string): Promise<boolean> {
  const userId = (await sessionStorage().getSession(cookieHeader)).get("userId");
  if (!userId) return false;
  // Served by the index on sync_ops.user_id (its foreign key).
  const [{ n }] = await db()("sync_ops")
    .where({ user_id: userId, status: "rejected" })
    .andWhere("received_at", ">", new Date(Date.now() - 3_600_000))
    .count({ n: "*" });
  return Number(n) >= REJECTED_OPS_PER_HOUR;
}
