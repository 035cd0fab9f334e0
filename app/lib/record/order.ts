import { byWorkOrder } from "~/lib/templates/work-order";
import type { RecordChecklist } from "./types";

/**
 * A record's checklists in the order the work is done (shaft and coupling first, sea trial last),
 * for every way the record is shown: the web view, the PDF, the JSON copy and /verify. Records
 * issued before this order was kept carry their checklists in whatever order they were read.
 */
export function inWorkOrder<T extends Pick<RecordChecklist, "templateKey" | "template">>(
  checklists: T[],
): T[] {
  const keyed = (c: T) => ({ key: c.templateKey, title: c.template.title });
  return [...checklists].sort((a, b) => byWorkOrder(keyed(a), keyed(b)));
}
