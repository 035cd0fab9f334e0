import type { DBSchema, IDBPDatabase } from "idb";
import type { ChecklistState } from "../checklist-sets.ts";
import type { ConflictRecord, OfflineBundle, ReviewComment } from "../sync/bundle.ts";
import type { RefusalCode } from "../sync/protocol.ts";
import type { Template } from "../templates/index.ts";
import { reopeningDatabase } from "./reopening-db.client.ts";

/** A response as the device knows it: what is shown, and the server's value and revision under it. */
export interface LocalResponse {
  checklistId: string;
  itemKey: string;
  value: unknown;
  serverValue: unknown;
  rev: number;
  by: string;
  at: string;
  /** Entered here and not yet confirmed by the server. */
  pending: boolean;
}

export interface OutboxEntry {
  opId: string;
  deviceId: string;
  seq: number;
  checklistId: string;
  itemKey: string;
  value: unknown;
  baseRev: number;
  at: string;
  resolves?: number[];
}

export interface Rejection {
  opId: string;
  checklistId: string;
  itemKey: string;
  value: unknown;
  reason: string;
  /** The server's machine-readable refusal code (see REFUSAL_CODES in the sync protocol). */
  code?: RefusalCode;
  at: string;
}

export interface LocalChecklist {
  id: string;
  jobId: number;
  key: string;
  title: string;
  version: number;
  state: ChecklistState;
  canFill: boolean;
  comments: ReviewComment[];
}

interface SternpostDB extends DBSchema {
  templates: { key: [string, number]; value: { key: string; version: number; template: Template } };
  jobs: { key: number; value: OfflineBundle["jobs"][number] };
  checklists: { key: string; value: LocalChecklist; indexes: { byJob: number } };
  responses: { key: [string, string]; value: LocalResponse; indexes: { byChecklist: string } };
  outbox: { key: string; value: OutboxEntry; indexes: { bySeq: number } };
  conflicts: { key: number; value: ConflictRecord; indexes: { byChecklist: string } };
  rejections: { key: string; value: Rejection };
  meta: { key: string; value: unknown };
}

export type Store = IDBPDatabase<SternpostDB>;
const database = reopeningDatabase<SternpostDB>("sternpost", 1, (db) => {
  db.createObjectStore("templates", { keyPath: ["key", "version"] });
  db.createObjectStore("jobs", { keyPath: "id" });
  db.createObjectStore("checklists", { keyPath: "id" }).createIndex("byJob", "jobId");
  db.createObjectStore("responses", { keyPath: ["checklistId", "itemKey"] }).createIndex(
    "byChecklist",
    "checklistId",
  );
  db.createObjectStore("outbox", { keyPath: "opId" }).createIndex("bySeq", "seq");
  db.createObjectStore("conflicts", { keyPath: "id" }).createIndex("byChecklist", "checklistId");
  db.createObjectStore("rejections", { keyPath: "opId" });
  db.createObjectStore("meta");
});

/** The device's database (reopened if the browser closed the connection). */
export const localDb = (): Promise<Store> => database.open();

/** For tests: forget the open connection (as after a crash), or switch to another device's database. */
export const forgetLocalDb = (nextName?: string) => database.forget(nextName);
