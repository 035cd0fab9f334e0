import type { ItemKind } from "../templates/index.ts";

/**
 * How the server combines an entry with the value it holds, by item kind (decided on the
 * server; docs/sync-merge-rules.md says the same in words):
 *
 * - log kinds — measure, readings, photo: the attempts (or photos) are an append-only set. Every
 *   entry's attempts are added to the server's, once each (by their id, made on the tablet;
 *   attempts recorded before ids existed are known by their content), and none is ever removed.
 *   Attempts are ordered by the time taken, then id; photos keep the server's order with new
 *   ones after. Two tablets adding attempts to one item both keep their work: no conflict.
 *   A photo list sent on the current revision stands as sent (a photo taken by mistake may be
 *   removed by someone who saw the server's list; the item's history keeps it).
 *   The note beside them is a scalar: a different note on both sides is still a conflict.
 * - strikes (an attempt struck through with a reason): an append-only set of their own, keyed by
 *   the struck attempt's id, ordered by the time struck then that id. Two tablets striking the
 *   same attempt keep the strike the server saw first; a strike is never removed, so an attempt
 *   once struck stays struck. A value with no strike carries no `strikes` field.
 * - scalar kinds — check, choice, text, initials, calc (its note): the value is one answer. An
 *   entry on the current revision replaces it; the same value is accepted; a different value on
 *   an older revision is a conflict kept with both values for a person to decide.
 */
export type MergeRule = "log" | "scalar";

const LOG_KINDS: ReadonlySet<ItemKind> = new Set(["measure", "readings", "photo"]);
export const mergeRuleFor = (kind: ItemKind): MergeRule => (LOG_KINDS.has(kind) ? "log" : "scalar");

type Entry = { id?: string; at?: string; [key: string]: unknown };
type LogValue = { attempts?: Entry[]; photos?: Entry[]; strikes?: Entry[]; note?: string };

/**
 * An entry's identity: its id, or (recorded before ids) its content, the same on every device.
 * A strike is known by the attempt it strikes.
 */
function entryKey(entry: Entry): string {
  if (typeof entry.id === "string") return entry.id;
  if (typeof entry.attempt === "string") return `strike:${entry.attempt}`;
  const keys = Object.keys(entry).sort();
  return `content:${JSON.stringify(keys.map((k) => [k, entry[k]]))}`;
}

function byTimeThenId(a: Entry, b: Entry): number {
  const ta = Date.parse(String(a.at));
  const tb = Date.parse(String(b.at));
  if (ta !== tb && !Number.isNaN(ta) && !Number.isNaN(tb)) return ta - tb;
  const ka = entryKey(a);
  const kb = entryKey(b);
  return ka < kb ? -1 : ka > kb ? 1 : 0;
}

/** The union of two lists of entries, each entry once; `order` sorts it (or keeps first-seen). */
function union(server: Entry[], incoming: Entry[], order?: (a: Entry, b: Entry) => number): Entry[] {
  const seen = new Set(server.map(entryKey));
  const merged = [...server, ...incoming.filter((e) => !seen.has(entryKey(e)) && seen.add(entryKey(e)))];
  return order ? merged.sort(order) : merged;
}

export type MergeOutcome = { value: unknown } | { conflict: true };

/**
 * A log kind's merge of an entry into the server's value. `onCurrent` says the entry was made on
 * the server's current revision: then its note replaces the server's (an ordinary edit); on an
 * older revision a different note on both sides is a conflict.
 */
export function mergeLog(server: unknown, incoming: unknown, onCurrent: boolean): MergeOutcome {
  if (server === undefined || server === null) return { value: incoming };
  const s = server as LogValue;
  const i = incoming as LogValue;
  const list = "photos" in i || "photos" in s ? "photos" : "attempts";
  // A photo taken by mistake may be removed by someone who saw the server's list (history keeps
  // it); an attempt is never removed.
  if (list === "photos" && onCurrent) return { value: incoming };
  const entries =
    list === "photos"
      ? union(s.photos ?? [], i.photos ?? [])
      : union(s.attempts ?? [], i.attempts ?? [], byTimeThenId);
  if (!onCurrent && i.note !== undefined && s.note !== undefined && i.note !== s.note)
    return { conflict: true };
  const note = onCurrent ? i.note : (s.note ?? i.note);
  const strikes = list === "attempts" ? union(s.strikes ?? [], i.strikes ?? [], byTimeThenId) : [];
  return {
    value: {
      [list]: entries,
      ...(strikes.length ? { strikes } : {}),
      ...(note !== undefined ? { note } : {}),
    },
  };
}
