import { lazy, Suspense, useState } from "react";
import type { Unit } from "~/lib/calc/units";
import { useDirtyMark } from "~/lib/pwa/dirty";
import { readNumber } from "~/lib/read-number";
import {
  acceptedUnits,
  takesNegative,
  unitSymbol,
  type CheckValue,
  type ChoiceItem,
  type ChoiceValue,
  type InitialsValue,
  type Item,
  type MeasureItem,
  type MeasureValue,
  type Responses,
  type Template,
  type TextValue,
  type Verdict,
  type Strike,
} from "~/lib/templates";
import { LocalTime } from "~/components/local-time";
import { SignToggle } from "~/components/signed-input";
import { attemptFigure } from "./attempt-figure.ts";
import { useCalculations } from "./calculations-context.ts";
import type { LoggedAttempt } from "./attempt-log.tsx";

// The attempt log (figures, raw readings, strike-through) loads once an item has an attempt.
const AttemptLog = lazy(() => import("./attempt-log.tsx").then((m) => ({ default: m.AttemptLog })));

/**
 * An item's attempts as a log (each with its figure), where a mistaken one is struck through: the
 * strike is appended to the item's strikes, never replacing one (docs/sync-merge-rules.md).
 */
export function AttemptsLogged<V extends { attempts: unknown[]; strikes?: Strike[] }>({
  noun,
  attempts,
  value,
  by,
  disabled,
  onSave,
}: {
  noun: "Attempt" | "Set";
  attempts: LoggedAttempt[];
  value: V;
  by: string;
  disabled: boolean;
  onSave: (value: V) => void;
}) {
  return (
    <Suspense fallback={null}>
      <AttemptLog
        noun={noun}
        attempts={attempts}
        strikes={value.strikes}
        by={by}
        disabled={disabled}
        onStrike={(strike) => onSave({ ...value, strikes: [...(value.strikes ?? []), strike] })}
      />
    </Suspense>
  );
}

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

export const now = () => new Date().toISOString();

/** The unit a reading is entered in, among those the item accepts (fixed when there is one). */
export function UnitField({
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

export function NoteField({
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
export function MeasurementNote({
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
  const calculations = useCalculations();
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
        <AttemptsLogged
          noun="Attempt"
          attempts={v.attempts.map((a) => ({
            ...a,
            ...attemptFigure(item, a, template, responses ?? {}, calculations),
          }))}
          value={v}
          by={by}
          disabled={disabled}
          onSave={onSave}
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
