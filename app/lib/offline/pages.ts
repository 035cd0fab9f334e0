/** The service worker's cache of page HTML (NetworkFirst; see vite.config.ts). */
export const PAGES_CACHE = "sternpost-pages";
