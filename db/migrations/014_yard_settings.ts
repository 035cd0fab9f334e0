import type { Knex } from "knex";

/**
 * The yard's own settings, one row: its name (printed on records; YARD_NAME until set) and its
 * time zone (every date on every screen and in the PDF is written in it; YARD_TIME_ZONE or UTC
 * until set).
 */
export async function up(knex: Knex) {
  await knex.schema.createTable("yard_settings", (t) => {
    t.tinyint("id").unsigned().primary();
    t.string("name", 120).notNullable();
    t.string("time_zone", 64).notNullable();
    t.integer("updated_by").unsigned().nullable().references("users.id");
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
}

export async function down(knex: Knex) {
  await knex.schema.dropTable("yard_settings");
}
