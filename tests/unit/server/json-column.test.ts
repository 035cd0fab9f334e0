import { describe, expect, it } from "vitest";
import { parseJsonColumn } from "~/server/json-column.server";

describe("parseJsonColumn", () => {
  it("parses the text MariaDB returns for a JSON column", () => {
    expect(parseJsonColumn('{"mm":0.05,"ok":true}')).toEqual({ mm: 0.05, ok: true });
    expect(parseJsonColumn("[1,2]")).toEqual([1, 2]);
    // A JSON string value arrives quoted, and comes back as the string itself.
    expect(parseJsonColumn('"port side"')).toBe("port side");
    expect(parseJsonColumn("null")).toBeNull();
  });

  it("passes through a value a native JSON type has already parsed", () => {
    const parsed = { mm: 0.05 };
    expect(parseJsonColumn(parsed)).toBe(parsed);
    expect(parseJsonColumn(12.5)).toBe(12.5);
    expect(parseJsonColumn(null)).toBeNull();
  });

  it("refuses text that is not JSON rather than guessing", () => {
    expect(() => parseJsonColumn("{not json")).toThrow(SyntaxError);
  });
});
