import { createContext, useContext } from "react";
import { DEFAULT_TIME_ZONE, formatMoment, type DateStyle } from "~/lib/format";

/**
 * The yard's time zone, given by the shell from the yard's settings (and kept on the tablet for
 * offline use). The server renders and the browser hydrates in this zone, so they write the same
 * text whatever zone the server or the tablet runs in.
 */
export const YardTimeZone = createContext<string>(DEFAULT_TIME_ZONE);

export function useYardTimeZone(): string {
  return useContext(YardTimeZone);
}

/** A moment as the yard's clock shows it, in a <time> element. */
export function LocalTime({ at, style = "short" }: { at: string | Date; style?: DateStyle }) {
  const zone = useYardTimeZone();
  const moment = new Date(at);
  if (Number.isNaN(moment.getTime())) return <>{String(at)}</>;
  return <time dateTime={moment.toISOString()}>{formatMoment(moment, zone, style)}</time>;
}
