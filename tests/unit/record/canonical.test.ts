import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { canonicalJson } from "~/lib/record/canonical";

/** The IEEE 754 double with these 64 bits, as RFC 8785 Appendix B lists its inputs. */
function double(bits: bigint): number {
  const view = new DataView(new ArrayBuffer(8));
  view.setBigUint64(0, bits);
  return view.getFloat64(0);
}

describe("canonical JSON follows RFC 8785 (JSON Canonicalization Scheme, June 2020)", () => {
  test("the worked example of section 3.2.2: whitespace, number forms and string escapes", () => {
    // Input and output as printed in RFC 8785 section 3.2.2 ("Sample data" / "canonical form").
    const input = String.raw`{
      "numbers": [333333333.33333329, 1E30, 4.50, 2e-3, 0.000000000000000000000000001],
      "string": "\u20ac$\u000F\u000aA'\u0042\u0022\u005c\\\"\/",
      "literals": [null, true, false]
    }`;
    const expected = String.raw`{"literals":[null,true,false],"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27],"string":"€$\u000f\nA'B\"\\\\\"/"}`;
    expect(canonicalJson(JSON.parse(input))).toBe(expected);
  });

  test("the sorting example of section 3.2.3: keys by UTF-16 code units, not by code points or bytes", () => {
    // RFC 8785 section 3.2.3: the emoji (a surrogate pair, 0xD83D first) sorts before U+FB33.
    const input = {
      "\u20ac": "Euro Sign",
      "\r": "Carriage Return",
      "\ufb33": "Hebrew Letter Dalet With Dagesh",
      "1": "One",
      "\ud83d\ude02": "Emoji: Face with Tears of Joy",
      "\u0080": "Control",
      "\u00f6": "Latin Small Letter O With Diaeresis",
    };
    // The escapes below are JavaScript's: U+0080 and the rest are written as characters, "\r" as \r.
    expect(canonicalJson(input)).toBe(
      '{"\\r":"Carriage Return","1":"One","\u0080":"Control","\u00f6":"Latin Small Letter O With Diaeresis",' +
        '"\u20ac":"Euro Sign","\ud83d\ude02":"Emoji: Face with Tears of Joy","\ufb33":"Hebrew Letter Dalet With Dagesh"}',
    );
  });

  // RFC 8785 Appendix B, "Number Serialization Samples": IEEE 754 bit patterns and their JSON.
  const appendixB: [bigint, string][] = [
    [0x0000000000000000n, "0"],
    [0x8000000000000000n, "0"], // minus zero
    [0x0000000000000001n, "5e-324"],
    [0x8000000000000001n, "-5e-324"],
    [0x7fefffffffffffffn, "1.7976931348623157e+308"],
    [0xffefffffffffffffn, "-1.7976931348623157e+308"],
    [0x4340000000000000n, "9007199254740992"],
    [0xc340000000000000n, "-9007199254740992"],
    [0x4430000000000000n, "295147905179352830000"],
    [0x44b52d02c7e14af5n, "9.999999999999997e+22"],
    [0x44b52d02c7e14af6n, "1e+23"],
    [0x44b52d02c7e14af7n, "1.0000000000000001e+23"],
    [0x444b1ae4d6e2ef4en, "999999999999999700000"],
    [0x444b1ae4d6e2ef4fn, "999999999999999900000"],
    [0x444b1ae4d6e2ef50n, "1e+21"],
    [0x3eb0c6f7a0b5ed8cn, "9.999999999999997e-7"],
    [0x3eb0c6f7a0b5ed8dn, "0.000001"],
    [0x41b3de4355555553n, "333333333.3333332"],
    [0x41b3de4355555554n, "333333333.33333325"],
    [0x41b3de4355555555n, "333333333.3333333"],
    [0x41b3de4355555556n, "333333333.3333334"],
    [0x41b3de4355555557n, "333333333.33333343"],
    [0xbecbf647612f3696n, "-0.0000033333333333333333"],
    [0x43143ff3c1cb0959n, "1424953923781206.2"], // round to even
  ];
  test.each(appendixB)("Appendix B: %s serialises as %s", (bits, json) => {
    expect(canonicalJson([double(bits)])).toBe(`[${json}]`);
  });

  test("Appendix B: NaN and Infinity have no JSON form and are refused", () => {
    expect(() => canonicalJson({ v: double(0x7fffffffffffffffn) })).toThrow(/NaN/);
    expect(() => canonicalJson({ v: double(0x7ff0000000000000n) })).toThrow(/Infinity/);
  });

  test("numbers a reading can produce: binary noise kept exactly, -0 as 0, 1e21 in exponent form", () => {
    // 0.1 + 0.2 is the double 0x3FD3333333333334, whose shortest round-trip form is
    // 0.30000000000000004 (ECMA-262 Number::toString, which RFC 8785 section 3.2.2.3 adopts; from memory).
    expect(canonicalJson({ tir: 0.1 + 0.2 })).toBe('{"tir":0.30000000000000004}');
    expect(canonicalJson({ offset: -0 })).toBe('{"offset":0}');
    expect(canonicalJson({ big: 1e21, justBelow: 1e20 })).toBe(
      '{"big":1e+21,"justBelow":100000000000000000000}',
    );
    expect(canonicalJson({ gap: 0.0005, thou: 4.5 })).toBe('{"gap":0.0005,"thou":4.5}');
  });

  test("non-ASCII text is written as UTF-8 characters, not escapes; a lone surrogate is refused", () => {
    expect(canonicalJson({ by: "Róisín Ó Briain", unit: "°C", text: "½ in ± 1 thou" })).toBe(
      '{"by":"Róisín Ó Briain","text":"½ in ± 1 thou","unit":"°C"}',
    );
    // RFC 8785 section 3.2.2.2 requires I-JSON strings (RFC 7493 section 2.1: no lone surrogates).
    expect(() => canonicalJson({ note: "\ud800" })).toThrow(/surrogate/i);
  });

  test("absent and undefined fields leave no trace; a value with no JSON form is refused", () => {
    expect(canonicalJson({ a: 1, b: undefined })).toBe('{"a":1}');
    expect(() => canonicalJson(undefined)).toThrow(/no JSON form/);
  });
});

describe("canonical JSON is stable", () => {
  test("key order does not depend on the order the fields were set in", () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string(), fc.jsonValue()), (object) => {
        const reversed = Object.fromEntries(Object.entries(object).reverse());
        expect(canonicalJson(reversed)).toBe(canonicalJson(object));
      }),
    );
  });

  test("reading the canonical text back and canonicalising again gives the same text", () => {
    fc.assert(
      fc.property(fc.jsonValue(), (value) => {
        const once = canonicalJson(value);
        expect(canonicalJson(JSON.parse(once))).toBe(once);
      }),
    );
  });
});
