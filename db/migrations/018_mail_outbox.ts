import type { Knex } from "knex";

/**
 * Mail waits here until the mail server takes it: written in the transaction of what it reports
 * (a record, an invitation, a notification), sent after, and retried while the server is away.
 * `next_attempt_at` is set while a message waits and NULL once it was sent or given up.
 */
export async function up(knex: Knex) {
  await knex.schema.createTable("mail_outbox", (t) => {
    t.bigIncrements("id");
    t.string("kind", 40).notNullable();
    t.string("recipient", 320).notNullable();
    t.string("subject", 998).notNullable();
    t.text("body", "mediumtext").notNullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.integer("attempts").unsigned().notNullable().defaultTo(0);
    t.timestamp("next_attempt_at", { precision: 3 }).nullable().index();
    t.timestamp("sent_at", { precision: 3 }).nullable();
    t.timestamp("failed_at", { precision: 3 }).nullable();
    t.string("last_error", 500).nullable();
  });
}

export async function down(knex: Knex) {
  await knex.schema.dropTable("mail_outbox");
}
