import { localDb } from "./db.client.ts";
import { getMeta } from "./store.client.ts";
import { uploadPendingPhotos } from "./photos.client.ts";
import { syncOnce, type SyncResult } from "./sync.client.ts";

export interface SyncStatus {
  online: boolean;
  waiting: number;
  conflicts: number;
  refused: number;
  lastSyncAt: string | null;
  syncing: boolean;
  problem: string | null;
  /** During a long push: entries sent so far of those waiting when it began. */
  progress: { sent: number; total: number } | null;
}

let status: SyncStatus = {
  online: true,
  waiting: 0,
  conflicts: 0,
  refused: 0,
  lastSyncAt: null,
  syncing: false,
  problem: null,
  progress: null,
};
const listeners = new Set<() => void>();

export const syncStatus = {
  get: () => status,
  subscribe(listener: () => void) {
    listeners.add(listener);
    return () => listeners.delete(listener);
  },
};

function publish(next: Partial<SyncStatus>) {
  status = { ...status, ...next };
  for (const l of listeners) l();
}

/** Re-reads the counts shown in the status bar. */
export async function refreshStatus() {
  const db = await localDb();
  const [waiting, conflicts, refused, lastSyncAt] = await Promise.all([
    db.count("outbox"),
    db.count("conflicts"),
    db.count("rejections"),
    getMeta<string>("lastSyncAt"),
  ]);
  publish({ waiting, conflicts, refused, lastSyncAt: lastSyncAt ?? null, online: navigator.onLine });
}

let timer: ReturnType<typeof setTimeout> | undefined;
let failures = 0;
const afterSync = new Set<() => void>();

/** Called with each successful sync (the screens reload what they show). */
export function onSynced(listener: () => void) {
  afterSync.add(listener);
  return () => afterSync.delete(listener);
}

/** One sync, one tab at a time (Web Locks); failures retry with backoff up to a minute. */
export async function requestSync() {
  clearTimeout(timer);
  const run = async () => {
    publish({ syncing: true, progress: null });
    const result = await syncOnce(fetch, "", (progress) => publish({ progress })).catch((): SyncResult => ({
      ok: false,
      reason: "server",
      message: "Sync stopped on this tablet; your entries are kept and it will try again.",
    }));
    // Photos go after the entries that reference them.
    if (result.ok) await uploadPendingPhotos().catch(() => undefined);
    publish({ syncing: false, progress: null, problem: result.ok ? null : result.message });
    if (result.ok) {
      failures = 0;
      for (const l of afterSync) l();
    } else failures++;
    await refreshStatus();
    const backoff = Math.min(60_000, 2000 * 2 ** Math.min(failures, 5));
    const delay = result.ok ? 30_000 : Math.max(backoff, Math.min(result.retryAfterMs ?? 0, 300_000));
    timer = setTimeout(requestSync, delay);
  };
  if (navigator.locks)
    await navigator.locks.request("sternpost-sync", { ifAvailable: true }, async (lock) =>
      lock ? run() : undefined,
    );
  else await run();
}

let started = false;

/** Sync on start, on coming back online, when the tab becomes visible, and on a timer. */
export function startSyncing() {
  if (started) return;
  started = true;
  window.addEventListener("online", () => {
    publish({ online: true });
    void requestSync();
  });
  window.addEventListener("offline", () => publish({ online: false }));
  document.addEventListener("visibilitychange", () => {
    if (document.visibilityState === "visible") void requestSync();
  });
  void refreshStatus().then(requestSync);
}
