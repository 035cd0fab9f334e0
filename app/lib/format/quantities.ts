/**
 * Numbers with their units. One implementation, kept where the acceptance rules use it
 * (templates/format.ts); screens and the PDF take it from here.
 */
export { formatEntered, formatNumber, formatQuantity, unitSymbol } from "~/lib/templates/format";

const grouped = new Intl.NumberFormat("en-GB", { maximumFractionDigits: 3 });

/** A count or a figure for reading, with thousands grouped: 5,000 hp. */
export function formatFigure(value: number, unit?: string): string {
  const text = grouped.format(value);
  return unit ? `${text} ${unit}` : text;
}

const counts = new Intl.NumberFormat("en-GB", { maximumFractionDigits: 0 });
/** A count of things, grouped for reading: "1,200". */
export const formatCount = (value: number): string => counts.format(value);
