import { canFillJob, type Actor } from "~/lib/permissions";
import type { ConflictRecord, OfflineBundle } from "~/lib/sync/bundle";
import { changesPage } from "./sync.server.ts";
import { db } from "./db.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import type { Template } from "~/lib/templates";
import { listVisibleJobs } from "./jobs.server.ts";
import type { ChecklistStateColumn, SyncConflictRow } from "./tables.server.ts";
import type { User } from "./users.server.ts";

/** The review comments on the given checklists and the answers to them, oldest first. */
export async function commentsOn(checklistIds: string[], knex = db()) {
  const rows = await knex("checklist_comments as m")
    .join("users as u", "u.id", "m.user_id")
    .whereIn("m.checklist_id", checklistIds)
    .orderBy("m.id")
    .select("m.id", "m.reply_to", "m.checklist_id", "m.item_key", "m.text", "m.at", "u.name");
  return (
    rows as {
      id: number;
      reply_to: number | null;
      checklist_id: string;
      item_key: string;
      text: string;
      at: Date;
      name: string;
    }[]
  ).map((r) => ({
    id: r.id,
    replyTo: r.reply_to,
    checklistId: r.checklist_id,
    itemKey: r.item_key,
    by: r.name,
    at: new Date(r.at).toISOString(),
    text: r.text,
  }));
}

/** Open conflicts on the given checklists, for the person who decides them. */
export async function openConflicts(checklistIds: string[]): Promise<ConflictRecord[]> {
  if (!checklistIds.length) return [];
  const rows = await db()("sync_conflicts as k")
    .join("users as u", "u.id", "k.user_id")
    .leftJoin("response_history as h", (j) =>
      j.on("h.checklist_id", "k.checklist_id").on("h.item_key", "k.item_key").on("h.rev", "k.server_rev"),
    )
    .leftJoin("users as su", "su.id", "h.user_id")
    .whereIn("k.checklist_id", checklistIds)
    .whereNull("k.resolved_at")
    .orderBy("k.id")
    .select("k.*", "u.name", "su.name as server_by", "h.at as server_at");
  type Row = SyncConflictRow & { name: string; server_by: string | null; server_at: Date | null };
  return (rows as Row[]).map((r) => ({
    id: r.id,
    checklistId: r.checklist_id,
    itemKey: r.item_key,
    serverValue: parseJsonColumn(r.server_value),
    serverRev: r.server_rev,
    clientValue: parseJsonColumn(r.client_value),
    ...(r.server_by ? { serverBy: r.server_by, serverAt: new Date(r.server_at!).toISOString() } : {}),
    by: r.name,
    at: new Date(r.received_at).toISOString(),
    deviceId: r.device_id,
  }));
}

/**
 * The person's jobs, their checklists, the template versions those use, every response and the
 * cursor they correspond to — read in one transaction so the cursor matches the responses.
 */
export async function offlineBundle(user: User): Promise<OfflineBundle> {
  const jobs = await listVisibleJobs(user as Actor);
  const jobIds = jobs.map((j) => j.id);
  return db().transaction(async (trx) => {
    const cursor = String((await trx("sync_clock").where({ id: 1 }).first())!.seq);
    const checklistRows: {
      id: string;
      job_id: number;
      state: ChecklistStateColumn;
      template_key: string;
      title: string;
      version: number;
      body: string;
    }[] = jobIds.length
      ? await trx("job_checklists as c")
          .join("template_versions as t", "t.id", "c.template_version_id")
          .whereIn("c.job_id", jobIds)
          .select("c.id", "c.job_id", "c.state", "t.template_key", "t.title", "t.version", "t.body")
      : [];
    const ids = checklistRows.map((c) => c.id);
    // Bounded like a pull: the first page of responses, and the cursor to pull the rest from.
    const page = ids.length
      ? await changesPage(trx, ids, 0, Number(cursor))
      : { changes: [], cursor: Number(cursor), more: false };
    const comments = ids.length ? await commentsOn(ids, trx) : [];
    const templates = new Map<string, OfflineBundle["templates"][number]>();
    for (const c of checklistRows)
      templates.set(`${c.template_key}@${c.version}`, {
        key: c.template_key,
        version: c.version,
        template: parseJsonColumn<Template>(c.body),
      });
    return {
      user: { id: user.id, name: user.name, email: user.email, role: user.role },
      jobs: jobs.map((j) => ({
        id: j.id,
        vesselName: j.vesselName,
        hin: j.hin,
        engineModel: j.engineModel,
        status: j.status,
        dueDate: j.dueDate,
        leadName: j.leadName,
      })),
      checklists: checklistRows.map((c) => {
        const job = jobs.find((j) => j.id === c.job_id)!;
        return {
          id: c.id,
          jobId: c.job_id,
          key: c.template_key,
          title: c.title,
          version: c.version,
          state: c.state,
          canFill: canFillJob(user, job),
          comments: comments.filter((m) => m.checklistId === c.id).map(({ checklistId: _, ...m }) => m),
        };
      }),
      templates: [...templates.values()],
      responses: page.changes,
      conflicts: await openConflicts(ids),
      cursor: String(page.cursor),
      ...(page.more ? { more: true as const } : {}),
    };
  });
}
