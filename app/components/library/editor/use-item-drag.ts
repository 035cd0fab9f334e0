import { useRef, useState, type KeyboardEvent, type PointerEvent } from "react";

/** Where a dragged item would land: a slot in a section, counted with the item still in place. */
export interface DropTarget {
  sectionId: string;
  index: number;
}

const EDGE = 72;

function dropTargetAt(x: number, y: number): DropTarget | null {
  const under = document.elementFromPoint(x, y);
  const row = under?.closest<HTMLElement>("[data-drop-item]");
  if (row?.dataset.section) {
    const rect = row.getBoundingClientRect();
    return {
      sectionId: row.dataset.section,
      index: Number(row.dataset.index) + (y > rect.top + rect.height / 2 ? 1 : 0),
    };
  }
  const list = under?.closest<HTMLElement>("[data-drop-section]");
  if (list?.dataset.dropSection)
    return { sectionId: list.dataset.dropSection, index: Number(list.dataset.count) };
  return null;
}

/**
 * Dragging items by a handle with pointer events, so a finger on a tablet works as well as a
 * mouse (HTML drag and drop does not start from touch everywhere). The page scrolls when the
 * pointer nears the top or bottom edge. The handle also moves its item with the arrow keys.
 */
export function useItemDrag(
  onDrop: (id: string, target: DropTarget) => void,
  onStep: (id: string, by: -1 | 1) => void,
) {
  const [drag, setDrag] = useState<{ id: string; target: DropTarget | null } | null>(null);
  const current = useRef(drag);
  current.current = drag;

  function handleProps(id: string) {
    return {
      onPointerDown(e: PointerEvent<HTMLElement>) {
        if (e.pointerType === "mouse" && e.button !== 0) return;
        e.preventDefault();
        e.currentTarget.setPointerCapture(e.pointerId);
        setDrag({ id, target: null });
      },
      onPointerMove(e: PointerEvent<HTMLElement>) {
        if (!current.current) return;
        if (e.clientY < EDGE) window.scrollBy(0, -16);
        else if (e.clientY > window.innerHeight - EDGE) window.scrollBy(0, 16);
        const target = dropTargetAt(e.clientX, e.clientY);
        setDrag((d) => d && { ...d, target });
      },
      onPointerUp() {
        const d = current.current;
        setDrag(null);
        if (d?.target) onDrop(d.id, d.target);
      },
      onPointerCancel() {
        setDrag(null);
      },
      onKeyDown(e: KeyboardEvent<HTMLElement>) {
        if (e.key !== "ArrowUp" && e.key !== "ArrowDown") return;
        e.preventDefault();
        onStep(id, e.key === "ArrowUp" ? -1 : 1);
      },
      style: { touchAction: "none" as const },
    };
  }

  return { dragging: drag?.id ?? null, target: drag?.target ?? null, handleProps };
}
