import { useState } from "react";
import type { ItemKind, Template } from "~/lib/templates";
import { itemPath, problemsUnder, sectionPath, type SectionDraft } from "~/lib/templates/editor-state";
import { TwoStepButton } from "../two-step-button.tsx";
import { EditorField, GroupProblems, useEditor } from "./editor-context.tsx";
import { kindNames } from "../kind-names.ts";
import { ItemEditor } from "./item-editor.tsx";
import type { DropTarget } from "./use-item-drag.ts";

export interface ItemsControl {
  open: ReadonlySet<string>;
  toggle: (id: string) => void;
  step: (id: string, by: -1 | 1, control: "up" | "down") => void;
  dragging: string | null;
  target: DropTarget | null;
  handleProps: (id: string) => Record<string, unknown>;
}

const kinds = Object.keys(kindNames) as ItemKind[];

/** One section: its title and key, its items in order (drag, arrow keys or buttons), adding items. */
export function SectionCard({
  section,
  sectionIndex,
  checked,
  items,
}: {
  section: SectionDraft;
  sectionIndex: number;
  checked: Template | null;
  items: ItemsControl;
}) {
  const { state, dispatch, problems } = useEditor();
  const [kind, setKind] = useState<ItemKind>("check");
  const last = state.sections.length - 1;
  const name = section.title || `section ${sectionIndex + 1}`;
  return (
    <section
      className="card flex flex-col gap-3"
      aria-label={`Section ${sectionIndex + 1}: ${name}`}
      data-section-key={section.key}
    >
      <div className="grid gap-3 md:grid-cols-[2fr_1fr_auto]">
        <EditorField
          id={`${section.id}-title`}
          path={sectionPath(sectionIndex, "title")}
          label={`Section ${sectionIndex + 1}`}
        >
          {(control) => (
            <input
              {...control}
              className="field-input text-lg font-bold"
              value={section.title}
              onChange={(e) =>
                dispatch({ type: "section/update", id: section.id, patch: { title: e.currentTarget.value } })
              }
            />
          )}
        </EditorField>
        <EditorField id={`${section.id}-key`} path={sectionPath(sectionIndex, "key")} label="Key">
          {(control) => (
            <input
              {...control}
              className="field-input font-mono"
              autoCapitalize="none"
              spellCheck={false}
              value={section.key}
              onChange={(e) =>
                dispatch({ type: "section/update", id: section.id, patch: { key: e.currentTarget.value } })
              }
            />
          )}
        </EditorField>
        <div className="flex items-end gap-2">
          <button
            type="button"
            className="btn px-2"
            disabled={sectionIndex === 0}
            aria-label={`Move section “${name}” up`}
            onClick={() => dispatch({ type: "section/step", id: section.id, by: -1 })}
          >
            ↑
          </button>
          <button
            type="button"
            className="btn px-2"
            disabled={sectionIndex === last}
            aria-label={`Move section “${name}” down`}
            onClick={() => dispatch({ type: "section/step", id: section.id, by: 1 })}
          >
            ↓
          </button>
        </div>
      </div>
      <GroupProblems path={sectionPath(sectionIndex, "items")} />
      <ol
        className="flex min-h-16 flex-col gap-2"
        data-drop-section={section.id}
        data-count={section.items.length}
        aria-label={`Items of ${name}`}
      >
        {section.items.map((item, i) => {
          const count = problemsUnder(problems, itemPath(sectionIndex, i));
          const isOpen = items.open.has(item.id);
          const label = item.label || item.key;
          const targeted = items.target?.sectionId === section.id && items.target.index === i;
          const first = sectionIndex === 0 && i === 0;
          const lastItem = sectionIndex === last && i === section.items.length - 1;
          return (
            <li
              key={item.id}
              data-drop-item
              data-section={section.id}
              data-index={i}
              data-item-key={item.key}
              className={`rounded-md border-2 border-t-4 bg-card p-2 ${count ? "border-fault" : "border-rule"} ${targeted ? "border-t-copper" : ""} ${items.dragging === item.id ? "opacity-50" : ""}`}
            >
              <div className="flex items-center gap-2">
                <button
                  type="button"
                  className="btn cursor-grab px-2 text-xl"
                  aria-label={`Move “${label}”: drag, or press the up and down arrow keys`}
                  data-focus={`${item.id}-handle`}
                  {...items.handleProps(item.id)}
                >
                  <span aria-hidden="true">⠿</span>
                </button>
                <button
                  type="button"
                  className="flex min-h-12 flex-1 flex-wrap items-center gap-x-3 text-left"
                  aria-expanded={isOpen}
                  onClick={() => items.toggle(item.id)}
                >
                  <span className="rounded bg-paper px-2 py-0.5 text-sm font-bold">
                    {kindNames[item.kind]}
                  </span>
                  <span className="font-bold">
                    {item.label || <em className="font-normal text-ink-soft">no label yet</em>}
                  </span>
                  <span className="font-mono text-sm text-ink-soft">{item.key}</span>
                  {count > 0 && (
                    <span className="font-bold text-fault">
                      <span aria-hidden="true">▲ </span>
                      {count} problem{count === 1 ? "" : "s"}
                    </span>
                  )}
                  <span aria-hidden="true" className="ml-auto">
                    {isOpen ? "▴" : "▾"}
                  </span>
                </button>
                <button
                  type="button"
                  className="btn px-2"
                  disabled={first}
                  aria-label={`Move “${label}” up`}
                  data-focus={`${item.id}-up`}
                  onClick={() => items.step(item.id, -1, "up")}
                >
                  ↑
                </button>
                <button
                  type="button"
                  className="btn px-2"
                  disabled={lastItem}
                  aria-label={`Move “${label}” down`}
                  data-focus={`${item.id}-down`}
                  onClick={() => items.step(item.id, 1, "down")}
                >
                  ↓
                </button>
              </div>
              {isOpen && (
                <ItemEditor
                  item={item}
                  sectionIndex={sectionIndex}
                  itemIndex={i}
                  checked={checked?.sections[sectionIndex]?.items[i]}
                />
              )}
            </li>
          );
        })}
        <li
          aria-hidden="true"
          className={`h-3 rounded border-t-4 ${items.target?.sectionId === section.id && items.target.index === section.items.length ? "border-copper" : "border-transparent"}`}
        />
      </ol>
      <div className="flex flex-wrap items-end gap-2">
        <label className="flex flex-col gap-1 font-bold">
          Kind of new item
          <select
            className="field-input"
            value={kind}
            onChange={(e) => setKind(e.currentTarget.value as ItemKind)}
          >
            {kinds.map((k) => (
              <option key={k} value={k}>
                {kindNames[k]}
              </option>
            ))}
          </select>
        </label>
        <button
          type="button"
          className="btn"
          onClick={() => dispatch({ type: "item/add", sectionId: section.id, kind })}
        >
          + Add item
        </button>
        <div className="ml-auto">
          <TwoStepButton
            label="Remove section…"
            confirmLabel="Remove the section"
            danger
            onConfirm={() => dispatch({ type: "section/remove", id: section.id })}
          >
            <p>
              “{name}” and its {section.items.length} item{section.items.length === 1 ? "" : "s"} are taken
              out of this draft.
            </p>
          </TwoStepButton>
        </div>
      </div>
    </section>
  );
}
