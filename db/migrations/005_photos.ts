import type { Knex } from "knex";

export async function up(knex: Knex) {
  // A photo taken on a tablet, by the UUID the tablet gave it. The bytes are in the S3 store under
  // storage_key (derived from sha256), so one id always means one set of bytes.
  await knex.schema.createTable("photos", (t) => {
    t.uuid("id").primary();
    t.uuid("checklist_id").notNullable().references("job_checklists.id").onDelete("CASCADE");
    t.string("item_key", 80).notNullable();
    t.specificType("sha256", "CHAR(64)").notNullable();
    t.integer("bytes").unsigned().notNullable();
    t.string("content_type", 40).notNullable();
    t.integer("uploaded_by").unsigned().notNullable().references("users.id");
    t.datetime("uploaded_at", { precision: 3 }).notNullable();
    t.string("storage_key", 200).notNullable();
    t.index(["checklist_id", "item_key"]);
  });
}

export async function down(knex: Knex) {
  await knex.schema.dropTable("photos");
}
