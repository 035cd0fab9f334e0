import { OutcomeValues } from "~/components/calculators/outcome-values";
import type { CalcValue } from "~/lib/templates";
import { NoteField, type EditorProps } from "./editors.tsx";

/** A calculation's result in the checklist: its figures, the rule it applied, its diagram and a note. */
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
