/** How the record PDF words dates, signed numbers and lists, and its statement of what governs. */
import { type Unit } from "~/lib/calc/units";
import { formatQuantity } from "~/lib/templates";
import { formatEntered } from "~/lib/templates/format";

/** The app's statement of what governs, on the cover and at the foot of every page. */
export const GOVERNING_STATEMENT =
  "Sternpost records and computes. The engine maker's installation instructions, the applicable standards and local regulations, and the judgement of a qualified person govern.";

export const dayFormat = new Intl.DateTimeFormat("en-GB", {
  day: "numeric",
  month: "long",
  year: "numeric",
  timeZone: "UTC",
});

/** "12 May 2025": a date no reader can take for another. */
export function day(iso: string): string {
  return dayFormat.format(new Date(`${iso.slice(0, 10)}T00:00:00Z`));
}

/** "12 May 2025, 09:14 UTC": every time in the record is in UTC, and says so. */
export function when(iso: string): string {
  const t = new Date(iso);
  if (Number.isNaN(t.getTime())) return iso;
  const utc = t.toISOString();
  return `${day(utc)}, ${utc.slice(11, 16)} UTC`;
}

/** A true minus sign: "−0.0005 in" reads as negative at a glance, a hyphen does not. */
export function minus(text: string): string {
  return text.replace(/(^|[\s(])-(?=\d)/g, "$1\u2212");
}

export const entered = (value: number, unit: Unit) => minus(formatEntered(value, unit));

export const quantity = (value: number, unit: Unit) => minus(formatQuantity(value, unit));

export function listWords(items: string[]): string {
  return items.length <= 1 ? (items[0] ?? "") : `${items.slice(0, -1).join(", ")} and ${items.at(-1)}`;
}
