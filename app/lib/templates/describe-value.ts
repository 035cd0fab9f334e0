import { formatQuantity, unitSymbol } from "./format";
import type { Item } from "./schema";
import { liveAttempts, strikeOf, type Strike } from "./values";
import { DEFAULT_TIME_ZONE, formatStamp } from "~/lib/format/dates";
import type {
  CheckValue,
  ChoiceValue,
  InitialsValue,
  MeasureValue,
  PhotoValue,
  ReadingsValue,
  TextValue,
} from "./values";

/** "; attempt 1 struck through by T. Tern (1 May 2026, 09:00 UTC): misread the dial" per strike. */
function struckText(
  v: { attempts: { id?: string }[]; strikes?: Strike[] },
  noun: string,
  timeZone: string,
): string {
  return v.attempts
    .flatMap((a, i) => {
      const s = strikeOf(v, a);
      return s
        ? [`; ${noun} ${i + 1} struck through by ${s.by} (${formatStamp(s.at, timeZone)}): ${s.reason}`]
        : [];
    })
    .join("");
}

/** A response in words, for places that show a value without its editor (conflicts, review). */
export function describeValue(item: Item | undefined, value: unknown, timeZone = DEFAULT_TIME_ZONE): string {
  if (value === null || value === undefined) return "nothing entered";
  const stored = value as { note?: string };
  const note = stored.note ? ` — note: “${stored.note}”` : "";
  switch (item?.kind) {
    case "check": {
      const v = value as CheckValue;
      return `${{ pass: "Pass", fail: "Fail", na: "Not applicable" }[v.result] ?? v.result}${note}`;
    }
    case "measure": {
      const v = value as MeasureValue;
      if (!v.attempts) return "no attempt";
      const last = liveAttempts(v).at(-1);
      const struck = struckText(v, "attempt", timeZone);
      return last
        ? `${formatQuantity(last.value, last.unit)} (attempt ${v.attempts.indexOf(last) + 1}, ${last.by})${struck}${note}`
        : `every attempt struck through${struck}${note}`;
    }
    case "readings": {
      const v = value as ReadingsValue;
      if (!v.attempts) return "no readings";
      const last = liveAttempts(v).at(-1);
      const struck = struckText(v, "set", timeZone);
      return last
        ? `${last.cells.map((row) => row.map((n) => (n === null ? "–" : n)).join(" ")).join(" | ")} ${unitSymbol(last.unit)} (set ${v.attempts.indexOf(last) + 1})${struck}${note}`
        : `every set struck through${struck}${note}`;
    }
    case "choice": {
      const v = value as ChoiceValue;
      return `${item.options.find((o) => o.key === v.option)?.label ?? v.option}${note}`;
    }
    case "text":
      return (value as TextValue).text;
    case "initials": {
      const v = value as InitialsValue;
      return `initialled ${v.initials} by ${v.by}`;
    }
    case "photo":
      return `${(value as PhotoValue).photos?.length ?? 0} photo(s)`;
    default:
      return note ? note.slice(3) : JSON.stringify(value);
  }
}
