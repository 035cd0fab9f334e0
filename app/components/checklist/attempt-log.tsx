import { useState } from "react";
import { LocalTime } from "~/components/local-time";
import { strikeOf, type Strike, type Verdict } from "~/lib/templates";

export interface LoggedAttempt {
  id?: string;
  /** The figure that matters, in one line (the value, or a set's TIR with its verdict). */
  figure: string;
  verdict: Verdict;
  by: string;
  at: string;
  /** The raw entry, shown on demand (a set of readings' grid). */
  raw?: React.ReactNode;
}

const verdictWord = (v: Verdict) =>
  v.status === "ok" ? "✓ within" : v.status === "out-of-range" || v.finding ? "▲ outside" : "";

/**
 * Every attempt of an item, oldest first, one line each; the last one not struck is reported. A
 * mistaken attempt is struck through with a reason: it stays here, struck, with who and when.
 */
export function AttemptLog({
  noun,
  attempts,
  strikes,
  by,
  disabled,
  onStrike,
}: {
  noun: "Attempt" | "Set";
  attempts: LoggedAttempt[];
  strikes?: Strike[];
  by: string;
  disabled: boolean;
  onStrike?: (strike: Strike) => void;
}) {
  const [striking, setStriking] = useState<string | null>(null);
  const [reason, setReason] = useState("");
  const value = { strikes };
  const reported = attempts.findLast((a) => !strikeOf(value, a));
  return (
    <div className="flex flex-col gap-2">
      <table className="w-full max-w-2xl border-collapse text-sm" data-testid="attempts">
        <caption className="text-left font-bold">
          {noun === "Set" ? "Sets of readings" : "Attempts"} (the last one not struck through is reported)
        </caption>
        <tbody>
          {attempts.map((a, i) => {
            const strike = strikeOf(value, a);
            return (
              <tr
                key={a.id ?? i}
                className={`border-b border-rule align-top ${a === reported ? "font-bold" : "text-ink-soft"}`}
                data-struck={strike ? "true" : undefined}
              >
                <td className="py-1 pr-2">#{i + 1}</td>
                <td className="py-1 pr-2">
                  <span className={`num ${strike ? "line-through" : ""}`}>{a.figure}</span>
                  {!strike && verdictWord(a.verdict) && <span> {verdictWord(a.verdict)}</span>}
                  {strike && (
                    <span className="block font-normal text-ink" data-testid="strike">
                      Struck through by {strike.by}, <LocalTime at={strike.at} />: {strike.reason}
                    </span>
                  )}
                  {a.raw && (
                    <details className="font-normal">
                      <summary className="cursor-pointer py-1 text-harbour underline">The readings</summary>
                      {a.raw}
                    </details>
                  )}
                </td>
                <td className="py-1 pr-2">{a.by}</td>
                <td className="py-1 pr-2">
                  <LocalTime at={a.at} />
                </td>
                <td className="py-1">
                  {onStrike && a.id && !strike && !disabled && (
                    <button
                      type="button"
                      className="btn text-sm"
                      aria-label={`Strike ${noun.toLowerCase()} ${i + 1} through`}
                      onClick={() => {
                        setStriking(a.id!);
                        setReason("");
                      }}
                    >
                      Strike through
                    </button>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {striking && onStrike && (
        <form
          className="flex flex-wrap items-end gap-2 rounded-md border-2 border-brass p-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (!reason.trim()) return;
            onStrike({ attempt: striking, reason: reason.trim(), at: new Date().toISOString(), by });
            setStriking(null);
          }}
        >
          <div className="flex grow flex-col gap-1">
            <label htmlFor={`strike-${striking}`} className="font-bold">
              Why is {noun.toLowerCase()} {attempts.findIndex((a) => a.id === striking) + 1} struck through?
            </label>
            <input
              id={`strike-${striking}`}
              className="field-input"
              maxLength={500}
              value={reason}
              autoComplete="off"
              onChange={(e) => setReason(e.target.value)}
            />
          </div>
          <button type="submit" className="btn btn-primary" disabled={!reason.trim()}>
            Strike it through
          </button>
          <button type="button" className="btn" onClick={() => setStriking(null)}>
            Cancel
          </button>
        </form>
      )}
    </div>
  );
}
