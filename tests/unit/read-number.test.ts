import { describe, expect, it } from "vitest";
import { readDecimal, readNumber } from "~/lib/read-number";

describe("reading a typed number", () => {
  it("takes a point or a comma as the decimal separator, and a sign", () => {
    expect(readNumber("0.002")).toBe(0.002);
    expect(readNumber("1,25")).toBe(1.25);
    expect(readNumber(" -0,5 ")).toBe(-0.5);
    expect(readNumber(".75")).toBe(0.75);
  });
  it("refuses exponents, thousands separators and words, and tells empty from wrong", () => {
    expect(readDecimal("")).toBeNull();
    expect(readDecimal("1e3")).toBe("invalid");
    expect(readDecimal("1,250.5")).toBe("invalid");
    expect(readDecimal("two")).toBe("invalid");
    expect(readNumber("1e3")).toBeNull();
  });
});
