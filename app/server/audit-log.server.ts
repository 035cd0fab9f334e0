import type { Role } from "~/lib/roles";
import { entityInWords, type AuditFilters } from "~/lib/validation/audit";
import { entityNames, nameKey, roleInWords, type EntityNames } from "./audit-names.server.ts";
import { db } from "./db.server.ts";

export const AUDIT_PAGE_SIZE = 100;

export interface AuditLogEntry {
  id: number;
  /** ISO instant, shown in the reader's local time. */
  at: string;
  who: { id: number; name: string; role: Role } | null;
  deviceId: string | null;
  action: string;
  entity: string;
  entityId: string;
  /** The page of the thing acted on, where it has one. */
  href: string | null;
  /** What the entry is about, by name: "Tom Reyes", "Engine alignment, version 2 on Shag of Inishbofin". */
  what: string;
  /** The entry as a sentence: "Mara Quill deactivated Tom Reyes". */
  sentence: string;
  /** What the sentence does not say of the entry's detail, as one readable line. */
  detail: string | null;
  /** Views of one thing by one person on this page are one entry: how many, and the first one's time. */
  views?: { count: number; firstAt: string };
}

type Detail = Record<string, unknown>;

/**
 * Each action as the rest of a sentence after the person's name, and the detail keys the sentence
 * has said (the rest stay in the detail line). An action missing here reads from its label.
 */
const sentences: Record<
  string,
  { says: (what: string, d: Detail, names: EntityNames) => string; used: string[] }
> = {
  "user.invited": {
    says: (w, d) => `invited ${w}${d.role ? ` as ${roleInWords(d.role)}` : ""}`,
    used: ["role"],
  },
  "user.role": { says: (w, d) => `made ${w} ${roleInWords(d.role)}`, used: ["role", "intent", "userId"] },
  "user.deactivate": { says: (w) => `deactivated ${w}`, used: ["intent", "userId"] },
  "user.reactivate": { says: (w) => `reactivated ${w}`, used: ["intent", "userId"] },
  "user.reinvite": { says: (w) => `sent ${w} a new invitation`, used: ["intent", "userId"] },
  "vessel.created": { says: (w) => `registered the vessel ${w}`, used: [] },
  "vessel.updated": { says: (w) => `updated the vessel ${w}`, used: [] },
  "job.created": { says: (w) => `opened ${w}`, used: [] },
  "job.updated": { says: (w) => `updated ${w}`, used: [] },
  "checklist.started": { says: (w) => `started ${w}`, used: ["jobId", "key", "version"] },
  "checklist.submitted": { says: (w) => `submitted ${w} for review`, used: [] },
  "checklist.returned": {
    says: (w, d) =>
      `returned ${w} for fixes${typeof d.comments === "number" ? ` with ${d.comments} comment${d.comments === 1 ? "" : "s"}` : ""}`,
    used: ["comments"],
  },
  "checklist.countersigned": { says: (w) => `countersigned ${w}`, used: [] },
  "checklist.amended": {
    says: (w, d, names) =>
      `amended ${names.get(nameKey("checklist", String(d.amends))) ?? "a countersigned checklist"} as ${w}`,
    used: ["amends"],
  },
  "record.issued": { says: (w) => `issued ${w}`, used: [] },
  "record.viewed": { says: (w) => `viewed ${w}`, used: [] },
  "template.created": { says: (w) => `created the template ${w}`, used: ["key", "version"] },
  "template.draft-created": {
    says: (w, d) => `started the draft ${w}${d.from ? ` from version ${d.from}` : ""}`,
    used: ["key", "version", "from"],
  },
  "template.draft-saved": { says: (w) => `saved the draft ${w}`, used: ["key", "version"] },
  "template.draft-discarded": { says: (w) => `discarded the draft ${w}`, used: ["key", "version"] },
  "template.published": {
    says: (w, d) => `published ${w}${d.supersedes ? `, replacing version ${d.supersedes}` : ""}`,
    used: ["key", "version", "supersedes"],
  },
  "template.retired": { says: (w) => `retired ${w}`, used: ["key", "version"] },
  "template.imported": { says: (w) => `imported ${w}`, used: ["key", "version"] },
  "yard.updated": { says: () => "changed the yard's settings", used: [] },
};

function parsedDetail(stored: unknown): unknown {
  if (typeof stored !== "string") return stored;
  try {
    return JSON.parse(stored);
  } catch {
    return stored;
  }
}

const pages: Record<string, (id: string) => string> = {
  job: (id) => `/jobs/${id}`,
  checklist: (id) => `/checklists/${id}`,
  vessel: (id) => `/vessels/${id}`,
};

const escapeLike = (text: string) => text.replace(/[\\%_]/g, "\\$&");

const inWords = (key: string) =>
  key
    .replace(/([a-z0-9])([A-Z])/g, "$1 $2")
    .replace(/[_-]/g, " ")
    .toLowerCase();

function valueLine(value: unknown): string {
  if (value === null) return "none";
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (Array.isArray(value)) return value.map(valueLine).join(", ");
  if (typeof value === "object") return JSON.stringify(value);
  return String(value);
}

/** `{"jobId":3,"key":"cooling"}` reads as "job id: 3 · key: cooling". */
export function detailLine(stored: unknown): string | null {
  if (stored === null || stored === undefined) return null;
  const value = parsedDetail(stored);
  if (typeof value === "string") return value;
  if (value && typeof value === "object" && !Array.isArray(value)) {
    const entries = Object.entries(value);
    return entries.length ? entries.map(([k, v]) => `${inWords(k)}: ${valueLine(v)}`).join(" · ") : null;
  }
  return valueLine(value);
}

/** One page of the log, newest first; `olderThan` is the cursor of the next page when there is one. */
export async function listAuditEntries(
  filters: AuditFilters,
  pageSize = AUDIT_PAGE_SIZE,
): Promise<{ entries: AuditLogEntry[]; olderThan: number | null }> {
  const query = db()("audit_log")
    .leftJoin("users", "users.id", "audit_log.user_id")
    .select("audit_log.*", "users.name as user_name", "users.role as user_role")
    .orderBy("audit_log.id", "desc")
    .limit(pageSize + 1);
  if (filters.action?.endsWith("."))
    query.where("audit_log.action", "like", `${escapeLike(filters.action)}%`);
  else if (filters.action) query.where("audit_log.action", filters.action);
  if (filters.person) query.where("audit_log.user_id", filters.person);
  if (filters.entity) query.where("audit_log.entity", filters.entity);
  if (filters.entityId) query.where("audit_log.entity_id", filters.entityId);
  if (filters.device) query.where("audit_log.device_id", filters.device);
  if (filters.since) query.where("audit_log.at", ">=", filters.since);
  if (filters.until) query.where("audit_log.at", "<", filters.until);
  if (filters.before) query.where("audit_log.id", "<", filters.before);

  const rows = await query;
  const shown = rows.slice(0, pageSize);
  const amended = shown
    .filter((row) => row.action === "checklist.amended")
    .map((row) => ({
      entity: "checklist",
      entityId: String((parsedDetail(row.detail) as Detail)?.amends ?? ""),
    }));
  const names = await entityNames([
    ...shown.map((row) => ({ entity: row.entity, entityId: row.entity_id })),
    ...amended,
  ]);
  const entries = shown.map((row): AuditLogEntry => {
    const who = row.user_id === null ? null : { id: row.user_id, name: row.user_name, role: row.user_role };
    // The yard's settings are one row: its number means nothing to a reader.
    const what =
      names.get(nameKey(row.entity, row.entity_id)) ??
      (row.entity === "yard" ? entityInWords(row.entity) : `${entityInWords(row.entity)} ${row.entity_id}`);
    const detail = parsedDetail(row.detail);
    const plain = detail && typeof detail === "object" && !Array.isArray(detail) ? (detail as Detail) : {};
    const sentence = sentences[row.action];
    const rest = sentence
      ? Object.fromEntries(Object.entries(plain).filter(([key]) => !sentence.used.includes(key)))
      : detail;
    return {
      id: Number(row.id),
      at: new Date(row.at).toISOString(),
      who,
      deviceId: row.device_id,
      action: row.action,
      entity: row.entity,
      entityId: row.entity_id,
      href: pages[row.entity]?.(encodeURIComponent(row.entity_id)) ?? null,
      what,
      sentence: `${who?.name ?? "The system"} ${sentence ? sentence.says(what, plain, names) : `${row.action}: ${what}`}`,
      detail: detailLine(rest),
    };
  });
  return {
    entries: collapseViews(entries),
    olderThan: rows.length > pageSize ? Number(shown[shown.length - 1]!.id) : null,
  };
}

/**
 * Views of the same thing by the same person on one page are one entry, at the newest view, with
 * how many and since when: a surveyor opening a record ten times is one line, not ten.
 */
export function collapseViews(entries: AuditLogEntry[]): AuditLogEntry[] {
  const kept = new Map<string, AuditLogEntry>();
  const out: AuditLogEntry[] = [];
  for (const entry of entries) {
    if (!entry.action.endsWith(".viewed")) {
      out.push(entry);
      continue;
    }
    const key = `${entry.who?.id ?? "system"} ${entry.action} ${entry.entity} ${entry.entityId}`;
    const newest = kept.get(key);
    if (!newest) {
      kept.set(key, entry);
      out.push(entry);
      continue;
    }
    // Newest first: this one is older than every view of the group so far.
    newest.views = { count: (newest.views?.count ?? 1) + 1, firstAt: entry.at };
  }
  return out;
}
