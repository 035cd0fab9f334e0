/** The e-mails Sternpost sends when something waits for a person; each can be turned off. */
export const notificationKinds = ["checklist-submitted", "checklist-returned", "record-viewed"] as const;
export type NotificationKind = (typeof notificationKinds)[number];

export const notificationLabels: Record<NotificationKind, { title: string; hint: string }> = {
  "checklist-submitted": {
    title: "A checklist on a job I lead is waiting for my review",
    hint: "Sent when a technician submits it.",
  },
  "checklist-returned": {
    title: "A checklist I work on was returned to me",
    hint: "Sent with the lead's comments.",
  },
  "record-viewed": {
    title: "A surveyor opened the record of a job I lead",
    hint: "Sent once per surveyor, the first time they open it.",
  },
};
