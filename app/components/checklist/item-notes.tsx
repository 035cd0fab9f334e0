import { describeRule, phaseLabels, type Item } from "~/lib/templates";

/** The hint, caution, reference and acceptance rule of an item, as every checklist screen shows them. */
export function ItemNotes({ item }: { item: Item }) {
  const rule = "rule" in item && item.rule ? describeRule(item.rule) : null;
  return (
    <div className="flex flex-col gap-2">
      {item.caution && (
        <p
          className="flex gap-2 rounded-md border-2 border-brass bg-brass-light p-2"
          role="note"
          aria-label="Caution"
        >
          <span aria-hidden="true" className="font-bold">
            ⚠
          </span>
          <span>
            <strong>Caution: </strong>
            {item.caution}
          </span>
        </p>
      )}
      {rule && (
        <p>
          <strong>Accept: </strong>
          <span className="num">{rule}</span>
        </p>
      )}
      {item.hint && (
        <p className="text-ink-soft">
          <strong className="text-ink">How: </strong>
          {item.hint}
        </p>
      )}
      <p className="flex flex-wrap gap-x-4 text-sm text-ink-soft">
        {item.phase && <span>Phase: {phaseLabels[item.phase]}</span>}
        {item.reference && <span>Reference: {item.reference}</span>}
        <span>{item.required ? "Required" : "Optional"}</span>
      </p>
    </div>
  );
}
