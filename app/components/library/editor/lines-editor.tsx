import type { LineDraft, LineList, OptionDraft } from "~/lib/templates/editor-state";
import { EditorField, GroupProblems, useEditor } from "./editor-context.tsx";

const words: Record<LineList, { one: string; add: string }> = {
  rows: { one: "Row", add: "Add a row" },
  columns: { one: "Column", add: "Add a column" },
  options: { one: "Option", add: "Add an option" },
};

/** The rows or columns of a readings grid, or the options of a choice: label, key, order. */
export function LinesEditor({
  itemId,
  list,
  lines,
  pathOf,
}: {
  itemId: string;
  list: LineList;
  lines: (LineDraft | OptionDraft)[];
  pathOf: (...rest: (string | number)[]) => string;
}) {
  const { dispatch } = useEditor();
  const w = words[list];
  return (
    <fieldset className="flex flex-col gap-3 rounded-md border border-rule p-3">
      <legend className="px-1 font-bold">
        {list === "options" ? "Options" : list === "rows" ? "Rows" : "Columns"}
      </legend>
      <GroupProblems path={pathOf(list)} />
      <ol className="flex flex-col gap-3">
        {lines.map((line, i) => (
          <li
            key={line.id}
            className="grid gap-2 border-b border-rule pb-3 md:grid-cols-[1fr_1fr_auto]"
            data-line={line.key}
          >
            <EditorField id={`${line.id}-label`} path={pathOf(list, i, "label")} label={`${w.one} ${i + 1}`}>
              {(control) => (
                <input
                  {...control}
                  className="field-input"
                  value={line.label}
                  onChange={(e) =>
                    dispatch({
                      type: "line/update",
                      itemId,
                      list,
                      lineId: line.id,
                      patch: { label: e.currentTarget.value },
                    })
                  }
                />
              )}
            </EditorField>
            <EditorField id={`${line.id}-key`} path={pathOf(list, i, "key")} label="Key">
              {(control) => (
                <input
                  {...control}
                  className="field-input font-mono"
                  autoCapitalize="none"
                  spellCheck={false}
                  value={line.key}
                  onChange={(e) =>
                    dispatch({
                      type: "line/update",
                      itemId,
                      list,
                      lineId: line.id,
                      patch: { key: e.currentTarget.value },
                    })
                  }
                />
              )}
            </EditorField>
            <div className="flex flex-wrap items-end gap-2">
              {list === "options" && (
                <label className="flex min-h-12 items-center gap-2">
                  <input
                    type="checkbox"
                    className="size-6"
                    checked={(line as OptionDraft).needsNote ?? false}
                    onChange={(e) =>
                      dispatch({
                        type: "line/update",
                        itemId,
                        list,
                        lineId: line.id,
                        patch: { needsNote: e.currentTarget.checked },
                      })
                    }
                  />
                  Needs a note
                </label>
              )}
              <button
                type="button"
                className="btn px-2"
                disabled={i === 0}
                aria-label={`Move ${w.one.toLowerCase()} ${i + 1} up`}
                onClick={() => dispatch({ type: "line/step", itemId, list, lineId: line.id, by: -1 })}
              >
                ↑
              </button>
              <button
                type="button"
                className="btn px-2"
                disabled={i === lines.length - 1}
                aria-label={`Move ${w.one.toLowerCase()} ${i + 1} down`}
                onClick={() => dispatch({ type: "line/step", itemId, list, lineId: line.id, by: 1 })}
              >
                ↓
              </button>
              <button
                type="button"
                className="btn px-2"
                aria-label={`Remove ${w.one.toLowerCase()} ${i + 1}`}
                onClick={() => dispatch({ type: "line/remove", itemId, list, lineId: line.id })}
              >
                ✕
              </button>
            </div>
          </li>
        ))}
      </ol>
      <div>
        <button type="button" className="btn" onClick={() => dispatch({ type: "line/add", itemId, list })}>
          + {w.add}
        </button>
      </div>
    </fieldset>
  );
}
