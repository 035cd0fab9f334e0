import type { Actor } from "~/lib/permissions";
import type { NativeStatement } from "./round-trip.server.ts";
import { TAKE_CLOCK_SQL } from "./sync-clock.server.ts";

/**
 * The statements every sync request sends, written as SQL (decision 090): built by Knex they cost
 * the server's one thread about half a millisecond per push, a quarter of applying it. Every value
 * still travels as a bound parameter.
 */
const statement = (sql: string, bindings: readonly unknown[] = []): NativeStatement => ({
  native: { sql, bindings },
});
const marks = (n: number) => Array(n).fill("?").join(", ");

/**
 * Which checklists a pull reads: a list of ids, or everything the person may see (the checklists
 * of the jobs they lead or work on; all of them for a manager).
 */
export type Scope = readonly string[] | Actor;

function scopeSql(scope: Scope): { sql: string; bindings: readonly unknown[] } {
  if (Array.isArray(scope)) return { sql: marks(scope.length) || "NULL", bindings: scope };
  const actor = scope as Actor;
  if (actor.role === "manager") return { sql: "SELECT c.id FROM job_checklists c", bindings: [] };
  if (actor.role === "lead")
    return {
      sql: "SELECT c.id FROM job_checklists c JOIN jobs j ON j.id = c.job_id WHERE j.lead_id = ?",
      bindings: [actor.id],
    };
  if (actor.role === "technician")
    return {
      sql: "SELECT c.id FROM job_checklists c JOIN job_technicians t ON t.job_id = c.job_id WHERE t.user_id = ?",
      bindings: [actor.id],
    };
  return { sql: "SELECT c.id FROM job_checklists c WHERE 1 = 0", bindings: [] };
}

/**
 * The end of a feed read: a change number, or the `@clock` a request set (less one when the batch
 * wrote: its own changes travel as written).
 */
export type UpTo = number | "@clock" | "@clock - 1";
const upToSql = (upTo: UpTo) =>
  typeof upTo === "number" ? { sql: "?", bindings: [upTo] } : { sql: upTo, bindings: [] };

/**
 * The change feed after `since` up to `upTo`, in order: each item's current value, its change
 * number and who set it (looked up per row, see author-name.server.ts). With a limit, one row more
 * than it, to tell whether more follow.
 */
export function feedStatement(scope: Scope, since: number, upTo: UpTo, limit?: number) {
  const inScope = scopeSql(scope);
  const end = upToSql(upTo);
  return statement(
    `SELECT r.checklist_id, r.item_key, r.value, r.rev, r.updated_at, r.change_seq,
      (SELECT u.name FROM users u WHERE u.id = r.updated_by) AS name
    FROM checklist_responses r
    WHERE r.checklist_id IN (${inScope.sql}) AND r.change_seq > ? AND r.change_seq <= ${end.sql}
    ORDER BY r.change_seq${limit === undefined ? "" : " LIMIT ?"}`,
    [...inScope.bindings, since, ...end.bindings, ...(limit === undefined ? [] : [limit + 1])],
  );
}

/** The checklists in scope whose state (submitted, returned, countersigned) changed after `since`. */
export function stateChangesStatement(scope: Scope, since: number) {
  const inScope = scopeSql(scope);
  return statement(
    `SELECT s.id, s.state, s.change_seq FROM job_checklists s
    WHERE s.id IN (${inScope.sql}) AND s.change_seq > ? AND s.change_seq <= @clock`,
    [...inScope.bindings, since],
  );
}

/**
 * The batch's checklists, locked in key order (the same order in every batch, so no deadlock),
 * with what deciding the batch needs of them.
 */
export const lockChecklistsStatement = (ids: readonly string[]) =>
  statement(
    `SELECT id, state, template_version_id, job_id FROM job_checklists
    WHERE id IN (${marks(ids.length)}) ORDER BY id FOR UPDATE`,
    ids,
  );

/** The jobs and crews of the batch's checklists (one row per job and technician). */
export const crewStatement = (checklistIds: readonly string[]) =>
  statement(
    `SELECT DISTINCT j.id AS job_id, j.lead_id, t.user_id
    FROM job_checklists c JOIN jobs j ON j.id = c.job_id LEFT JOIN job_technicians t ON t.job_id = j.id
    WHERE c.id IN (${marks(checklistIds.length)})`,
    checklistIds,
  );

/**
 * Every current value of the batch's checklists — its current history row (decision 046) — and the
 * conflicts still waiting on them (a row-constructor IN over a thousand pairs costs more than
 * reading the few checklists whole).
 */
export const currentStateStatement = (checklistIds: readonly string[]) =>
  statement(
    `SELECT 'value' AS kind, r.checklist_id, r.item_key, r.rev, r.value, r.at AS updated_at,
      (SELECT u.name FROM users u WHERE u.id = r.user_id) AS name, r.id AS row_id
    FROM response_history r WHERE r.checklist_id IN (${marks(checklistIds.length)}) AND r.is_current = 1
    UNION ALL
    SELECT 'conflict', k.checklist_id, k.item_key, NULL, NULL, NULL, NULL, k.id
    FROM sync_conflicts k WHERE k.checklist_id IN (${marks(checklistIds.length)}) AND k.resolved_at IS NULL`,
    [...checklistIds, ...checklistIds],
  );

/** History rows that stop being current: they leave the feed (decision 046). */
export const leaveFeedStatement = (historyIds: readonly number[]) =>
  statement(
    `UPDATE response_history SET change_seq = NULL WHERE id IN (${marks(historyIds.length)})`,
    historyIds,
  );

export const START_TRANSACTION = statement("START TRANSACTION");
export const COMMIT = statement("COMMIT");
/**
 * Takes the clock's next number and keeps it in `@clock` (the history's own auto-increment changes
 * LAST_INSERT_ID() afterwards); see sync-clock.server.ts.
 */
export const TAKE_CLOCK = [statement(TAKE_CLOCK_SQL), statement("SET @clock = LAST_INSERT_ID()")];
/** Answers `@clock` as set by TAKE_CLOCK. */
export const CLOCK_TAKEN = statement("SELECT @clock AS seq");
/** Sets `@clock` to the last number handed out (a pull reads up to it). */
export const CLOCK_NOW = statement("SELECT @clock := seq AS seq FROM sync_clock WHERE id = 1");
/** Sets `@clock` to a known number. */
export const clockAtStatement = (clock: number) => statement("SELECT @clock := ? AS seq", [clock]);
