import type { Knex } from "knex";
import { sealKey, sealTriggers } from "./015_seal_by_key.ts";

/**
 * An item's current value is its current history row (decision 046): `checklist_responses` becomes
 * a view of `response_history`, and an applied entry writes one row, not two. The current row of
 * an item carries its place in the change feed (`change_seq`); a row a later revision replaced
 * has none. `is_current` follows from it, and a unique key on (checklist, item, is_current) lets
 * an item have one current row at most, whoever writes. Existing values keep their meaning and the
 * records their digests: every current value already has its history row (the applier and the
 * amendment always wrote both), which receives the value's change number; a value without one,
 * if any, is copied into the history first. Sealed rows keep their seal (`open_ref` NULL): the
 * seal's triggers, which would set it again, are off while rows are copied.
 */
const LOCKED =
  "SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'A countersigned checklist cannot be changed; record an amendment.'";

const dropSealTriggers = async (knex: Knex, table: string) => {
  for (const when of ["insert", "update"]) await knex.raw(`DROP TRIGGER IF EXISTS ${table}_sealed_${when}`);
};

/** Each item's current row. */
const CURRENT_VALUES = `SELECT h.checklist_id, h.item_key, h.value, h.rev, h.user_id AS updated_by,
    h.device_id, h.at AS updated_at, h.change_seq, h.open_ref
  FROM response_history h
  WHERE h.is_current = 1`;
export const ONE_CURRENT = "response_history_one_current_row";

export async function up(knex: Knex) {
  await knex.schema.alterTable("response_history", (t) => {
    // Position in the change feed (the cursor a device pulls from), while the row is current.
    t.bigInteger("change_seq").unsigned().nullable().index();
  });
  await knex.raw(`ALTER TABLE response_history
    ADD COLUMN is_current TINYINT AS (IF(change_seq IS NULL, NULL, 1)) PERSISTENT,
    ADD UNIQUE KEY ${ONE_CURRENT} (checklist_id, item_key, is_current)`);
  await dropSealTriggers(knex, "response_history");
  await knex.raw(`UPDATE response_history h JOIN checklist_responses r
    ON r.checklist_id = h.checklist_id AND r.item_key = h.item_key AND r.rev = h.rev
    SET h.change_seq = r.change_seq`);
  await knex.raw(`INSERT INTO response_history
      (checklist_id, item_key, rev, value, user_id, device_id, at, open_ref, change_seq)
    SELECT r.checklist_id, r.item_key, r.rev, r.value, r.updated_by, r.device_id, r.updated_at,
      r.open_ref, r.change_seq
    FROM checklist_responses r
    WHERE NOT EXISTS (SELECT 1 FROM response_history h
      WHERE h.checklist_id = r.checklist_id AND h.item_key = r.item_key AND h.rev = r.rev)`);
  await sealTriggers(knex, "response_history");
  await knex.schema.dropTable("checklist_responses");
  // INVOKER: whoever reads the view needs rights on the history itself, and a restore on another
  // server does not depend on the account that created it.
  await knex.raw(`CREATE SQL SECURITY INVOKER VIEW checklist_responses AS ${CURRENT_VALUES}`);
}

export async function down(knex: Knex) {
  await knex.raw("DROP VIEW checklist_responses");
  await knex.raw(`CREATE TABLE checklist_responses (
    checklist_id char(36) NOT NULL,
    item_key varchar(80) NOT NULL,
    value longtext CHARACTER SET utf8mb4 COLLATE utf8mb4_bin NOT NULL CHECK (json_valid(value)),
    rev int(10) unsigned NOT NULL,
    updated_by int(10) unsigned NOT NULL,
    device_id varchar(64) DEFAULT NULL,
    updated_at datetime(3) NOT NULL,
    change_seq bigint(20) unsigned NOT NULL,
    open_ref char(36) DEFAULT NULL,
    PRIMARY KEY (checklist_id, item_key),
    KEY checklist_responses_updated_by_foreign (updated_by),
    KEY checklist_responses_change_seq_index (change_seq),
    KEY ${sealKey("checklist_responses")} (open_ref),
    CONSTRAINT checklist_responses_checklist_id_foreign FOREIGN KEY (checklist_id)
      REFERENCES job_checklists (id) ON DELETE CASCADE,
    CONSTRAINT ${sealKey("checklist_responses")} FOREIGN KEY (open_ref)
      REFERENCES job_checklists (open_id) ON DELETE SET NULL ON UPDATE SET NULL,
    CONSTRAINT checklist_responses_updated_by_foreign FOREIGN KEY (updated_by) REFERENCES users (id)
  ) DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_general_ci`);
  await knex.raw(`INSERT INTO checklist_responses
      (checklist_id, item_key, value, rev, updated_by, device_id, updated_at, change_seq, open_ref)
    SELECT checklist_id, item_key, value, rev, updated_by, device_id, updated_at,
      COALESCE(change_seq, 0), open_ref
    FROM (${CURRENT_VALUES}) AS current_values`);
  await sealTriggers(knex, "checklist_responses");
  await knex.raw(`CREATE TRIGGER checklist_responses_sealed_delete BEFORE DELETE ON checklist_responses
    FOR EACH ROW BEGIN IF EXISTS (SELECT 1 FROM job_checklists c
      WHERE c.id = OLD.checklist_id AND c.state = 'countersigned') THEN ${LOCKED}; END IF; END`);
  await knex.raw(`ALTER TABLE response_history DROP KEY ${ONE_CURRENT}, DROP COLUMN is_current`);
  await knex.schema.alterTable("response_history", (t) => {
    t.dropIndex(["change_seq"]);
    t.dropColumn("change_seq");
  });
}
