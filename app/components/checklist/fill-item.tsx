import { lazy, Suspense } from "react";
import type { Item, Responses, Template, Verdict } from "~/lib/templates";
import {
  CheckEditor,
  ChoiceEditor,
  InitialsEditor,
  MeasureEditor,
  TextEditor,
  type EditorProps,
} from "./editors.tsx";
import { ItemNotes } from "./item-notes.tsx";
import { VerdictBadge } from "./verdict-badge.tsx";

export interface FillItemProps {
  item: Item;
  template: Template;
  /** Every response of the checklist by item key (a calculation reads other items). */
  responses?: Responses;
  value: unknown;
  verdict: Verdict;
  pending: boolean;
  by: string;
  disabled: boolean;
  onSave: (value: unknown) => void;
  diagram?: React.ReactNode;
  /** Photos are kept per checklist on the tablet. */
  checklistId?: string;
  children?: React.ReactNode;
}

// The readings grid loads only for a checklist that has one; the camera, compression and photo
// queue only for a photo item.
const ReadingsEditor = lazy(() =>
  import("./readings-editor.tsx").then((m) => ({ default: m.ReadingsEditor })),
);
// A calculation's panel loads only for a template with calc items (as its registry does).
const CalcPanel = lazy(() => import("./calc-panel.tsx").then((m) => ({ default: m.CalcPanel })));
// The camera, compression and photo queue load only for a photo item.
const PhotoEditor = lazy(() => import("./photo-editor.tsx").then((m) => ({ default: m.PhotoEditor })));

function Editor(props: EditorProps & { diagram?: React.ReactNode; checklistId?: string }) {
  const { item } = props;
  switch (item.kind) {
    case "check":
      return <CheckEditor {...props} />;
    case "measure":
      return <MeasureEditor {...(props as EditorProps<typeof item>)} />;
    case "readings":
      return (
        <Suspense fallback={<p className="text-ink-soft">Opening the grid…</p>}>
          <ReadingsEditor {...(props as EditorProps<typeof item>)} />
        </Suspense>
      );
    case "choice":
      return <ChoiceEditor {...(props as EditorProps<typeof item>)} />;
    case "text":
      return <TextEditor {...props} />;
    case "initials":
      return <InitialsEditor {...props} />;
    case "calc":
      return (
        <Suspense fallback={null}>
          <CalcPanel {...props} />
        </Suspense>
      );
    case "photo":
      return props.checklistId ? (
        <Suspense fallback={<p className="text-ink-soft">Opening the camera…</p>}>
          <PhotoEditor {...(props as EditorProps<typeof item>)} checklistId={props.checklistId} />
        </Suspense>
      ) : null;
  }
}

/** One item as the technician fills it: what to do, the entry, and its verdict in words and a shape. */
export function FillItem({
  item,
  template,
  responses,
  value,
  verdict,
  pending,
  by,
  disabled,
  onSave,
  diagram,
  checklistId,
  children,
}: FillItemProps) {
  return (
    <li className="card flex flex-col gap-3" data-item={item.key} id={`item-${item.key}`}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <h3 className="text-lg font-bold">
          {item.label}
          {item.required && <span className="sr-only"> (required)</span>}
        </h3>
        {/* Kept in place (hidden) while the item can be filled: the mark coming and going with the
            sync never moves the buttons under a gloved tap. */}
        {(pending || !disabled) && (
          <span
            className={`text-sm font-bold text-harbour ${pending ? "" : "invisible"}`}
            data-testid={pending ? "pending" : undefined}
            aria-hidden={pending ? undefined : true}
          >
            Saved on this tablet · waiting to send
          </span>
        )}
      </div>
      <ItemNotes item={item} />
      <Editor
        item={item}
        value={value}
        verdict={verdict}
        by={by}
        disabled={disabled}
        onSave={onSave}
        diagram={diagram}
        checklistId={checklistId}
        template={template}
        responses={responses}
      />
      <VerdictBadge verdict={verdict} />
      {/* What is said about the item (the lead's comments, the technician's replies, a refusal). */}
      {children}
    </li>
  );
}
