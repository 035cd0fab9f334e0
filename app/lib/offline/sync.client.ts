import type { SyncResponse } from "../sync/protocol.ts";
import type { OutboxEntry } from "./db.client.ts";
import { applySyncAnswer, deviceId, getMeta, outboxInOrder, refuseLocally } from "./store.client.ts";

/** Operations per request: well under the server's limit, small enough for a weak signal. */
const BATCH = 200;

/** What the technician is told when the server cannot be reached (never a raw browser error). */
export const UNREACHABLE = "Server unreachable; your entries are kept on this tablet and will be sent.";

export type SyncResult =
  | { ok: true; pushed: number }
  | { ok: false; reason: "offline" | "signed-out" | "server"; message: string; retryAfterMs?: number };

/** Progress of a long push: entries sent so far of those waiting when the sync began. */
export type SyncProgress = { sent: number; total: number };

/** Answers that mean "not now" rather than "not this": the outbox is kept and sent again later. */
const TRY_AGAIN_LATER = new Set([408, 425, 429, 503]);

function retryAfter(response: Response): number | undefined {
  const header = response.headers.get("Retry-After");
  if (!header) return undefined;
  const seconds = Number(header);
  if (Number.isFinite(seconds)) return Math.max(0, seconds * 1000);
  const date = Date.parse(header);
  return Number.isNaN(date) ? undefined : Math.max(0, date - Date.now());
}

async function refusalMessage(response: Response): Promise<string> {
  const body = (await response.json().catch(() => null)) as {
    error?: string;
    fields?: { path: string; message: string }[];
  } | null;
  const fields = body?.fields?.map((f) => `${f.path} ${f.message}`).join("; ");
  return [body?.error ?? `The server refused this entry (${response.status}).`, fields]
    .filter(Boolean)
    .join(" ");
}

/**
 * Pushes the outbox in order and pulls changes, until the outbox is empty. Each round sends at
 * most one operation per item: a second entry on the same item waits for the first one's new
 * revision, so a device never conflicts with itself. An entry leaves the outbox only when its
 * result has come back; a lost answer means the same operations are sent again, which the
 * server answers from its record without applying them twice.
 *
 * A batch the server refuses as a whole (a 4xx other than "try later") is halved until the
 * entry it cannot take is alone; that entry becomes a refusal the technician sees, and the rest
 * of the outbox goes on. No answer, or 503 ("database down"), is offline: everything is kept.
 */
export async function syncOnce(
  fetcher: typeof fetch = fetch,
  base = "",
  onProgress: (progress: SyncProgress) => void = () => {},
): Promise<SyncResult> {
  const device = await deviceId();
  const me = (await getMeta<{ name: string }>("user"))?.name ?? "me";
  const total = (await outboxInOrder()).length;
  let pushed = 0;
  let limit = BATCH;
  for (let round = 0; round < 10_000; round++) {
    const outbox = await outboxInOrder();
    const seen = new Set<string>();
    const batch: OutboxEntry[] = [];
    for (const op of outbox) {
      if (batch.length === limit) break;
      const item = `${op.checklistId}|${op.itemKey}`;
      if (seen.has(item)) continue;
      seen.add(item);
      batch.push(op);
    }
    const cursor = (await getMeta<string>("cursor")) ?? null;
    let response: Response;
    try {
      response = await fetcher(`${base}/api/sync`, {
        method: "POST",
        credentials: "same-origin",
        headers: { "Content-Type": "application/json" },
        body: JSON.stringify({
          deviceId: device,
          cursor,
          ops: batch.map(({ opId, seq, checklistId, itemKey, value, baseRev, at, resolves }) => ({
            opId,
            seq,
            checklistId,
            itemKey,
            value,
            baseRev,
            at,
            ...(resolves ? { resolves } : {}),
          })),
        }),
      });
    } catch {
      return { ok: false, reason: "offline", message: UNREACHABLE };
    }
    if (response.status === 401)
      return { ok: false, reason: "signed-out", message: "Sign in again to send your entries." };
    if (TRY_AGAIN_LATER.has(response.status) || response.status === 502 || response.status === 504)
      return { ok: false, reason: "offline", message: UNREACHABLE, retryAfterMs: retryAfter(response) };
    if (response.status >= 400 && response.status < 500 && batch.length > 0) {
      if (batch.length > 1) {
        limit = Math.ceil(batch.length / 2); // find the entry the server cannot take
        continue;
      }
      await refuseLocally(batch[0]!, await refusalMessage(response));
      pushed += 1;
      onProgress({ sent: pushed, total });
      continue;
    }
    if (!response.ok)
      return {
        ok: false,
        reason: "server",
        message: `The server had a problem (${response.status}); your entries are kept and will be sent again.`,
      };
    const answer = (await response.json()) as SyncResponse;
    await applySyncAnswer(batch, answer, me);
    pushed += batch.length;
    onProgress({ sent: Math.min(pushed, total), total });
    limit = Math.min(BATCH, limit * 2);
    // Done when nothing is left to send and the pull has reached the end of the feed.
    if (!answer.more && (batch.length === 0 || (await outboxInOrder()).length === 0))
      return { ok: true, pushed };
  }
  return { ok: true, pushed };
}
