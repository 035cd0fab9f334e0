import type { Knex } from "knex";
import { ONE_CURRENT } from "./016_current_value_is_latest_history.ts";

/**
 * The key that keeps one current row per item (migration 016) had the item before `is_current`,
 * so reading a checklist's current values — every sync batch does, and the review, the record and
 * the offline copy — walked every revision the checklist ever had. With `is_current` second, the
 * same unique key holds the current rows of a checklist side by side and nothing else.
 */
export async function up(knex: Knex) {
  await knex.raw(`ALTER TABLE response_history DROP KEY ${ONE_CURRENT},
    ADD UNIQUE KEY ${ONE_CURRENT} (checklist_id, is_current, item_key)`);
}

export async function down(knex: Knex) {
  await knex.raw(`ALTER TABLE response_history DROP KEY ${ONE_CURRENT},
    ADD UNIQUE KEY ${ONE_CURRENT} (checklist_id, item_key, is_current)`);
}
