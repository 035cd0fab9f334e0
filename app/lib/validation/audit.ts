import { z } from "zod";
import { isTimeZone } from "~/lib/format";

/** Plain words for each action the application writes; a code missing here is shown as stored. */
export const auditActionLabels = {
  "user.invited": "Invited a person",
  "user.role": "Changed a person's role",
  "user.deactivate": "Deactivated a person",
  "user.reactivate": "Reactivated a person",
  "user.reinvite": "Sent an invitation again",
  "vessel.created": "Registered a vessel",
  "vessel.updated": "Updated a vessel",
  "job.created": "Created a job",
  "job.updated": "Updated a job",
  "checklist.started": "Started a checklist",
  "checklist.submitted": "Submitted a checklist",
  "checklist.returned": "Returned a checklist for fixes",
  "checklist.countersigned": "Countersigned a checklist",
  "checklist.amended": "Amended a countersigned checklist",
  "checklist.amendment-discarded": "Discarded an amendment opened by mistake",
  "record.issued": "Issued a commissioning record",
  "record.viewed": "Viewed a commissioning record",
  "template.created": "Created a checklist template",
  "template.draft-created": "Started a template draft",
  "template.draft-saved": "Saved a template draft",
  "template.draft-discarded": "Discarded a template draft",
  "template.published": "Published a template version",
  "template.retired": "Retired a template version",
  "template.imported": "Imported a template",
  "yard.updated": "Changed the yard's settings",
} as const satisfies Record<string, string>;

export function actionInWords(code: string): string {
  return (auditActionLabels as Record<string, string>)[code] ?? code;
}

/** The families of actions: the filter offers each as a whole ("checklist.") or one by one. */
export const auditActionGroups = [
  { prefix: "checklist.", label: "Checklists", all: "Every checklist action" },
  { prefix: "record.", label: "Records", all: "Every record action" },
  { prefix: "job.", label: "Jobs", all: "Every job action" },
  { prefix: "vessel.", label: "Vessels", all: "Every vessel action" },
  { prefix: "user.", label: "People", all: "Every change to people" },
  { prefix: "template.", label: "Checklist templates", all: "Every template action" },
].map((group) => ({
  ...group,
  actions: Object.keys(auditActionLabels).filter((code) => code.startsWith(group.prefix)),
}));

export const auditEntityLabels: Record<string, string> = {
  checklist: "Checklist",
  record: "Record",
  job: "Job",
  vessel: "Vessel",
  user: "Person",
  template_version: "Template version",
  yard: "Yard settings",
};

export function entityInWords(entity: string): string {
  return auditEntityLabels[entity] ?? entity;
}

/** The zone's wall-clock reading at an instant, written as if it were a UTC instant. */
function wallClock(instant: number, timeZone: string): number {
  const parts = new Intl.DateTimeFormat("en-US", {
    timeZone,
    hourCycle: "h23",
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
    hour: "2-digit",
    minute: "2-digit",
    second: "2-digit",
  }).formatToParts(instant);
  const part = (type: string) => Number(parts.find((p) => p.type === type)!.value);
  return Date.UTC(part("year"), part("month") - 1, part("day"), part("hour"), part("minute"), part("second"));
}

const offset = (instant: number, timeZone: string) => wallClock(instant, timeZone) - instant;

/** The instant a calendar day (YYYY-MM-DD) begins in a time zone. */
export function startOfDayIn(date: string, timeZone: string): Date {
  const midnight = Date.parse(`${date}T00:00:00Z`);
  const first = midnight - offset(midnight, timeZone);
  // The offset at the first guess is right unless the clocks change between it and UTC midnight.
  const second = midnight - offset(first, timeZone);
  // Where the clocks jump over midnight the second guess falls on the evening before, and the
  // day begins at the jump, which is the first guess.
  return new Date(wallClock(second, timeZone) >= midnight ? second : first);
}

const nextDay = (date: string) =>
  new Date(Date.parse(`${date}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);

/** A GET form sends every field; an empty one means "any". */
const optional = <T extends z.ZodType>(schema: T) =>
  z.preprocess((v) => (typeof v === "string" && v.trim() === "" ? undefined : v), schema.optional());

const day = (label: string) => optional(z.iso.date({ error: `Enter the ${label} as a date (YYYY-MM-DD).` }));

/**
 * The audit log's filters, read from the page's search parameters. Dates are whole days in the
 * reader's time zone (sent by the page), turned here into the instants the query compares.
 */
export const auditFiltersSchema = z
  .object({
    action: optional(
      z
        .string({ error: "Choose one action or one family of actions." })
        .trim()
        .max(64, "Choose one action or one family of actions.")
        .regex(/^[a-z][a-z_-]*\.([a-z][a-z_-]*)?$/, "Choose one action or one family of actions."),
    ),
    person: optional(
      z.coerce
        .number({ error: "Choose a person from the list." })
        .int("Choose a person from the list.")
        .positive("Choose a person from the list."),
    ),
    entity: optional(
      z
        .string({ error: "Choose what kind of thing to look for." })
        .trim()
        .max(32, "Choose what kind of thing to look for.")
        .regex(/^[a-z][a-z_]*$/, "Choose what kind of thing to look for."),
    ),
    entityId: optional(
      z
        .string({ error: "Enter one id." })
        .trim()
        .max(64, "An id is at most 64 characters.")
        .regex(/^[A-Za-z0-9_.-]+$/, "An id has only letters, digits, dots and dashes."),
    ),
    device: optional(
      z.string({ error: "Enter one device id." }).trim().max(64, "A device id is at most 64 characters."),
    ),
    from: day("first day"),
    to: day("last day"),
    // Set by the loader to the yard's zone: the days are the yard's days.
    tz: z.string().refine(isTimeZone).catch("UTC"),
    before: optional(
      z.coerce
        .number({ error: "That page of the log does not exist." })
        .int()
        .positive("That page of the log does not exist."),
    ),
  })
  .refine((f) => f.entityId === undefined || f.entity !== undefined, {
    path: ["entity"],
    message: "Choose what kind of thing the id belongs to.",
  })
  .refine((f) => !f.from || !f.to || f.to >= f.from, {
    path: ["to"],
    message: "The last day is before the first day.",
  })
  .transform((f) => ({
    ...f,
    since: f.from ? startOfDayIn(f.from, f.tz) : undefined,
    until: f.to ? startOfDayIn(nextDay(f.to), f.tz) : undefined,
  }));

export type AuditFilters = z.infer<typeof auditFiltersSchema>;
