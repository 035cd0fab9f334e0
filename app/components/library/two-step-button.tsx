import { useState, type ReactNode } from "react";

/**
 * A button that asks once more before doing something that cannot be taken back (publish,
 * retire, discard, remove). The first press shows what will happen and the real button.
 */
export function TwoStepButton({
  label,
  confirmLabel,
  children,
  danger = false,
  onConfirm,
  submit,
}: {
  label: string;
  confirmLabel: string;
  /** What will happen, said before the second press. */
  children?: ReactNode;
  danger?: boolean;
  /** Called on the second press, unless the second button submits a form. */
  onConfirm?: () => void;
  /** name/value of the submit button when it sits in a form. */
  submit?: { name: string; value: string };
}) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <button
        type="button"
        className={danger ? "btn border-fault text-fault" : "btn"}
        onClick={() => setAsking(true)}
      >
        {label}
      </button>
    );
  }
  return (
    <div
      role="group"
      aria-label={label}
      className={`flex w-full flex-col gap-3 rounded-md border-2 p-3 ${danger ? "border-fault bg-fault-light" : "border-harbour bg-card"}`}
    >
      {children}
      <div className="flex flex-wrap gap-2">
        <button
          type={submit ? "submit" : "button"}
          name={submit?.name}
          value={submit?.value}
          className={danger ? "btn btn-danger" : "btn btn-primary"}
          onClick={
            submit
              ? undefined
              : () => {
                  setAsking(false);
                  onConfirm?.();
                }
          }
        >
          {confirmLabel}
        </button>
        <button type="button" className="btn" onClick={() => setAsking(false)}>
          Cancel
        </button>
      </div>
    </div>
  );
}
