/** What a sync request may carry and what MariaDB can store (protocol.ts re-exports these). */

/** The most operations one request may carry; a bigger batch is answered 413. */
export const MAX_OPS_PER_REQUEST = 1000;
/** The largest request body the route reads, in bytes (413 beyond it). */
export const MAX_SYNC_BODY_BYTES = 4 * 1024 * 1024;
/** About how many changes one pull answers (a page ends between change numbers); `more` asks for the next. */
export const MAX_CHANGES_PER_PULL = 500;
/** The largest number the unsigned INT columns (seq, revisions, conflict ids) hold. */
export const MAX_UINT32 = 4_294_967_295;
/** How deep a value may nest; the deepest item kind (readings: attempts → cells → row) needs 5. */
export const MAX_VALUE_DEPTH = 16;

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** A string MariaDB's utf8mb4 columns and JSON check accept: no lone UTF-16 surrogate. */
export const isWellFormed = (s: string) => !LONE_SURROGATE.test(s);

/**
 * Why a value could not be stored as JSON in MariaDB, or null if it can. Walks the value without
 * recursion, so a value nested thousands of levels deep is refused instead of overflowing the stack.
 */
export function unstorableJson(value: unknown): string | null {
  const stack: { v: unknown; depth: number }[] = [{ v: value, depth: 0 }];
  while (stack.length) {
    const { v, depth } = stack.pop()!;
    if (v === null || typeof v === "boolean") continue;
    if (typeof v === "number") {
      if (!Number.isFinite(v)) return "holds a number JSON cannot carry";
      continue;
    }
    if (typeof v === "string") {
      if (!isWellFormed(v)) return "holds text cut in the middle of a character (a lone UTF-16 surrogate)";
      continue;
    }
    if (typeof v !== "object") return "is not a JSON value";
    if (depth >= MAX_VALUE_DEPTH) return `is nested more than ${MAX_VALUE_DEPTH} levels deep`;
    if (Array.isArray(v)) {
      for (const x of v) stack.push({ v: x, depth: depth + 1 });
      continue;
    }
    if (Object.getPrototypeOf(v) !== Object.prototype && Object.getPrototypeOf(v) !== null)
      return "is not a JSON value";
    for (const [k, x] of Object.entries(v)) {
      if (!isWellFormed(k)) return "has a key cut in the middle of a character (a lone UTF-16 surrogate)";
      stack.push({ v: x, depth: depth + 1 });
    }
  }
  return null;
}
