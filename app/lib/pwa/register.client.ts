import { registerSW } from "virtual:pwa-register";
import { PAGES_CACHE } from "../offline/pages.ts";

type Listener = (ready: boolean) => void;
let update: ((reload?: boolean) => Promise<void>) | undefined;
let needRefresh = false;
const listeners = new Set<Listener>();

/** Whether this page can keep checklists offline: a service worker needs a secure context. */
export type WorkerStatus = "pending" | "active" | "failed" | "unsupported";
let status: WorkerStatus = "pending";
const statusListeners = new Set<(s: WorkerStatus) => void>();
function setStatus(next: WorkerStatus) {
  status = next;
  for (const l of statusListeners) l(next);
}
export function onWorkerStatus(listener: (s: WorkerStatus) => void) {
  statusListeners.add(listener);
  listener(status);
  return () => statusListeners.delete(listener);
}

/**
 * Registers the service worker (workbox-window under the hood). A new version waits for the
 * person to choose to reload: never on its own, since entries may be waiting or a form half-filled.
 */
export function registerWorker() {
  if (!window.isSecureContext || !("serviceWorker" in navigator)) return setStatus("unsupported");
  if (update) return;
  update = registerSW({
    immediate: true,
    onNeedRefresh() {
      needRefresh = true;
      for (const l of listeners) l(true);
    },
    onRegisterError() {
      setStatus("failed");
    },
    async onRegisteredSW() {
      // The first page was loaded before the worker controlled it: keep its HTML explicitly.
      await navigator.serviceWorker.ready;
      setStatus("active");
      const cache = await caches.open(PAGES_CACHE);
      if (!(await cache.match(location.href))) await cache.add(location.href).catch(() => undefined);
    },
  });
}

export function onUpdateReady(listener: Listener) {
  listeners.add(listener);
  if (needRefresh) listener(true);
  return () => listeners.delete(listener);
}

export async function applyUpdate() {
  await update?.(true);
}
