import type { Knex } from "knex";

/**
 * Statements answered in order, one result each: a statement's outcome or its rows. `together`
 * sends them to MariaDB as one request — only on the connections of `applierDb()` (the sync
 * applier's pool), which allow several statements per request; every value still travels as a
 * bound parameter. A batch that needs five round trips on a busy server waits behind other
 * requests five times; sent together, once (decision 044). Otherwise they go one at a time, as a
 * Galera node needs them.
 */
export async function runStatements(
  knex: Knex | Knex.Transaction,
  statements: (Knex.QueryBuilder | Knex.Raw)[],
  { together }: { together: boolean },
): Promise<unknown[]> {
  if (!statements.length) return [];
  if (!together) {
    const answers: unknown[] = [];
    // A raw statement answers [rows, fields]; a built one, its rows.
    for (const s of statements) answers.push("isRawInstance" in s ? ((await s) as unknown[])[0] : await s);
    return answers;
  }
  const parts = statements.map((s) => s.toSQL().toNative());
  const [answer] = (await knex.raw(
    parts.map((p) => p.sql).join(";\n"),
    parts.flatMap((p) => p.bindings as Knex.Value[]),
  )) as [unknown];
  return parts.length === 1 ? [answer] : (answer as unknown[]);
}
