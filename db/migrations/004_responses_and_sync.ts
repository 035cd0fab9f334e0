import type { Knex } from "knex";

export async function up(knex: Knex) {
  // The current value of each item of a checklist, with its revision (the sync's baseRev).
  await knex.schema.createTable("checklist_responses", (t) => {
    t.uuid("checklist_id").notNullable().references("job_checklists.id").onDelete("CASCADE");
    t.string("item_key", 80).notNullable();
    t.json("value").notNullable();
    t.integer("rev").unsigned().notNullable();
    t.integer("updated_by").unsigned().notNullable().references("users.id");
    t.string("device_id", 64).nullable();
    t.datetime("updated_at", { precision: 3 }).notNullable();
    // Position in the change feed: the cursor a device pulls from.
    t.bigInteger("change_seq").unsigned().notNullable().index();
    t.primary(["checklist_id", "item_key"]);
  });
  // Every value an item ever had, in order: nothing applied is ever lost.
  await knex.schema.createTable("response_history", (t) => {
    t.bigIncrements("id");
    t.uuid("checklist_id").notNullable().references("job_checklists.id").onDelete("CASCADE");
    t.string("item_key", 80).notNullable();
    t.integer("rev").unsigned().notNullable();
    t.json("value").notNullable();
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.string("device_id", 64).nullable();
    t.uuid("op_id").nullable().unique();
    t.datetime("at", { precision: 3 }).notNullable();
    t.datetime("client_at", { precision: 3 }).nullable();
    t.unique(["checklist_id", "item_key", "rev"]);
  });
  // Operations whose answer is not in response_history or sync_conflicts (refused, or accepted
  // as the server's own value), so a repeated opId gets the same answer.
  await knex.schema.createTable("sync_ops", (t) => {
    t.uuid("op_id").primary();
    t.string("device_id", 64).notNullable();
    t.integer("seq").unsigned().notNullable();
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.uuid("checklist_id").notNullable();
    t.string("item_key", 80).notNullable();
    t.enu("status", ["applied", "conflict", "rejected"]).notNullable();
    t.json("result").notNullable();
    t.datetime("received_at", { precision: 3 }).notNullable();
    t.index(["device_id", "seq"]);
  });
  // A value that arrived based on an older revision and differed: kept for a person to decide.
  await knex.schema.createTable("sync_conflicts", (t) => {
    t.increments("id");
    t.uuid("checklist_id").notNullable().references("job_checklists.id").onDelete("CASCADE");
    t.string("item_key", 80).notNullable();
    t.uuid("op_id").notNullable().unique();
    t.integer("base_rev").unsigned().notNullable();
    t.integer("server_rev").unsigned().notNullable();
    t.json("server_value").nullable();
    t.json("client_value").notNullable();
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.string("device_id", 64).notNullable();
    t.datetime("client_at", { precision: 3 }).nullable();
    t.datetime("received_at", { precision: 3 }).notNullable();
    t.datetime("resolved_at", { precision: 3 }).nullable();
    t.integer("resolved_by").unsigned().nullable().references("users.id");
    t.uuid("resolution_op_id").nullable();
    t.index(["checklist_id", "resolved_at"]);
  });
  // One row whose lock serialises appliers, so change_seq order is commit order and no device
  // pulling "changes after N" can miss a change committed late with a smaller number.
  await knex.schema.createTable("sync_clock", (t) => {
    t.tinyint("id").unsigned().primary();
    t.bigInteger("seq").unsigned().notNullable();
  });
  await knex("sync_clock").insert({ id: 1, seq: 0 });
}

export async function down(knex: Knex) {
  await knex.schema.dropTable("sync_clock");
  await knex.schema.dropTable("sync_conflicts");
  await knex.schema.dropTable("sync_ops");
  await knex.schema.dropTable("response_history");
  await knex.schema.dropTable("checklist_responses");
}
