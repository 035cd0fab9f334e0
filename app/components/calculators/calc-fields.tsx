import { dimensionOf, type CalcInputSpec, type Unit } from "~/lib/calc";
import { Field } from "~/components/field";
import { SignToggle } from "~/components/signed-input";
import {
  choicesFor,
  resizeGrid,
  unitText,
  withPositionsUnit,
  withUnit,
  type ClockPosition,
  type Entry,
} from "./calc-entries";

/** Free-text inputs that take one of a few words, and classes offered as suggestions. */
const textChoices: Record<string, { options: string[]; only: boolean }> = {
  "threadPitch.series": { options: ["UNC", "UNF"], only: true },
  "isoFit.hole": { options: ["H7", "H8", "H9", "H11", "G7", "F8", "JS7"], only: false },
  "isoFit.shaft": { options: ["k6", "h6", "f7", "g6", "js6", "m6", "n6", "p6", "r6", "s6"], only: false },
};

const clockWords: Record<ClockPosition, string> = {
  top: "Top",
  bottom: "Bottom",
  port: "Port",
  starboard: "Starboard",
};

interface EntryFieldProps {
  calcName: string;
  name: string;
  spec: CalcInputSpec;
  /** The spec of an input this editor also carries (the runout grid's station positions). */
  carried?: CalcInputSpec;
  entry: Entry;
  error?: string;
  onChange(entry: Entry): void;
}

/**
 * An input that may be negative gets a ± toggle beside each field (many decimal keypads have no
 * minus key): dial readings (runout, rim), offsets, temperatures and angles. Gaps, diameters,
 * bores and distances are never negative.
 */
export function takesSign(spec: CalcInputSpec): boolean {
  const words = `${spec.label} ${[spec.field ?? []].flat().join(" ")}`;
  if (/gap|diameter|bore|distance|length|position|rating|largest|maximum|limit/i.test(words)) return false;
  const dimension = spec.unit ? dimensionOf(spec.unit) : undefined;
  if (dimension === "temperature" || dimension === "angle") return true;
  return /offset|reading|dial|rim/i.test(words);
}

const labelOf = (spec: CalcInputSpec) => (spec.optional ? `${spec.label} (optional)` : spec.label);

/** One calculator input, drawn for its shape: a number, four clock positions, a grid of readings, a list or a word. */
export function EntryField(props: EntryFieldProps) {
  const { entry } = props;
  switch (entry.shape) {
    case "number":
      return <NumberField {...props} entry={entry} />;
    case "clock":
      return <ClockField {...props} entry={entry} />;
    case "grid":
      return <GridField {...props} entry={entry} />;
    case "list":
      return <ListField {...props} entry={entry} />;
    case "text":
      return <TextField {...props} entry={entry} />;
  }
}

const fieldId = (name: string) => `calc-${name}`;
const errorProps = (name: string, error?: string) =>
  error ? { "aria-invalid": true, "aria-describedby": `${fieldId(name)}-error` } : {};

function UnitPicker({
  name,
  label,
  spec,
  unit,
  onPick,
}: {
  name: string;
  label: string;
  spec: CalcInputSpec;
  unit?: Unit;
  onPick(unit: Unit): void;
}) {
  const choices = choicesFor(spec);
  if (!unit || choices.length === 0) return null;
  if (choices.length === 1) {
    return unit === "1" ? null : <span className="num min-w-12 self-center font-bold">{unitText(unit)}</span>;
  }
  return (
    <select
      aria-label={`${label}: unit`}
      id={`${fieldId(name)}-unit`}
      className="field-input w-auto min-w-24"
      value={unit}
      onChange={(e) => onPick(e.target.value as Unit)}
    >
      {choices.map((u) => (
        <option key={u} value={u}>
          {unitText(u)}
        </option>
      ))}
    </select>
  );
}

function NumberField({
  name,
  spec,
  entry,
  error,
  onChange,
}: EntryFieldProps & { entry: Extract<Entry, { shape: "number" }> }) {
  return (
    <Field id={fieldId(name)} label={labelOf(spec)} errors={error ? [error] : undefined}>
      <div className="flex gap-2">
        <input
          id={fieldId(name)}
          inputMode="decimal"
          autoComplete="off"
          className="field-input num min-w-0 flex-1"
          value={entry.text}
          onChange={(e) => onChange({ ...entry, text: e.target.value })}
          {...errorProps(name, error)}
        />
        {takesSign(spec) && (
          <SignToggle
            field={spec.label}
            value={entry.text}
            onChange={(text) => onChange({ ...entry, text })}
          />
        )}
        <UnitPicker
          name={name}
          label={spec.label}
          spec={spec}
          unit={entry.unit}
          onPick={(unit) => onChange(withUnit(entry, unit))}
        />
      </div>
    </Field>
  );
}

/** The four positions laid out as seen from aft: top above, port left, starboard right, bottom below. */
function ClockField({
  name,
  spec,
  entry,
  error,
  onChange,
}: EntryFieldProps & { entry: Extract<Entry, { shape: "clock" }> }) {
  const cell = (position: ClockPosition, area: string) => (
    <label className={`flex flex-col gap-1 ${area}`}>
      <span className="text-sm font-bold">{clockWords[position]}</span>
      <span className="flex gap-1">
        <input
          inputMode="decimal"
          autoComplete="off"
          className="field-input num min-w-0"
          aria-label={`${spec.label}: ${clockWords[position]}`}
          value={entry.texts[position]}
          onChange={(e) => onChange({ ...entry, texts: { ...entry.texts, [position]: e.target.value } })}
          {...errorProps(name, error)}
        />
        {takesSign(spec) && (
          <SignToggle
            field={`${spec.label}: ${clockWords[position]}`}
            value={entry.texts[position]}
            onChange={(text) => onChange({ ...entry, texts: { ...entry.texts, [position]: text } })}
          />
        )}
      </span>
    </label>
  );
  return (
    <fieldset className="flex flex-col gap-2" id={fieldId(name)}>
      <legend className="font-bold">{labelOf(spec)}</legend>
      <p className="text-sm text-ink-soft">Seen from aft, looking forward.</p>
      <div className="grid max-w-md grid-cols-3 gap-2">
        {cell("top", "col-start-2")}
        {cell("port", "col-start-1 row-start-2")}
        <div className="col-start-2 row-start-2 flex items-center justify-center">
          <UnitPicker
            name={name}
            label={spec.label}
            spec={spec}
            unit={entry.unit}
            onPick={(unit) => onChange(withUnit(entry, unit))}
          />
        </div>
        {cell("starboard", "col-start-3 row-start-2")}
        {cell("bottom", "col-start-2 row-start-3")}
      </div>
      <FieldError name={name} error={error} />
    </fieldset>
  );
}

function GridField({
  name,
  spec,
  carried,
  entry,
  error,
  onChange,
}: EntryFieldProps & { entry: Extract<Entry, { shape: "grid" }> }) {
  const setCell = (r: number, c: number, text: string) =>
    onChange({
      ...entry,
      texts: entry.texts.map((row, i) => (i === r ? row.map((t, j) => (j === c ? text : t)) : row)),
    });
  const signed = takesSign(spec);
  const setPosition = (r: number, text: string) =>
    entry.positions &&
    onChange({
      ...entry,
      positions: { ...entry.positions, texts: entry.positions.texts.map((t, i) => (i === r ? text : t)) },
    });
  return (
    <fieldset className="flex flex-col gap-2" id={fieldId(name)}>
      <legend className="font-bold">{labelOf(spec)}</legend>
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <span>Readings in</span>
        <UnitPicker
          name={name}
          label={spec.label}
          spec={spec}
          unit={entry.unit}
          onPick={(unit) => onChange(withUnit(entry, unit))}
        />
        {entry.positions && carried && (
          <>
            <span>positions in</span>
            <UnitPicker
              name={`${name}-positions`}
              label={carried.label}
              spec={carried}
              unit={entry.positions.unit}
              onPick={(unit) => onChange(withPositionsUnit(entry, unit))}
            />
          </>
        )}
      </div>
      <div className="overflow-x-auto">
        <table className="border-collapse">
          <thead>
            <tr>
              <th className="p-1"></th>
              {entry.positions && carried && (
                <th scope="col" className="p-1 text-left text-sm">
                  Position <span className="font-normal">(optional)</span>
                </th>
              )}
              {entry.columns.map((c) => (
                <th key={c} scope="col" className="p-1 text-left text-sm">
                  {c}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {entry.rows.map((row, r) => (
              <tr key={row}>
                <th scope="row" className="whitespace-nowrap p-1 pr-2 text-left text-sm">
                  {row}
                </th>
                {entry.positions && carried && (
                  <td className="p-1">
                    <input
                      inputMode="decimal"
                      autoComplete="off"
                      className="field-input num w-24"
                      aria-label={`${row}: position along the shaft (${unitText(entry.positions.unit)})`}
                      value={entry.positions.texts[r]}
                      onChange={(e) => setPosition(r, e.target.value)}
                    />
                  </td>
                )}
                {entry.columns.map((c, j) => (
                  <td key={c} className="p-1">
                    <div className="flex gap-1">
                      <input
                        inputMode="decimal"
                        autoComplete="off"
                        className={`field-input num ${signed ? "w-20" : "w-24"}`}
                        aria-label={`${row}, ${c} (${unitText(entry.unit)})`}
                        value={entry.texts[r][j]}
                        onChange={(e) => setCell(r, j, e.target.value)}
                        {...errorProps(name, error)}
                      />
                      {signed && (
                        <SignToggle
                          field={`${row}, ${c}`}
                          value={entry.texts[r][j]}
                          onChange={(text) => setCell(r, j, text)}
                        />
                      )}
                    </div>
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          className="btn"
          onClick={() => onChange(resizeGrid(entry, entry.rows.length + 1))}
        >
          Add a station
        </button>
        <button
          type="button"
          className="btn"
          disabled={entry.rows.length <= 1}
          onClick={() => onChange(resizeGrid(entry, entry.rows.length - 1))}
        >
          Remove the last station
        </button>
      </div>
      <FieldError name={name} error={error} />
    </fieldset>
  );
}

function ListField({
  name,
  spec,
  entry,
  error,
  onChange,
}: EntryFieldProps & { entry: Extract<Entry, { shape: "list" }> }) {
  return (
    <fieldset className="flex flex-col gap-2" id={fieldId(name)}>
      <legend className="font-bold">{labelOf(spec)}</legend>
      <div className="flex flex-wrap items-center gap-2">
        {entry.texts.map((text, i) => (
          <input
            key={i}
            inputMode="decimal"
            autoComplete="off"
            className="field-input num w-28"
            aria-label={`${spec.label}: ${i + 1}`}
            value={text}
            onChange={(e) =>
              onChange({ ...entry, texts: entry.texts.map((t, j) => (j === i ? e.target.value : t)) })
            }
            {...errorProps(name, error)}
          />
        ))}
        <UnitPicker
          name={name}
          label={spec.label}
          spec={spec}
          unit={entry.unit}
          onPick={(unit) => onChange(withUnit(entry, unit))}
        />
      </div>
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          className="btn"
          onClick={() => onChange({ ...entry, texts: [...entry.texts, ""] })}
        >
          Add one more
        </button>
        <button
          type="button"
          className="btn"
          disabled={entry.texts.length <= 1}
          onClick={() => onChange({ ...entry, texts: entry.texts.slice(0, -1) })}
        >
          Remove the last
        </button>
      </div>
      <FieldError name={name} error={error} />
    </fieldset>
  );
}

function TextField({
  calcName,
  name,
  spec,
  entry,
  error,
  onChange,
}: EntryFieldProps & { entry: Extract<Entry, { shape: "text" }> }) {
  const choices = textChoices[`${calcName}.${name}`];
  if (choices?.only) {
    return (
      <fieldset className="flex flex-col gap-2" id={fieldId(name)}>
        <legend className="font-bold">{labelOf(spec)}</legend>
        <div className="flex flex-wrap gap-2">
          {choices.options.map((option) => (
            <button
              key={option}
              type="button"
              aria-pressed={entry.text === option}
              className={entry.text === option ? "btn btn-primary" : "btn"}
              onClick={() => onChange({ ...entry, text: option })}
            >
              {option}
            </button>
          ))}
        </div>
        <FieldError name={name} error={error} />
      </fieldset>
    );
  }
  return (
    <Field id={fieldId(name)} label={labelOf(spec)} errors={error ? [error] : undefined}>
      <input
        id={fieldId(name)}
        autoComplete="off"
        autoCapitalize="off"
        spellCheck={false}
        className="field-input"
        list={choices ? `${fieldId(name)}-choices` : undefined}
        value={entry.text}
        onChange={(e) => onChange({ ...entry, text: e.target.value })}
        {...errorProps(name, error)}
      />
      {choices && (
        <datalist id={`${fieldId(name)}-choices`}>
          {choices.options.map((option) => (
            <option key={option} value={option} />
          ))}
        </datalist>
      )}
    </Field>
  );
}

/** The same error line as Field's, for the grouped editors. */
function FieldError({ name, error }: { name: string; error?: string }) {
  if (!error) return null;
  return (
    <p id={`${fieldId(name)}-error`} role="alert" className="flex items-start gap-2 font-bold text-fault">
      <span aria-hidden="true">▲</span>
      <span>{error}</span>
    </p>
  );
}
