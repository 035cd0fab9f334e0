/** Deeper JSON than this is refused before any parser sees it (real requests nest < 10 levels). */
export const MAX_JSON_DEPTH = 64;

const OPEN = new Set([0x5b, 0x7b]); // [ {
const CLOSE = new Set([0x5d, 0x7d]); // ] }
const QUOTE = 0x22;
const BACKSLASH = 0x5c;

/**
 * Follows the nesting of a JSON text chunk by chunk, without parsing it: `push` answers false as
 * soon as the nesting passes `max`. Recursive parsers and validators (zod's z.json among them)
 * overflow the stack on a few thousand levels, which would be a 500.
 */
export function jsonDepthWatch(max = MAX_JSON_DEPTH) {
  let depth = 0;
  let inString = false;
  let escaped = false;
  return {
    push(chunk: Uint8Array): boolean {
      for (const byte of chunk) {
        if (inString) {
          if (escaped) escaped = false;
          else if (byte === BACKSLASH) escaped = true;
          else if (byte === QUOTE) inString = false;
        } else if (byte === QUOTE) inString = true;
        else if (OPEN.has(byte)) {
          if (++depth > max) return false;
        } else if (CLOSE.has(byte)) depth--;
      }
      return true;
    },
  };
}
