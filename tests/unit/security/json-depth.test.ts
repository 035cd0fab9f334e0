import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { jsonDepthWatch } from "~/server/http/json-depth.server";

const bytes = (text: string) => new TextEncoder().encode(text);

/** The nesting depth of a parsed value, by its definition (arrays and objects add one level). */
const depthOf = (v: unknown): number =>
  v !== null && typeof v === "object" ? 1 + Math.max(0, ...Object.values(v).map(depthOf)) : 0;

describe("jsonDepthWatch", () => {
  it("lets through nesting up to the limit and stops one past it", () => {
    expect(jsonDepthWatch(3).push(bytes('{"a":[[1]]}'))).toBe(true);
    expect(jsonDepthWatch(3).push(bytes('{"a":[[[1]]]}'))).toBe(false);
  });

  it("ignores brackets inside strings, escaped quotes included", () => {
    expect(jsonDepthWatch(2).push(bytes('{"a":"[[[{{{\\"[[[","b":[1]}'))).toBe(true);
  });

  it("follows the nesting, and strings, across chunk boundaries", () => {
    const watch = jsonDepthWatch(4);
    // Levels: 2, then a string holding "[[[" split over two chunks, then 4, then the fifth.
    const results = ["[[", '"x[', '[[",', "[[", "[]]]]"].map((piece) => watch.push(bytes(piece)));
    expect(results).toEqual([true, true, true, true, false]);
  });

  it("agrees with the parsed depth of any JSON value", () => {
    fc.assert(
      fc.property(fc.jsonValue({ maxDepth: 8 }), fc.integer({ min: 0, max: 8 }), (value, max) => {
        const text = JSON.stringify(value);
        expect(jsonDepthWatch(max).push(bytes(text))).toBe(depthOf(value) <= max);
      }),
    );
  });
});
