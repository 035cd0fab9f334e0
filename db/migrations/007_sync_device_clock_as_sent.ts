import type { Knex } from "knex";

/**
 * A device's clock is kept exactly as the device sent it (an ISO 8601 string, up to 40
 * characters), however wrong: a DATETIME column could not hold year 0000 or 9999 with an offset,
 * and refusing the write failed the whole batch. The clock never decides anything.
 */
export async function up(knex: Knex) {
  for (const table of ["response_history", "sync_conflicts"]) {
    await knex.raw(`ALTER TABLE ?? MODIFY client_at VARCHAR(40) NULL`, [table]);
    // Earlier rows held a UTC DATETIME: write them back in the ISO form the tablets send.
    await knex.raw(
      `UPDATE ?? SET client_at = CONCAT(REPLACE(client_at, ' ', 'T'), 'Z') WHERE client_at NOT LIKE '%T%'`,
      [table],
    );
  }
}

export async function down(knex: Knex) {
  for (const table of ["response_history", "sync_conflicts"]) {
    // A DATETIME cannot hold every clock a device sent; the device clock decides nothing, so it goes.
    await knex.raw(`UPDATE ?? SET client_at = NULL`, [table]);
    await knex.raw(`ALTER TABLE ?? MODIFY client_at DATETIME(3) NULL`, [table]);
  }
}
