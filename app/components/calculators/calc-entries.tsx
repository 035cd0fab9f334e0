import { readDecimal } from "~/lib/read-number";
import { convert, dimensionOf, isUnit, type CalcInput, type CalcInputSpec, type Unit } from "~/lib/calc";
import { formatNumber, unitSymbol } from "~/lib/templates/format";

/**
 * What a person has typed into one calculator input, kept as text so a half-typed "0." survives,
 * and turned into the registry's CalcInput only when it is complete.
 */
export const CLOCK = ["top", "bottom", "port", "starboard"] as const;
export type ClockPosition = (typeof CLOCK)[number];

export type Entry =
  | { shape: "number"; text: string; unit?: Unit }
  | { shape: "clock"; texts: Record<ClockPosition, string>; unit: Unit }
  | {
      shape: "grid";
      rows: string[];
      columns: string[];
      texts: string[][];
      positions?: { texts: string[]; unit: Unit };
      unit: Unit;
    }
  | { shape: "list"; texts: string[]; unit: Unit }
  | { shape: "text"; text: string };

export type Entries = Record<string, Entry>;

/** Inputs that another input's editor carries: the runout grid has a column for the station positions. */
export const carriedBy: Record<string, Record<string, string>> = {
  shaftRunout: { positionsIn: "readings" },
};

const RUNOUT_COLUMNS = ["0°", "90°", "180°", "270°"];
const stationNames = (count: number) => Array.from({ length: count }, (_, i) => `Station ${i + 1}`);

/** The editor an input gets from its spec: a clock of gaps or rim readings, text, a grid, a list or one number. */
function shapeOf(spec: CalcInputSpec): Entry["shape"] {
  if (spec.clock) return "clock";
  if (spec.accepts.includes("text")) return "text";
  if (spec.accepts.includes("grid") && !spec.accepts.includes("numbers")) return "grid";
  if (spec.accepts.includes("numbers")) return "list";
  return "number";
}

export function initialEntries(calcName: string, specs: Record<string, CalcInputSpec>): Entries {
  const carried = carriedBy[calcName] ?? {};
  const entries: Entries = {};
  for (const [name, spec] of Object.entries(specs)) {
    if (carried[name]) continue;
    const unit = spec.unit;
    switch (shapeOf(spec)) {
      case "text":
        entries[name] = { shape: "text", text: "" };
        break;
      case "clock":
        entries[name] = {
          shape: "clock",
          texts: { top: "", bottom: "", port: "", starboard: "" },
          unit: unit ?? "in",
        };
        break;
      case "grid": {
        const carries = Object.entries(carried).some(([, owner]) => owner === name);
        entries[name] = {
          shape: "grid",
          rows: stationNames(3),
          columns: RUNOUT_COLUMNS,
          texts: stationNames(3).map(() => RUNOUT_COLUMNS.map(() => "")),
          ...(carries ? { positions: { texts: ["", "", ""], unit: "in" as Unit } } : {}),
          unit: unit ?? "in",
        };
        break;
      }
      case "list":
        entries[name] = { shape: "list", texts: ["", "", ""], unit: unit ?? "in" };
        break;
      default:
        entries[name] = { shape: "number", text: "", unit };
    }
  }
  return entries;
}

/** A grid with one more or one fewer station (at least one stays). */
export function resizeGrid(entry: Extract<Entry, { shape: "grid" }>, count: number): Entry {
  const n = Math.max(1, count);
  const rows = stationNames(n);
  return {
    ...entry,
    rows,
    texts: rows.map((_, i) => entry.texts[i] ?? entry.columns.map(() => "")),
    ...(entry.positions
      ? { positions: { ...entry.positions, texts: rows.map((_, i) => entry.positions!.texts[i] ?? "") } }
      : {}),
  };
}

// ---- units ---------------------------------------------------------------------------------

/** The units offered for an input, its own first: lengths in inches, thousandths or millimetres. */
const unitChoices: Partial<Record<Unit, Unit[]>> = {
  in: ["in", "thou", "mm"],
  mm: ["mm", "in", "thou"],
  thou: ["thou", "in", "mm"],
  ft: ["ft", "m"],
  kn: ["kn", "mph", "km/h"],
  kPa: ["kPa", "psi", "bar", "inHg", "inH2O"],
  psi: ["psi", "kPa", "bar"],
  hp: ["hp", "kW"],
  "lb/in3": ["lb/in3", "kg/m3"],
  "in/in": ["in/in", "thou/in", "mm/m"],
};

export function choicesFor(spec: CalcInputSpec): Unit[] {
  return spec.unit ? (unitChoices[spec.unit] ?? [spec.unit]) : [];
}

const unitWords: Partial<Record<Unit, string>> = {
  "lb/in3": "lb/in³",
  "kg/m3": "kg/m³",
  "in/in": "in per in",
  "thou/in": "thou per in",
  "mm/m": "mm per m",
  "1": "ratio",
};

/** A unit as written beside a field or a result; strings the registry uses that are not units pass through. */
export function unitText(unit: string): string {
  if (!isUnit(unit)) return unit;
  return unitWords[unit] ?? unitSymbol(unit);
}

/** Every unit switch of a length field converts what is typed, so 0.003 in becomes 0.0762 mm. */
function convertText(text: string, from: Unit, to: Unit): string {
  const value = readDecimal(text);
  if (value === null || value === "invalid" || from === to) return text;
  return formatNumber(convert(value, from, to));
}

export function withUnit(entry: Entry, unit: Unit): Entry {
  if (entry.shape === "text" || !entry.unit || dimensionOf(entry.unit) !== dimensionOf(unit)) return entry;
  const from = entry.unit;
  const c = (t: string) => convertText(t, from, unit);
  switch (entry.shape) {
    case "number":
      return { ...entry, text: c(entry.text), unit };
    case "clock":
      return {
        ...entry,
        texts: {
          top: c(entry.texts.top),
          bottom: c(entry.texts.bottom),
          port: c(entry.texts.port),
          starboard: c(entry.texts.starboard),
        },
        unit,
      };
    case "grid":
      return { ...entry, texts: entry.texts.map((row) => row.map(c)), unit };
    case "list":
      return { ...entry, texts: entry.texts.map(c), unit };
  }
}

export type LengthSystem = "inch" | "metric";

/** The station positions of a grid in another length unit, converted. */
export function withPositionsUnit(entry: Extract<Entry, { shape: "grid" }>, unit: Unit): Entry {
  if (!entry.positions) return entry;
  const from = entry.positions.unit;
  return {
    ...entry,
    positions: { texts: entry.positions.texts.map((t) => convertText(t, from, unit)), unit },
  };
}

/**
 * The length unit of a system for an input whose own unit is `specUnit`: millimetres (metres for
 * feet), or back to inches (thou kept, feet for metres). Inputs the library takes in millimetres
 * (ISO fits, DIN keys, a metric thread pitch) stay in millimetres: their standards are metric.
 */
function lengthIn(system: LengthSystem, specUnit: Unit, current: Unit): Unit {
  const feet = specUnit === "ft" || specUnit === "m";
  if (system === "metric") return feet ? "m" : "mm";
  if (feet) return "ft";
  if (specUnit === "mm") return "mm";
  return current === "thou" ? "thou" : "in";
}

/** Every length entry switched to inches or to millimetres. */
export function withLengthSystem(
  entries: Entries,
  specs: Record<string, CalcInputSpec>,
  system: LengthSystem,
): Entries {
  const next: Entries = {};
  for (const [name, entry] of Object.entries(entries)) {
    const specUnit = specs[name]?.unit;
    let updated = entry;
    if (specUnit && entry.shape !== "text" && entry.unit && dimensionOf(entry.unit) === "length") {
      updated = withUnit(entry, lengthIn(system, specUnit, entry.unit));
    }
    if (updated.shape === "grid" && updated.positions)
      updated = withPositionsUnit(updated, lengthIn(system, "in", updated.positions.unit));
    next[name] = updated;
  }
  return next;
}

/** Whether any input is a length the library takes in inches or feet, so the inches-or-millimetres switch has something to do. */
export function hasInchLengths(specs: Record<string, CalcInputSpec>): boolean {
  return Object.values(specs).some((spec) => spec.unit === "in" || spec.unit === "ft");
}

// ---- reading what was typed ----------------------------------------------------------------

export interface ReadEntries {
  inputs: Record<string, CalcInput | undefined>;
  /** Labels of inputs still to be filled (required and blank, or started and not finished). */
  waiting: string[];
  /** Messages for fields holding something that is not a number. */
  invalid: Record<string, string>;
}

const NOT_A_NUMBER = "Enter a number, like 0.003 or 24.";

/** The registry's inputs from what is typed, or what is still missing and what cannot be read. */
export function readEntries(
  calcName: string,
  specs: Record<string, CalcInputSpec>,
  entries: Entries,
): ReadEntries {
  const inputs: Record<string, CalcInput | undefined> = {};
  const waiting: string[] = [];
  const invalid: Record<string, string> = {};
  const carried = carriedBy[calcName] ?? {};

  /** All the numbers of one input: undefined if all blank, "partial" if some are, "invalid" if any is not a number. */
  const readAll = (texts: string[]): number[] | undefined | "partial" | "invalid" => {
    const values = texts.map(readDecimal);
    if (values.includes("invalid")) return "invalid";
    if (values.every((v) => v === null)) return undefined;
    if (values.some((v) => v === null)) return "partial";
    return values as number[];
  };
  const settle = (
    name: string,
    label: string,
    optional: boolean | undefined,
    result: ReturnType<typeof readAll>,
    make: (values: number[]) => CalcInput,
  ) => {
    if (result === "invalid") invalid[name] = NOT_A_NUMBER;
    else if (result === "partial") waiting.push(`${label} (some are blank)`);
    else if (result === undefined) {
      if (!optional) waiting.push(label);
    } else inputs[name] = make(result);
  };

  for (const [name, spec] of Object.entries(specs)) {
    if (carried[name]) continue;
    const entry = entries[name];
    if (!entry) continue;
    switch (entry.shape) {
      case "text": {
        const text = entry.text.trim();
        if (text) inputs[name] = { kind: "text", value: text };
        else if (!spec.optional) waiting.push(spec.label);
        break;
      }
      case "number":
        settle(name, spec.label, spec.optional, readAll([entry.text]), ([value]) => ({
          kind: "number",
          value,
          unit: entry.unit ?? "1",
        }));
        break;
      case "clock":
        settle(name, spec.label, spec.optional, readAll(CLOCK.map((p) => entry.texts[p])), (values) => ({
          kind: "numbers",
          values,
          unit: entry.unit,
        }));
        break;
      case "list": {
        const filled = entry.texts.filter((t) => t.trim() !== "");
        settle(name, spec.label, spec.optional, filled.length ? readAll(filled) : undefined, (values) => ({
          kind: "numbers",
          values,
          unit: entry.unit,
        }));
        break;
      }
      case "grid": {
        settle(name, spec.label, spec.optional, readAll(entry.texts.flat()), (flat) => ({
          kind: "grid",
          rows: entry.rows,
          columns: entry.columns,
          values: entry.rows.map((_, r) =>
            flat.slice(r * entry.columns.length, (r + 1) * entry.columns.length),
          ),
          unit: entry.unit,
        }));
        const positionsName = Object.keys(carried).find((n) => carried[n] === name);
        if (positionsName && entry.positions) {
          const positionsSpec = specs[positionsName];
          const positionsUnit = entry.positions.unit;
          settle(
            positionsName,
            positionsSpec.label,
            positionsSpec.optional,
            readAll(entry.positions.texts),
            (values) => ({ kind: "numbers", values, unit: positionsUnit }),
          );
          if (invalid[positionsName]) invalid[name] = invalid[positionsName];
        }
        break;
      }
    }
  }
  return { inputs, waiting, invalid };
}

/** Which entry shows an error the registry reports for an input (carried inputs show at their carrier). */
export function entryFor(calcName: string, field: string): string {
  return carriedBy[calcName]?.[field] ?? field;
}
