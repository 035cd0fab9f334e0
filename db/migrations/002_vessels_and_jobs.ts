import type { Knex } from "knex";

export async function up(knex: Knex) {
  await knex.schema.createTable("vessels", (t) => {
    t.increments("id");
    t.string("name", 120).notNullable();
    t.string("hin", 12).nullable().unique();
    // Length as entered, with its unit, and normalised to metres for sorting and reports.
    t.decimal("length_value", 8, 2).notNullable();
    t.enu("length_unit", ["ft", "m"]).notNullable();
    t.decimal("length_m", 8, 3).notNullable();
    t.enu("hull_type", ["displacement", "semi-displacement", "planing", "catamaran", "other"]).notNullable();
    t.string("owner_name", 120).notNullable();
    t.string("owner_email", 254).nullable();
    t.string("owner_phone", 40).nullable();
    t.text("waterline_notes").nullable();
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
  await knex.schema.createTable("jobs", (t) => {
    t.increments("id");
    t.integer("vessel_id").unsigned().notNullable().references("vessels.id");
    t.enu("scope", ["repower", "new-installation", "realignment", "shaft-replacement"]).notNullable();
    t.enu("status", ["planned", "underway", "completed"]).notNullable().defaultTo("planned");
    t.string("engine_model", 120).notNullable();
    t.string("engine_serial", 60).notNullable();
    t.decimal("rated_power_hp", 7, 1).notNullable();
    t.integer("rated_rpm_min").unsigned().notNullable();
    t.integer("rated_rpm_max").unsigned().notNullable();
    t.decimal("gear_ratio", 5, 3).notNullable();
    t.decimal("prop_diameter_in", 6, 2).notNullable();
    t.decimal("prop_pitch_in", 6, 2).notNullable();
    t.tinyint("prop_blades").unsigned().notNullable();
    t.decimal("shaft_diameter_in", 6, 4).notNullable();
    t.string("shaft_material", 60).notNullable();
    t.string("coupling_type", 60).notNullable();
    t.date("start_date").nullable();
    t.date("due_date").nullable();
    t.integer("lead_id").unsigned().notNullable().references("users.id");
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
  await knex.schema.createTable("job_technicians", (t) => {
    t.integer("job_id").unsigned().notNullable().references("jobs.id").onDelete("CASCADE");
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.primary(["job_id", "user_id"]);
  });
}

export async function down(knex: Knex) {
  await knex.schema.dropTable("job_technicians");
  await knex.schema.dropTable("jobs");
  await knex.schema.dropTable("vessels");
}
