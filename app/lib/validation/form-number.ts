import { z } from "zod";
import { formatFigure } from "~/lib/format";
import { readDecimal } from "~/lib/read-number";

interface Range {
  /** Smallest accepted value; `above` makes it exclusive ("more than 0"). */
  min: number;
  max: number;
  unit?: string;
  above?: boolean;
  whole?: boolean;
  /** Said after the range: how the trade writes it ("1:1 or more; 2.0 for 2:1"). */
  note?: string;
}

/**
 * A number typed in a form, read the one way Sternpost reads numbers (read-number.ts: "1,25" is
 * 1.25), with messages that say what is wrong: not a number, a whole number expected, or the
 * range — "Enter the rated power between 1 and 5,000 hp", never "as a number" for 99,999.
 */
export function formNumber(label: string, { min, max, unit, above = false, whole = false, note }: Range) {
  const limits = above
    ? `above ${formatFigure(min)}, up to ${formatFigure(max, unit)}`
    : `between ${formatFigure(min)} and ${formatFigure(max, unit)}`;
  const range = `Enter ${label} ${limits}${note ? ` (${note})` : ""}.`;
  return z.preprocess(
    (value) => {
      if (typeof value !== "string") return value;
      // A comma before groups of three digits ("99,999", "1,200") is a thousands separator as the
      // figure is printed on a data plate; "1,25" or "0,125" is a decimal comma (read-number.ts).
      if (/^\s*[1-9]\d{0,2}(,\d{3})+\s*$/.test(value)) return Number(value.replace(/,/g, ""));
      const read = readDecimal(value);
      return read === "invalid" ? Number.NaN : (read ?? undefined);
    },
    z
      .number({
        error: (issue) =>
          issue.input === undefined ? `Enter ${label}.` : `Enter ${label} as a number, like 12.5 or 12,5.`,
      })
      .refine((n) => (above ? n > min : n >= min) && n <= max, { error: range })
      .refine((n) => !whole || Number.isInteger(n), { error: `Enter ${label} as a whole number.` }),
  );
}
