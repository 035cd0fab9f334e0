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
import { applierDb, db } from "./db.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import { runStatements } from "./round-trip.server.ts";
import type {
  ChecklistResponseRow,
  ChecklistStateColumn,
  JobChecklistRow,
  ResponseHistoryRow,
  SyncConflictRow,
} from "./tables.server.ts";
import { withRetry } from "./retry.server.ts";
import { submitChecklist, undecidedConflicts } from "./review.server.ts";
import { clockQuery, lastChangeNumber, takeClock } from "./sync-clock.server.ts";

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

/** The checklists of the jobs this person may see (the scope of what they pull). */
function visibleChecklists(knex: Knex, actor: Actor) {
  const q = knex("job_checklists as c").join("jobs as j", "j.id", "c.job_id");
  if (actor.role === "manager") return q;
  if (actor.role === "lead") return q.where("j.lead_id", actor.id);
  if (actor.role === "technician")
    return q.whereIn("j.id", knex("job_technicians").where({ user_id: actor.id }).select("job_id"));
  return q.whereRaw("1 = 0");
}

/**
 * Published template versions never change, so each is parsed once per process: the item
 * schemas cached on its items (valueSchemaFor) then serve every later batch.
 */
const parsedTemplates = new Map<number, Template>();
async function templatesById(trx: Knex.Transaction, ids: number[]): Promise<Map<number, Template>> {
  const missing = ids.filter((id) => !parsedTemplates.has(id));
  if (missing.length) {
    const bodies = await trx("template_versions").whereIn("id", missing).select("id", "body");
    for (const b of bodies) parsedTemplates.set(b.id, JSON.parse(b.body));
  }
  return new Map(ids.map((id) => [id, parsedTemplates.get(id)!]));
}

type LockedChecklist = Pick<JobChecklistRow, "id" | "state" | "template_version_id" | "job_id">;

type CrewRow = { job_id: number; lead_id: number; user_id: number | null };

/** The jobs and crews of the batch's checklists (one row per job and technician). */
const crewQuery = (trx: Knex.Transaction, checklistIds: string[]) =>
  trx("job_checklists as c")
    .join("jobs as j", "j.id", "c.job_id")
    .leftJoin("job_technicians as t", "t.job_id", "j.id")
    .whereIn("c.id", checklistIds)
    .distinct("j.id as job_id", "j.lead_id", "t.user_id");

/** Who may do what on each checklist the batch touches, from its locked row and its job's crew. */
async function loadAccess(
  trx: Knex.Transaction,
  actor: Actor,
  checklists: LockedChecklist[],
  crew: CrewRow[],
): Promise<Map<string, ChecklistAccess>> {
  const templates = await templatesById(trx, [...new Set(checklists.map((c) => c.template_version_id))]);
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

/** Which of these operation ids are known at all, and where each one's answer is kept. */
function knownOpIdsQuery(trx: Knex.Transaction, opIds: string[]) {
  const marks = opIds.map(() => "?").join(",");
  return trx.raw(
    `SELECT op_id, 'history' AS kept FROM response_history WHERE op_id IN (${marks})
     UNION ALL SELECT op_id, 'conflict' FROM sync_conflicts WHERE op_id IN (${marks})
     UNION ALL SELECT op_id, 'other' FROM sync_ops WHERE op_id IN (${marks})`,
    [...opIds, ...opIds, ...opIds],
  );
}

/**
 * The answers already given to the known operation ids (in a fresh batch, none), read only from
 * the table that holds each kind of answer.
 */
async function answersGiven(trx: Knex.Transaction, found: KnownOpId[]) {
  const answers = new Map<string, { userId: number; result: OpResult }>();
  if (!found.length) return answers;
  const keptIn = (kept: string) => found.filter((f) => f.kept === kept).map((f) => f.op_id);
  const [applied, conflicted, others] = await Promise.all([
    keptIn("history").length
      ? trx("response_history").whereIn("op_id", keptIn("history")).select("op_id", "user_id", "rev")
      : [],
    keptIn("conflict").length
      ? trx("sync_conflicts as k")
          // Who set the server's value, and when: its history row.
          .leftJoin("response_history as h", (j) =>
            j
              .on("h.checklist_id", "k.checklist_id")
              .on("h.item_key", "k.item_key")
              .on("h.rev", "k.server_rev"),
          )
          .leftJoin("users as u", "u.id", "h.user_id")
          .whereIn("k.op_id", keptIn("conflict"))
          .select("k.op_id", "k.user_id", "k.id", "k.server_rev", "k.server_value", "u.name", "h.at")
      : [],
    keptIn("other").length
      ? trx("sync_ops").whereIn("op_id", keptIn("other")).select("op_id", "user_id", "result")
      : [],
  ]);
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

/**
 * The change feed after `since` up to `upTo`, in order; with a limit, one row more than it, to
 * tell whether more follow.
 */
const feedQuery = (
  knex: Knex,
  scope: string[] | Knex.QueryBuilder,
  since: number,
  upTo: number,
  limit?: number,
) => {
  const q = knex("checklist_responses as r")
    .join("users as u", "u.id", "r.updated_by")
    .whereIn("r.checklist_id", scope)
    .where("r.change_seq", ">", since)
    .where("r.change_seq", "<=", upTo)
    .select("r.checklist_id", "r.item_key", "r.value", "r.rev", "r.updated_at", "r.change_seq", "u.name")
    .orderBy("r.change_seq");
  return limit === undefined ? q : q.limit(limit + 1);
};

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
  scope: string[] | Knex.QueryBuilder,
  upTo: number,
  limit: number,
): Promise<{ changes: Change[]; cursor: number; more: boolean }> {
  if (rows.length <= limit) return { changes: rows.map(toChange), cursor: upTo, more: false };
  const last = Number(rows[limit - 1]!.change_seq);
  const whole: FeedRow[] = await feedQuery(knex, scope, last - 1, last);
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
  scope: string[] | Knex.QueryBuilder,
  since: number,
  upTo: number,
  limit = MAX_CHANGES_PER_PULL,
): Promise<{ changes: Change[]; cursor: number; more: boolean }> {
  if (upTo <= since) return { changes: [], cursor: upTo, more: false };
  return pageOf(knex, await feedQuery(knex, scope, since, upTo, limit), scope, upTo, limit);
}

/**
 * Applies a batch and answers what changed since the cursor. The batch is one transaction: either
 * all of it is recorded (with each op's result) or nothing is. The rules per operation: a known
 * opId gets its first answer again; baseRev equal to the current revision is applied
 * (revision + 1); the same value as the server's is accepted without a conflict; anything else is
 * a conflict, kept with both values.
 *
 * Concurrency (decision 043): the batch first locks the rows of the checklists it touches, so
 * batches on other checklists run beside it, and takes the change-feed clock only once its
 * decisions are made, just before writing; the clock's row lock is held for the writes and the
 * commit alone. Change numbers therefore still follow commit order, and the pull — read after the
 * commit, when every smaller number is committed — never misses a late commit (decision 004).
 *
 * The batch is decided in memory over rows read with a few queries, then written with a few
 * multi-row statements, so a thousand operations cost a handful of round trips.
 */
export async function sync(actor: Actor & { name: string }, request: SyncRequest): Promise<SyncResponse> {
  const since = request.cursor && /^\d+$/.test(request.cursor) ? Number(request.cursor) : 0;
  // A pull needs no transaction of its own: every change numbered up to the clock it reads (or to
  // the batch's own number) is committed, so plain reads see each of them or a later change.
  if (!request.ops.length)
    return {
      results: [],
      ...(await pullPage(actor, since, await lastChangeNumber(db()), [], !(await onGaleraNode()))),
    };
  // A deadlock, a lost certification on a Galera cluster, or a concurrent copy of one of the
  // batch's opIds (a duplicate key) runs the whole batch again; a copy is then answered as a repeat.
  // On a Galera cluster statements go one at a time, each answered before the next (decision 044).
  const oneServer = !(await onGaleraNode());
  const { results, clock, wrote } = await withRetry(
    () => applierDb().transaction((trx) => applyBatch(trx, actor, request, oneServer)),
    { alsoRetry: [ER_DUP_ENTRY] },
  );
  // Read after the commit, the pull sees every change numbered up to the batch's own.
  return { results, ...(await pullPage(actor, since, clock, wrote, oneServer)) };
}

const ER_DUP_ENTRY = 1062;

/**
 * Whether the applier's server is a Galera node (`wsrep_on`), asked once per process. When it
 * cannot be told, the answer is yes: the commit is then sent on its own, which is right anywhere.
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

/**
 * The checklists' rows, locked in key order (the same order in every batch, so no deadlock), with
 * what deciding the batch needs of them.
 */
const lockQuery = (trx: Knex.Transaction, ids: string[]) =>
  trx("job_checklists")
    .whereIn("id", ids)
    .orderBy("id")
    .forUpdate()
    .select("id", "state", "template_version_id", "job_id");

type CurrentRow = {
  kind: "value" | "conflict";
  checklist_id: string;
  item_key: string;
  rev: number | string;
  value: string;
  updated_at: Date;
  name: string;
  conflict_id: number | string;
};

/**
 * Every current value of the batch's checklists, and the conflicts still waiting on them (a
 * row-constructor IN over a thousand pairs costs more than reading the few checklists whole).
 */
const currentStateQuery = (trx: Knex.Transaction, checklistIds: string[]) =>
  trx("checklist_responses as r")
    .join("users as u", "u.id", "r.updated_by")
    .whereIn("r.checklist_id", checklistIds)
    .select(
      trx.raw("'value' AS kind"),
      "r.checklist_id",
      "r.item_key",
      "r.rev",
      "r.value",
      "r.updated_at",
      "u.name",
      trx.raw("NULL AS conflict_id"),
    )
    .unionAll((q) =>
      q
        .from("sync_conflicts as k")
        .whereIn("k.checklist_id", checklistIds)
        .whereNull("k.resolved_at")
        .select(
          trx.raw("'conflict'"),
          "k.checklist_id",
          "k.item_key",
          trx.raw("NULL"),
          trx.raw("NULL"),
          trx.raw("NULL"),
          trx.raw("NULL"),
          "k.id",
        ),
    );

/**
 * Everything deciding a batch needs, in one round trip: its checklists' rows, locked first (so
 * every read after sees what batches before this one committed on them), the opIds already
 * answered, the jobs' crews, and the current values with the conflicts waiting on them.
 */
async function readBatch(trx: Knex.Transaction, checklistIds: string[], opIds: string[], together: boolean) {
  const some = checklistIds.length > 0;
  const queries = [
    ...(some ? [lockQuery(trx, checklistIds)] : []),
    ...(opIds.length ? [knownOpIdsQuery(trx, opIds)] : []),
    ...(some ? [crewQuery(trx, checklistIds), currentStateQuery(trx, checklistIds)] : []),
  ];
  const answers = await runStatements(trx, queries, { together });
  const locked = (some ? answers.shift() : []) as LockedChecklist[];
  const known = (opIds.length ? answers.shift() : []) as KnownOpId[];
  const [crew = [], rows = []] = answers as [CrewRow[]?, CurrentRow[]?];
  const [values, conflicts] = partition(rows, (r) => r.kind === "value");
  // Conflicts still waiting on the batch's checklists: an entry applied on the item decides them.
  const waiting = new Map<string, number[]>();
  for (const c of conflicts) {
    const key = itemId(c.checklist_id, c.item_key);
    waiting.set(key, [...(waiting.get(key) ?? []), Number(c.conflict_id)]);
  }
  return { locked, known, crew, values, waiting };
}

/**
 * Decides and writes a batch; answers each operation, the change number of its writes (or, with
 * nothing for the feed, the last number handed out) and the changes it wrote.
 */
async function applyBatch(
  trx: Knex.Transaction,
  actor: Actor & { name: string },
  request: SyncRequest,
  oneServer: boolean,
): Promise<{ results: OpResult[]; clock: number; wrote: Change[] }> {
  const results: OpResult[] = [];
  const wrote: Change[] = [];
  const now = new Date();
  const ops = request.ops.map(readOperation);
  const valid = ops.filter((o): o is Operation => !("status" in o));
  const checklistIds = [...new Set(valid.map((o) => o.checklistId))];
  const batch = await readBatch(
    trx,
    checklistIds,
    request.ops.map((o) => o.opId),
    oneServer,
  );
  const known = await answersGiven(trx, batch.known);
  const access = await loadAccess(trx, actor, batch.locked, batch.crew);
  const { values: currentRows, waiting } = batch;
  const existed = new Set(currentRows.map((r) => itemId(r.checklist_id, r.item_key)));
  const current = new Map<string, { rev: number; value: unknown; by: string; at: Date }>(
    currentRows.map((r) => [
      itemId(r.checklist_id, r.item_key),
      // A union's integer columns may arrive as strings (BIGINT): numbers here.
      { rev: Number(r.rev), value: parseJsonColumn(r.value), by: r.name, at: new Date(r.updated_at) },
    ]),
  );

  const responses = new Map<string, Omit<ChecklistResponseRow, "change_seq">>();
  const history: Omit<ResponseHistoryRow, "id">[] = [];
  const writtenOps = new Set<string>();
  const conflicts: {
    op: Operation;
    row: Omit<SyncConflictRow, "id" | "resolved_at" | "resolved_by" | "resolution_op_id"> &
      Partial<Pick<SyncConflictRow, "resolved_at">>;
    resultIndex: number;
  }[] = [];
  const resolutions: { op: Operation; ids: number[] }[] = [];
  const recorded: { op: Operation; resultIndex: number }[] = [];
  const submissions: { op: Operation; resultIndex: number }[] = [];

  const submittedHere = new Set<string>();
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
        responses.set(key, {
          checklist_id: op.checklistId,
          item_key: op.itemKey,
          value,
          rev: rev + 1,
          updated_by: actor.id,
          device_id: request.deviceId,
          updated_at: now,
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
  const opRow = ({ op, resultIndex }: { op: Operation; resultIndex: number }) => ({
    op_id: op.opId,
    device_id: request.deviceId,
    seq: op.seq,
    user_id: actor.id,
    checklist_id: op.checklistId,
    item_key: op.itemKey,
    status: results[resultIndex]!.status,
    result: JSON.stringify(results[resultIndex]),
    received_at: now,
  });
  for (const r of responses.values()) {
    wrote.push({
      checklistId: r.checklist_id,
      itemKey: r.item_key,
      value: JSON.parse(r.value),
      rev: r.rev,
      by: actor.name,
      at: now.toISOString(),
    });
  }
  // The clock is taken by the UPDATE below; LAST_INSERT_ID() is its new number on this connection
  // (the value table has no auto-increment column to change it).
  const [changed, added] = partition(
    [...responses.values()].map((r) => ({ ...r, change_seq: trx.raw("LAST_INSERT_ID()") })),
    (r) => existed.has(itemId(r.checklist_id, r.item_key)),
  );
  const takesClock = responses.size > 0 || submissions.length > 0;
  // The whole write in one round trip. Everything not in the change feed comes first; the clock,
  // last: its lock (every applier's) is held only for the feed's writes and the commit. A batch
  // with nothing for the feed (repeats, refusals, conflicts) does not take it. Conflict ids are
  // read back by opId: a Galera cluster hands out auto-increment ids in steps of the node count.
  const commitWithWrites = oneServer && !submissions.length;
  const writes = await runStatements(
    trx,
    [
      ...(conflicts.length
        ? [
            trx("sync_conflicts").insert(conflicts.map((c) => c.row)),
            trx("sync_conflicts")
              .whereIn(
                "op_id",
                conflicts.map((c) => c.op.opId),
              )
              .select("id", "op_id"),
          ]
        : []),
      // One statement each: a batch holds at most MAX_OPS_PER_REQUEST rows, well within a packet.
      ...(history.length ? [trx("response_history").insert(history)] : []),
      ...resolutions.map(({ op, ids }) =>
        trx("sync_conflicts")
          .whereIn("id", ids)
          .where({ checklist_id: op.checklistId, item_key: op.itemKey })
          .whereNull("resolved_at")
          .update({ resolved_at: now, resolved_by: actor.id, resolution_op_id: op.opId }),
      ),
      ...(recorded.length ? [trx("sync_ops").insert(recorded.map(opRow))] : []),
      ...(takesClock ? [takeClock(trx)] : []),
      // New items take a plain insert; only items that had a value go through the upsert.
      ...(added.length ? [trx("checklist_responses").insert(added)] : []),
      ...(changed.length
        ? [
            trx("checklist_responses")
              .insert(changed)
              .onConflict(["checklist_id", "item_key"])
              .merge(["value", "rev", "updated_by", "device_id", "updated_at", "change_seq"]),
          ]
        : []),
      takesClock ? trx.raw("SELECT LAST_INSERT_ID() AS seq") : clockQuery(trx),
      // With nothing left to do in the transaction, on one server the commit travels with the
      // writes: the server releases the clock as soon as they are done, not a round trip later, once
      // this busy process gets round to asking. (The transaction's own COMMIT then finds nothing to
      // do.)
      ...(commitWithWrites ? [trx.raw("COMMIT")] : []),
    ],
    { together: oneServer },
  );
  const clock = Number(
    (
      writes[writes.length - (commitWithWrites && !submissions.length ? 2 : 1)] as { seq: number | string }[]
    )[0]!.seq,
  );
  if (conflicts.length) {
    const ids = new Map((writes[1] as { id: number; op_id: string }[]).map((r) => [r.op_id, Number(r.id)]));
    for (const c of conflicts)
      results[c.resultIndex] = { ...results[c.resultIndex]!, conflictId: ids.get(c.op.opId)! };
  }
  const submitted: { op: Operation; resultIndex: number }[] = [];
  for (const { op, resultIndex } of submissions) {
    submitted.push({ op, resultIndex });
    if (submittedHere.has(op.checklistId)) {
      results[resultIndex] = reject(op, "locked", "The checklist is already waiting for review.");
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
    const refused = await submitChecklist(trx, actor, op.checklistId, request.deviceId);
    if (refused) {
      results[resultIndex] = reject(op, "incomplete", refused);
      continue;
    }
    submittedHere.add(op.checklistId);
    await trx("job_checklists").where({ id: op.checklistId }).update({ change_seq: clock });
    results[resultIndex] = { opId: op.opId, status: "applied", rev: 0 };
  }
  if (submitted.length) await trx("sync_ops").insert(submitted.map(opRow));
  return { results, clock, wrote };
}

/**
 * One page of what changed after `since` for this person: the feed up to `clock` (or, when the
 * batch wrote changes numbered `clock`, up to the number before, plus those changes as written).
 */
async function pullPage(
  actor: Actor,
  since: number,
  clock: number,
  wrote: Change[],
  together: boolean,
): Promise<Omit<SyncResponse, "results">> {
  // The visible checklists as a subquery: the feed is read by its change numbers after the
  // cursor (an index range), each row kept if its checklist is one of them. The feed and the
  // checklists' states go in one round trip (the applier's pool takes several statements).
  const knex = applierDb();
  const scope = () => visibleChecklists(knex, actor).select("c.id");
  const upTo = wrote.length ? clock - 1 : clock;
  const limit = MAX_CHANGES_PER_PULL;
  const [rows = [], stateRows = []] = (await runStatements(
    knex,
    [
      ...(upTo > since ? [feedQuery(knex, scope(), since, upTo, limit)] : []),
      // Submitted, returned, countersigned: a checklist's state reaches every tablet with the pull.
      ...(clock > since
        ? [
            knex("job_checklists as s")
              .whereIn("s.id", scope())
              .where("s.change_seq", ">", since)
              .where("s.change_seq", "<=", clock)
              .select("s.id", "s.state", "s.change_seq"),
          ]
        : []),
    ],
    { together },
  )) as [FeedRow[]?, { id: string; state: ChecklistStateColumn; change_seq: number | string }[]?];
  const page =
    upTo > since
      ? await pageOf(knex, rows, scope(), upTo, limit)
      : { changes: [], cursor: upTo, more: false };
  const changes = page.changes;
  const cursor = page.more ? page.cursor : clock;
  if (!page.more && since < clock) changes.push(...wrote);
  const states = stateRows.filter((c) => Number(c.change_seq) <= cursor);
  return {
    changes,
    checklists: states.map((c: { id: string; state: ChecklistStateColumn }) => ({
      id: c.id,
      state: c.state,
    })),
    cursor: String(cursor),
    ...(page.more ? { more: true as const } : {}),
  };
}
