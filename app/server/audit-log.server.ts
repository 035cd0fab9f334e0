import type { Role } from "~/lib/roles";
import type { AuditFilters } from "~/lib/validation/audit";
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
  /** The entry's detail as one readable line. */
  detail: string | null;
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
  let value = stored;
  if (typeof stored === "string") {
    try {
      value = JSON.parse(stored);
    } catch {
      return stored;
    }
  }
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
  return {
    entries: shown.map((row) => ({
      id: Number(row.id),
      at: new Date(row.at).toISOString(),
      who: row.user_id === null ? null : { id: row.user_id, name: row.user_name, role: row.user_role },
      deviceId: row.device_id,
      action: row.action,
      entity: row.entity,
      entityId: row.entity_id,
      href: pages[row.entity]?.(encodeURIComponent(row.entity_id)) ?? null,
      detail: detailLine(row.detail),
    })),
    olderThan: rows.length > pageSize ? Number(shown[shown.length - 1]!.id) : null,
  };
}
