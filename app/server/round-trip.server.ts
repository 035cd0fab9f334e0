import type { Knex } from "knex";

/**
 * Several statements sent to MariaDB as one request, answered in order, one result each: a
 * statement or a row list. Only for the connections of `applierDb()` (the sync applier's pool),
 * which allow several statements per request; every value still travels as a bound parameter.
 * A batch that needs five round trips on a busy server waits behind other requests five times;
 * sent together, once (decision 044).
 */
export async function inOneRoundTrip(
  knex: Knex | Knex.Transaction,
  statements: (Knex.QueryBuilder | Knex.Raw)[],
): Promise<unknown[]> {
  if (!statements.length) return [];
  const parts = statements.map((s) => s.toSQL().toNative());
  const [answer] = (await knex.raw(
    parts.map((p) => p.sql).join(";\n"),
    parts.flatMap((p) => p.bindings as Knex.Value[]),
  )) as [unknown];
  return parts.length === 1 ? [answer] : (answer as unknown[]);
}
