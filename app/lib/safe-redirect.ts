const BASE = "http://sternpost.invalid";

/**
 * Only a path on this site survives; anything else becomes "/". Browsers read "\" as "/" and drop
 * tabs and newlines inside URLs, so "/\evil.example" and "/\t/evil.example" would leave the site.
 */
export function safeRedirect(to: unknown, fallback = "/"): string {
  if (typeof to !== "string" || !to.startsWith("/") || to.startsWith("//")) return fallback;
  // eslint-disable-next-line no-control-regex
  if (/[\\\u0000-\u001f\u007f\s]/.test(to)) return fallback;
  const url = new URL(to, BASE);
  return url.origin === BASE ? url.pathname + url.search + url.hash : fallback;
}
