import { describeRule, phaseLabels, phases, type Item, type Phase } from "~/lib/templates";
import { itemPath, type ItemDraft } from "~/lib/templates/editor-state";
import { TwoStepButton } from "../two-step-button.tsx";
import { EditorField, useEditor } from "./editor-context.tsx";
import { KindFields } from "./kind-fields.tsx";

type TextField = "label" | "hint" | "caution" | "reference";

/** Everything about one item: the fields every kind has, then its own. */
export function ItemEditor({
  item,
  sectionIndex,
  itemIndex,
  checked,
}: {
  item: ItemDraft;
  sectionIndex: number;
  itemIndex: number;
  checked?: Item;
}) {
  const { state, dispatch } = useEditor();
  const pathOf = (...rest: (string | number)[]) => itemPath(sectionIndex, itemIndex, ...rest);
  const text = (field: TextField, label: string, hint?: string, long = false) => (
    <EditorField id={`${item.id}-${field}`} path={pathOf(field)} label={label} hint={hint}>
      {(control) =>
        long ? (
          <textarea
            {...control}
            rows={3}
            className="field-input"
            value={item[field]}
            onChange={(e) =>
              dispatch({ type: "item/update", id: item.id, patch: { [field]: e.currentTarget.value } })
            }
          />
        ) : (
          <input
            {...control}
            className="field-input"
            value={item[field]}
            onChange={(e) =>
              dispatch({ type: "item/update", id: item.id, patch: { [field]: e.currentTarget.value } })
            }
          />
        )
      }
    </EditorField>
  );
  const rule = checked && "rule" in checked && checked.rule ? describeRule(checked.rule) : null;
  return (
    <div className="mt-3 flex flex-col gap-4 border-t border-rule pt-3" data-item-editor={item.id}>
      <div className="grid gap-3 md:grid-cols-2">
        {text("label", "Label", "What the technician reads first.")}
        <EditorField
          id={`${item.id}-key`}
          path={pathOf("key")}
          label="Key"
          hint={
            item.autoKey
              ? "Follows the label until you type one; unique in the template."
              : "Unique in the template; calculations refer to it."
          }
        >
          {(control) => (
            <input
              {...control}
              className="field-input font-mono"
              autoCapitalize="none"
              spellCheck={false}
              value={item.key}
              onChange={(e) =>
                dispatch({ type: "item/update", id: item.id, patch: { key: e.currentTarget.value } })
              }
            />
          )}
        </EditorField>
      </div>
      {text("hint", "How (hint)", "How to do or measure it.", true)}
      {text(
        "caution",
        "Caution",
        "What can hurt someone at this step: hot work, a shaft turned by hand, exhaust CO, lifting, batteries, sea trials.",
        true,
      )}
      {text(
        "reference",
        "Reference",
        "The standard, handbook or practice it comes from; a shop rule of thumb says common practice.",
      )}
      <div className="grid gap-3 md:grid-cols-3">
        <EditorField id={`${item.id}-phase`} path={pathOf("phase")} label="Phase">
          {(control) => (
            <select
              {...control}
              className="field-input"
              value={item.phase}
              onChange={(e) =>
                dispatch({
                  type: "item/update",
                  id: item.id,
                  patch: { phase: e.currentTarget.value as Phase | "" },
                })
              }
            >
              <option value="">Any time</option>
              {phases.map((p) => (
                <option key={p} value={p}>
                  {phaseLabels[p]}
                </option>
              ))}
            </select>
          )}
        </EditorField>
        <div className="flex items-end">
          <label className="flex min-h-12 items-center gap-3 font-bold">
            <input
              type="checkbox"
              className="size-6"
              checked={item.required}
              onChange={(e) =>
                dispatch({ type: "item/update", id: item.id, patch: { required: e.currentTarget.checked } })
              }
            />
            Required
          </label>
        </div>
        <EditorField id={`${item.id}-section`} path={`${pathOf()}.section`} label="Section">
          {(control) => (
            <select
              {...control}
              className="field-input"
              value={state.sections[sectionIndex].id}
              onChange={(e) => {
                const target = state.sections.find((s) => s.id === e.currentTarget.value);
                if (target)
                  dispatch({
                    type: "item/move",
                    id: item.id,
                    sectionId: target.id,
                    index: target.items.length,
                  });
              }}
            >
              {state.sections.map((s, i) => (
                <option key={s.id} value={s.id}>
                  {i + 1}. {s.title || s.key}
                </option>
              ))}
            </select>
          )}
        </EditorField>
      </div>
      <KindFields item={item} pathOf={pathOf} />
      {rule && (
        <p className="rounded-md bg-paper p-2">
          Technicians will read: <strong>Accept: </strong>
          <span className="num">{rule}</span>
        </p>
      )}
      <div>
        <TwoStepButton
          label="Remove this item…"
          confirmLabel="Remove the item"
          danger
          onConfirm={() => dispatch({ type: "item/remove", id: item.id })}
        >
          <p>“{item.label || item.key}” is taken out of this draft. Calculations that use it will say so.</p>
        </TwoStepButton>
      </div>
    </div>
  );
}
