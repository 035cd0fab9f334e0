import type { Knex } from "knex";

export async function up(knex: Knex) {
  // A device's clock is kept exactly as the device sent it (an ISO 8601 string, up to 40
  // characters), however wrong: a DATETIME column could not hold year 0000 or 9999 with an
  // offset, and refusing the write failed the whole batch. The clock never decides anything.
  for (const table of ["response_history", "sync_conflicts"]) {
    await knex.raw(`ALTER TABLE ?? MODIFY client_at VARCHAR(40) NULL`, [table]);
    // Earlier rows held a UTC DATETIME: write them back in the ISO form the tablets send.
    await knex.raw(
      `UPDATE ?? SET client_at = CONCAT(REPLACE(client_at, ' ', 'T'), 'Z') WHERE client_at NOT LIKE '%T%'`,
      [table],
    );
  }
  // A checklist's state change (submitted, returned, countersigned) takes a place in the change
  // feed, so other tablets learn it from their next pull.
  await knex.schema.alterTable("job_checklists", (t) => {
    t.bigInteger("change_seq").unsigned().nullable().index();
  });
}

export async function down(knex: Knex) {
  await knex.schema.alterTable("job_checklists", (t) => {
    t.dropIndex(["change_seq"]);
    t.dropColumn("change_seq");
  });
  for (const table of ["response_history", "sync_conflicts"]) {
    // A DATETIME cannot hold every clock a device sent; the device clock decides nothing, so it goes.
    await knex.raw(`UPDATE ?? SET client_at = NULL`, [table]);
    await knex.raw(`ALTER TABLE ?? MODIFY client_at DATETIME(3) NULL`, [table]);
  }
}
