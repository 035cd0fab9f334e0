import type { ChecklistState } from "../checklist-sets.ts";
import type { Template } from "../templates/index.ts";
import type { Role } from "../roles.ts";

/** Everything a device keeps to work a person's jobs with no connection. */
export interface OfflineBundle {
  user: { id: number; name: string; email: string; role: Role };
  jobs: {
    id: number;
    vesselName: string;
    hin: string | null;
    engineModel: string;
    status: string;
    dueDate: string | null;
    leadName: string;
  }[];
  checklists: {
    id: string;
    jobId: number;
    key: string;
    title: string;
    version: number;
    state: ChecklistState;
    canFill: boolean;
    comments: ReviewComment[];
  }[];
  templates: { key: string; version: number; template: Template }[];
  responses: { checklistId: string; itemKey: string; value: unknown; rev: number; by: string; at: string }[];
  conflicts: ConflictRecord[];
  cursor: string;
  /** Only the first page of responses came: the tablet pulls the rest from the cursor. */
  more?: true;
}

/** A lead's remark on an item, shown to the technician at the item. */
export interface ReviewComment {
  id: number;
  /** A technician's answer names the lead's comment it answers; a lead's comment has none. */
  replyTo: number | null;
  itemKey: string;
  by: string;
  at: string;
  text: string;
}

/** A value kept aside because it arrived based on an older revision and differed. */
export interface ConflictRecord {
  id: number;
  checklistId: string;
  itemKey: string;
  serverValue: unknown;
  serverRev: number;
  clientValue: unknown;
  /** Who set the server's value, and when (absent when the item had none). */
  serverBy?: string;
  serverAt?: string;
  by: string;
  at: string;
  deviceId: string;
}
