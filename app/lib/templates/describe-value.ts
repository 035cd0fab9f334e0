import { formatQuantity, unitSymbol } from "./format";
import type { Item } from "./schema";
import type {
  CheckValue,
  ChoiceValue,
  InitialsValue,
  MeasureValue,
  PhotoValue,
  ReadingsValue,
  TextValue,
} from "./values";

/** A response in words, for places that show a value without its editor (conflicts, review). */
export function describeValue(item: Item | undefined, value: unknown): string {
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
      const last = v.attempts?.at(-1);
      return last
        ? `${formatQuantity(last.value, last.unit)} (attempt ${v.attempts.length}, ${last.by})${note}`
        : "no attempt";
    }
    case "readings": {
      const v = value as ReadingsValue;
      const last = v.attempts?.at(-1);
      return last
        ? `${last.cells.map((row) => row.map((n) => (n === null ? "–" : n)).join(" ")).join(" | ")} ${unitSymbol(last.unit)} (set ${v.attempts.length})${note}`
        : "no readings";
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
