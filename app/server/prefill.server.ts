import { randomUUID } from "node:crypto";
import type { Actor } from "~/lib/permissions";
import { prefillResponses, type JobEquipment } from "~/lib/templates";
import { findChecklist } from "./checklists.server.ts";
import { sync } from "./sync.server.ts";

/** The device the job's own figures are written from, so the history says where they came from. */
const DEVICE = "job-equipment";

/**
 * Fills the items of newly started checklists that take a fact of the job's equipment (rated rpm
 * band, gear ratio, propeller, shaft size and system, system voltage), through the ordinary sync
 * so they are revisioned, in the history and pulled by the tablets like any entry. Written as the
 * person who started the checklists; a manager, who records no entries, leaves them to be typed.
 */
export async function prefillFromJob(
  actor: Actor & { name: string },
  job: JobEquipment,
  checklistIds: string[],
): Promise<number> {
  const at = new Date().toISOString();
  const ops = [];
  for (const id of checklistIds) {
    const checklist = await findChecklist(id);
    if (!checklist) continue;
    for (const [itemKey, value] of Object.entries(prefillResponses(checklist.template, job, {}, at)))
      ops.push({ opId: randomUUID(), seq: ops.length, checklistId: id, itemKey, value, baseRev: 0, at });
  }
  if (!ops.length) return 0;
  const answer = await sync(actor, { deviceId: DEVICE, cursor: null, ops } as Parameters<typeof sync>[1]);
  return answer.results.filter((r) => r.status === "applied").length;
}
