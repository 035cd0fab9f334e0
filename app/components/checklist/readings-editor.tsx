import { useEffect, useRef, useState } from "react";
import type { Unit } from "~/lib/calc/units";
import { useDirtyMark } from "~/lib/pwa/dirty";
import { readNumber } from "~/lib/read-number";
import {
  acceptedUnits,
  liveAttempts,
  takesNegative,
  unitSymbol,
  type ReadingsAttempt,
  type ReadingsItem,
  type ReadingsValue,
} from "~/lib/templates";
import { SignToggle } from "~/components/signed-input";
import { attemptFigure } from "./attempt-figure.ts";
import { useCalculations } from "./calculations-context.ts";
import { AttemptsLogged, MeasurementNote, now, UnitField, type EditorProps } from "./editors.tsx";

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
  const calculations = useCalculations();
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
        <AttemptsLogged
          noun="Set"
          attempts={v.attempts.map((a) => ({
            ...a,
            ...attemptFigure(item, a, template, responses ?? {}, calculations),
            raw: <RawGrid item={item} attempt={a} />,
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
