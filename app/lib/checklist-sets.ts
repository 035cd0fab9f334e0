import type { JobInput } from "./validation/jobs.ts";

/** The checklists a job of each scope usually needs: the default ticks on the job page. */
export const defaultTemplatesFor: Record<JobInput["scope"], string[]> = {
  repower: [
    "propeller-shaft-and-coupling",
    "engine-alignment",
    "exhaust",
    "cooling",
    "fuel-system",
    "instruments-and-electrical",
    "ventilation",
    "sea-trial",
  ],
  "new-installation": [
    "propeller-shaft-and-coupling",
    "engine-alignment",
    "exhaust",
    "cooling",
    "fuel-system",
    "instruments-and-electrical",
    "ventilation",
    "sea-trial",
  ],
  realignment: ["engine-alignment", "sea-trial"],
  "shaft-replacement": ["propeller-shaft-and-coupling", "engine-alignment", "sea-trial"],
};

export const checklistStateLabels = {
  "in-progress": "Being filled",
  submitted: "Waiting for review",
  returned: "Returned for fixes",
  countersigned: "Countersigned",
} as const;
export type ChecklistState = keyof typeof checklistStateLabels;
