import { openDB, type DBSchema, type IDBPDatabase } from "idb";
import type { ChecklistState } from "../checklist-sets.ts";
import type { ConflictRecord, OfflineBundle, ReviewComment } from "../sync/bundle.ts";
import type { Template } from "../templates/index.ts";

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
let dbName = "sternpost";
let opening: Promise<Store> | null = null;

/**
 * The device's database, opened once. If the browser closes the connection (WebKit does, under
 * memory pressure) the next call opens a new one instead of retrying on the dead handle.
 */
export function localDb(): Promise<Store> {
  opening ??= openDB<SternpostDB>(dbName, 1, {
    upgrade(db) {
      db.createObjectStore("templates", { keyPath: ["key", "version"] });
      db.createObjectStore("jobs", { keyPath: "id" });
      db.createObjectStore("checklists", { keyPath: "id" }).createIndex("byJob", "jobId");
      db.createObjectStore("responses", { keyPath: ["checklistId", "itemKey"] }).createIndex("byChecklist", "checklistId");
      db.createObjectStore("outbox", { keyPath: "opId" }).createIndex("bySeq", "seq");
      db.createObjectStore("conflicts", { keyPath: "id" }).createIndex("byChecklist", "checklistId");
      db.createObjectStore("rejections", { keyPath: "opId" });
      db.createObjectStore("meta");
    },
    terminated() {
      opening = null;
    },
  }).then((db) => {
    db.addEventListener("close", () => (opening = null));
    return db;
  });
  return opening;
}

/** For tests: forget the open connection (as after a crash), or switch to another device's database. */
export function forgetLocalDb(nextName = dbName) {
  opening = null;
  dbName = nextName;
}
