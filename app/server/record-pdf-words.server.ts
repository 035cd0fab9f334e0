/** How the record PDF words dates, signed numbers and lists, and its statement of what governs. */
import { type Unit } from "~/lib/calc/units";
import { formatQuantity } from "~/lib/templates";
import { formatEntered } from "~/lib/templates/format";
import { formatMoment, formatStamp } from "~/lib/format";

/** The app's statement of what governs, on the cover and at the foot of every page. */
export const GOVERNING_STATEMENT =
  "Sternpost records and computes. The engine maker's installation instructions, the applicable standards and local regulations, and the judgement of a qualified person govern.";

/** "12 May 2025": a calendar date (a job's start or due day), which has no time zone. */
export function day(iso: string): string {
  return formatMoment(`${iso.slice(0, 10)}T12:00:00Z`, "UTC", "date");
}

/** "12 May 2025, 09:14 UTC": a moment on the yard's clock, naming the zone so no reader guesses. */
export const when = (iso: string, timeZone: string): string => formatStamp(iso, timeZone);

/** A true minus sign: "−0.0005 in" reads as negative at a glance, a hyphen does not. */
export function minus(text: string): string {
  return text.replace(/(^|[\s(])-(?=\d)/g, "$1\u2212");
}

export const entered = (value: number, unit: Unit) => minus(formatEntered(value, unit));

export const quantity = (value: number, unit: Unit) => minus(formatQuantity(value, unit));

export function listWords(items: string[]): string {
  return items.length <= 1 ? (items[0] ?? "") : `${items.slice(0, -1).join(", ")} and ${items.at(-1)}`;
}
