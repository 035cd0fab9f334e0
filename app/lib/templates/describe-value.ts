import { formatQuantity, unitSymbol } from "./format";
import type { Item } from "./schema";

/** A response in words, for places that show a value without its editor (conflicts, review). */
export function describeValue(item: Item | undefined, value: unknown): string {
  if (value === null || value === undefined) return "nothing entered";
  const v = value as any;
  const note = v.note ? ` — note: “${v.note}”` : "";
  switch (item?.kind) {
    case "check":
      return `${{ pass: "Pass", fail: "Fail", na: "Not applicable" }[v.result as "pass"] ?? v.result}${note}`;
    case "measure": {
      const last = v.attempts?.at(-1);
      return last
        ? `${formatQuantity(last.value, last.unit)} (attempt ${v.attempts.length}, ${last.by})${note}`
        : "no attempt";
    }
    case "readings": {
      const last = v.attempts?.at(-1);
      return last
        ? `${last.cells.map((row: (number | null)[]) => row.map((n) => (n === null ? "–" : n)).join(" ")).join(" | ")} ${unitSymbol(last.unit)} (set ${v.attempts.length})${note}`
        : "no readings";
    }
    case "choice":
      return `${item.options.find((o) => o.key === v.option)?.label ?? v.option}${note}`;
    case "text":
      return v.text;
    case "initials":
      return `initialled ${v.initials} by ${v.by}`;
    case "photo":
      return `${v.photos?.length ?? 0} photo(s)`;
    default:
      return note ? note.slice(3) : JSON.stringify(value);
  }
}
