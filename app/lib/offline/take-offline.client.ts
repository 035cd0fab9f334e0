import type { OfflineBundle } from "../sync/bundle.ts";
import { PAGES_CACHE } from "./pages.ts";
import { saveBundle } from "./store.client.ts";
import { syncOnce } from "./sync.client.ts";

/** The pages a technician needs with no connection, besides each checklist's own page. */
const STATIC_PAGES = ["/", "/sync", "/calculators"];

/**
 * Makes the person's jobs available offline: stores jobs, checklists, templates and responses in
 * IndexedDB, keeps the HTML of the pages that open them, and asks the browser to keep the data.
 */
export async function takeOffline(
  calculatorPages: string[] = [],
): Promise<{ checklists: number; pages: number }> {
  const response = await fetch("/api/offline", { credentials: "same-origin", cache: "no-store" });
  if (!response.ok)
    throw new Error(
      response.status === 401 ? "Sign in again first." : `The server answered ${response.status}.`,
    );
  const bundle = (await response.json()) as OfflineBundle;
  await saveBundle(bundle);
  if (bundle.more) await syncOnce(); // the rest of the responses, page by page
  await navigator.storage?.persist?.().catch(() => false);
  const pages = [...STATIC_PAGES, ...calculatorPages, ...bundle.checklists.map((c) => `/checklists/${c.id}`)];
  if ("caches" in window) {
    const cache = await caches.open(PAGES_CACHE);
    await Promise.all(pages.map((url) => cache.add(url).catch(() => undefined)));
  }
  localStorage.setItem("sternpost:offline-ready", new Date().toISOString());
  return { checklists: bundle.checklists.length, pages: pages.length };
}
