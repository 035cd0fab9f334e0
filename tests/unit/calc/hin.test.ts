import { describe, expect, it } from "vitest";
import { validateHin } from "~/lib/calc";

// 33 CFR 181.25, "Hull identification number format". The maker's codes are invented.
describe("validateHin — 33 CFR 181.25", () => {
  it("accepts a 12-character HIN and reads its parts (181.25 (a)–(d))", () => {
    const r = validateHin("SXT4A7C2K425");
    expect(r.valid).toBe(true);
    expect(r.problems).toEqual([]);
    expect(r.manufacturerCode).toBe("SXT"); // (a) characters 1–3
    expect(r.serial).toBe("4A7C2"); // (b) characters 4–8
    expect(r.certification).toEqual({ month: 11, yearDigit: 4 }); // (c) K = November, year ending in 4
    expect(r.modelYear).toBe(2025); // (d) "25"
    expect(r.notes).toEqual([]);
  });

  it("rejects slashes, hyphens and spaces inside the number (181.25: 'uninterrupted by slashes, hyphens, or spaces')", () => {
    const r = validateHin("SXT-4A7C2-K425");
    expect(r.valid).toBe(false);
    expect(r.problems.join(" ")).toMatch(/without spaces, hyphens or slashes/);
    expect(validateHin("SXT 4A7C2 K425").valid).toBe(false);
    expect(validateHin("SXT4A7C2/K425").valid).toBe(false);
  });

  it("takes the number as typed in lower case or with spaces around it", () => {
    expect(validateHin("  sxt4a7c2k425 ").valid).toBe(true);
  });

  it("needs exactly twelve characters (181.25: 'must consist of twelve characters')", () => {
    expect(validateHin("SXT4A7C2K42").problems).toContain("A HIN has 12 characters; this one has 11.");
    expect(validateHin("SXT4A7C2K4255").problems).toContain("A HIN has 12 characters; this one has 13.");
    expect(validateHin("").problems).toEqual(["No hull identification number was entered."]);
  });

  it("allows only letters and digits", () => {
    const r = validateHin("SXT4A#C2K425");
    expect(r.valid).toBe(false);
    expect(r.problems[0]).toMatch(/only letters and digits; remove "#"/);
  });

  it("refuses I, O and Q in the serial number (181.25 (b))", () => {
    for (const letter of ["I", "O", "Q"]) {
      const r = validateHin(`SXT4${letter}7C2K425`);
      expect(r.valid).toBe(false);
      expect(r.problems.join(" ")).toMatch(/may not use the letters I, O or Q/);
      expect(r.serial).toBeUndefined();
    }
  });

  it("needs a month letter A–L in position 9 (181.25 (c): January 'A' … December)", () => {
    expect(validateHin("SXT4A7C2A425").certification?.month).toBe(1);
    expect(validateHin("SXT4A7C2L425").certification?.month).toBe(12);
    const r = validateHin("SXT4A7C2M425");
    expect(r.valid).toBe(false);
    expect(r.problems.join(" ")).toMatch(/Character 9 is the month/);
    expect(r.notes.join(" ")).toMatch(/older layout/); // from memory: the pre-August-1984 "model year format" had M here
    expect(validateHin("SXT4A7C21425").valid).toBe(false);
  });

  it("needs a digit in position 10 (181.25 (c): 'must be an Arabic numeral')", () => {
    const r = validateHin("SXT4A7C2KX25");
    expect(r.valid).toBe(false);
    expect(r.problems.join(" ")).toMatch(/Character 10 is the last digit of the year/);
  });

  it("needs two digits of model year in positions 11–12 (181.25 (d))", () => {
    const r = validateHin("SXT4A7C2K42A");
    expect(r.valid).toBe(false);
    expect(r.problems.join(" ")).toMatch(/Characters 11 and 12 are the model year/);
    expect(r.modelYear).toBeUndefined();
  });

  it("reports every problem at once, in plain sentences", () => {
    const r = validateHin("SXT4O7C2MX2A");
    expect(r.problems).toHaveLength(4);
    for (const p of r.problems) expect(p).toMatch(/^[A-Z].*\.$/);
  });

  it("reads two-digit model years 72–99 as 19xx (12-character HINs began in 1972, 33 CFR 181 subpart C history)", () => {
    expect(validateHin("SXT4A7C2H899").modelYear).toBe(1999);
    expect(validateHin("SXT4A7C2H900").modelYear).toBe(2000);
  });

  it("notes, without failing, a certification year that cannot fall in the model year", () => {
    // 33 CFR 175.3: a model year runs from June 1 of the year before to July 31 of its year.
    const odd = validateHin("SXT4A7C2K125");
    expect(odd.valid).toBe(true);
    expect(odd.notes.join(" ")).toMatch(/does not fit model year 2025/);
    expect(validateHin("SXT4A7C2F525").notes).toEqual([]); // June 2025, model year 2025
  });
});
