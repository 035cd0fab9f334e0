import type { Knex } from "knex";
import { db } from "./db.server.ts";
import { env } from "./env.server.ts";
import { logger } from "./logger.server.ts";
import { sendMail } from "./mail.server.ts";

export interface OutgoingMail {
  /** What the message is, for the logs and the People page (invitation, record, a notification kind). */
  kind: string;
  to: string;
  subject: string;
  text: string;
}

type Send = (message: { to: string; subject: string; text: string }) => Promise<unknown>;

/** A message being sent is left alone this long by the other instances (then taken as lost). */
const CLAIM_S = 300;
/** Retries wait 1, 2, 4… times MAIL_RETRY_S, at most an hour; after three days a message is given up. */
const MAX_WAIT_S = 3600;
const GIVE_UP_AFTER_H = 72;

const inSeconds = (s: number) => new Date(Date.now() + s * 1000);

/**
 * Keeps messages to send, in the caller's transaction when it has one: the message exists
 * exactly when what it reports was committed. Answers their ids for `deliver`.
 */
export async function queueMail(messages: OutgoingMail[], knex: Knex = db()): Promise<number[]> {
  const ids: number[] = [];
  // One row at a time: a Galera cluster hands out auto-increment ids in steps of the node count.
  for (const m of messages) {
    const [id] = await knex("mail_outbox").insert({
      kind: m.kind,
      recipient: m.to,
      subject: m.subject,
      body: m.text,
      next_attempt_at: new Date(),
    });
    ids.push(Number(id));
  }
  return ids;
}

/** Keeps and sends at once; what the mail server does not take now is retried later. */
export async function queueAndSend(messages: OutgoingMail[]) {
  return deliver(await queueMail(messages));
}

/**
 * Sends the given waiting messages (each one taken first, so two instances never send the same
 * message twice at once). A refusal is logged and kept on the message, never thrown: what the
 * message reports has already happened. Answers how many the mail server took.
 */
export async function deliver(ids: number[], send: Send = sendMail): Promise<{ sent: number }> {
  let sent = 0;
  for (const id of ids) {
    try {
      if (await deliverOne(id, send)) sent++;
    } catch (error) {
      // The database, not the mail server: the message stays kept and the retry loop comes back.
      logger.warn({ mailId: id, err: (error as Error).message }, "mail outbox not reached");
    }
  }
  return { sent };
}

async function deliverOne(id: number, send: Send): Promise<boolean> {
  const row = await db()("mail_outbox").where({ id }).first();
  if (!row?.next_attempt_at || new Date(row.next_attempt_at) > new Date()) return false;
  const taken = await db()("mail_outbox")
    .where({ id, next_attempt_at: row.next_attempt_at })
    .update({ next_attempt_at: inSeconds(CLAIM_S), attempts: row.attempts + 1 });
  if (!taken) return false; // another instance has it
  try {
    await send({ to: row.recipient, subject: row.subject, text: row.body });
  } catch (error) {
    await setBack(row, error as Error & { responseCode?: number; code?: string });
    return false;
  }
  await db()("mail_outbox")
    .where({ id })
    .update({ sent_at: new Date(), next_attempt_at: null, last_error: null });
  return true;
}

/** After a failed attempt: a refusal of the message itself is final; anything else is retried. */
async function setBack(
  row: { id: number; kind: string; attempts: number; created_at: Date },
  error: Error & { responseCode?: number; code?: string },
) {
  const attempts = row.attempts + 1;
  const refused = (error.responseCode ?? 0) >= 500 || error.code === "EENVELOPE";
  const tooOld = Date.now() - new Date(row.created_at).getTime() > GIVE_UP_AFTER_H * 3600_000;
  const wait = Math.min(env().MAIL_RETRY_S * 2 ** (attempts - 1), MAX_WAIT_S);
  const last_error = error.message.slice(0, 500);
  const giveUp = refused || tooOld;
  await db()("mail_outbox")
    .where({ id: row.id })
    .update(
      giveUp
        ? { next_attempt_at: null, failed_at: new Date(), last_error }
        : { next_attempt_at: inSeconds(wait), last_error },
    );
  logger.warn(
    { mailId: row.id, kind: row.kind, attempts, err: last_error, ...(giveUp ? {} : { retryInS: wait }) },
    giveUp ? "mail not sent, given up" : "mail not sent yet",
  );
}

/** Sends every message whose turn has come (the retry loop's work). */
export async function deliverDue(send: Send = sendMail) {
  const ids: number[] = await db()("mail_outbox")
    .where("next_attempt_at", "<=", new Date())
    .orderBy("id")
    .limit(100)
    .pluck("id");
  return deliver(ids, send);
}

/** What the People page tells the manager: messages still waiting, and the last reason given. */
export async function mailWaiting() {
  const waiting = db()("mail_outbox").whereNotNull("next_attempt_at");
  const [count, last, failed] = await Promise.all([
    waiting.clone().count({ n: "*" }).first(),
    waiting.clone().whereNotNull("last_error").orderBy("id", "desc").first("last_error"),
    db()("mail_outbox")
      .where("failed_at", ">", inSeconds(-7 * 24 * 3600))
      .count({ n: "*" })
      .first(),
  ]);
  return {
    waiting: Number(count?.n ?? 0),
    lastError: (last?.last_error as string | undefined) ?? null,
    failedThisWeek: Number(failed?.n ?? 0),
  };
}

let timer: NodeJS.Timeout | undefined;

/** The retry loop of a server process: every MAIL_RETRY_S, whatever is due is sent. */
export function startMailRetries() {
  timer ??= setInterval(() => {
    deliverDue().catch((error: Error) => logger.warn({ err: error.message }, "mail retry failed"));
  }, env().MAIL_RETRY_S * 1000).unref();
}
