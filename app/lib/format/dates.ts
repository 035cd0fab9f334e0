/**
 * Dates and times as Sternpost writes them: in the yard's time zone (a setting, see /yard), never
 * the server's or the tablet's own, so the page the server renders and the page the tablet
 * hydrates read the same, and a surveyor abroad reads the yard's clock.
 */

export const dateStyles = {
  /** 02/12/2026, 09:30 — tables and lists. */
  short: { dateStyle: "short", timeStyle: "short" },
  /** 2 Dec 2026, 09:30 — a line of text. */
  medium: { dateStyle: "medium", timeStyle: "short" },
  /** 2 Dec 2026 — a day. */
  date: { dateStyle: "medium" },
  /** 09:30 — a time on a day the reader already knows (the last sync). */
  time: { timeStyle: "short" },
  /** 2 Dec 2026, 09:30:15 — the audit log, where seconds tell entries apart. */
  full: { dateStyle: "medium", timeStyle: "medium" },
} satisfies Record<string, Intl.DateTimeFormatOptions>;
export type DateStyle = keyof typeof dateStyles;

/** The zone used until a yard has chosen one (and for a name the runtime does not know). */
export const DEFAULT_TIME_ZONE = "UTC";

/** Whether the runtime knows this IANA time zone name. */
export function isTimeZone(name: string): boolean {
  if (!name) return false;
  try {
    new Intl.DateTimeFormat("en-GB", { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(timeZone: string, style: DateStyle): Intl.DateTimeFormat {
  const zone = isTimeZone(timeZone) ? timeZone : DEFAULT_TIME_ZONE;
  const key = `${zone} ${style}`;
  let made = formatters.get(key);
  if (!made) {
    made = new Intl.DateTimeFormat("en-GB", { ...dateStyles[style], timeZone: zone });
    formatters.set(key, made);
  }
  return made;
}

/** A moment in the yard's zone; text that is not a date is shown as it is. */
export function formatMoment(at: string | Date, timeZone: string, style: DateStyle = "short"): string {
  const moment = at instanceof Date ? at : new Date(at);
  if (Number.isNaN(moment.getTime())) return String(at);
  return formatter(timeZone, style).format(moment);
}

/** The zone's short name at that moment ("NZDT", "GMT-3:30"), said once beside a table of times. */
export function zoneAbbreviation(timeZone: string, at: Date = new Date()): string {
  const zone = isTimeZone(timeZone) ? timeZone : DEFAULT_TIME_ZONE;
  const parts = new Intl.DateTimeFormat("en-GB", { timeZone: zone, timeZoneName: "short" }).formatToParts(at);
  return parts.find((p) => p.type === "timeZoneName")?.value ?? zone;
}

/**
 * "12 May 2025, 09:14 GMT+12": a moment that names its zone, for what stands on its own and may be
 * read far from the yard (the record PDF, the verification page).
 */
export function formatStamp(at: string | Date, timeZone: string): string {
  const moment = at instanceof Date ? at : new Date(at);
  if (Number.isNaN(moment.getTime())) return String(at);
  return `${formatMoment(moment, timeZone, "medium")} ${zoneAbbreviation(timeZone, moment)}`;
}
