import { CalcError, isCalcError } from "./errors";
import { formatQuantity, roundForUnit } from "./precision";
import { convert, dimensionOf, type Unit } from "./units";

/**
 * How a template's calc item feeds a calculation: each definition names its inputs (what kind
 * of value each takes, in which unit, and which argument of the calculation it becomes),
 * converts what it is given, runs the calculation and reports values, units, a verdict and the
 * rule it applied. Each definition lives beside its calculation; the registry only lists them.
 */
export type CalcInput =
  | {
      kind: "grid";
      rows: string[];
      columns: string[];
      values: (number | null)[][];
      unit: Unit;
      /** What a person calls the rows and columns ("Mid-length", "180°"); the keys otherwise. */
      rowLabels?: string[];
      columnLabels?: string[];
    }
  | { kind: "number"; value: number; unit: Unit }
  | { kind: "numbers"; values: number[]; unit: Unit }
  | { kind: "text"; value: string };

export interface CalcInputSpec {
  label: string;
  accepts: CalcInput["kind"][];
  unit?: Unit;
  optional?: boolean;
  /**
   * The argument(s) of the calculation this input becomes ("diameterIn", "offsetIn.vertical"):
   * an error the calculation raises about that argument is reported against this input.
   */
  field?: string | string[];
  /** Four readings at top, bottom, port and starboard (seen from aft): a screen shows a clock. */
  clock?: boolean;
}

export type UnitSystem = "inch" | "metric";

export interface CalcOutcome {
  values: Record<string, number | string>;
  units: Record<string, string>;
  /** pass/fail where the calculation has an acceptance rule; info where it gives figures or instructions. */
  verdict: "pass" | "fail" | "info";
  rule: string;
  /** The calculation's full result, for diagrams. */
  detail: unknown;
  /** The value the acceptance rule applies to (a key of `values`). */
  primary?: string;
  /** The length units the technician entered, which the values and the rule are written in. */
  unitSystem?: UnitSystem;
}

export interface CalcDefinition {
  name: string;
  title: string;
  summary: string;
  /** The standard or handbook the rule comes from. */
  source: string;
  /** Said beside the result where the work can hurt someone; only the hazard of this calculation. */
  caution?: string;
  inputs: Record<string, CalcInputSpec>;
  run(inputs: Record<string, CalcInput | undefined>): CalcOutcome;
}

export type Inputs = Record<string, CalcInput | undefined>;

/** The calculations a screen or the server has at hand, by name (the registry, or none yet). */
export type Calculations = Readonly<Record<string, CalcDefinition>>;

// Each caution names the one hazard of the work its calculation belongs to (issue 12, item 11).
export const CAUTION_ROTATING =
  "Isolate the engine (key out, stop control set) so it cannot start while the shaft is turned by hand; keep hands and sleeves clear of the coupling.";
export const CAUTION_HOT_WORK =
  "Heat straightening is hot work: fuel and vapours out of the space, fire watch and extinguisher, hot metal marked.";
export const CAUTION_LIFTING =
  "Support the engine before loosening its mounts and keep hands clear of a load on a hoist or jack. The engine maker's installation instructions govern.";
export const CAUTION_EXHAUST =
  "Exhaust leaks give off carbon monoxide: run the engine only with the space ventilated and a tested CO alarm aboard. The engine maker's limits govern.";
export const CAUTION_SEA_TRIAL =
  "Sea trials: life jackets, a second person on watch, and a plan for a stopped engine or a leak.";
export const CAUTION_BATTERIES =
  "Disconnect the batteries before working on cables; a shorted battery cable can burn or start a fire.";
export const CAUTION_RUNNING_ENGINE =
  "The engine is running: keep clear of belts, pulleys and the turning shaft, and mind hot surfaces.";

// ---- reading the inputs --------------------------------------------------------------------

function present(inputs: Inputs, name: string, spec: CalcInputSpec): CalcInput | undefined {
  const input = inputs[name];
  if (input === undefined) {
    if (spec.optional) return undefined;
    throw new CalcError(name, `${spec.label} is missing.`);
  }
  if (!spec.accepts.includes(input.kind)) {
    throw new CalcError(name, `${spec.label} takes ${spec.accepts.join(" or ")}, not ${input.kind}.`);
  }
  return input;
}

function inUnit(name: string, label: string, value: number, from: Unit, to: Unit): number {
  if (dimensionOf(from) !== dimensionOf(to)) {
    throw new CalcError(name, `${label} is in ${from}, which cannot be read as ${to}.`);
  }
  return convert(value, from, to);
}

/** A grid's row or column key in words: "deg-180" → "180°", "mid-shaft" stays. */
export function keyWords(key: string): string {
  const degrees = /^deg-?(\d+)$/.exec(key);
  if (degrees) return `${degrees[1]}°`;
  return key.replace(/-/g, " ");
}

/** Readings at four clock positions, seen from aft. */
export interface ClockGaps {
  top: number;
  bottom: number;
  port: number;
  starboard: number;
}

export interface GridValues {
  rows: string[];
  columns: string[];
  rowLabels: string[];
  columnLabels: string[];
  values: number[][];
}

export function reader(inputs: Inputs, specs: Record<string, CalcInputSpec>) {
  const spec = (name: string) => specs[name];
  return {
    /** The unit an input was entered in, when it was entered with one. */
    unitOf(name: string): Unit | undefined {
      const input = inputs[name];
      return input && input.kind !== "text" ? input.unit : undefined;
    },
    number(name: string, unit: Unit): number | undefined {
      const input = present(inputs, name, spec(name));
      if (!input) return undefined;
      if (input.kind !== "number") throw new CalcError(name, `${spec(name).label} takes one number.`);
      return inUnit(name, spec(name).label, input.value, input.unit, unit);
    },
    /** Every number of the input, whatever its shape: one number, a list or a table of readings. */
    numbers(name: string, unit: Unit): number[] | undefined {
      const input = present(inputs, name, spec(name));
      if (!input) return undefined;
      if (input.kind === "numbers")
        return input.values.map((v) => inUnit(name, spec(name).label, v, input.unit, unit));
      if (input.kind === "number") return [inUnit(name, spec(name).label, input.value, input.unit, unit)];
      if (input.kind === "grid") return this.grid(name, unit)!.values.flat();
      throw new CalcError(name, `${spec(name).label} takes a list of numbers.`);
    },
    text(name: string): string | undefined {
      const input = present(inputs, name, spec(name));
      if (!input) return undefined;
      if (input.kind !== "text") throw new CalcError(name, `${spec(name).label} takes text.`);
      return input.value;
    },
    grid(name: string, unit: Unit): GridValues | undefined {
      const input = present(inputs, name, spec(name));
      if (!input) return undefined;
      if (input.kind !== "grid") throw new CalcError(name, `${spec(name).label} takes a table of readings.`);
      const rowLabels = input.rows.map((key, i) => input.rowLabels?.[i] ?? keyWords(key));
      const columnLabels = input.columns.map((key, i) => input.columnLabels?.[i] ?? keyWords(key));
      const values = input.values.map((row, r) =>
        row.map((cell, c) => {
          if (cell === null || !Number.isFinite(cell)) {
            throw new CalcError(
              name,
              `${spec(name).label}: ${rowLabels[r] ?? r + 1} at ${columnLabels[c] ?? c + 1} is missing.`,
            );
          }
          return inUnit(name, spec(name).label, cell, input.unit, unit);
        }),
      );
      return { rows: input.rows, columns: input.columns, rowLabels, columnLabels, values };
    },
    /** Top, bottom, port and starboard from a four-cell grid (by key) or four numbers in that order. */
    clock(name: string, unit: Unit): ClockGaps | undefined {
      const input = present(inputs, name, spec(name));
      if (!input) return undefined;
      if (input.kind === "numbers") {
        const v = this.numbers(name, unit)!;
        if (v.length !== 4)
          throw new CalcError(name, `${spec(name).label} takes four values: top, bottom, port, starboard.`);
        return { top: v[0], bottom: v[1], port: v[2], starboard: v[3] };
      }
      const grid = this.grid(name, unit);
      if (!grid) return undefined;
      const flat =
        grid.columns.length === 1
          ? grid.rows.map((label, i) => [label, grid.values[i][0]] as const)
          : grid.rows.length === 1
            ? grid.columns.map((label, i) => [label, grid.values[0][i]] as const)
            : [];
      const find = (pattern: RegExp) => flat.find(([label]) => pattern.test(label))?.[1];
      const gaps = {
        top: find(/top/i),
        bottom: find(/bottom/i),
        port: find(/port/i),
        starboard: find(/starboard|stbd/i),
      };
      if (Object.values(gaps).some((v) => v === undefined)) {
        throw new CalcError(
          name,
          `${spec(name).label} needs one reading each at top, bottom, port and starboard.`,
        );
      }
      return gaps as ClockGaps;
    },
    /** "yes"/"no" from a choice or constant ("yes", "true", "inside"... and their opposites). */
    yesNo(name: string): boolean | undefined {
      const text = this.text(name);
      if (text === undefined) return undefined;
      const word = text.trim().toLowerCase();
      if (/^(yes|y|true|inside|in|engine-space)$/.test(word)) return true;
      if (/^(no|n|false|outside|out|elsewhere)$/.test(word)) return false;
      throw new CalcError(name, `${spec(name).label} is "yes" or "no", not "${text}".`);
    },
  };
}

export type Reader = ReturnType<typeof reader>;

// ---- the unit system of a result -----------------------------------------------------------

const METRIC_LENGTHS: Unit[] = ["mm", "m"];

/** Metric when the first length input given was entered in mm or m: a millimetre shop sees mm. */
function systemOf(inputs: Inputs, specs: Record<string, CalcInputSpec>): UnitSystem {
  for (const [name, spec] of Object.entries(specs)) {
    const input = inputs[name];
    if (!input || input.kind === "text" || !spec.unit || dimensionOf(spec.unit) !== "length") continue;
    return METRIC_LENGTHS.includes(input.unit) ? "metric" : "inch";
  }
  return "inch";
}

/** Inch-system units and what a metric shop reads instead. */
const METRIC_FOR: Partial<Record<string, Unit>> = { in: "mm", thou: "mm", ft: "m", "in/in": "mm/m" };

/**
 * What a definition's run is given besides its inputs: the unit system the technician works in
 * and a writer of quantities that follows it and the one precision rule, for rule texts.
 */
export interface Show {
  system: UnitSystem;
  /** A quantity written in the shop's units ("0.025 mm" or "0.001 in"), given in inch units. */
  q(value: number, unit: Unit): string;
}

function showFor(system: UnitSystem): Show {
  return {
    system,
    q(value, unit) {
      const to = system === "metric" ? METRIC_FOR[unit] : undefined;
      return to ? formatQuantity(convert(value, unit, to), to) : formatQuantity(value, unit);
    },
  };
}

/** The outcome's values in the shop's units, each rounded by the one precision rule. */
function inShopUnits(outcome: CalcOutcome, system: UnitSystem): CalcOutcome {
  const values: Record<string, number | string> = {};
  const units: Record<string, string> = { ...outcome.units };
  for (const [key, value] of Object.entries(outcome.values)) {
    const unit = outcome.units[key] as Unit | undefined;
    const to = system === "metric" && unit ? METRIC_FOR[unit] : undefined;
    if (typeof value !== "number" || !unit) {
      values[key] = value;
      continue;
    }
    if (to) units[key] = to;
    values[key] = roundForUnit(to ? convert(value, unit, to) : value, to ?? unit);
  }
  return { ...outcome, values, units, unitSystem: system };
}

/** An error raised about a calculation's argument, reported against the input that fed it. */
function blamed(error: CalcError, specs: Record<string, CalcInputSpec>): CalcError {
  if (Object.hasOwn(specs, error.field)) return error;
  const root = error.field.split(/[.[]/)[0];
  const owns = (spec: CalcInputSpec, field: string) =>
    spec.field !== undefined && ([] as string[]).concat(spec.field).includes(field);
  const byField = (field: string) => Object.entries(specs).find(([, spec]) => owns(spec, field))?.[0];
  const name = byField(error.field) ?? byField(root);
  return name ? new CalcError(name, error.message) : error;
}

export interface CalcDefinitionSource extends Omit<CalcDefinition, "run"> {
  run(read: Reader, show: Show): CalcOutcome;
}

/**
 * A registry definition from its parts: the run reads the inputs through a reader, writes rule
 * texts through `show`, and has its errors reported against the inputs and its values put in
 * the shop's units, the same way for every calculation.
 */
export function defineCalc(source: CalcDefinitionSource): CalcDefinition {
  return {
    ...source,
    run(inputs) {
      const system = systemOf(inputs, source.inputs);
      try {
        return inShopUnits(source.run(reader(inputs, source.inputs), showFor(system)), system);
      } catch (error) {
        if (isCalcError(error)) throw blamed(error, source.inputs);
        throw error;
      }
    },
  };
}
