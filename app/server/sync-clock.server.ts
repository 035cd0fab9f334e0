import type { Knex } from "knex";

/**
 * The change feed's clock (decision 004). Taking the next number locks the clock row until the
 * transaction ends, so numbers are handed out in commit order and a device pulling "changes
 * after N" can never miss a change committed late with a smaller number.
 */
export async function nextChangeNumber(trx: Knex.Transaction): Promise<number> {
  const { seq } = (await trx("sync_clock").where({ id: 1 }).forUpdate().first())!;
  const next = Number(seq) + 1;
  await trx("sync_clock").where({ id: 1 }).update({ seq: next });
  return next;
}

/** The last number handed out (what a pull may read up to without taking the lock). */
export async function lastChangeNumber(trx: Knex.Transaction): Promise<number> {
  return Number((await trx("sync_clock").where({ id: 1 }).first())!.seq);
}

/** Puts a checklist's state change in the feed (call in the transaction that changes it). */
export async function checklistStateChanged(trx: Knex.Transaction, checklistId: string) {
  await trx("job_checklists")
    .where({ id: checklistId })
    .update({ change_seq: await nextChangeNumber(trx) });
}
