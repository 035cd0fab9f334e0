import type { Knex } from "knex";

/**
 * The job's equipment gains what the checklists need to pick their tables and limits: the shaft's
 * system (inch or metric: keys, tapers and nuts differ), a metric shaft's diameter as entered, and
 * the DC system voltage the electrical checks work from. Existing jobs are inch, 12 V.
 */
export async function up(knex: Knex) {
  await knex.schema.alterTable("jobs", (t) => {
    t.enu("shaft_system", ["inch", "metric"]).notNullable().defaultTo("inch").after("prop_blades");
    t.decimal("shaft_diameter_mm", 7, 3).nullable().after("shaft_diameter_in");
    t.tinyint("system_volts").unsigned().notNullable().defaultTo(12).after("coupling_type");
  });
}

export async function down(knex: Knex) {
  await knex.schema.alterTable("jobs", (t) => {
    t.dropColumn("system_volts");
    t.dropColumn("shaft_diameter_mm");
    t.dropColumn("shaft_system");
  });
}
