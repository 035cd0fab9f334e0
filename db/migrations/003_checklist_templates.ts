import type { Knex } from "knex";

export async function up(knex: Knex) {
  await knex.schema.createTable("template_versions", (t) => {
    t.increments("id");
    t.string("template_key", 80).notNullable();
    t.integer("version").unsigned().notNullable();
    t.enu("status", ["draft", "published", "retired"]).notNullable().defaultTo("draft");
    t.string("title", 200).notNullable();
    // The template exactly as the format defines it (see docs/template-format.md).
    t.text("body", "mediumtext").notNullable();
    t.string("body_sha256", 64).notNullable();
    t.datetime("published_at", { precision: 3 }).nullable();
    t.datetime("retired_at", { precision: 3 }).nullable();
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["template_key", "version"]);
    t.index(["template_key", "status"]);
  });
  // A published version never changes: only its retirement may be recorded, and it is never deleted.
  await knex.raw(`
    CREATE TRIGGER template_versions_frozen BEFORE UPDATE ON template_versions FOR EACH ROW
    BEGIN
      IF OLD.status <> 'draft' AND (
           NEW.body <> OLD.body OR NEW.body_sha256 <> OLD.body_sha256 OR NEW.title <> OLD.title
        OR NEW.template_key <> OLD.template_key OR NEW.version <> OLD.version
        OR NOT (NEW.published_at <=> OLD.published_at)
        OR (OLD.status = 'retired' AND NEW.status <> 'retired')
        OR NEW.status = 'draft') THEN
        SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'A published template version cannot be changed; make a new version.';
      END IF;
    END`);
  await knex.raw(`
    CREATE TRIGGER template_versions_kept BEFORE DELETE ON template_versions FOR EACH ROW
    BEGIN
      IF OLD.status <> 'draft' THEN
        SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'A published template version cannot be deleted.';
      END IF;
    END`);

  await knex.schema.createTable("job_checklists", (t) => {
    t.uuid("id").primary();
    t.integer("job_id").unsigned().notNullable().references("jobs.id").onDelete("CASCADE");
    t.integer("template_version_id").unsigned().notNullable().references("template_versions.id");
    t.string("template_key", 80).notNullable();
    t.enu("state", ["in-progress", "submitted", "returned", "countersigned"])
      .notNullable()
      .defaultTo("in-progress");
    t.integer("started_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["job_id", "template_key"]);
  });
}

export async function down(knex: Knex) {
  await knex.schema.dropTable("job_checklists");
  await knex.raw("DROP TRIGGER IF EXISTS template_versions_kept");
  await knex.raw("DROP TRIGGER IF EXISTS template_versions_frozen");
  await knex.schema.dropTable("template_versions");
}
