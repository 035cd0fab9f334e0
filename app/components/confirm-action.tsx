/**
 * A step that cannot be undone asks twice: the first button opens the consequence and a second
 * "Yes, …" button that does it. Built on <details>, so it works before the scripts load and
 * without them; the yes-button submits whichever form it sits in.
 */
export function ConfirmAction({
  label,
  yes,
  consequence,
  name = "intent",
  value,
  danger = false,
  testId,
}: {
  label: string;
  yes: string;
  consequence: React.ReactNode;
  name?: string;
  value: string;
  danger?: boolean;
  testId?: string;
}) {
  return (
    <details className="group" data-testid={testId}>
      <summary className="btn">{label}…</summary>
      <div
        role="group"
        aria-label={`Confirm: ${label}`}
        className="mt-2 flex max-w-md flex-col gap-2 rounded-md border-2 border-brass bg-card p-3"
      >
        <p>{consequence}</p>
        <div className="flex flex-wrap gap-2">
          <button
            type="submit"
            name={name}
            value={value}
            className={`btn ${danger ? "btn-danger" : "btn-primary"}`}
          >
            Yes, {yes}
          </button>
        </div>
      </div>
    </details>
  );
}
