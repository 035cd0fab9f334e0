import { useState } from "react";
import { OutcomeValues } from "~/components/calculators/outcome-values";
import type { Unit } from "~/lib/calc/units";
import { useDirtyMark } from "~/lib/pwa/dirty";
import { readNumber } from "~/lib/read-number";
import {
  acceptedUnits,
  formatQuantity,
  unitSymbol,
  type CalcValue,
  type CheckValue,
  type ChoiceItem,
  type ChoiceValue,
  type InitialsValue,
  type Item,
  type MeasureItem,
  type MeasureValue,
  type ReadingsItem,
  type ReadingsValue,
  type TextValue,
  type Verdict,
} from "~/lib/templates";
import { LocalTime } from "~/components/local-time";

export interface EditorProps<I extends Item = Item> {
  item: I;
  value: unknown;
  verdict: Verdict;
  by: string;
  disabled: boolean;
  onSave: (value: unknown) => void;
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

export function MeasureEditor({ item, value, verdict, by, disabled, onSave }: EditorProps<MeasureItem>) {
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
      attempts: [...(v?.attempts ?? []), { id: crypto.randomUUID(), value: reading, unit, at: now(), by }],
      ...(v?.note ? { note: v.note } : {}),
    });
  }
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-2">
        <div className="flex flex-col gap-1">
          <label htmlFor={`${item.key}-value`} className="font-bold">
            Reading
          </label>
          <input
            id={`${item.key}-value`}
            inputMode="decimal"
            autoComplete="off"
            className="field-input num w-40"
            value={text}
            disabled={disabled}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? `${item.key}-value-error` : undefined}
            onChange={(e) => setText(e.target.value)}
            onKeyDown={(e) => e.key === "Enter" && record()}
          />
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
        <Attempts
          attempts={v.attempts.map((a) => ({ text: formatQuantity(a.value, a.unit), by: a.by, at: a.at }))}
        />
      )}
      {v && (verdict.finding === "out-of-range" || v.note) && (
        <NoteField
          id={`${item.key}-note`}
          label="Corrective action"
          note={v.note}
          disabled={disabled}
          onSave={(note) => onSave({ ...v, note })}
        />
      )}
    </div>
  );
}

function Attempts({ attempts }: { attempts: { text: string; by: string; at: string }[] }) {
  return (
    <table className="w-full max-w-xl border-collapse text-sm" data-testid="attempts">
      <caption className="text-left font-bold">Attempts (the last is reported)</caption>
      <tbody>
        {attempts.map((a, i) => (
          <tr
            key={i}
            className={`border-b border-rule ${i === attempts.length - 1 ? "font-bold" : "text-ink-soft"}`}
          >
            <td className="py-1 pr-2">#{i + 1}</td>
            <td className="num py-1 pr-2">{a.text}</td>
            <td className="py-1 pr-2">{a.by}</td>
            <td className="py-1">
              <LocalTime at={a.at} />
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export function ReadingsEditor({ item, value, verdict, by, disabled, onSave }: EditorProps<ReadingsItem>) {
  const v = value as ReadingsValue | undefined;
  const last = v?.attempts.at(-1);
  const units = acceptedUnits(item);
  const [unit, setUnit] = useState<Unit>(last?.unit ?? item.unit);
  const blank = () =>
    item.rows.map((_, r) =>
      item.columns.map((__, c) => ((last?.cells[r]?.[c] ?? "") === "" ? "" : String(last!.cells[r]![c]))),
    );
  const [cells, setCells] = useState<string[][]>(blank);
  const [error, setError] = useState<string | null>(null);
  const offending = new Set((verdict.offending ?? []).map((o) => `${o.row}:${o.column ?? "*"}`));
  function record() {
    const numbers = cells.map((row) => row.map(readNumber));
    const missing = numbers
      .flatMap((row, r) =>
        row.map((n, c) => (n === null ? `${item.rows[r]!.label} / ${item.columns[c]!.label}` : null)),
      )
      .filter(Boolean);
    if (missing.length)
      return setError(
        `Fill every cell with a number; missing or not a number: ${missing.slice(0, 4).join(", ")}${missing.length > 4 ? "…" : ""}.`,
      );
    setError(null);
    onSave({
      attempts: [...(v?.attempts ?? []), { id: crypto.randomUUID(), cells: numbers, unit, at: now(), by }],
      ...(v?.note ? { note: v.note } : {}),
    });
  }
  return (
    <div className="flex flex-col gap-3">
      <div className="overflow-x-auto">
        <table className="border-collapse">
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
                  return (
                    <td key={col.key} className="p-1">
                      <input
                        aria-label={`${row.label}, ${col.label} (${unitSymbol(unit)})`}
                        inputMode="decimal"
                        autoComplete="off"
                        className="field-input num w-24"
                        aria-invalid={bad || undefined}
                        disabled={disabled}
                        value={cells[r]![c]!}
                        onChange={(e) =>
                          setCells((all) =>
                            all.map((line, i) =>
                              i === r ? line.map((cell, j) => (j === c ? e.target.value : cell)) : line,
                            ),
                          )
                        }
                      />
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
        <button type="button" className="btn btn-primary" disabled={disabled} onClick={record}>
          {v?.attempts.length ? "Record a new set of readings" : "Record readings"}
        </button>
      </div>
      {error && (
        <p role="alert" className="font-bold text-fault">
          ▲ {error}
        </p>
      )}
      {v && v.attempts.length > 1 && (
        <Attempts
          attempts={v.attempts.map((a) => ({
            text:
              a.cells.map((row) => row.map((n) => (n === null ? "–" : String(n))).join(" ")).join(" | ") +
              ` ${unitSymbol(a.unit)}`,
            by: a.by,
            at: a.at,
          }))}
        />
      )}
      {v && (verdict.finding === "out-of-range" || v.note) && (
        <NoteField
          id={`${item.key}-note`}
          label="Corrective action"
          note={v.note}
          disabled={disabled}
          onSave={(note) => onSave({ ...v, note })}
        />
      )}
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
      {(verdict.finding || value?.note) && (
        <NoteField
          id={`${item.key}-note`}
          label="Corrective action"
          note={value?.note}
          disabled={disabled}
          onSave={(note) => onSave({ note })}
        />
      )}
    </div>
  );
}
