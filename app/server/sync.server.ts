import type { Knex } from "knex";
import { canFillJob, canViewJob, type Actor } from "~/lib/permissions";
import { sameJson, type Change, type Operation, type OpResult, type SyncRequest, type SyncResponse } from "~/lib/sync/protocol";
import { findItem, valueSchemaFor, type Template } from "~/lib/templates";
import { db } from "./db.server.ts";

interface ChecklistAccess {
  id: string;
  state: string;
  template: Template;
  canView: boolean;
  canFill: boolean;
}

/** The checklists of the jobs this person may see (the scope of what they pull). */
function visibleChecklists(knex: Knex, actor: Actor) {
  const q = knex("job_checklists as c").join("jobs as j", "j.id", "c.job_id");
  if (actor.role === "manager") return q;
  if (actor.role === "lead") return q.where("j.lead_id", actor.id);
  if (actor.role === "technician") return q.whereIn("j.id", knex("job_technicians").where({ user_id: actor.id }).select("job_id"));
  return q.whereRaw("1 = 0");
}

async function loadAccess(trx: Knex.Transaction, actor: Actor, checklistId: string): Promise<ChecklistAccess | null> {
  const row = await trx("job_checklists as c")
    .join("template_versions as t", "t.id", "c.template_version_id")
    .join("jobs as j", "j.id", "c.job_id")
    .where("c.id", checklistId)
    .first("c.id", "c.state", "t.body", "j.id as job_id", "j.lead_id");
  if (!row) return null;
  const technicianIds: number[] = await trx("job_technicians").where({ job_id: row.job_id }).pluck("user_id");
  const job = { leadId: row.lead_id, technicianIds };
  return { id: row.id, state: row.state, template: JSON.parse(row.body), canView: canViewJob(actor, job), canFill: canFillJob(actor, job) };
}

const json = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v);
const reject = (op: Operation, reason: string): OpResult => ({ opId: op.opId, status: "rejected", reason });

async function applyOne(trx: Knex.Transaction, actor: Actor, deviceId: string, op: Operation, changeSeq: number, access: ChecklistAccess | null): Promise<OpResult> {
  if (!access || !access.canView) return reject(op, "This checklist is not on one of your jobs.");
  if (!access.canFill) return reject(op, "Only the job's technicians and its lead record entries.");
  if (access.state === "submitted") return reject(op, "The checklist has been submitted for review and takes no more entries.");
  if (access.state === "countersigned") return reject(op, "The checklist is countersigned and locked; a correction is an amendment.");
  const item = findItem(access.template, op.itemKey);
  if (!item) return reject(op, `The checklist has no item "${op.itemKey}".`);
  const parsed = valueSchemaFor(item).safeParse(op.value);
  if (!parsed.success) {
    const first = parsed.error.issues[0]!;
    return reject(op, `The entry for "${item.label}" is not valid: ${[...first.path].join(".") || "value"} ${first.message}.`);
  }

  const current = await trx("checklist_responses").where({ checklist_id: op.checklistId, item_key: op.itemKey }).forUpdate().first();
  const currentRev: number = current?.rev ?? 0;
  const currentValue = current ? json(current.value) : undefined;
  const now = new Date();

  if (op.baseRev === currentRev || (current && sameJson(currentValue, op.value))) {
    const unchanged = op.baseRev !== currentRev; // the same value as the server's: nothing to write
    const rev = unchanged ? currentRev : currentRev + 1;
    if (op.resolves?.length) {
      await trx("sync_conflicts")
        .whereIn("id", op.resolves)
        .where({ checklist_id: op.checklistId, item_key: op.itemKey })
        .whereNull("resolved_at")
        .update({ resolved_at: now, resolved_by: actor.id, resolution_op_id: op.opId });
    }
    if (unchanged) return { opId: op.opId, status: "applied", rev };
    const value = JSON.stringify(op.value);
    const row = { value, rev, updated_by: actor.id, device_id: deviceId, updated_at: now, change_seq: changeSeq };
    if (current) await trx("checklist_responses").where({ checklist_id: op.checklistId, item_key: op.itemKey }).update(row);
    else await trx("checklist_responses").insert({ checklist_id: op.checklistId, item_key: op.itemKey, ...row });
    await trx("response_history").insert({
      checklist_id: op.checklistId, item_key: op.itemKey, rev, value, user_id: actor.id, device_id: deviceId, op_id: op.opId, at: now, client_at: new Date(op.at),
    });
    return { opId: op.opId, status: "applied", rev };
  }

  // Based on an older revision and different: the server keeps its value, the sent one is kept too.
  const [conflictId] = await trx("sync_conflicts").insert({
    checklist_id: op.checklistId, item_key: op.itemKey, op_id: op.opId, base_rev: op.baseRev, server_rev: currentRev,
    server_value: current ? current.value : null, client_value: JSON.stringify(op.value), user_id: actor.id, device_id: deviceId,
    client_at: new Date(op.at), received_at: now,
  });
  return { opId: op.opId, status: "conflict", rev: currentRev, serverValue: currentValue ?? null, conflictId };
}

/**
 * Applies a batch and answers what changed since the cursor, in one transaction: either the
 * whole batch is recorded (with each op's result) or nothing is. Applying batches take the
 * sync clock's row lock first, so change numbers are handed out in commit order.
 */
export async function sync(actor: Actor, request: SyncRequest): Promise<SyncResponse> {
  return db().transaction(async (trx) => {
    let clock: number;
    const results: OpResult[] = [];
    if (request.ops.length) {
      const { seq } = await trx("sync_clock").where({ id: 1 }).forUpdate().first();
      clock = Number(seq) + 1;
      await trx("sync_clock").where({ id: 1 }).update({ seq: clock });
      const known = new Map<string, any>(
        (await trx("sync_ops").whereIn("op_id", request.ops.map((o) => o.opId))).map((r: any) => [r.op_id, r]),
      );
      const accessCache = new Map<string, ChecklistAccess | null>();
      for (const op of request.ops) {
        const seen = known.get(op.opId);
        if (seen) {
          // A retry: the first answer, unchanged (another person's opId is simply refused).
          results.push(seen.user_id === actor.id ? json(seen.result) : reject(op, "This operation id was used by someone else."));
          continue;
        }
        if (!accessCache.has(op.checklistId)) accessCache.set(op.checklistId, await loadAccess(trx, actor, op.checklistId));
        const result = await applyOne(trx, actor, request.deviceId, op, clock, accessCache.get(op.checklistId) ?? null);
        results.push(result);
        known.set(op.opId, { user_id: actor.id, result: JSON.stringify(result) });
        await trx("sync_ops").insert({
          op_id: op.opId, device_id: request.deviceId, seq: op.seq, user_id: actor.id, checklist_id: op.checklistId,
          item_key: op.itemKey, status: result.status, result: JSON.stringify(result), received_at: new Date(),
        });
      }
    } else {
      clock = Number((await trx("sync_clock").where({ id: 1 }).first()).seq);
    }
    const since = request.cursor && /^\d+$/.test(request.cursor) ? Number(request.cursor) : 0;
    const rows = await trx("checklist_responses as r")
      .join("users as u", "u.id", "r.updated_by")
      .whereIn("r.checklist_id", visibleChecklists(trx, actor).select("c.id"))
      .where("r.change_seq", ">", since)
      .where("r.change_seq", "<=", clock)
      .orderBy("r.change_seq")
      .select("r.checklist_id", "r.item_key", "r.value", "r.rev", "r.updated_at", "u.name");
    const changes: Change[] = rows.map((r: any) => ({
      checklistId: r.checklist_id, itemKey: r.item_key, value: json(r.value), rev: r.rev, by: r.name, at: new Date(r.updated_at).toISOString(),
    }));
    return { results, changes, cursor: String(clock) };
  });
}
