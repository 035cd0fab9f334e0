import type { Knex } from "knex";

const LOCKED =
  "SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'A countersigned checklist cannot be changed; record an amendment.'";
const lockedChecklist = (column: string) =>
  `EXISTS (SELECT 1 FROM job_checklists c WHERE c.id = ${column} AND c.state = 'countersigned')`;

export async function up(knex: Knex) {
  await knex.schema.alterTable("job_checklists", (t) => {
    t.integer("submitted_by").unsigned().nullable().references("users.id");
    t.datetime("submitted_at", { precision: 3 }).nullable();
    t.integer("countersigned_by").unsigned().nullable().references("users.id");
    t.datetime("countersigned_at", { precision: 3 }).nullable();
    t.string("digest", 64).nullable();
    // An amendment is a new checklist that points at the countersigned one it corrects.
    t.uuid("amends_id").nullable().references("job_checklists.id");
  });
  // Amendments repeat a template on a job, so the one-per-template rule moves to the application.
  await knex.schema.alterTable("job_checklists", (t) => {
    t.index(["job_id", "template_key"], "job_checklists_job_template");
  });
  await knex.schema.alterTable("job_checklists", (t) => {
    t.dropUnique(["job_id", "template_key"]);
  });
  await knex.schema.createTable("checklist_comments", (t) => {
    t.increments("id");
    t.uuid("checklist_id").notNullable().references("job_checklists.id").onDelete("CASCADE");
    t.string("item_key", 80).notNullable();
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.text("text").notNullable();
    t.datetime("at", { precision: 3 }).notNullable();
    t.index(["checklist_id"]);
  });

  // The lock, in the database as well as the application.
  await knex.raw(`CREATE TRIGGER job_checklists_sealed BEFORE UPDATE ON job_checklists FOR EACH ROW
    BEGIN IF OLD.state = 'countersigned' THEN ${LOCKED}; END IF; END`);
  await knex.raw(`CREATE TRIGGER job_checklists_kept BEFORE DELETE ON job_checklists FOR EACH ROW
    BEGIN IF OLD.state = 'countersigned' THEN ${LOCKED}; END IF; END`);
  for (const [table, when] of [
    ["checklist_responses", "INSERT"],
    ["checklist_responses", "UPDATE"],
    ["checklist_responses", "DELETE"],
    ["response_history", "INSERT"],
    ["response_history", "UPDATE"],
    ["response_history", "DELETE"],
    ["checklist_comments", "INSERT"],
    ["checklist_comments", "UPDATE"],
    ["checklist_comments", "DELETE"],
  ] as const) {
    const row = when === "DELETE" ? "OLD" : "NEW";
    await knex.raw(`CREATE TRIGGER ${table}_sealed_${when.toLowerCase()} BEFORE ${when} ON ${table} FOR EACH ROW
      BEGIN IF ${lockedChecklist(`${row}.checklist_id`)} THEN ${LOCKED}; END IF; END`);
  }

  // An issued record: the snapshot the PDF and the web view are made from, and its digest.
  await knex.schema.createTable("records", (t) => {
    t.uuid("id").primary();
    t.integer("job_id").unsigned().notNullable().references("jobs.id");
    t.text("content", "longtext").notNullable();
    t.string("digest", 64).notNullable();
    t.integer("issued_by").unsigned().notNullable().references("users.id");
    t.datetime("issued_at", { precision: 3 }).notNullable();
  });
  await knex.schema.createTable("record_recipients", (t) => {
    t.uuid("record_id").notNullable().references("records.id");
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.string("email", 254).notNullable();
    t.datetime("sent_at", { precision: 3 }).notNullable();
    t.primary(["record_id", "user_id"]);
  });
}

export async function down(knex: Knex) {
  await knex.schema.dropTable("record_recipients");
  await knex.schema.dropTable("records");
  for (const table of ["checklist_responses", "response_history", "checklist_comments"]) {
    for (const when of ["insert", "update", "delete"])
      await knex.raw(`DROP TRIGGER IF EXISTS ${table}_sealed_${when}`);
  }
  await knex.raw("DROP TRIGGER IF EXISTS job_checklists_kept");
  await knex.raw("DROP TRIGGER IF EXISTS job_checklists_sealed");
  await knex.schema.dropTable("checklist_comments");
  await knex.schema.alterTable("job_checklists", (t) => {
    t.unique(["job_id", "template_key"]);
  });
  await knex.schema.alterTable("job_checklists", (t) => {
    t.dropIndex(["job_id", "template_key"], "job_checklists_job_template");
    t.dropForeign(["amends_id"]);
    t.dropForeign(["submitted_by"]);
    t.dropForeign(["countersigned_by"]);
    t.dropColumns(
      "submitted_by",
      "submitted_at",
      "countersigned_by",
      "countersigned_at",
      "digest",
      "amends_id",
    );
  });
}
