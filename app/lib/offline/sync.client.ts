import type { SyncResponse } from "../sync/protocol.ts";
import type { OutboxEntry } from "./db.client.ts";
import { applySyncAnswer, deviceId, getMeta, outboxInOrder } from "./store.client.ts";

/** Operations per request: well under the server's limit, small enough for a weak signal. */
const BATCH = 200;

export type SyncResult =
  { ok: true; pushed: number } | { ok: false; reason: "offline" | "signed-out" | "server"; message: string };

/**
 * Pushes the outbox in order and pulls changes, until the outbox is empty. Each round sends at
 * most one operation per item: a second entry on the same item waits for the first one's new
 * revision, so a device never conflicts with itself. An entry leaves the outbox only when its
 * result has come back; a lost answer means the same operations are sent again, which the
 * server answers from its record without applying them twice.
 */
export async function syncOnce(fetcher: typeof fetch = fetch, base = ""): Promise<SyncResult> {
  const device = await deviceId();
  const me = (await getMeta<{ name: string }>("user"))?.name ?? "me";
  let pushed = 0;
  for (let round = 0; round < 1000; round++) {
    const outbox = await outboxInOrder();
    const seen = new Set<string>();
    const batch: OutboxEntry[] = [];
    for (const op of outbox) {
      const item = `${op.checklistId}|${op.itemKey}`;
      if (seen.has(item)) continue;
      seen.add(item);
      batch.push(op);
      if (batch.length === BATCH) break;
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
    } catch (error) {
      return { ok: false, reason: "offline", message: String(error) };
    }
    if (response.status === 401)
      return { ok: false, reason: "signed-out", message: "Sign in again to send your entries." };
    if (!response.ok)
      return { ok: false, reason: "server", message: `The server answered ${response.status}.` };
    const answer = (await response.json()) as SyncResponse;
    await applySyncAnswer(batch, answer, me);
    pushed += batch.length;
    if (batch.length === 0 || (await outboxInOrder()).length === 0) return { ok: true, pushed };
  }
  return { ok: true, pushed };
}
