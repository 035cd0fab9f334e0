import type { Knex } from "knex";

/**
 * The change feed's clock (decisions 004, 043). Taking the next number locks the clock row until
 * the transaction ends, so numbers are handed out in commit order and a device pulling "changes
 * after N" can never miss a change committed late with a smaller number. Take it last, just
 * before writing: whoever holds it holds up every other writer.
 */
export async function nextChangeNumber(trx: Knex.Transaction): Promise<number> {
  const [answer] = await takeClock(trx);
  return Number((answer as { insertId: number | string }).insertId);
}

/**
 * The statement that takes the next number: the UPDATE takes the row lock and LAST_INSERT_ID(expr)
 * hands the new value back in its own answer (the OK packet's insert id) and, until the
 * connection's next auto-increment insert, as LAST_INSERT_ID() to the statements after it.
 */
export const TAKE_CLOCK_SQL = "UPDATE sync_clock SET seq = LAST_INSERT_ID(seq + 1) WHERE id = 1";
const takeClock = (knex: Knex) => knex.raw(TAKE_CLOCK_SQL);

/** The last number handed out (what a pull may read up to without taking the lock). */
export async function lastChangeNumber(trx: Knex): Promise<number> {
  return Number((await trx("sync_clock").where({ id: 1 }).first("seq"))!.seq);
}

/** Puts a checklist's state change in the feed (call in the transaction that changes it). */
export async function checklistStateChanged(trx: Knex.Transaction, checklistId: string) {
  // The checklist's row before the clock: the order every sync batch takes them in, so the two
  // never wait on each other in a circle.
  await trx("job_checklists").where({ id: checklistId }).forUpdate().select("id");
  await trx("job_checklists")
    .where({ id: checklistId })
    .update({ change_seq: await nextChangeNumber(trx) });
}
