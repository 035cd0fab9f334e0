import { createContext, useContext, type Dispatch, type ReactNode } from "react";
import { Field } from "~/components/field";
import type { EditorAction, EditorState } from "~/lib/templates/editor-state";
import type { TemplateProblem } from "~/lib/templates";

/** What every part of the editor needs: the draft, the way to change it, and the schema's problems by path. */
export interface EditorContextValue {
  state: EditorState;
  dispatch: Dispatch<EditorAction>;
  problems: readonly TemplateProblem[];
  byPath: Map<string, string[]>;
}

export const EditorContext = createContext<EditorContextValue | null>(null);

export function useEditor(): EditorContextValue {
  const value = useContext(EditorContext);
  if (!value) throw new Error("useEditor outside the template editor");
  return value;
}

export function useProblemsAt(path: string): string[] {
  return useEditor().byPath.get(path) ?? [];
}

export interface ControlProps {
  id: string;
  "aria-invalid"?: true;
  "aria-describedby"?: string;
}

/** A labelled control whose errors are the schema's problems at `path`. */
export function EditorField({
  id,
  path,
  label,
  hint,
  children,
}: {
  id: string;
  path: string;
  label: ReactNode;
  hint?: ReactNode;
  children: (control: ControlProps) => ReactNode;
}) {
  const errors = useProblemsAt(path);
  const describedBy = [hint ? `${id}-hint` : "", errors.length ? `${id}-error` : ""]
    .filter(Boolean)
    .join(" ");
  return (
    <div data-path={path}>
      <Field id={id} label={label} hint={hint} errors={errors}>
        {children({
          id,
          "aria-invalid": errors.length ? true : undefined,
          "aria-describedby": describedBy || undefined,
        })}
      </Field>
    </div>
  );
}

/** Problems at a path that belongs to a group rather than one control (an item's inputs, a list). */
export function GroupProblems({ path, id }: { path: string; id?: string }) {
  const errors = useProblemsAt(path);
  if (!errors.length) return null;
  return (
    <p id={id} role="alert" data-path={path} className="flex items-start gap-2 font-bold text-fault">
      <span aria-hidden="true">▲</span>
      <span>{errors.join(" ")}</span>
    </p>
  );
}
