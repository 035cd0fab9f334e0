import { useEffect } from "react";

/** Forms with unsaved typing; an update waits until there are none. */
const dirty = new Set<string>();

export const hasDirtyForms = () => dirty.size > 0;

export function useDirtyMark(id: string, isDirty: boolean) {
  useEffect(() => {
    if (isDirty) dirty.add(id);
    else dirty.delete(id);
    return () => void dirty.delete(id);
  }, [id, isDirty]);
}
