/** A typed number with its sign flipped: "" → "-", "-0.002" → "0.002", "0.002" → "-0.002". */
export function flipSign(text: string): string {
  const t = text.trim();
  if (t.startsWith("-")) return t.slice(1);
  return `-${t.startsWith("+") ? t.slice(1) : t}`;
}

/**
 * The ± toggle beside a signed field: many tablets' decimal keypads have no minus key. A 48 px
 * target; out of the tab order so Tab and Enter still go from field to field (typing "-" works too).
 */
export function SignToggle({
  field,
  value,
  disabled,
  onChange,
}: {
  /** What the field is, for the button's name ("Change the sign of …"). */
  field: string;
  value: string;
  disabled?: boolean;
  onChange: (value: string) => void;
}) {
  return (
    <button
      type="button"
      tabIndex={-1}
      className="btn px-0 text-xl"
      aria-label={`Change the sign of ${field}`}
      disabled={disabled}
      onClick={() => onChange(flipSign(value))}
      data-testid="sign-toggle"
    >
      ±
    </button>
  );
}
