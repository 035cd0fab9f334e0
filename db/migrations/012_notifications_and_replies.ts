import type { Knex } from "knex";

/**
 * The lead's day: who turned which e-mail off (a row per opt-out, so a new kind of message is on
 * for everyone until they say otherwise), a technician's reply to a lead's comment, and the moment
 * a surveyor first opened a record they were sent (their lead is told once).
 */
export async function up(knex: Knex) {
  await knex.schema.createTable("notification_optouts", (t) => {
    t.integer("user_id").unsigned().notNullable().references("users.id").onDelete("CASCADE");
    t.enu("kind", ["checklist-submitted", "checklist-returned", "record-viewed"]).notNullable();
    t.primary(["user_id", "kind"]);
  });
  await knex.schema.alterTable("checklist_comments", (t) => {
    t.integer("reply_to").unsigned().nullable().references("checklist_comments.id").after("item_key");
  });
  await knex.schema.alterTable("record_recipients", (t) => {
    t.datetime("first_viewed_at", { precision: 3 }).nullable();
  });
}

export async function down(knex: Knex) {
  await knex.schema.alterTable("record_recipients", (t) => {
    t.dropColumn("first_viewed_at");
  });
  await knex.schema.alterTable("checklist_comments", (t) => {
    t.dropForeign(["reply_to"]);
    t.dropColumn("reply_to");
  });
  await knex.schema.dropTable("notification_optouts");
}
