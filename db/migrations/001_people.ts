import type { Knex } from "knex";

export async function up(knex: Knex) {
  await knex.schema.createTable("users", (t) => {
    t.increments("id");
    t.string("email", 254).notNullable().unique();
    t.string("name", 120).notNullable();
    t.enu("role", ["technician", "lead", "manager", "surveyor"]).notNullable();
    t.string("password_hash", 100).nullable();
    t.boolean("active").notNullable().defaultTo(true);
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
  await knex.schema.createTable("invitations", (t) => {
    t.increments("id");
    t.integer("user_id").unsigned().notNullable().references("users.id").onDelete("CASCADE");
    t.string("token_hash", 64).notNullable().unique();
    t.datetime("expires_at", { precision: 3 }).notNullable();
    t.datetime("used_at", { precision: 3 }).nullable();
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
  // Sessions live in the database so any app instance can serve any request.
  await knex.schema.createTable("sessions", (t) => {
    t.string("id", 64).primary();
    t.integer("user_id").unsigned().nullable().references("users.id").onDelete("CASCADE");
    t.text("data").notNullable();
    t.datetime("expires_at", { precision: 3 }).nullable().index();
  });
  // Shape required by rate-limiter-flexible's MySQL store (created here, not at run time).
  await knex.raw(
    "CREATE TABLE rate_limits (`key` VARCHAR(255) CHARACTER SET utf8 NOT NULL, `points` INT(9) NOT NULL DEFAULT 0, `expire` BIGINT UNSIGNED, PRIMARY KEY (`key`)) ENGINE=InnoDB",
  );
  await knex.schema.createTable("audit_log", (t) => {
    t.bigIncrements("id");
    t.timestamp("at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).index();
    t.integer("user_id").unsigned().nullable().references("users.id");
    t.string("device_id", 64).nullable();
    t.string("action", 64).notNullable().index();
    t.string("entity", 32).notNullable();
    t.string("entity_id", 64).notNullable();
    t.json("detail").nullable();
    t.index(["entity", "entity_id"]);
  });
}

export async function down(knex: Knex) {
  await knex.schema.dropTable("audit_log");
  await knex.schema.dropTable("rate_limits");
  await knex.schema.dropTable("sessions");
  await knex.schema.dropTable("invitations");
  await knex.schema.dropTable("users");
}
