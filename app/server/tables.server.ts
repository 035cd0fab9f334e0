import type { NotificationKind } from "~/lib/notifications";
import type { Role } from "~/lib/roles";

/**
 * The rows of every table as mysql2 returns them from MariaDB (db/migrations), declared once so
 * that `db()("jobs")` is typed wherever it is queried. As read: DATETIME and TIMESTAMP are Dates,
 * DECIMAL is a string (exact), BIGINT a number (a string past 2^53), BOOLEAN a 0/1 number, and a
 * JSON column is its text (MariaDB stores JSON as LONGTEXT; read it with parseJsonColumn).
 */

/** A BIGINT as mysql2 returns it with supportBigNumbers: a number while safe, a string beyond. */
export type BigIntColumn = number | string;
/** A JSON column: text as stored (write JSON.stringify(value), read parseJsonColumn(text)). */
export type JsonColumn = string;

export interface UserRow {
  id: number;
  email: string;
  name: string;
  role: Role;
  password_hash: string | null;
  active: number | boolean;
  created_at: Date;
  updated_at: Date;
}

export interface InvitationRow {
  id: number;
  user_id: number;
  token_hash: string;
  expires_at: Date;
  used_at: Date | null;
  created_by: number | null;
  created_at: Date;
}

export interface SessionRow {
  id: string;
  user_id: number | null;
  data: string;
  expires_at: Date | null;
}

export interface AuditLogRow {
  id: BigIntColumn;
  at: Date;
  user_id: number | null;
  device_id: string | null;
  action: string;
  entity: string;
  entity_id: string;
  detail: JsonColumn | null;
}

export interface VesselRow {
  id: number;
  name: string;
  hin: string | null;
  length_value: string | number;
  length_unit: "ft" | "m";
  length_m: string | number;
  hull_type: "displacement" | "semi-displacement" | "planing" | "catamaran" | "other";
  owner_name: string;
  owner_email: string | null;
  owner_phone: string | null;
  waterline_notes: string | null;
  created_by: number | null;
  created_at: Date;
  updated_at: Date;
}

export interface JobRow {
  id: number;
  vessel_id: number;
  scope: "repower" | "new-installation" | "realignment" | "shaft-replacement";
  status: "planned" | "underway" | "completed";
  engine_model: string;
  engine_serial: string;
  rated_power_hp: string | number;
  rated_rpm_min: number;
  rated_rpm_max: number;
  gear_ratio: string | number;
  prop_diameter_in: string | number;
  prop_pitch_in: string | number;
  prop_blades: number;
  shaft_system: "inch" | "metric";
  shaft_diameter_in: string | number;
  /** A metric shaft's diameter as entered (migration 009). */
  shaft_diameter_mm: string | number | null;
  shaft_material: string;
  coupling_type: string;
  system_volts: 12 | 24;
  start_date: Date | string | null;
  due_date: Date | string | null;
  lead_id: number;
  created_by: number | null;
  created_at: Date;
  updated_at: Date;
}

export interface JobTechnicianRow {
  job_id: number;
  user_id: number;
}

export type TemplateStatus = "draft" | "published" | "retired";

export interface TemplateVersionRow {
  id: number;
  template_key: string;
  version: number;
  status: TemplateStatus;
  title: string;
  /** The template's JSON text exactly as the format defines it (docs/template-format.md). */
  body: string;
  body_sha256: string;
  published_at: Date | null;
  retired_at: Date | null;
  created_by: number | null;
  created_at: Date;
}

export type ChecklistStateColumn = "in-progress" | "submitted" | "returned" | "countersigned";

export interface JobChecklistRow {
  id: string;
  job_id: number;
  template_version_id: number;
  template_key: string;
  state: ChecklistStateColumn;
  started_by: number | null;
  submitted_by: number | null;
  submitted_at: Date | null;
  countersigned_by: number | null;
  countersigned_at: Date | null;
  digest: string | null;
  amends_id: string | null;
  /** The change-feed number of its last state change, so other tablets pull it (migration 007). */
  change_seq: BigIntColumn | null;
  created_at: Date;
  updated_at: Date;
  /** Its own id until countersigned, then NULL: what the seal's keys point at (migration 015). */
  open_id?: string | null;
}

/** The seal's column on a checklist's rows, set by a trigger whatever is sent (migration 015). */
interface SealedRow {
  open_ref?: string | null;
}

/** A view (migration 016): each item's current row of response_history. Read it; never write it. */
export interface ChecklistResponseRow extends SealedRow {
  checklist_id: string;
  item_key: string;
  value: JsonColumn;
  rev: number;
  updated_by: number;
  device_id: string | null;
  updated_at: Date;
  change_seq: BigIntColumn;
}

export interface ResponseHistoryRow extends SealedRow {
  id: BigIntColumn;
  checklist_id: string;
  item_key: string;
  rev: number;
  value: JsonColumn;
  user_id: number;
  device_id: string | null;
  op_id: string | null;
  at: Date;
  /** The device's clock exactly as the device sent it (migration 007): it decides nothing. */
  client_at: string | null;
  /** Position in the change feed while the row is its item's current value, else NULL (migration 016). */
  change_seq: BigIntColumn | null;
}

export interface SyncOpRow {
  op_id: string;
  device_id: string;
  seq: number;
  user_id: number;
  checklist_id: string;
  item_key: string;
  status: "applied" | "conflict" | "rejected";
  result: JsonColumn;
  received_at: Date;
}

export interface SyncConflictRow {
  id: number;
  checklist_id: string;
  item_key: string;
  op_id: string;
  base_rev: number;
  server_rev: number;
  server_value: JsonColumn | null;
  client_value: JsonColumn;
  user_id: number;
  device_id: string;
  /** The device's clock exactly as the device sent it (migration 007): it decides nothing. */
  client_at: string | null;
  received_at: Date;
  resolved_at: Date | null;
  resolved_by: number | null;
  resolution_op_id: string | null;
}

export interface SyncClockRow {
  id: number;
  seq: BigIntColumn;
}

export interface PhotoRow {
  id: string;
  checklist_id: string;
  item_key: string;
  sha256: string;
  bytes: number;
  content_type: string;
  uploaded_by: number;
  uploaded_at: Date;
  storage_key: string;
}

export interface ChecklistCommentRow extends SealedRow {
  id: number;
  checklist_id: string;
  item_key: string;
  /** A technician's answer names the lead's comment it answers. */
  reply_to: number | null;
  user_id: number;
  text: string;
  at: Date;
}

export interface RecordRow {
  id: string;
  job_id: number;
  /** The issued record's JSON text, as hashed into its digest. */
  content: string;
  digest: string;
  issued_by: number;
  issued_at: Date;
}

export interface RecordRecipientRow {
  record_id: string;
  user_id: number;
  email: string;
  sent_at: Date;
  first_viewed_at: Date | null;
}

export interface NotificationOptoutRow {
  user_id: number;
  kind: NotificationKind;
}

declare module "knex/types/tables" {
  interface Tables {
    users: UserRow;
    invitations: InvitationRow;
    sessions: SessionRow;
    audit_log: AuditLogRow;
    vessels: VesselRow;
    jobs: JobRow;
    job_technicians: JobTechnicianRow;
    template_versions: TemplateVersionRow;
    job_checklists: JobChecklistRow;
    checklist_responses: ChecklistResponseRow;
    response_history: ResponseHistoryRow;
    sync_ops: SyncOpRow;
    sync_conflicts: SyncConflictRow;
    sync_clock: SyncClockRow;
    photos: PhotoRow;
    checklist_comments: ChecklistCommentRow;
    records: RecordRow;
    record_recipients: RecordRecipientRow;
    notification_optouts: NotificationOptoutRow;
  }
}
