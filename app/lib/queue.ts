/** One thing waiting for a lead or the manager on Today. */
export interface QueueEntry {
  kind: "submitted" | "conflict" | "record-ready";
  /** Since when it waits (ISO): the queue is oldest first. */
  since: string;
  title: string;
  vessel: string;
  detail: string;
  to: string;
}

export const queueKindLabels: Record<QueueEntry["kind"], string> = {
  submitted: "To review",
  conflict: "To decide",
  "record-ready": "To issue",
};
