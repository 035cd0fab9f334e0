import type { Knex } from "knex";

/**
 * The seal on countersigned checklists, kept by a foreign key instead of a look-up per row
 * (decision 045). A checklist has `open_id` (its own id) until it is countersigned, then NULL;
 * each row of its values, history and comments carries `open_ref` (its checklist's id, set by a
 * trigger whatever the writer sent) with a foreign key to `open_id`. Countersigning sets the
 * rows' `open_ref` to NULL through the key's ON UPDATE SET NULL; from then on writing any of
 * them, or a new row, names a checklist with no `open_id` and the key refuses it. Deletes keep
 * the look-up triggers of migration 006 (rare, and the key does not see them).
 */
const SEALED = ["checklist_responses", "response_history", "checklist_comments"] as const;
const LOCKED =
  "SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'A countersigned checklist cannot be changed; record an amendment.'";
const lockedChecklist = (column: string) =>
  `EXISTS (SELECT 1 FROM job_checklists c WHERE c.id = ${column} AND c.state = 'countersigned')`;
const openIdOf = "IF(NEW.state = 'countersigned', NULL, NEW.id)";
/** The key's name is what its refusal says: it must read as the rule. */
export const sealKey = (table: string) => `${table}_sealed_when_countersigned`;

/** The triggers that set a row's `open_ref` to its checklist whatever the writer sent. */
export async function sealTriggers(knex: Knex, table: string) {
  for (const when of ["insert", "update"])
    await knex.raw(`CREATE TRIGGER ${table}_sealed_${when} BEFORE ${when.toUpperCase()} ON ${table}
      FOR EACH ROW SET NEW.open_ref = NEW.checklist_id`);
}

export async function up(knex: Knex) {
  await knex.schema.alterTable("job_checklists", (t) => {
    t.uuid("open_id").nullable().unique("job_checklists_open_id_unique");
  });
  await knex.raw("UPDATE job_checklists SET open_id = id WHERE state <> 'countersigned'");
  await knex.raw("DROP TRIGGER IF EXISTS job_checklists_sealed");
  await knex.raw(`CREATE TRIGGER job_checklists_sealed BEFORE UPDATE ON job_checklists FOR EACH ROW
    BEGIN IF OLD.state = 'countersigned' THEN ${LOCKED}; END IF; SET NEW.open_id = ${openIdOf}; END`);
  await knex.raw(`CREATE TRIGGER job_checklists_open BEFORE INSERT ON job_checklists FOR EACH ROW
    SET NEW.open_id = ${openIdOf}`);

  for (const table of SEALED) {
    await knex.raw(`DROP TRIGGER IF EXISTS ${table}_sealed_insert`);
    await knex.raw(`DROP TRIGGER IF EXISTS ${table}_sealed_update`);
    await knex.schema.alterTable(table, (t) => {
      t.uuid("open_ref").nullable();
    });
    await knex.raw(
      `UPDATE ${table} r JOIN job_checklists c ON c.id = r.checklist_id SET r.open_ref = c.open_id`,
    );
    await knex.raw(`ALTER TABLE ${table} ADD CONSTRAINT ${sealKey(table)} FOREIGN KEY (open_ref)
      REFERENCES job_checklists (open_id) ON UPDATE SET NULL ON DELETE SET NULL`);
    await sealTriggers(knex, table);
  }
}

export async function down(knex: Knex) {
  for (const table of SEALED) {
    for (const when of ["insert", "update"]) {
      await knex.raw(`DROP TRIGGER IF EXISTS ${table}_sealed_${when}`);
      await knex.raw(`CREATE TRIGGER ${table}_sealed_${when} BEFORE ${when.toUpperCase()} ON ${table}
        FOR EACH ROW BEGIN IF ${lockedChecklist("NEW.checklist_id")} THEN ${LOCKED}; END IF; END`);
    }
    await knex.raw(`ALTER TABLE ${table} DROP FOREIGN KEY ${sealKey(table)}`);
    await knex.schema.alterTable(table, (t) => {
      t.dropColumn("open_ref");
    });
  }
  await knex.raw("DROP TRIGGER IF EXISTS job_checklists_open");
  await knex.raw("DROP TRIGGER IF EXISTS job_checklists_sealed");
  await knex.raw(`CREATE TRIGGER job_checklists_sealed BEFORE UPDATE ON job_checklists FOR EACH ROW
    BEGIN IF OLD.state = 'countersigned' THEN ${LOCKED}; END IF; END`);
  await knex.schema.alterTable("job_checklists", (t) => {
    t.dropUnique(["open_id"], "job_checklists_open_id_unique");
    t.dropColumn("open_id");
  });
}
