import type { Unit } from "~/lib/calc/units";
import type { CalcRule, ReadingsRule, Rule } from "./schema";

/** How a unit is written next to a number in a message or a rule. */
const symbols: Partial<Record<Unit, string>> = {
  degF: "°F",
  degC: "°C",
  inH2O: "inH₂O",
  lbfFt: "lbf·ft",
  Nm: "N·m",
  deg: "°",
  "1": "",
};

export function unitSymbol(unit: Unit): string {
  return symbols[unit] ?? unit;
}

/** Six significant digits: enough for a limit like 1.2495 in, and no binary noise (0.30000000000000004). */
export function formatNumber(value: number): string {
  return String(Number(value.toPrecision(6)));
}

function withUnit(number: string, unit: Unit): string {
  const symbol = unitSymbol(unit);
  const tight = symbol === "" || symbol === "%" || symbol.startsWith("°");
  return tight ? `${number}${symbol}` : `${number} ${symbol}`;
}

/** A derived value, rounded for reading. */
export function formatQuantity(value: number, unit: Unit): string {
  return withUnit(formatNumber(value), unit);
}

/** A value exactly as the person entered it. */
export function formatEntered(value: number, unit: Unit): string {
  return withUnit(String(value), unit);
}

/** The acceptance rule in words, as the checklist shows it beside the item. */
export function describeRule(rule: Rule | ReadingsRule | CalcRule): string {
  const q = (value: number) => formatQuantity(value, rule.unit);
  const parts: string[] = [];
  if (rule.nominal !== undefined && rule.tolerance !== undefined) {
    parts.push(`${formatNumber(rule.nominal)} ± ${q(rule.tolerance)}`);
  }
  if (rule.min !== undefined && rule.max !== undefined)
    parts.push(`between ${q(rule.min)} and ${q(rule.max)}`);
  else if (rule.min !== undefined) parts.push(`at least ${q(rule.min)}`);
  else if (rule.max !== undefined) parts.push(`at most ${q(rule.max)}`);
  const text = parts.join(", and ");
  if ("output" in rule) return `${rule.output} ${text}`;
  return "appliesTo" in rule && rule.appliesTo === "row-spread"
    ? `largest minus smallest in each row ${text}`
    : text;
}
