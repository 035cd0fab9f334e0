import { defineCalc } from "./define";
/**
 * Hull identification number check, after 33 CFR 181.25 ("Hull identification number format"):
 * twelve characters, uninterrupted by slashes, hyphens or spaces —
 *   1–3   manufacturer identification code (assigned under 33 CFR 181.31),
 *   4–8   serial number: letters or digits, except the letters I, O and Q,
 *   9     month of certification (or of manufacture): A = January … L = December,
 *   10    last digit of the year of certification (or manufacture), a digit,
 *   11–12 last two digits of the model year.
 * Problems come back as plain sentences for whoever is typing the number in at the desk.
 */
export interface HinResult {
  valid: boolean;
  problems: string[];
  /** Remarks that do not make the number invalid (for instance an older hull layout). */
  notes: string[];
  /** The characters checked: trimmed, upper-cased, separators removed. */
  hin: string;
  manufacturerCode?: string;
  serial?: string;
  certification?: { month: number; yearDigit: number };
  /** Four-digit model year; 72–99 are read as 1972–1999 (12-character HINs began in 1972), 00–71 as 2000–2071. */
  modelYear?: number;
}

const MONTHS = "ABCDEFGHIJKL";
const MONTH_NAMES = [
  "January",
  "February",
  "March",
  "April",
  "May",
  "June",
  "July",
  "August",
  "September",
  "October",
  "November",
  "December",
];

export function validateHin(hin: string): HinResult {
  const typed = typeof hin === "string" ? hin.trim().toUpperCase() : "";
  const compact = typed.replace(/[\s\-/]/g, "");
  const problems: string[] = [];
  const notes: string[] = [];
  const result = (): HinResult => ({ valid: problems.length === 0, problems, notes, hin: compact });

  if (compact.length === 0) {
    problems.push("No hull identification number was entered.");
    return result();
  }
  if (compact !== typed) {
    problems.push("Write the HIN as one run of characters, without spaces, hyphens or slashes.");
  }
  const stray = [...new Set(compact.replace(/[A-Z0-9]/g, ""))];
  if (stray.length > 0) {
    problems.push(`A HIN holds only letters and digits; remove ${stray.map((c) => `"${c}"`).join(", ")}.`);
  }
  if (compact.length !== 12) {
    problems.push(`A HIN has 12 characters; this one has ${compact.length}.`);
    return result();
  }
  if (stray.length > 0) return result();

  const manufacturerCode = compact.slice(0, 3);
  const serial = compact.slice(3, 8);
  const monthLetter = compact[8];
  const yearDigit = compact[9];
  const modelYearDigits = compact.slice(10, 12);

  const forbidden = [...new Set(serial.replace(/[^IOQ]/g, ""))];
  if (forbidden.length > 0) {
    problems.push(
      `The serial number (characters 4 to 8, "${serial}") may not use the letters I, O or Q; ` +
        `it has ${forbidden.join(", ")}. Check whether a 1 or a 0 was meant.`,
    );
  }

  const month = MONTHS.indexOf(monthLetter) + 1;
  if (month === 0) {
    problems.push(
      `Character 9 is the month the boat was certified, a letter from A (January) to L (December); it is "${monthLetter}".`,
    );
    // From memory: hulls from before August 1984 could carry an "M" here ("model year format").
    if (monthLetter === "M") {
      notes.push(
        "An M in position 9 is the older layout used on some hulls built before August 1984; this check covers only the current layout.",
      );
    }
  }
  if (!/^[0-9]$/.test(yearDigit)) {
    problems.push(
      `Character 10 is the last digit of the year the boat was certified and must be a digit; it is "${yearDigit}".`,
    );
  }
  if (!/^[0-9]{2}$/.test(modelYearDigits)) {
    problems.push(
      `Characters 11 and 12 are the model year and must be two digits; they are "${modelYearDigits}".`,
    );
  }

  const out = result();
  out.manufacturerCode = manufacturerCode;
  if (forbidden.length === 0) out.serial = serial;
  if (month > 0 && /^[0-9]$/.test(yearDigit)) {
    out.certification = { month, yearDigit: Number(yearDigit) };
  }
  if (/^[0-9]{2}$/.test(modelYearDigits)) {
    const yy = Number(modelYearDigits);
    out.modelYear = yy >= 72 ? 1900 + yy : 2000 + yy;
  }
  if (out.certification && out.modelYear !== undefined) {
    const { yearDigit: d, month: m } = out.certification;
    const my = out.modelYear;
    // A model year usually starts in the summer of the year before it (33 CFR 175.3 counts it
    // from June 1); a certification year digit that is neither of those two years is worth a look.
    if (d !== my % 10 && d !== (my + 9) % 10) {
      notes.push(
        `The boat was certified in ${MONTH_NAMES[m - 1]} of a year ending in ${d}, which does not fit model year ${my}; check the number on the hull.`,
      );
    }
  }
  return out;
}

export const validateHinCalc = defineCalc({
  name: "validateHin",
  title: "Hull identification number",
  summary: "Whether a HIN follows the 12-character layout, and why not.",
  source: "33 CFR 181.25",
  inputs: { hin: { label: "Hull identification number", accepts: ["text"] } },
  run(read) {
    const result = validateHin(read.text("hin")!);
    const values: Record<string, string | number> = { HIN: result.hin };
    if (result.manufacturerCode) values["maker's code"] = result.manufacturerCode;
    if (result.modelYear !== undefined) values["model year"] = result.modelYear;
    if (result.problems.length) values.problems = result.problems.join(" ");
    return {
      values,
      units: {},
      verdict: result.valid ? "pass" : "fail",
      primary: "HIN",
      rule: "33 CFR 181.25 hull identification number format",
      detail: result,
    };
  },
});
