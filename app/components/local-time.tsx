import { useEffect, useState } from "react";

/**
 * UTC while rendering on the server and hydrating, the reader's own zone once the page runs in
 * the browser: the server's HTML and the first client render agree, then times read locally.
 */
export function useReaderTimeZone() {
  const [zone, setZone] = useState("UTC");
  useEffect(() => setZone(Intl.DateTimeFormat().resolvedOptions().timeZone), []);
  return zone;
}

const styles = {
  short: { dateStyle: "short", timeStyle: "short" },
  medium: { dateStyle: "medium", timeStyle: "short" },
  date: { dateStyle: "medium" },
  full: { dateStyle: "medium", timeStyle: "medium" },
} satisfies Record<string, Intl.DateTimeFormatOptions>;

/** A moment as the reader's clock shows it (UTC until the page has hydrated), in a <time> element. */
export function LocalTime({ at, style = "short" }: { at: string | Date; style?: keyof typeof styles }) {
  const zone = useReaderTimeZone();
  const moment = new Date(at);
  if (Number.isNaN(moment.getTime())) return <>{String(at)}</>;
  const text = new Intl.DateTimeFormat("en-GB", { ...styles[style], timeZone: zone }).format(moment);
  return <time dateTime={moment.toISOString()}>{text}</time>;
}
