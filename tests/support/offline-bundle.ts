import type { OfflineBundle } from "~/lib/sync/bundle";
import type { Item, Template } from "~/lib/templates";

/** A one-section template named "demo" holding the given items. */
export const demoTemplate = (items: Item[]): Template => ({
  key: "demo",
  version: 1,
  title: "Demo",
  purpose: "Unit tests.",
  sections: [{ key: "s", title: "S", items }],
});

/**
 * What "Make my jobs available offline" hands a technician's tablet: one job, the given
 * checklists of the demo template (open unless a state is given), nothing entered yet.
 */
export function demoBundle(
  template: Template,
  checklists: { id: string; state?: OfflineBundle["checklists"][number]["state"] }[],
  over: Partial<OfflineBundle> = {},
): OfflineBundle {
  return {
    user: { id: 1, name: "Tess Tech", email: "t@test.example", role: "technician" },
    jobs: [
      {
        id: 1,
        vesselName: "Test hull",
        hin: null,
        engineModel: "E",
        status: "underway",
        dueDate: null,
        leadName: "L",
      },
    ],
    checklists: checklists.map(({ id, state = "in-progress" }) => ({
      id,
      jobId: 1,
      key: "demo",
      title: "Demo",
      version: 1,
      state,
      canFill: true,
      comments: [],
    })),
    templates: [{ key: "demo", version: 1, template }],
    responses: [],
    conflicts: [],
    cursor: "0",
    ...over,
  };
}
