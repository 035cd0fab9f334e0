import { z } from "zod";
import { notificationKinds } from "../notifications.ts";

/** The account settings form: the kinds of e-mail left ticked stay on. */
export const notificationSettingsSchema = z.object({
  notify: z
    .array(z.enum(notificationKinds, { error: "That kind of message does not exist." }))
    .max(notificationKinds.length)
    .default([]),
});
