import type { Knex } from "knex";
import { canFillJob, canViewJob, type Actor } from "~/lib/permissions";
import {
  describeProblems,
  MAX_CHANGES_PER_PULL,
  operationSchema,
  sameJson,
  type Change,
  type Operation,
  type OpResult,
  type RefusalCode,
  type SyncRequest,
  type SyncResponse,
} from "~/lib/sync/protocol";
import { findItem, valueSchemaFor, type Template } from "~/lib/templates";
import { mergeLog, mergeRuleFor } from "~/lib/sync/merge";
import { SUBMIT_KEY } from "~/lib/sync/submission";
import { applierDb } from "./db.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import { insertRows, onOneConnection, type Send, type Statement } from "./round-trip.server.ts";
import type {
  ChecklistResponseRow,
  ChecklistStateColumn,
  JobChecklistRow,
  ResponseHistoryRow,
  SyncConflictRow,
} from "./tables.server.ts";
import { withRetry } from "./retry.server.ts";
import { submitChecklist, undecidedConflicts } from "./review.server.ts";
import { lastChangeNumber, nextChangeNumber } from "./sync-clock.server.ts";
import {
  CLOCK_NOW,
  CLOCK_TAKEN,
  clockAtStatement,
  COMMIT,
  crewStatement,
  currentStateStatement,
  feedStatement,
  leaveFeedStatement,
  lockChecklistsStatement,
  stateChangesStatement,
  START_TRANSACTION,
  TAKE_CLOCK,
  type Scope,
  type UpTo,
} from "./sync-statements.server.ts";

interface ChecklistAccess {
  state: string;
  template: Template;
  canView: boolean;
  canFill: boolean;
}

const reject = (op: { opId: string }, code: RefusalCode, reason: string): OpResult => ({
  opId: op.opId,
  status: "rejected",
  code,
  reason,
});
const itemId = (checklistId: string, itemKey: string) => `${checklistId}|${itemKey}`;
const partition = <T>(xs: T[], test: (x: T) => boolean): [T[], T[]] => [
  xs.filter(test),
  xs.filter((x) => !test(x)),
];

/**
 * Published template versions never change, so each is parsed once per process: the item
 * schemas cached on its items (valueSchemaFor) then serve every later batch.
 */
const parsedTemplates = new Map<number, Template>();
async function templatesById(
  send: Send,
  knex: Knex,
  ids: number[],
  together: boolean,
): Promise<Map<number, Template>> {
  const missing = ids.filter((id) => !parsedTemplates.has(id));
  if (missing.length) {
    const [bodies] = (await send([knex("template_versions").whereIn("id", missing).select("id", "body")], {
      together,
    })) as [{ id: number; body: string }[]];
    for (const b of bodies) parsedTemplates.set(b.id, JSON.parse(b.body));
  }
  return new Map(ids.map((id) => [id, parsedTemplates.get(id)!]));
}

type LockedChecklist = Pick<JobChecklistRow, "id" | "state" | "template_version_id" | "job_id">;

type CrewRow = { job_id: number; lead_id: number; user_id: number | null };

/** Who may do what on each checklist the batch touches, from its locked row and its job's crew. */
async function loadAccess(
  send: Send,
  knex: Knex,
  actor: Actor,
  { locked: checklists, crew }: { locked: LockedChecklist[]; crew: CrewRow[] },
  together: boolean,
): Promise<Map<string, ChecklistAccess>> {
  const templates = await templatesById(
    send,
    knex,
    [...new Set(checklists.map((c) => c.template_version_id))],
    together,
  );
  const jobs = new Map<number, { leadId: number; technicianIds: number[] }>();
  for (const r of crew) {
    const job = jobs.get(r.job_id) ?? { leadId: r.lead_id, technicianIds: [] };
    if (r.user_id !== null) job.technicianIds.push(r.user_id);
    jobs.set(r.job_id, job);
  }
  return new Map(
    checklists.map((c) => {
      const job = jobs.get(c.job_id) ?? { leadId: 0, technicianIds: [] };
      return [
        c.id,
        {
          state: c.state,
          template: templates.get(c.template_version_id)!,
          canView: canViewJob(actor, job),
          canFill: canFillJob(actor, job),
        },
      ];
    }),
  );
}

type KnownOpId = { op_id: string; kept: "history" | "conflict" | "other" };

/**
 * Which of these operation ids are known at all, and where each one's answer is kept. The ids
 * travel once, as a table of values joined to each place (three IN lists of a thousand cost a
 * quarter more).
 */
function knownOpIdsQuery(opIds: string[]): Statement {
  return {
    native: {
      sql: `WITH asked (op_id) AS (VALUES ${opIds.map(() => "(?)").join(",")})
        SELECT h.op_id, 'history' AS kept FROM asked JOIN response_history h ON h.op_id = asked.op_id
        UNION ALL SELECT k.op_id, 'conflict' FROM asked JOIN sync_conflicts k ON k.op_id = asked.op_id
        UNION ALL SELECT s.op_id, 'other' FROM asked JOIN sync_ops s ON s.op_id = asked.op_id`,
      bindings: opIds,
    },
  };
}

/**
 * The answers already given to the known operation ids (in a fresh batch, none), read only from
 * the table that holds each kind of answer.
 */
async function answersGiven(send: Send, knex: Knex, found: KnownOpId[], together: boolean) {
  const answers = new Map<string, { userId: number; result: OpResult }>();
  if (!found.length) return answers;
  const keptIn = (kept: string) => found.filter((f) => f.kept === kept).map((f) => f.op_id);
  const reads: [string, Statement][] = [
    [
      "history",
      knex("response_history").whereIn("op_id", keptIn("history")).select("op_id", "user_id", "rev"),
    ],
    [
      "conflict",
      knex("sync_conflicts as k")
        // Who set the server's value, and when: its history row.
        .leftJoin("response_history as h", (j) =>
          j.on("h.checklist_id", "k.checklist_id").on("h.item_key", "k.item_key").on("h.rev", "k.server_rev"),
        )
        .leftJoin("users as u", "u.id", "h.user_id")
        .whereIn("k.op_id", keptIn("conflict"))
        .select("k.op_id", "k.user_id", "k.id", "k.server_rev", "k.server_value", "u.name", "h.at"),
    ],
    ["other", knex("sync_ops").whereIn("op_id", keptIn("other")).select("op_id", "user_id", "result")],
  ];
  const asked = reads.filter(([kept]) => keptIn(kept).length);
  const rows = new Map(
    (
      await send(
        asked.map(([, q]) => q),
        { together },
      )
    ).map((r, i) => [asked[i]![0], r as never[]]),
  );
  const applied: { op_id: string; user_id: number; rev: number }[] = rows.get("history") ?? [];
  const conflicted: {
    op_id: string;
    user_id: number;
    id: number;
    server_rev: number;
    server_value: string | null;
    name: string | null;
    at: Date;
  }[] = rows.get("conflict") ?? [];
  const others: { op_id: string; user_id: number; result: string }[] = rows.get("other") ?? [];
  for (const r of applied)
    answers.set(r.op_id!, { userId: r.user_id, result: { opId: r.op_id!, status: "applied", rev: r.rev } });
  for (const r of conflicted) {
    answers.set(r.op_id, {
      userId: r.user_id,
      result: {
        opId: r.op_id,
        status: "conflict",
        rev: r.server_rev,
        serverValue: r.server_value === null ? null : parseJsonColumn(r.server_value),
        ...(r.name ? { serverBy: r.name, serverAt: new Date(r.at).toISOString() } : {}),
        conflictId: r.id,
      },
    });
  }
  for (const r of others)
    answers.set(r.op_id, { userId: r.user_id, result: parseJsonColumn<OpResult>(r.result) });
  return answers;
}

/** Why this person may not write to this checklist at all, or null. */
function accessRefusal(op: Operation, access: ChecklistAccess | undefined): OpResult | null {
  if (!access || !access.canView)
    return reject(op, "not-on-your-job", "This checklist is not on one of your jobs.");
  if (!access.canFill)
    return reject(op, "not-allowed", "Only the job's technicians and its lead record entries.");
  if (access.state === "submitted")
    return reject(op, "locked", "The checklist has been submitted for review and takes no more entries.");
  if (access.state === "countersigned")
    return reject(op, "locked", "The checklist is countersigned and locked; a correction is an amendment.");
  return null;
}

function refusal(op: Operation, access: ChecklistAccess | undefined): OpResult | null {
  const denied = accessRefusal(op, access);
  if (denied || !access) return denied;
  const item = findItem(access.template, op.itemKey);
  if (!item) return reject(op, "unknown-item", `The checklist has no item "${op.itemKey}".`);
  const parsed = valueSchemaFor(item).safeParse(op.value);
  if (!parsed.success) {
    const first = parsed.error.issues[0]!;
    return reject(
      op,
      "invalid-value",
      `The entry for "${item.label}" is not valid: ${[...first.path].join(".") || "value"} ${first.message}.`,
    );
  }
  return null;
}

/** An operation read on its own: a malformed one is refused by itself, never failing the batch. */
function readOperation(raw: SyncRequest["ops"][number]): Operation | OpResult {
  const parsed = operationSchema.safeParse(raw);
  if (parsed.success) return parsed.data as Operation;
  const problems = describeProblems(parsed.error)
    .map((p) => `${p.path || "operation"} ${p.message}`)
    .join("; ");
  return reject(raw, "invalid-operation", `The entry could not be read: ${problems}.`);
}

/** A row of the change feed: the item's current value, its change number and who set it. */
type FeedRow = Pick<
  ChecklistResponseRow,
  "checklist_id" | "item_key" | "value" | "rev" | "updated_at" | "change_seq"
> & { name: string };

/** Runs one of the feed's statements outside a batch. */
async function feedRows(knex: Knex, scope: Scope, since: number, upTo: UpTo, limit?: number) {
  const { sql, bindings } = feedStatement(scope, since, upTo, limit).native;
  const [rows] = (await knex.raw(sql, bindings as Knex.RawBinding[])) as [FeedRow[]];
  return rows;
}

const toChange = (r: FeedRow): Change => ({
  checklistId: r.checklist_id,
  itemKey: r.item_key,
  value: parseJsonColumn(r.value),
  rev: r.rev,
  by: r.name,
  at: new Date(r.updated_at).toISOString(),
});

/**
 * A page of the feed from its first rows (read with feedQuery): a page ends only between change
 * numbers, so a batch's changes are never split and the cursor (the last number included) is
 * exact; the last number's changes are read whole when the page ends inside them. `more` says
 * the device should pull again from that cursor.
 */
async function pageOf(
  knex: Knex,
  rows: FeedRow[],
  scope: Scope,
  upTo: number,
  limit: number,
): Promise<{ changes: Change[]; cursor: number; more: boolean }> {
  if (rows.length <= limit) return { changes: rows.map(toChange), cursor: upTo, more: false };
  const last = Number(rows[limit - 1]!.change_seq);
  const whole = await feedRows(knex, scope, last - 1, last);
  return {
    changes: [...rows.filter((r) => Number(r.change_seq) < last), ...whole].map(toChange),
    cursor: last,
    more: last < upTo,
  };
}

/**
 * One page of the change feed after `since` (up to `upTo`), at most about `limit` changes (see
 * pageOf).
 */
export async function changesPage(
  knex: Knex,
  scope: Scope,
  since: number,
  upTo: number,
  limit = MAX_CHANGES_PER_PULL,
): Promise<{ changes: Change[]; cursor: number; more: boolean }> {
  if (upTo <= since) return { changes: [], cursor: upTo, more: false };
  return pageOf(knex, await feedRows(knex, scope, since, upTo, limit), scope, upTo, limit);
}

/**
 * Applies a batch and answers what changed since the cursor. The batch is one transaction: either
 * all of it is recorded (with each op's result) or nothing is. The rules per operation: a known
 * opId gets its first answer again; baseRev equal to the current revision is applied
 * (revision + 1); the same value as the server's is accepted without a conflict; anything else is
 * a conflict, kept with both values. A submission is decided after the batch's entries are
 * committed, in a transaction of its own, so they count towards "complete".
 *
 * Concurrency (decision 043): the batch first locks the rows of the checklists it touches, so
 * batches on other checklists run beside it, and takes the change-feed clock only once its
 * decisions are made, just before writing; the clock's row lock is held for the writes and the
 * commit alone. Change numbers therefore still follow commit order, and the pull — read after the
 * commit, when every smaller number is committed — never misses a late commit (decision 004).
 *
 * Round trips (decision 044): on one server the batch is read in one request (which opens the
 * transaction) and written, committed and followed by the pull in a second; a pull alone is one.
 */
export async function sync(actor: Actor & { name: string }, request: SyncRequest): Promise<SyncResponse> {
  const since = request.cursor && /^\d+$/.test(request.cursor) ? Number(request.cursor) : 0;
  const knex = applierDb();
  // On a Galera cluster statements go one at a time, each answered before the next (decision 044).
  const together = !(await onGaleraNode());
  // A pull needs no transaction: every change numbered up to the clock it reads is committed, so
  // plain reads see each of them or a later change.
  if (!request.ops.length) {
    const read = await onOneConnection(knex, (send) =>
      send([CLOCK_NOW, ...pullStatements(actor, since, false)], { together }),
    );
    return { results: [], ...(await pageFrom(knex, actor, since, pulled(read, []))) };
  }
  // A deadlock, a lost certification on a Galera cluster, or a concurrent copy of one of the
  // batch's opIds (a duplicate key) runs the whole batch again; a copy is then answered as a repeat.
  const batch = await withRetry(
    () => onOneConnection(knex, (send) => applyBatch(send, knex, actor, request, since, together)),
    { alsoRetry: [ER_DUP_ENTRY] },
  );
  const { results, submissions } = batch;
  if (!submissions.length) return { results, ...(await pageFrom(knex, actor, since, batch.pulled!)) };
  const clock = await withRetry(
    () => knex.transaction((trx) => decideSubmissions(trx, actor, request.deviceId, submissions, results)),
    { alsoRetry: [ER_DUP_ENTRY] },
  );
  const read = await onOneConnection(knex, (send) =>
    send([clockAtStatement(clock), ...pullStatements(actor, since, false)], { together }),
  );
  return { results, ...(await pageFrom(knex, actor, since, pulled(read, []))) };
}

const ER_DUP_ENTRY = 1062;

/**
 * Whether the applier's server is a Galera node (`wsrep_on`), asked once per process. When it
 * cannot be told, the answer is yes: statements then go one at a time, which is right anywhere.
 */
let galera: Promise<boolean> | undefined;
function onGaleraNode(): Promise<boolean> {
  galera ??= applierDb()
    .raw("SELECT @@wsrep_on AS wsrep")
    .then(([rows]: [{ wsrep: number | string }[]]) => Number(rows[0]?.wsrep) !== 0)
    .catch(() => {
      galera = undefined; // ask again next time
      return true;
    });
  return galera;
}

type CurrentRow = {
  kind: "value" | "conflict";
  checklist_id: string;
  item_key: string;
  rev: number | string;
  value: string;
  updated_at: Date;
  name: string;
  /** The current history row's id, or the waiting conflict's. */
  row_id: number | string;
};

/**
 * Everything deciding a batch needs, in one round trip that opens its transaction: its checklists'
 * rows, locked first (so every read after sees what batches before this one committed on them),
 * the opIds already answered, the jobs' crews, and the current values with the conflicts waiting
 * on them.
 */
async function readBatch(send: Send, knex: Knex, checklistIds: string[], opIds: string[], together: boolean) {
  const some = checklistIds.length > 0;
  const queries = [
    START_TRANSACTION,
    ...(some ? [lockChecklistsStatement(checklistIds)] : []),
    ...(opIds.length ? [knownOpIdsQuery(opIds)] : []),
    ...(some ? [crewStatement(checklistIds), currentStateStatement(checklistIds)] : []),
  ];
  const answers = (await send(queries, { together })).slice(1);
  const locked = (some ? answers.shift() : []) as LockedChecklist[];
  const known = (opIds.length ? answers.shift() : []) as KnownOpId[];
  const [crew = [], rows = []] = answers as [CrewRow[]?, CurrentRow[]?];
  const [values, conflicts] = partition(rows, (r) => r.kind === "value");
  // Conflicts still waiting on the batch's checklists: an entry applied on the item decides them.
  const waiting = new Map<string, number[]>();
  for (const c of conflicts) {
    const key = itemId(c.checklist_id, c.item_key);
    waiting.set(key, [...(waiting.get(key) ?? []), Number(c.row_id)]);
  }
  return { locked, known, crew, values, waiting };
}

type Submission = { op: Operation; resultIndex: number };

/**
 * Decides, writes and commits a batch; answers each operation and the submissions left to decide,
 * and, when there are none, the pull read after the commit.
 */
async function applyBatch(
  send: Send,
  knex: Knex,
  actor: Actor & { name: string },
  request: SyncRequest,
  since: number,
  together: boolean,
): Promise<{ results: OpResult[]; submissions: Submission[]; pulled?: Pulled }> {
  const results: OpResult[] = [];
  const now = new Date();
  const ops = request.ops.map(readOperation);
  const valid = ops.filter((o): o is Operation => !("status" in o));
  const checklistIds = [...new Set(valid.map((o) => o.checklistId))];
  const batch = await readBatch(
    send,
    knex,
    checklistIds,
    request.ops.map((o) => o.opId),
    together,
  );
  const known = await answersGiven(send, knex, batch.known, together);
  const access = await loadAccess(send, knex, actor, batch, together);
  const { values: currentRows, waiting } = batch;
  // Each item's current history row, which a new revision replaces.
  const currentRowId = new Map(
    currentRows.map((r) => [itemId(r.checklist_id, r.item_key), Number(r.row_id)]),
  );
  const current = new Map<string, { rev: number; value: unknown; by: string; at: Date }>(
    currentRows.map((r) => [
      itemId(r.checklist_id, r.item_key),
      // A union's integer columns may arrive as strings (BIGINT): numbers here.
      { rev: Number(r.rev), value: parseJsonColumn(r.value), by: r.name, at: new Date(r.updated_at) },
    ]),
  );

  // The items' new values, the last per item (the feed's changes), and every row written for them.
  const changed = new Map<string, Change>();
  const history: Omit<ResponseHistoryRow, "id" | "change_seq">[] = [];
  const writtenOps = new Set<string>();
  const conflicts: {
    op: Operation;
    row: Omit<SyncConflictRow, "id" | "resolved_at" | "resolved_by" | "resolution_op_id"> &
      Partial<Pick<SyncConflictRow, "resolved_at">>;
    resultIndex: number;
  }[] = [];
  const resolutions: { op: Operation; ids: number[] }[] = [];
  const recorded: Submission[] = [];
  const submissions: Submission[] = [];

  for (const read of ops) {
    const seen = known.get(read.opId);
    if (seen) {
      // A retry: the first answer, marked as a repeat (another person's opId is simply refused).
      results.push(
        seen.userId === actor.id
          ? { ...seen.result, opId: read.opId, repeat: true }
          : reject(read, "op-id-taken", "This operation id was used by someone else."),
      );
      continue;
    }
    if ("status" in read) {
      results.push(read); // malformed: refused on its own, nothing stored
      continue;
    }
    const op = read;
    if (op.itemKey === SUBMIT_KEY) {
      // Decided after this batch's entries are written: they count towards "complete".
      const denied = accessRefusal(op, access.get(op.checklistId));
      if (denied) {
        results.push(denied);
        recorded.push({ op, resultIndex: results.length - 1 });
      } else {
        submissions.push({ op, resultIndex: results.length });
        results.push({ opId: op.opId, status: "applied", rev: 0 }); // replaced once decided
      }
      continue;
    }
    const key = itemId(op.checklistId, op.itemKey);
    let result = refusal(op, access.get(op.checklistId));
    if (!result) {
      const now_ = current.get(key);
      const rev = now_?.rev ?? 0;
      const onCurrent = op.baseRev === rev;
      const kind = findItem(access.get(op.checklistId)!.template, op.itemKey)!.kind;
      // What the entry does to the item, by its kind's merge rule (app/lib/sync/merge.ts).
      let next: { write: unknown } | { same: true } | { conflict: true };
      if (mergeRuleFor(kind) === "log" && now_) {
        const merged = mergeLog(now_.value, op.value, onCurrent);
        next =
          "conflict" in merged
            ? merged
            : sameJson(merged.value, now_.value)
              ? { same: true }
              : { write: merged.value };
      } else if (onCurrent) next = { write: op.value };
      else if (now_ && sameJson(now_.value, op.value)) next = { same: true };
      else next = { conflict: true };
      if ("write" in next) {
        const value = JSON.stringify(next.write);
        current.set(key, { rev: rev + 1, value: next.write, by: actor.name, at: now });
        changed.set(key, {
          checklistId: op.checklistId,
          itemKey: op.itemKey,
          value: next.write as Change["value"],
          rev: rev + 1,
          by: actor.name,
          at: now.toISOString(),
        });
        writtenOps.add(op.opId);
        history.push({
          checklist_id: op.checklistId,
          item_key: op.itemKey,
          rev: rev + 1,
          value,
          user_id: actor.id,
          device_id: request.deviceId,
          op_id: op.opId,
          at: now,
          client_at: op.at,
        });
        result = { opId: op.opId, status: "applied", rev: rev + 1 };
        // Made on the server's current value, this entry decides every conflict waiting on the
        // item: those already stored, and those this batch raised before it.
        const ids = onCurrent ? [...new Set([...(waiting.get(key) ?? []), ...(op.resolves ?? [])])] : [];
        if (ids.length) resolutions.push({ op, ids });
        if (onCurrent) {
          waiting.delete(key);
          for (const c of conflicts)
            if (itemId(c.op.checklistId, c.op.itemKey) === key && !c.row.resolved_at)
              Object.assign(c.row, {
                resolved_at: now,
                resolved_by: actor.id,
                resolution_op_id: op.opId,
              });
        }
      } else if ("same" in next) {
        result = { opId: op.opId, status: "applied", rev }; // the same value: nothing to write
        if (op.resolves?.length) resolutions.push({ op, ids: op.resolves });
      } else {
        result = {
          opId: op.opId,
          status: "conflict",
          rev,
          serverValue: now_?.value ?? null,
          ...(now_ ? { serverBy: now_.by, serverAt: now_.at.toISOString() } : {}),
        };
        conflicts.push({
          op,
          resultIndex: results.length,
          row: {
            checklist_id: op.checklistId,
            item_key: op.itemKey,
            op_id: op.opId,
            base_rev: op.baseRev,
            server_rev: rev,
            server_value: now_ ? JSON.stringify(now_.value) : null,
            client_value: JSON.stringify(op.value),
            user_id: actor.id,
            device_id: request.deviceId,
            client_at: op.at,
            received_at: now,
          },
        });
      }
    }
    results.push(result);
    // Applied values and conflicts are their own record; only the rest needs a row of its own.
    if (result.status === "rejected" || (result.status === "applied" && !writtenOps.has(op.opId))) {
      recorded.push({ op, resultIndex: results.length - 1 });
    }
  }
  const opRow = opRowOf(actor, request.deviceId, results, now);
  const wrote = [...changed.values()];
  const takesClock = history.length > 0;
  // The new current row of each changed item is its last revision here; the row it replaces (if
  // the item had a value) and any earlier revision of this batch leave the feed.
  const [latest, replacedHere] = partition(
    history,
    (h) => changed.get(itemId(h.checklist_id, h.item_key))!.rev === h.rev,
  );
  const replaced = [...changed.keys()].flatMap((key) => currentRowId.get(key) ?? []);
  // The whole write in one round trip, with the commit. Everything that needs no change number
  // comes first (the rows that stop being current included); the clock, last: its lock (every
  // applier's) is held only for the new current rows (decision 046) and the commit. A batch with
  // nothing for the feed (repeats, refusals, conflicts) does not take it. Conflict ids are read
  // back by opId: a Galera cluster hands out auto-increment ids in steps of the node count.
  const writes: Statement[] = [];
  const add = (s: Statement) => writes.push(s) - 1;
  let conflictIdsAt = -1;
  if (conflicts.length) {
    add(knex("sync_conflicts").insert(conflicts.map((c) => c.row)));
    const opIds = conflicts.map((c) => c.op.opId);
    conflictIdsAt = add(knex("sync_conflicts").whereIn("op_id", opIds).select("id", "op_id"));
  }
  for (const { op, ids } of resolutions)
    add(
      knex("sync_conflicts")
        .whereIn("id", ids)
        .where({ checklist_id: op.checklistId, item_key: op.itemKey })
        .whereNull("resolved_at")
        .update({ resolved_at: now, resolved_by: actor.id, resolution_op_id: op.opId }),
    );
  if (recorded.length) add(knex("sync_ops").insert(recorded.map(opRow)));
  if (replaced.length) add(leaveFeedStatement(replaced));
  if (replacedHere.length) add(insertRows("response_history", replacedHere));
  if (takesClock) {
    // The UPDATE takes the clock; its number is kept in @clock, since the history's own
    // auto-increment changes LAST_INSERT_ID(). One statement: a batch holds at most
    // MAX_OPS_PER_REQUEST rows, well within a packet.
    TAKE_CLOCK.forEach(add);
    add(insertRows("response_history", latest, { change_seq: "@clock" }));
  }
  add(COMMIT);
  // After the commit, in the same request: the clock (the batch's own number, or the last handed
  // out) and, with no submission left to decide, the pull.
  const clockIndex = add(takesClock ? CLOCK_TAKEN : CLOCK_NOW);
  if (!submissions.length) writes.push(...pullStatements(actor, since, wrote.length > 0));
  const answers = await send(writes, { together });
  if (conflicts.length) {
    const rows = answers[conflictIdsAt] as { id: number; op_id: string }[];
    const ids = new Map(rows.map((r) => [r.op_id, Number(r.id)]));
    for (const c of conflicts)
      results[c.resultIndex] = { ...results[c.resultIndex]!, conflictId: ids.get(c.op.opId)! };
  }
  return {
    results,
    submissions,
    ...(submissions.length ? {} : { pulled: pulled(answers.slice(clockIndex), wrote) }),
  };
}

/** The bookkeeping row of an operation whose answer is kept in sync_ops. */
const opRowOf =
  (actor: Actor, deviceId: string, results: OpResult[], now: Date) =>
  ({ op, resultIndex }: Submission) => ({
    op_id: op.opId,
    device_id: deviceId,
    seq: op.seq,
    user_id: actor.id,
    checklist_id: op.checklistId,
    item_key: op.itemKey,
    status: results[resultIndex]!.status,
    result: JSON.stringify(results[resultIndex]),
    received_at: now,
  });

/**
 * Decides a batch's submissions once its entries are committed, in order, in one transaction:
 * each checklist's row is locked, then the clock, as a batch takes them. Answers the clock the
 * state changes are numbered with (or the last number handed out).
 */
async function decideSubmissions(
  trx: Knex.Transaction,
  actor: Actor,
  deviceId: string,
  submissions: Submission[],
  results: OpResult[],
): Promise<number> {
  const opIds = submissions.map((s) => s.op.opId);
  // A copy of one of these operations, decided since: answered as a repeat.
  const known = new Map(
    (await trx("sync_ops").whereIn("op_id", opIds).select("op_id", "user_id", "result")).map((r) => [
      r.op_id,
      r,
    ]),
  );
  const checklistIds = [...new Set(submissions.map((s) => s.op.checklistId))];
  const locked = await trx("job_checklists")
    .whereIn("id", checklistIds)
    .orderBy("id")
    .forUpdate()
    .select("id", "state");
  const states = new Map(locked.map((c) => [c.id, c.state]));
  const submitted = new Set<string>();
  const decided: Submission[] = [];
  for (const { op, resultIndex } of submissions) {
    const seen = known.get(op.opId);
    if (seen) {
      results[resultIndex] =
        seen.user_id === actor.id
          ? { ...parseJsonColumn<OpResult>(seen.result), opId: op.opId, repeat: true }
          : reject(op, "op-id-taken", "This operation id was used by someone else.");
      continue;
    }
    decided.push({ op, resultIndex });
    const state = submitted.has(op.checklistId) ? "submitted" : states.get(op.checklistId);
    if (state === "submitted" || state === "countersigned") {
      results[resultIndex] = reject(
        op,
        "locked",
        state === "submitted"
          ? "The checklist is already waiting for review."
          : "The checklist is countersigned and locked; a correction is an amendment.",
      );
      continue;
    }
    const undecided = await undecidedConflicts(trx, op.checklistId);
    if (undecided) {
      results[resultIndex] = reject(
        op,
        "conflict-undecided",
        `Not submitted: ${undecided} conflict(s) on this checklist wait to be decided on the To-decide page.`,
      );
      continue;
    }
    const refused = await submitChecklist(trx, actor, op.checklistId, deviceId);
    if (refused) {
      results[resultIndex] = reject(op, "incomplete", refused);
      continue;
    }
    submitted.add(op.checklistId);
    results[resultIndex] = { opId: op.opId, status: "applied", rev: 0 };
  }
  if (decided.length)
    await trx("sync_ops").insert(decided.map(opRowOf(actor, deviceId, results, new Date())));
  if (!submitted.size) return lastChangeNumber(trx);
  // Submitted: every tablet learns the state with its next pull.
  const clock = await nextChangeNumber(trx);
  await trx("job_checklists")
    .whereIn("id", [...submitted])
    .update({ change_seq: clock });
  return clock;
}

/**
 * The pull's reads, after a statement that set `@clock`: the feed after `since` up to it (up to
 * the number before, when the batch wrote: its own changes travel as written), and the checklists
 * whose state changed in that span.
 */
function pullStatements(actor: Actor, since: number, wrote: boolean): Statement[] {
  // The visible checklists as a subquery: the feed is read by its change numbers after the
  // cursor (an index range), each row kept if its checklist is one of them.
  return [
    feedStatement(actor, since, wrote ? "@clock - 1" : "@clock", MAX_CHANGES_PER_PULL),
    // Submitted, returned, countersigned: a checklist's state reaches every tablet with the pull.
    stateChangesStatement(actor, since),
  ];
}

type StateRow = { id: string; state: ChecklistStateColumn; change_seq: number | string };
type Pulled = { clock: number; rows: FeedRow[]; states: StateRow[]; wrote: Change[] };

/** The answers to [clock, ...pullStatements], with the changes the batch wrote. */
const pulled = (answers: unknown[], wrote: Change[]): Pulled => {
  const [clockRows, rows, states] = answers as [{ seq: number | string }[], FeedRow[], StateRow[]];
  return { clock: Number(clockRows[0]!.seq), rows, states, wrote };
};

/**
 * One page of what changed after `since` for this person, from the pull's reads: the feed up to
 * the clock (or, when the batch wrote changes numbered `clock`, up to the number before, plus
 * those changes as written).
 */
async function pageFrom(
  knex: Knex,
  actor: Actor,
  since: number,
  { clock, rows, states: stateRows, wrote }: Pulled,
): Promise<Omit<SyncResponse, "results">> {
  const upTo = wrote.length ? clock - 1 : clock;
  const page =
    upTo > since
      ? await pageOf(knex, rows, actor, upTo, MAX_CHANGES_PER_PULL)
      : { changes: [], cursor: upTo, more: false };
  const changes = page.changes;
  const cursor = page.more ? page.cursor : clock;
  if (!page.more && since < clock) changes.push(...wrote);
  const states = stateRows.filter((c) => Number(c.change_seq) <= cursor);
  return {
    changes,
    checklists: states.map((c) => ({ id: c.id, state: c.state })),
    cursor: String(cursor),
    ...(page.more ? { more: true as const } : {}),
  };
}
