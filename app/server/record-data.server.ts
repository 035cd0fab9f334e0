import type { Knex } from "knex";
import type { RecordChecklist } from "~/lib/record/types";
import type { Template } from "~/lib/templates";
import { authorName } from "./author-name.server.ts";
import { db } from "./db.server.ts";
import { parseJsonColumn } from "./json-column.server.ts";
import { checklistPhotos } from "./photos.server.ts";
import type {
  ChecklistCommentRow,
  ChecklistResponseRow,
  JobChecklistRow,
  ResponseHistoryRow,
  TemplateVersionRow,
} from "./tables.server.ts";

type ChecklistHead = Pick<JobChecklistRow, "id" | "submitted_at" | "countersigned_at" | "digest"> &
  Pick<TemplateVersionRow, "template_key" | "version" | "body"> & {
    submitted_name: string | null;
    countersigned_name: string | null;
  };
type Authored<Row> = Row & { name: string };
type ResponseRow = Pick<ChecklistResponseRow, "item_key" | "value" | "rev" | "updated_at">;
type HistoryRow = Pick<ResponseHistoryRow, "item_key" | "value" | "rev" | "at">;
type CommentRow = Pick<ChecklistCommentRow, "item_key" | "text" | "at">;

const iso = (d: Date | string | null) => (d === null ? undefined : new Date(d).toISOString());

/**
 * A checklist as the record carries it, read from the tables. The same function runs at
 * countersigning (to store the digest) and at verification (to recompute it), so the two can
 * only differ when the stored rows did.
 */
export async function loadRecordChecklist(
  checklistId: string,
  knex: Knex = db(),
): Promise<RecordChecklist | undefined> {
  const row: ChecklistHead | undefined = await knex("job_checklists as c")
    .join("template_versions as t", "t.id", "c.template_version_id")
    .leftJoin("users as s", "s.id", "c.submitted_by")
    .leftJoin("users as k", "k.id", "c.countersigned_by")
    .where("c.id", checklistId)
    .first(
      "c.id",
      "c.submitted_at",
      "c.countersigned_at",
      "c.digest",
      "t.template_key",
      "t.version",
      "t.body",
      "s.name as submitted_name",
      "k.name as countersigned_name",
    );
  if (!row) return undefined;
  const [responses, history, comments]: [
    Authored<ResponseRow>[],
    Authored<HistoryRow>[],
    Authored<CommentRow>[],
  ] = await Promise.all([
    knex("checklist_responses as r")
      .where("r.checklist_id", checklistId)
      .select("r.item_key", "r.value", "r.rev", "r.updated_at", authorName(knex, "r.updated_by")),
    knex("response_history as h")
      .join("users as u", "u.id", "h.user_id")
      .where("h.checklist_id", checklistId)
      .orderBy(["h.item_key", "h.rev"])
      .select("h.item_key", "h.value", "h.rev", "h.at", "u.name"),
    knex("checklist_comments as m")
      .join("users as u", "u.id", "m.user_id")
      .where("m.checklist_id", checklistId)
      .orderBy("m.id")
      .select("m.item_key", "m.text", "m.at", "u.name"),
  ]);
  const photos = await checklistPhotos(checklistId, knex);
  const historyByItem: RecordChecklist["history"] = {};
  for (const h of history)
    (historyByItem[h.item_key] ??= []).push({
      rev: h.rev,
      value: parseJsonColumn(h.value),
      by: h.name,
      at: new Date(h.at).toISOString(),
    });
  return {
    id: row.id,
    templateKey: row.template_key,
    templateVersion: row.version,
    template: parseJsonColumn<Template>(row.body),
    responses: Object.fromEntries(
      responses.map((r) => [
        r.item_key,
        { value: parseJsonColumn(r.value), rev: r.rev, by: r.name, at: new Date(r.updated_at).toISOString() },
      ]),
    ),
    history: historyByItem,
    comments: comments.map((c) => ({
      itemKey: c.item_key,
      by: c.name,
      at: new Date(c.at).toISOString(),
      text: c.text,
    })),
    photos,
    submittedBy: row.submitted_name ?? undefined,
    submittedAt: iso(row.submitted_at),
    countersignedBy: row.countersigned_name ?? undefined,
    countersignedAt: iso(row.countersigned_at),
    digest: row.digest ?? "",
  };
}
