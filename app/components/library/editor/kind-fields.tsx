import { calculations, type CalcInputSpec } from "~/lib/calc/registry";
import type { Unit } from "~/lib/calc/units";
import { calcDefinition, unitSymbol } from "~/lib/templates";
import {
  constantKindFor,
  itemsThatFit,
  unitsLike,
  type BindingDraft,
  type ItemDraft,
} from "~/lib/templates/editor-state";
import { EditorField, GroupProblems, useEditor } from "./editor-context.tsx";
import { LinesEditor } from "./lines-editor.tsx";
import { UnitSelect } from "./unit-select.tsx";

type PathOf = (...rest: (string | number)[]) => string;

function UnitFields({ item, pathOf }: { item: ItemDraft; pathOf: PathOf }) {
  const { dispatch } = useEditor();
  const others = unitsLike(item.unit).filter((u) => u !== item.unit);
  return (
    <div className="grid gap-3 md:grid-cols-2">
      <EditorField
        id={`${item.id}-unit`}
        path={pathOf("unit")}
        label="Unit"
        hint="The unit offered first on the tablet."
      >
        {(control) => (
          <UnitSelect
            control={control}
            value={item.unit}
            onChange={(unit) => dispatch({ type: "item/unit", id: item.id, unit })}
          />
        )}
      </EditorField>
      {others.length > 0 && (
        <fieldset data-path={pathOf("accepts")}>
          <legend className="font-bold">Also accepted</legend>
          <p className="text-sm text-ink-soft">Units a technician may enter instead; Sternpost converts.</p>
          <GroupProblems path={pathOf("accepts")} />
          <div className="flex flex-wrap gap-x-4">
            {others.map((u) => (
              <label key={u} className="flex min-h-12 items-center gap-2">
                <input
                  type="checkbox"
                  className="size-6"
                  checked={item.accepts?.includes(u) ?? false}
                  onChange={(e) =>
                    dispatch({ type: "item/accept", id: item.id, unit: u, accepted: e.currentTarget.checked })
                  }
                />
                {unitSymbol(u) || u}
              </label>
            ))}
          </div>
        </fieldset>
      )}
    </div>
  );
}

function RuleFields({ item, pathOf }: { item: ItemDraft; pathOf: PathOf }) {
  const { dispatch } = useEditor();
  const rule = item.rule;
  const limit = (field: "min" | "max" | "nominal" | "tolerance", label: string) =>
    rule && (
      <EditorField id={`${item.id}-rule-${field}`} path={pathOf("rule", field)} label={label}>
        {(control) => (
          <input
            {...control}
            inputMode="decimal"
            className="field-input num"
            value={rule[field]}
            onChange={(e) =>
              dispatch({ type: "item/rule", id: item.id, patch: { [field]: e.currentTarget.value } })
            }
          />
        )}
      </EditorField>
    );
  return (
    <fieldset className="flex flex-col gap-3 rounded-md border border-rule p-3" data-path={pathOf("rule")}>
      <legend className="px-1 font-bold">Acceptance rule</legend>
      <label className="flex min-h-12 items-center gap-3">
        <input
          type="checkbox"
          className="size-6"
          checked={rule !== null}
          onChange={(e) =>
            dispatch({ type: "item/rule", id: item.id, patch: e.currentTarget.checked ? {} : null })
          }
        />
        Judge the reading against limits
      </label>
      {rule && (
        <>
          <p className="text-sm text-ink-soft">
            Limits are inclusive. A nominal with its tolerance narrows the minimum and maximum.
          </p>
          <GroupProblems path={pathOf("rule")} />
          <div className="grid grid-cols-2 gap-3 md:grid-cols-4">
            {limit("min", "Minimum")}
            {limit("max", "Maximum")}
            {limit("nominal", "Nominal")}
            {limit("tolerance", "Tolerance (±)")}
          </div>
          <div className="grid gap-3 md:grid-cols-2">
            <EditorField
              id={`${item.id}-rule-unit`}
              path={pathOf("rule", "unit")}
              label="Limits in"
              hint="May differ from the reading's unit, e.g. thou against millimetres."
            >
              {(control) => (
                <UnitSelect
                  control={control}
                  value={rule.unit}
                  among={unitsLike(item.unit).length ? unitsLike(item.unit) : undefined}
                  onChange={(unit) => dispatch({ type: "item/rule", id: item.id, patch: { unit } })}
                />
              )}
            </EditorField>
            {item.kind === "readings" && (
              <EditorField
                id={`${item.id}-rule-applies`}
                path={pathOf("rule", "appliesTo")}
                label="Applies to"
              >
                {(control) => (
                  <select
                    {...control}
                    className="field-input"
                    value={rule.appliesTo}
                    onChange={(e) =>
                      dispatch({
                        type: "item/rule",
                        id: item.id,
                        patch: { appliesTo: e.currentTarget.value as "each-cell" | "row-spread" },
                      })
                    }
                  >
                    <option value="each-cell">Every reading</option>
                    <option value="row-spread">Each row's largest minus smallest</option>
                  </select>
                )}
              </EditorField>
            )}
          </div>
        </>
      )}
    </fieldset>
  );
}

const takesWords: Record<string, string> = {
  number: "a number",
  grid: "a grid of readings",
  numbers: "a list of numbers",
  text: "text",
};

function InputBinding({
  item,
  name,
  spec,
  pathOf,
}: {
  item: ItemDraft;
  name: string;
  spec: CalcInputSpec;
  pathOf: PathOf;
}) {
  const { state, dispatch } = useEditor();
  const binding = item.inputs[name];
  const fits = itemsThatFit(state, item.id, item.calc, name);
  const constantKind = constantKindFor(spec.accepts);
  const value = !binding ? "" : binding.from === "value" ? "value" : `item:${binding.item}`;
  const bound = binding?.from === "item" ? binding.item : null;
  const misfit = bound !== null && !fits.some((f) => f.key === bound);
  const choose = (choice: string) => {
    let next: BindingDraft | null = null;
    if (choice === "value" && constantKind) next = { from: "value", text: "", as: constantKind };
    else if (choice.startsWith("item:")) next = { from: "item", item: choice.slice(5) };
    dispatch({ type: "calc/bind", id: item.id, input: name, binding: next });
  };
  const unit = spec.unit ? ` in ${unitSymbol(spec.unit as Unit) || spec.unit}` : "";
  return (
    <li className="grid gap-2 border-b border-rule pb-3 md:grid-cols-2" data-input={name}>
      <EditorField
        id={`${item.id}-input-${name}`}
        path={pathOf("inputs", name, "item")}
        label={
          <>
            {spec.label}{" "}
            <span className="font-normal text-ink-soft">({spec.optional ? "optional" : "required"})</span>
          </>
        }
        hint={`Takes ${spec.accepts.map((k) => takesWords[k] ?? k).join(" or ")}${unit}.`}
      >
        {(control) => (
          <select
            {...control}
            className="field-input"
            value={value}
            onChange={(e) => choose(e.currentTarget.value)}
          >
            <option value="">{spec.optional ? "Not used" : "Choose…"}</option>
            {constantKind && <option value="value">A fixed value</option>}
            {fits.length > 0 && (
              <optgroup label="Items of this template">
                {fits.map((f) => (
                  <option key={f.id} value={`item:${f.key}`}>
                    {f.label || f.key} ({f.key})
                  </option>
                ))}
              </optgroup>
            )}
            {misfit && <option value={`item:${bound}`}>{bound} — does not fit</option>}
          </select>
        )}
      </EditorField>
      {binding?.from === "value" && (
        <EditorField
          id={`${item.id}-value-${name}`}
          path={pathOf("inputs", name, "value")}
          label="Fixed value"
          hint={
            binding.as === "numbers"
              ? `Numbers separated by spaces or commas, decimals with a point${unit}.`
              : binding.as === "number"
                ? `A number${unit}.`
                : "Text."
          }
        >
          {(control) => (
            <input
              {...control}
              inputMode={binding.as === "text" ? "text" : "decimal"}
              className="field-input num"
              value={binding.text}
              onChange={(e) =>
                dispatch({
                  type: "calc/bind",
                  id: item.id,
                  input: name,
                  binding: { ...binding, text: e.currentTarget.value },
                })
              }
            />
          )}
        </EditorField>
      )}
    </li>
  );
}

function CalcFields({ item, pathOf }: { item: ItemDraft; pathOf: PathOf }) {
  const { dispatch } = useEditor();
  const definition = calcDefinition(item.calc);
  return (
    <div className="flex flex-col gap-3">
      <EditorField id={`${item.id}-calc`} path={pathOf("calc")} label="Calculation">
        {(control) => (
          <select
            {...control}
            className="field-input"
            value={item.calc}
            onChange={(e) => dispatch({ type: "calc/set", id: item.id, calc: e.currentTarget.value })}
          >
            <option value="">Choose a calculation…</option>
            {Object.values(calculations).map((c) => (
              <option key={c.name} value={c.name}>
                {c.title}
              </option>
            ))}
          </select>
        )}
      </EditorField>
      {definition && (
        <div className="text-sm">
          <p>{definition.summary}</p>
          <p className="text-ink-soft">Rule: {definition.source}</p>
        </div>
      )}
      <GroupProblems path={pathOf("inputs")} />
      {definition && (
        <fieldset className="rounded-md border border-rule p-3">
          <legend className="px-1 font-bold">Inputs</legend>
          <ul className="flex flex-col gap-3">
            {Object.entries(definition.inputs).map(([name, spec]) => (
              <InputBinding key={name} item={item} name={name} spec={spec} pathOf={pathOf} />
            ))}
          </ul>
        </fieldset>
      )}
    </div>
  );
}

const askedFor: Partial<Record<ItemDraft["kind"], string>> = {
  check: "The technician answers pass, fail or not applicable; fail and not applicable need a note.",
  text: "The technician writes a note.",
  initials: "The technician confirms the step with their initials; Sternpost records who and when.",
};

/** The fields only this kind of item has. */
export function KindFields({ item, pathOf }: { item: ItemDraft; pathOf: PathOf }) {
  const { dispatch } = useEditor();
  switch (item.kind) {
    case "measure":
      return (
        <>
          <UnitFields item={item} pathOf={pathOf} />
          <RuleFields item={item} pathOf={pathOf} />
        </>
      );
    case "readings":
      return (
        <>
          <LinesEditor itemId={item.id} list="rows" lines={item.rows} pathOf={pathOf} />
          <LinesEditor itemId={item.id} list="columns" lines={item.columns} pathOf={pathOf} />
          <UnitFields item={item} pathOf={pathOf} />
          <RuleFields item={item} pathOf={pathOf} />
        </>
      );
    case "calc":
      return <CalcFields item={item} pathOf={pathOf} />;
    case "choice":
      return <LinesEditor itemId={item.id} list="options" lines={item.options} pathOf={pathOf} />;
    case "photo":
      return (
        <EditorField id={`${item.id}-min-photos`} path={pathOf("minPhotos")} label="Photos needed, at least">
          {(control) => (
            <input
              {...control}
              inputMode="numeric"
              className="field-input num max-w-40"
              value={item.minPhotos}
              onChange={(e) =>
                dispatch({ type: "item/update", id: item.id, patch: { minPhotos: e.currentTarget.value } })
              }
            />
          )}
        </EditorField>
      );
    default:
      return <p className="text-ink-soft">{askedFor[item.kind]}</p>;
  }
}
