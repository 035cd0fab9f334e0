import { useEffect, useMemo, useReducer, useRef, useState } from "react";
import { useBlocker, useFetcher } from "react-router";
import { ChecklistPreview } from "~/components/library/checklist-preview";
import { FormErrors } from "~/components/field";
import type { Template, TemplateProblem } from "~/lib/templates";
import {
  checkDraft,
  editorReducer,
  fromTemplate,
  locate,
  problemsByPath,
  sameAsTemplate,
  toTemplateInput,
} from "~/lib/templates/editor-state";
import { EditorContext, EditorField } from "./editor-context.tsx";
import { SectionCard, type ItemsControl } from "./section-card.tsx";
import { useItemDrag } from "./use-item-drag.ts";

export type SaveReply = { ok: true } | { ok: false; problems?: TemplateProblem[]; errors?: string[] };

const pathOfItem = /^sections\[(\d+)\]\.items\[(\d+)\]/;

/**
 * The draft editor. Every change goes through the pure reducer in editor-state.ts; the library's
 * schema reads the result on every change, so each field shows its problem as it is typed. The
 * draft is saved only once it passes (the server checks again), so a draft in the library
 * always loads, and publishing it can never fail on its content.
 */
export function TemplateEditor({ saved }: { saved: Template }) {
  const [state, dispatch] = useReducer(editorReducer, saved, fromTemplate);
  const check = useMemo(() => checkDraft(state), [state]);
  const fetcher = useFetcher<SaveReply>();
  const reply = fetcher.state === "idle" ? fetcher.data : undefined;
  const problems = useMemo(
    () => (check.ok ? (reply && !reply.ok ? (reply.problems ?? []) : []) : check.problems),
    [check, reply],
  );
  const byPath = useMemo(() => problemsByPath(problems), [problems]);
  const dirty = useMemo(() => !sameAsTemplate(state, saved), [state, saved]);
  const [view, setView] = useState<"edit" | "preview">("edit");
  const [open, setOpen] = useState<Set<string>>(() => new Set());
  const [announcement, setAnnouncement] = useState("");
  const [focusNext, setFocusNext] = useState<string | null>(null);
  const summary = useRef<HTMLDivElement>(null);

  // What was just added opens, with the cursor in its first field.
  useEffect(() => {
    if (!state.lastAdded) return;
    if (state.lastAdded.startsWith("i")) setOpen((o) => new Set(o).add(state.lastAdded!));
    setFocusNext(`${state.lastAdded}-${state.lastAdded.startsWith("i") ? "label" : "title"}`);
  }, [state.lastAdded]);

  useEffect(() => {
    if (!focusNext) return;
    const element =
      document.getElementById(focusNext) ??
      document.querySelector<HTMLElement>(`[data-focus="${focusNext}"]`);
    if (element) {
      element.focus();
      element.scrollIntoView({ block: "nearest" });
    }
    setFocusNext(null);
  }, [focusNext, state, open]);

  useEffect(() => {
    if (!dirty) return;
    const warn = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [dirty]);
  const blocker = useBlocker(
    ({ currentLocation, nextLocation }) =>
      dirty && fetcher.state === "idle" && currentLocation.pathname !== nextLocation.pathname,
  );

  function announceMove(id: string) {
    return (next: typeof state) => {
      const at = locate(next, id);
      if (!at) return;
      const section = next.sections[at.sectionIndex];
      const item = section.items[at.itemIndex];
      setAnnouncement(
        `“${item.label || item.key}” is now item ${at.itemIndex + 1} of ${section.items.length} in ${section.title || section.key}.`,
      );
    };
  }

  const drag = useItemDrag(
    (id, target) => {
      const action = { type: "item/move" as const, id, sectionId: target.sectionId, index: target.index };
      dispatch(action);
      announceMove(id)(editorReducer(state, action));
    },
    (id, by) => {
      const action = { type: "item/step" as const, id, by };
      dispatch(action);
      announceMove(id)(editorReducer(state, action));
      setFocusNext(`${id}-handle`);
    },
  );

  const items: ItemsControl = {
    open,
    toggle: (id) =>
      setOpen((o) => {
        const next = new Set(o);
        if (!next.delete(id)) next.add(id);
        return next;
      }),
    step: (id, by, control) => {
      const action = { type: "item/step" as const, id, by };
      const next = editorReducer(state, action);
      dispatch(action);
      announceMove(id)(next);
      // Keep the focus on the button pressed, or on the other one when this end is reached.
      const at = locate(next, id)!;
      const atEnd =
        control === "up"
          ? at.sectionIndex === 0 && at.itemIndex === 0
          : at.sectionIndex === next.sections.length - 1 &&
            at.itemIndex === next.sections[at.sectionIndex].items.length - 1;
      setFocusNext(`${id}-${atEnd ? (control === "up" ? "down" : "up") : control}`);
    },
    dragging: drag.dragging,
    target: drag.target,
    handleProps: drag.handleProps,
  };

  function reveal(path: string) {
    setView("edit");
    const match = pathOfItem.exec(path);
    const item = match ? state.sections[Number(match[1])]?.items[Number(match[2])] : undefined;
    if (item) setOpen((o) => new Set(o).add(item.id));
    requestAnimationFrame(() => {
      const field = document.querySelector<HTMLElement>(`[data-path="${CSS.escape(path)}"]`);
      const target =
        field ??
        (item ? document.querySelector<HTMLElement>(`[data-item-key="${CSS.escape(item.key)}"]`) : null);
      target?.scrollIntoView({ block: "center" });
      target?.querySelector<HTMLElement>("input, select, textarea")?.focus();
    });
  }

  function save(intent: "save" | "save-review") {
    if (!check.ok) {
      summary.current?.focus();
      summary.current?.scrollIntoView({ block: "start" });
      return;
    }
    fetcher.submit({ intent, body: toTemplateInput(state) } as never, {
      method: "post",
      encType: "application/json",
    });
  }

  const status =
    fetcher.state !== "idle"
      ? "Saving…"
      : problems.length
        ? `▲ ${problems.length} problem${problems.length === 1 ? "" : "s"} to fix before the draft can be saved`
        : dirty
          ? "Changes not saved yet"
          : "✓ Saved: the draft loads as it stands";

  return (
    <EditorContext.Provider value={{ state, dispatch, problems, byPath }}>
      <div className="flex flex-col gap-4">
        {reply && !reply.ok && <FormErrors errors={reply.errors} />}
        {problems.length > 0 && (
          <div
            ref={summary}
            tabIndex={-1}
            className="rounded-md border-2 border-fault bg-fault-light p-3"
            data-testid="problem-summary"
          >
            <p className="font-bold text-fault">
              <span aria-hidden="true">▲ </span>
              {problems.length} problem{problems.length === 1 ? "" : "s"}: nothing is saved until{" "}
              {problems.length === 1 ? "it is" : "they are"} fixed.
            </p>
            <ul className="mt-2 flex flex-col gap-1">
              {problems.map((p, i) => (
                <li key={i} className="flex flex-wrap items-center gap-2">
                  <button
                    type="button"
                    className="min-h-12 text-left text-harbour underline"
                    onClick={() => reveal(p.path)}
                  >
                    <code className="font-mono text-sm">{p.path || "template"}</code> {p.message}
                  </button>
                </li>
              ))}
            </ul>
          </div>
        )}

        <div role="group" aria-label="View" className="flex gap-2">
          <button
            type="button"
            className={view === "edit" ? "btn btn-primary" : "btn"}
            aria-pressed={view === "edit"}
            onClick={() => setView("edit")}
          >
            Edit
          </button>
          <button
            type="button"
            className={view === "preview" ? "btn btn-primary" : "btn"}
            aria-pressed={view === "preview"}
            onClick={() => setView("preview")}
          >
            Preview
          </button>
        </div>

        {view === "preview" ? (
          <section aria-label="Preview" className="flex flex-col gap-3">
            <p className="text-sm font-bold tracking-wide text-ink-soft uppercase">
              As a technician will see it
            </p>
            {check.ok ? (
              <>
                <h2 className="text-3xl font-bold">{check.template.title}</h2>
                <ChecklistPreview template={check.template} />
              </>
            ) : (
              <p>The preview appears once the draft has no problems.</p>
            )}
          </section>
        ) : (
          <>
            <section className="card grid gap-3" aria-label="Template">
              <EditorField id="template-title" path="title" label="Title">
                {(control) => (
                  <input
                    {...control}
                    className="field-input text-xl font-bold"
                    value={state.title}
                    onChange={(e) =>
                      dispatch({ type: "template/set", field: "title", value: e.currentTarget.value })
                    }
                  />
                )}
              </EditorField>
              <EditorField
                id="template-purpose"
                path="purpose"
                label="Purpose"
                hint="What the checklist is for and when it is used."
              >
                {(control) => (
                  <textarea
                    {...control}
                    rows={3}
                    className="field-input"
                    value={state.purpose}
                    onChange={(e) =>
                      dispatch({ type: "template/set", field: "purpose", value: e.currentTarget.value })
                    }
                  />
                )}
              </EditorField>
              <p className="text-sm text-ink-soft">
                Key <span className="font-mono">{state.key}</span>, version {state.version}. Both stay as they
                are.
              </p>
            </section>
            {state.sections.map((section, i) => (
              <SectionCard
                key={section.id}
                section={section}
                sectionIndex={i}
                checked={check.ok ? check.template : null}
                items={items}
              />
            ))}
            <div>
              <button type="button" className="btn" onClick={() => dispatch({ type: "section/add" })}>
                + Add a section
              </button>
            </div>
          </>
        )}

        <p aria-live="polite" className="sr-only">
          {announcement}
        </p>

        {blocker.state === "blocked" && (
          <div
            role="alertdialog"
            aria-label="Unsaved changes"
            className="fixed top-4 left-1/2 z-30 w-[min(40rem,calc(100%-2rem))] -translate-x-1/2 rounded-md border-2 border-brass bg-brass-light p-3 shadow-lg"
          >
            <p className="font-bold">This draft has changes that are not saved. Leave without saving them?</p>
            <div className="mt-2 flex gap-2">
              <button type="button" className="btn btn-primary" autoFocus onClick={() => blocker.reset()}>
                Stay and keep editing
              </button>
              <button type="button" className="btn" onClick={() => blocker.proceed()}>
                Leave without saving
              </button>
            </div>
          </div>
        )}

        <div className="sticky bottom-0 z-10 -mx-4 flex flex-wrap items-center gap-3 border-t-2 border-ink bg-paper px-4 py-3">
          <p
            role="status"
            className={`flex-1 font-bold ${problems.length ? "text-fault" : ""}`}
            data-testid="save-status"
          >
            {status}
          </p>
          <button
            type="button"
            className="btn btn-primary"
            onClick={() => save("save")}
            disabled={fetcher.state !== "idle"}
          >
            Save draft
          </button>
          <button
            type="button"
            className="btn"
            onClick={() => save("save-review")}
            disabled={fetcher.state !== "idle"}
          >
            Save and review
          </button>
        </div>
      </div>
    </EditorContext.Provider>
  );
}
