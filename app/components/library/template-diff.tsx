import {
  describeRule,
  formatQuantity,
  phaseLabels,
  unitSymbol,
  type FieldChange,
  type Item,
  type ItemChange,
  type ItemPlace,
  type Phase,
  type Rule,
  type TemplateDiff,
} from "~/lib/templates";
import { kindNames } from "./kind-names.ts";

const fieldNames: Record<string, string> = {
  title: "Title",
  purpose: "Purpose",
  kind: "Kind",
  label: "Label",
  hint: "How (hint)",
  caution: "Caution",
  reference: "Reference",
  required: "Required",
  phase: "Phase",
  unit: "Unit",
  accepts: "Accepted units",
  rule: "Acceptance rule",
  "rule.min": "Rule: minimum",
  "rule.max": "Rule: maximum",
  "rule.nominal": "Rule: nominal",
  "rule.tolerance": "Rule: tolerance (±)",
  "rule.unit": "Rule: unit",
  "rule.appliesTo": "Rule: applies to",
  rows: "Rows",
  columns: "Columns",
  calc: "Calculation",
  inputs: "Inputs",
  options: "Options",
  minPhotos: "Minimum photos",
};

function fieldName(field: string): string {
  if (field.startsWith("inputs.")) return `Input ${field.slice("inputs.".length)}`;
  return fieldNames[field] ?? field;
}

function shown(field: string, value: unknown): string {
  if (value === undefined) return "(not set)";
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (field === "phase" && typeof value === "string") return phaseLabels[value as Phase] ?? value;
  if (field === "rule" && value && typeof value === "object") return describeRule(value as Rule);
  if (Array.isArray(value))
    return value
      .map((v) => (v && typeof v === "object" && "label" in v ? String(v.label) : String(v)))
      .join(" · ");
  if (value && typeof value === "object") {
    if ("item" in value) return `from item ${String((value as { item: string }).item)}`;
    if ("value" in value) return `fixed value ${JSON.stringify((value as { value: unknown }).value)}`;
    return JSON.stringify(value);
  }
  return String(value);
}

function Changes({ fields, item }: { fields: FieldChange[]; item?: Item }) {
  const ruleUnit = item && "rule" in item && item.rule ? item.rule.unit : undefined;
  const withUnit = (field: string, value: unknown) =>
    ruleUnit && typeof value === "number" && /^rule\.(min|max|nominal|tolerance)$/.test(field)
      ? formatQuantity(value, ruleUnit)
      : shown(field, value);
  return (
    <table className="mt-2 w-full border-collapse text-sm">
      <thead>
        <tr className="text-left">
          <th className="border-b border-rule p-1">Field</th>
          <th className="border-b border-rule p-1">Before</th>
          <th className="border-b border-rule p-1">Now</th>
        </tr>
      </thead>
      <tbody>
        {fields.map((f) => (
          <tr key={f.field} data-field={f.field}>
            <th scope="row" className="border-b border-rule p-1 text-left align-top">
              {fieldName(f.field)}
            </th>
            <td className="border-b border-rule p-1 align-top text-ink-soft">
              <del className="decoration-fault">{withUnit(f.field, f.before)}</del>
            </td>
            <td className="border-b border-rule p-1 align-top">
              <ins className="no-underline font-bold">{withUnit(f.field, f.after)}</ins>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** An added or removed item in a line: its kind and, for a reading, what it accepts. */
function ItemSummary({ item }: { item: Item }) {
  const rule = "rule" in item && item.rule ? describeRule(item.rule) : null;
  return (
    <p className="text-sm">
      {kindNames[item.kind]}
      {"unit" in item && <>, in {unitSymbol(item.unit) || item.unit}</>}
      {rule && (
        <>
          {" "}
          · Accept: <span className="num">{rule}</span>
        </>
      )}
      {item.kind === "calc" && <> · {item.calc}</>}
    </p>
  );
}

const place = (p: ItemPlace) => `${p.sectionTitle}, place ${p.position}`;

const marks = {
  added: { mark: "+", word: "Added", className: "border-sound" },
  removed: { mark: "−", word: "Removed", className: "border-fault" },
  moved: { mark: "↕", word: "Moved", className: "border-harbour" },
  changed: { mark: "✎", word: "Changed", className: "border-brass" },
};

function ItemEntry({ change }: { change: ItemChange }) {
  const tags = [
    change.status === "added" ? marks.added : null,
    change.status === "removed" ? marks.removed : null,
    change.moved ? marks.moved : null,
    change.fields.length ? marks.changed : null,
  ].filter((t) => t !== null);
  return (
    <li
      className={`rounded-md border-l-8 bg-card p-3 ${tags[0]?.className ?? "border-rule"}`}
      data-change={change.status}
      data-item={change.key}
    >
      <p className="flex flex-wrap items-baseline gap-x-3">
        {tags.map((t) => (
          <span key={t.word} className="font-bold">
            <span aria-hidden="true">{t.mark} </span>
            {t.word}
          </span>
        ))}
        <span className="text-lg font-bold">{change.label}</span>
        <span className="font-mono text-sm text-ink-soft">{change.key}</span>
      </p>
      <p className="text-sm text-ink-soft">
        {change.status === "added" && change.to && <>In {place(change.to)}</>}
        {change.status === "removed" && change.from && <>Was in {place(change.from)}</>}
        {change.status === "kept" && change.moved && change.from && change.to && (
          <>
            From {place(change.from)} to {place(change.to)}
          </>
        )}
      </p>
      {change.status !== "kept" && <ItemSummary item={change.item} />}
      {change.fields.length > 0 && <Changes fields={change.fields} item={change.item} />}
    </li>
  );
}

/** The differences between two versions as a manager reviews them before publishing. */
export function TemplateDiffView({ diff }: { diff: TemplateDiff }) {
  const { counts } = diff;
  const sectionNotes = diff.sections.filter((s) => s.status !== "kept" || s.moved || s.fields.length);
  if (diff.same) {
    return (
      <p data-testid="diff-summary">
        No differences: version {diff.to.version} says exactly what version {diff.from.version} says.
      </p>
    );
  }
  return (
    <div className="flex flex-col gap-4">
      <p data-testid="diff-summary" className="font-bold">
        Version {diff.from.version} → version {diff.to.version}: {counts.added} added · {counts.removed}{" "}
        removed · {counts.moved} moved · {counts.changed} changed
      </p>
      {diff.fields.length > 0 && <Changes fields={diff.fields} />}
      {sectionNotes.length > 0 && (
        <ul className="flex flex-col gap-1" aria-label="Sections">
          {sectionNotes.map((s) => (
            <li key={s.key} data-section-change={s.status}>
              <strong>
                Section{" "}
                {s.status === "added"
                  ? "added"
                  : s.status === "removed"
                    ? "removed"
                    : s.moved
                      ? "moved"
                      : "renamed"}
                :
              </strong>{" "}
              {s.title}
              {s.fields.length > 0 && s.status === "kept" && (
                <span className="text-ink-soft"> (was “{String(s.fields[0].before)}”)</span>
              )}
            </li>
          ))}
        </ul>
      )}
      {diff.items.length > 0 && (
        <ol className="flex flex-col gap-2" aria-label="Items">
          {diff.items.map((c) => (
            <ItemEntry key={`${c.status}-${c.key}`} change={c} />
          ))}
        </ol>
      )}
    </div>
  );
}
