import type { Knex } from "knex";
import { db } from "./db.server.ts";

export interface AuditEntry {
  userId: number | null;
  deviceId?: string | null;
  action: string;
  entity: string;
  entityId: string | number;
  detail?: unknown;
}

/** Appends to the audit log, inside the caller's transaction when one is given. */
export async function audit(entry: AuditEntry, trx: Knex | Knex.Transaction = db()) {
  await trx("audit_log").insert({
    user_id: entry.userId,
    device_id: entry.deviceId ?? null,
    action: entry.action,
    entity: entry.entity,
    entity_id: String(entry.entityId),
    detail: entry.detail === undefined ? null : JSON.stringify(entry.detail),
  });
}
