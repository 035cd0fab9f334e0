import { z } from "zod";
import { isTimeZone } from "~/lib/format";

export const yardSchema = z.object({
  name: z
    .string({ error: "Enter the yard's name, as its records should print it." })
    .trim()
    .min(1, { error: "Enter the yard's name, as its records should print it." })
    .max(120, { error: "Keep the yard's name to 120 characters." }),
  timeZone: z
    .string({ error: "Choose the yard's time zone." })
    .refine(isTimeZone, { error: "Choose a time zone from the list, like Europe/Lisbon." }),
});
export type YardInput = z.infer<typeof yardSchema>;

/** Every zone the runtime knows, for the list; UTC first-class even where the runtime omits it. */
export function timeZoneNames(): string[] {
  const names = Intl.supportedValuesOf("timeZone");
  return names.includes("UTC") ? names : ["UTC", ...names];
}
