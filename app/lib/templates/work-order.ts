/**
 * The order a yard works through the starter templates on a job: the shaft line first (it is
 * trued and fitted before the engine is aligned to it), the sea trial last. Screens and the record
 * sort a job's checklists with it; a template the shop adds comes after these, by title.
 */
export const workOrder = [
  "propeller-shaft-and-coupling",
  "engine-alignment",
  "exhaust",
  "cooling",
  "fuel-system",
  "instruments-and-electrical",
  "ventilation",
  "sea-trial",
] as const;

/** Where a template comes in the order of work; unknown keys after every known one. */
export function workOrderIndex(key: string): number {
  const index = (workOrder as readonly string[]).indexOf(key);
  return index === -1 ? workOrder.length : index;
}

/** Sorts templates (or checklists) by the order of work, then by title. */
export function byWorkOrder<T extends { key: string; title: string }>(a: T, b: T): number {
  return workOrderIndex(a.key) - workOrderIndex(b.key) || a.title.localeCompare(b.title);
}
