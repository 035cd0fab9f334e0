import { useEffect, useRef, useState } from "react";
import { OutcomeValues } from "~/components/calculators/outcome-values";
import type { Unit } from "~/lib/calc/units";
import { useDirtyMark } from "~/lib/pwa/dirty";
import { readNumber } from "~/lib/read-number";
import {
  acceptedUnits,
  liveAttempts,
  takesNegative,
  unitSymbol,
  type CalcValue,
  type CheckValue,
  type ChoiceItem,
  type ChoiceValue,
  type InitialsValue,
  type Item,
  type MeasureItem,
  type MeasureValue,
  type ReadingsAttempt,
  type ReadingsItem,
  type ReadingsValue,
  type Responses,
  type Template,
  type TextValue,
  type Verdict,
} from "~/lib/templates";
import { LocalTime } from "~/components/local-time";
import { SignToggle } from "~/components/signed-input";
import { AttemptLog } from "./attempt-log.tsx";
import { attemptFigure } from "./attempt-figure.ts";

export interface EditorProps<I extends Item = Item> {
  item: I;
  value: unknown;
  verdict: Verdict;
  by: string;
  disabled: boolean;
  onSave: (value: unknown) => void;
  /** The checklist around the item: a set of readings is summed up by the calculation that reads it. */
  template: Template;
  responses?: Responses;
}

const now = () => new Date().toISOString();

/** The unit a reading is entered in, among those the item accepts (fixed when there is one). */
function UnitField({
  id,
  units,
  unit,
  disabled,
  onChange,
}: {
  id: string;
  units: readonly Unit[];
  unit: Unit;
  disabled: boolean;
  onChange: (unit: Unit) => void;
}) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        Unit
      </label>
      <select
        id={id}
        className="field-input w-28"
        value={unit}
        disabled={disabled || units.length === 1}
        onChange={(e) => onChange(e.target.value as Unit)}
      >
        {units.map((u) => (
          <option key={u} value={u}>
            {unitSymbol(u)}
          </option>
        ))}
      </select>
    </div>
  );
}
const choiceButton = (active: boolean) => `btn ${active ? "btn-primary" : ""}`;

function NoteField({
  id,
  label,
  note,
  disabled,
  onSave,
}: {
  id: string;
  label: string;
  note?: string;
  disabled: boolean;
  onSave: (note: string) => void;
}) {
  const [text, setText] = useState(note ?? "");
  useDirtyMark(id, text !== (note ?? ""));
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      <textarea
        id={id}
        className="field-input"
        rows={2}
        value={text}
        disabled={disabled}
        onChange={(e) => setText(e.target.value)}
      />
      <div>
        <button
          type="button"
          className="btn"
          disabled={disabled || text === (note ?? "")}
          onClick={() => onSave(text)}
        >
          Save note
        </button>
      </div>
    </div>
  );
}

export function CheckEditor({ item, value, verdict, disabled, onSave }: EditorProps) {
  const v = value as CheckValue | undefined;
  const options: [CheckValue["result"], string][] = [
    ["pass", "✓ Pass"],
    ["fail", "✕ Fail"],
    ["na", "– Not applicable"],
  ];
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap gap-2" role="group" aria-label={`${item.label}: result`}>
        {options.map(([result, label]) => (
          <button
            key={result}
            type="button"
            aria-pressed={v?.result === result}
            className={choiceButton(v?.result === result)}
            disabled={disabled}
            onClick={() => onSave({ result, ...(v?.note ? { note: v.note } : {}) })}
          >
            {label}
          </button>
        ))}
      </div>
      {v && (
        <NoteField
          id={`${item.key}-note`}
          label={v.result === "pass" ? "Note (optional)" : "Note (required: what was found, what was done)"}
          note={v.note}
          disabled={disabled}
          onSave={(note) => onSave({ ...v, note })}
        />
      )}
      {verdict.finding && !v?.note && <p className="text-sm">A fail or not-applicable needs a note.</p>}
    </div>
  );
}

/** The note every measurement can carry whatever its verdict; required (a corrective action) when out of range. */
function MeasurementNote({
  item,
  value,
  verdict,
  disabled,
  onSave,
}: {
  item: Item;
  value: { note?: string } | undefined;
  verdict: Verdict;
  disabled: boolean;
  onSave: (note: string) => void;
}) {
  if (!value) return null;
  return (
    <NoteField
      id={`${item.key}-note`}
      label={
        verdict.finding === "out-of-range"
          ? "Corrective action (required: what was done about it)"
          : "Note (optional: what explains this reading)"
      }
      note={value.note}
      disabled={disabled}
      onSave={onSave}
    />
  );
}

export function MeasureEditor({
  item,
  value,
  verdict,
  by,
  disabled,
  onSave,
  template,
  responses,
}: EditorProps<MeasureItem>) {
  const v = value as MeasureValue | undefined;
  const units = acceptedUnits(item);
  const [text, setText] = useState("");
  const [unit, setUnit] = useState<Unit>(v?.attempts.at(-1)?.unit ?? item.unit);
  const [error, setError] = useState<string | null>(null);
  useDirtyMark(`${item.key}-reading`, text !== "");
  function record() {
    const reading = readNumber(text);
    if (reading === null) return setError("Enter the reading as a number, like 0.002.");
    setError(null);
    setText("");
    onSave({
      ...v,
      attempts: [...(v?.attempts ?? []), { id: crypto.randomUUID(), value: reading, unit, at: now(), by }],
    });
  }
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-2">
        <div className="flex flex-col gap-1">
          <label htmlFor={`${item.key}-value`} className="font-bold">
            Reading
          </label>
          <div className="flex gap-1">
            <input
              id={`${item.key}-value`}
              inputMode="decimal"
              enterKeyHint="done"
              autoComplete="off"
              className="field-input num w-40"
              value={text}
              disabled={disabled}
              aria-invalid={error ? true : undefined}
              aria-describedby={error ? `${item.key}-value-error` : undefined}
              onChange={(e) => setText(e.target.value)}
              onKeyDown={(e) => e.key === "Enter" && record()}
            />
            {takesNegative(item) && (
              <SignToggle
                field={`${item.label}: reading`}
                value={text}
                disabled={disabled}
                onChange={setText}
              />
            )}
          </div>
        </div>
        <UnitField id={`${item.key}-unit`} units={units} unit={unit} disabled={disabled} onChange={setUnit} />
        <button type="button" className="btn btn-primary" disabled={disabled || !text} onClick={record}>
          {v?.attempts.length ? "Record a new attempt" : "Record reading"}
        </button>
      </div>
      {error && (
        <p id={`${item.key}-value-error`} role="alert" className="font-bold text-fault">
          ▲ {error}
        </p>
      )}
      {v && v.attempts.length > 0 && (
        <AttemptLog
          noun="Attempt"
          attempts={v.attempts.map((a) => ({
            ...a,
            ...attemptFigure(item, a, template, responses ?? {}),
          }))}
          strikes={v.strikes}
          by={by}
          disabled={disabled}
          onStrike={(strike) => onSave({ ...v, strikes: [...(v.strikes ?? []), strike] })}
        />
      )}
      <MeasurementNote
        item={item}
        value={v}
        verdict={verdict}
        disabled={disabled}
        onSave={(note) => onSave({ ...v, note })}
      />
    </div>
  );
}

/** A set of readings as its grid, for the "The readings" details of a logged set. */
function RawGrid({ item, attempt }: { item: ReadingsItem; attempt: ReadingsAttempt }) {
  return (
    <table className="my-1 border-collapse text-sm">
      <thead>
        <tr>
          <th></th>
          {item.columns.map((c) => (
            <th key={c.key} scope="col" className="px-2 text-right">
              {c.label}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {item.rows.map((row, r) => (
          <tr key={row.key}>
            <th scope="row" className="pr-2 text-left">
              {row.label}
            </th>
            {item.columns.map((c, ci) => (
              <td key={c.key} className="num px-2 text-right">
                {attempt.cells[r]?.[ci] ?? "–"}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
      <caption className="caption-bottom text-left">in {unitSymbol(attempt.unit)}</caption>
    </table>
  );
}

/**
 * A grid of readings, entered fast: Enter (or the keypad's Next) goes to the next cell in reading
 * order, row by row, and on the last cell records the set — so a gauge that types its reading
 * and Enter fills the grid with no touch. A new set starts empty with the focus in its first
 * cell, or from the last set, to change only the cells that moved.
 */
export function ReadingsEditor({
  item,
  value,
  verdict,
  by,
  disabled,
  onSave,
  template,
  responses,
}: EditorProps<ReadingsItem>) {
  const v = value as ReadingsValue | undefined;
  const lastLive = v ? liveAttempts(v).at(-1) : undefined;
  const units = acceptedUnits(item);
  const columns = item.columns.length;
  const total = item.rows.length * columns;
  const signed = takesNegative(item);
  const [unit, setUnit] = useState<Unit>(v?.attempts.at(-1)?.unit ?? item.unit);
  const empty = () => item.rows.map(() => item.columns.map(() => ""));
  const [cells, setCells] = useState<string[][]>(empty);
  const [error, setError] = useState<string | null>(null);
  const grid = useRef<HTMLTableElement>(null);
  // Set when this screen records a set; once the set is saved the grid empties for the next one.
  const recorded = useRef(false);
  const count = v?.attempts.length ?? 0;
  useDirtyMark(
    `${item.key}-grid`,
    cells.some((row) => row.some((cell) => cell !== "")),
  );
  const offending = new Set((verdict.offending ?? []).map((o) => `${o.row}:${o.column ?? "*"}`));

  const cell = (index: number) => grid.current?.querySelector<HTMLInputElement>(`[data-cell="${index}"]`);
  const focusCell = (index: number) => cell(Math.min(Math.max(index, 0), total - 1))?.focus();

  useEffect(() => {
    if (!recorded.current) return;
    recorded.current = false;
    setCells(empty());
    // A new set starts here: focus its first cell, ready for the next reading.
    requestAnimationFrame(() => focusCell(0));
    // eslint-disable-next-line react-hooks/exhaustive-deps -- runs when a set is saved, not when the grid's shape is re-read
  }, [count]);

  function put(r: number, c: number, text: string) {
    setCells((all) => all.map((line, i) => (i === r ? line.map((old, j) => (j === c ? text : old)) : line)));
  }

  function startFromLast() {
    if (!lastLive) return;
    setUnit(lastLive.unit);
    setCells(item.rows.map((_, r) => item.columns.map((__, c) => String(lastLive.cells[r]?.[c] ?? ""))));
    requestAnimationFrame(() => focusCell(0));
  }

  function record() {
    const numbers = cells.map((row) => row.map(readNumber));
    const missing = numbers.flatMap((row, r) =>
      row.flatMap((n, c) =>
        n === null
          ? [{ index: r * columns + c, name: `${item.rows[r]!.label} / ${item.columns[c]!.label}` }]
          : [],
      ),
    );
    if (missing.length) {
      setError(
        `Fill every cell with a number; missing or not a number: ${missing
          .slice(0, 4)
          .map((m) => m.name)
          .join(", ")}${missing.length > 4 ? "…" : ""}.`,
      );
      return focusCell(missing[0]!.index);
    }
    setError(null);
    recorded.current = true;
    onSave({
      ...v,
      attempts: [...(v?.attempts ?? []), { id: crypto.randomUUID(), cells: numbers, unit, at: now(), by }],
    });
  }

  function onKeyDown(e: React.KeyboardEvent<HTMLInputElement>, index: number) {
    if (e.key !== "Enter") return;
    e.preventDefault();
    if (index < total - 1) focusCell(index + 1);
    else record();
  }

  return (
    <div className="flex flex-col gap-3">
      <div className="overflow-x-auto">
        <table className="border-collapse" ref={grid}>
          <thead>
            <tr>
              <th className="p-1"></th>
              {item.columns.map((c) => (
                <th key={c.key} scope="col" className="p-1 text-sm">
                  {c.label}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {item.rows.map((row, r) => (
              <tr key={row.key}>
                <th scope="row" className="p-1 pr-2 text-left text-sm">
                  {row.label}
                </th>
                {item.columns.map((col, c) => {
                  const bad = offending.has(`${r}:${c}`) || offending.has(`${r}:*`);
                  const index = r * columns + c;
                  const name = `${row.label}, ${col.label} (${unitSymbol(unit)})`;
                  return (
                    <td key={col.key} className="p-1">
                      <div className="flex gap-1">
                        <input
                          aria-label={name}
                          data-cell={index}
                          inputMode="decimal"
                          enterKeyHint={index === total - 1 ? "done" : "next"}
                          autoComplete="off"
                          className={`field-input num ${signed ? "w-20" : "w-24"}`}
                          aria-invalid={bad || undefined}
                          disabled={disabled}
                          value={cells[r]![c]!}
                          onFocus={(e) => e.currentTarget.select()}
                          onKeyDown={(e) => onKeyDown(e, index)}
                          onChange={(e) => put(r, c, e.target.value)}
                        />
                        {signed && (
                          <SignToggle
                            field={name}
                            value={cells[r]![c]!}
                            disabled={disabled}
                            onChange={(text) => put(r, c, text)}
                          />
                        )}
                      </div>
                      {bad && <span className="sr-only">outside limit</span>}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap items-end gap-2">
        <UnitField id={`${item.key}-unit`} units={units} unit={unit} disabled={disabled} onChange={setUnit} />
        {lastLive && (
          <button type="button" className="btn" disabled={disabled} onClick={startFromLast}>
            Start from the last set
          </button>
        )}
        <button type="button" className="btn btn-primary" disabled={disabled} onClick={record}>
          {v?.attempts.length ? "Record a new set of readings" : "Record readings"}
        </button>
      </div>
      {error && (
        <p role="alert" className="font-bold text-fault">
          ▲ {error}
        </p>
      )}
      {v && v.attempts.length > 0 && (
        <AttemptLog
          noun="Set"
          attempts={v.attempts.map((a) => {
            const shown = attemptFigure(item, a, template, responses ?? {});
            return { ...a, ...shown, raw: <RawGrid item={item} attempt={a} /> };
          })}
          strikes={v.strikes}
          by={by}
          disabled={disabled}
          onStrike={(strike) => onSave({ ...v, strikes: [...(v.strikes ?? []), strike] })}
        />
      )}
      <MeasurementNote
        item={item}
        value={v}
        verdict={verdict}
        disabled={disabled}
        onSave={(note) => onSave({ ...v, note })}
      />
    </div>
  );
}

export function ChoiceEditor({ item, value, verdict, disabled, onSave }: EditorProps<ChoiceItem>) {
  const v = value as ChoiceValue | undefined;
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap gap-2" role="group" aria-label={item.label}>
        {item.options.map((o) => (
          <button
            key={o.key}
            type="button"
            aria-pressed={v?.option === o.key}
            className={choiceButton(v?.option === o.key)}
            disabled={disabled}
            onClick={() => onSave({ option: o.key, ...(v?.note ? { note: v.note } : {}) })}
          >
            {o.label}
          </button>
        ))}
      </div>
      {v && (verdict.finding || v.note) && (
        <NoteField
          id={`${item.key}-note`}
          label="Note"
          note={v.note}
          disabled={disabled}
          onSave={(note) => onSave({ ...v, note })}
        />
      )}
    </div>
  );
}

export function TextEditor({ item, value: stored, disabled, onSave }: EditorProps) {
  const value = stored as TextValue | undefined;
  const [text, setText] = useState<string>(value?.text ?? "");
  useDirtyMark(`${item.key}-text`, text !== (value?.text ?? ""));
  return (
    <div className="flex flex-col gap-2">
      <label htmlFor={`${item.key}-text`} className="sr-only">
        {item.label}
      </label>
      <textarea
        id={`${item.key}-text`}
        className="field-input"
        rows={3}
        value={text}
        disabled={disabled}
        onChange={(e) => setText(e.target.value)}
      />
      <div>
        <button
          type="button"
          className="btn btn-primary"
          disabled={disabled || text === (value?.text ?? "")}
          onClick={() => onSave({ text })}
        >
          Save
        </button>
      </div>
    </div>
  );
}

export function InitialsEditor({ item, value: stored, by, disabled, onSave }: EditorProps) {
  const value = stored as InitialsValue | undefined;
  const [initials, setInitials] = useState("");
  const [error, setError] = useState<string | null>(null);
  if (value)
    return (
      <p className="font-bold">
        Confirmed by {value.initials} ({value.by}), <LocalTime at={value.at} />.
      </p>
    );
  return (
    <div className="flex flex-wrap items-end gap-2">
      <div className="flex flex-col gap-1">
        <label htmlFor={`${item.key}-initials`} className="font-bold">
          Your initials
        </label>
        <input
          id={`${item.key}-initials`}
          className="field-input w-32 uppercase"
          maxLength={8}
          value={initials}
          disabled={disabled}
          onChange={(e) => setInitials(e.target.value)}
        />
      </div>
      <button
        type="button"
        className="btn btn-primary"
        disabled={disabled}
        onClick={() => {
          if (!initials.trim()) return setError("Type your initials to confirm this step.");
          onSave({ initials: initials.trim().toUpperCase(), at: now(), by });
        }}
      >
        Confirm
      </button>
      {error && (
        <p role="alert" className="w-full font-bold text-fault">
          ▲ {error}
        </p>
      )}
    </div>
  );
}

export function CalcPanel({
  item,
  value: stored,
  verdict,
  disabled,
  onSave,
  diagram,
}: EditorProps & { diagram?: React.ReactNode }) {
  const value = stored as CalcValue | undefined;
  const outcome = verdict.outcome;
  return (
    <div className="flex flex-col gap-3">
      {outcome ? (
        <>
          <OutcomeValues outcome={outcome} size="small" />
          <p className="text-sm">
            <strong>Rule: </strong>
            {outcome.rule}
          </p>
          {diagram}
        </>
      ) : (
        <p className="text-ink-soft">Computed once its inputs are entered.</p>
      )}
      {(verdict.finding || value?.note || outcome) && (
        <NoteField
          id={`${item.key}-note`}
          label={verdict.finding ? "Corrective action" : "Note (optional)"}
          note={value?.note}
          disabled={disabled}
          onSave={(note) => onSave({ note })}
        />
      )}
    </div>
  );
}
