import { randomUUID } from "node:crypto";
import type { Knex } from "knex";

/** SQL with its bound values, ready to send: for the few statements too big for Knex to build cheaply. */
export type NativeStatement = { native: { sql: string; bindings: readonly unknown[] } };
export type Statement = Knex.QueryBuilder | Knex.Raw | NativeStatement;

const quoted = (name: string) => `\`${name.replaceAll("`", "``")}\``;

/**
 * A multi-row INSERT as one statement, every value bound. Knex builds the same statement doing
 * several checks per value (a few milliseconds for a thousand rows of a sync batch); here the
 * columns are the first row's. `fixed` columns take one SQL expression in every row.
 */
export function insertRows(
  table: string,
  rows: Record<string, unknown>[],
  fixed: Record<string, string> = {},
): NativeStatement {
  const columns = Object.keys(rows[0]!);
  const row = `(${[...columns.map(() => "?"), ...Object.values(fixed)].join(", ")})`;
  const bindings: unknown[] = [];
  for (const r of rows) for (const c of columns) bindings.push(r[c]);
  const names = [...columns, ...Object.keys(fixed)].map(quoted).join(", ");
  return {
    native: {
      sql: `INSERT INTO ${quoted(table)} (${names}) VALUES ${Array(rows.length).fill(row).join(", ")}`,
      bindings,
    },
  };
}

/**
 * Sends statements on one connection and answers them in order, one answer each: a SELECT's rows,
 * a write's outcome (affected rows, insert id). `together` sends them to MariaDB as one request —
 * only on the connections of `applierDb()` (the sync applier's pool), which allow several
 * statements per request; every value still travels as a bound parameter. Otherwise they go one
 * at a time, as a Galera node needs them (decision 044). A failing statement stops the ones after
 * it either way.
 */
export type Send = (statements: Statement[], options: { together: boolean }) => Promise<unknown[]>;

type Connection = {
  query(
    options: { sql: string },
    bindings: readonly unknown[],
    done: (error: Error | null, answer: unknown) => void,
  ): void;
};

/**
 * Runs `work` on one connection of `knex`'s pool, which it has to itself. A transaction is opened
 * and ended by the statements `work` sends (`START TRANSACTION` with its first reads, `COMMIT`
 * with its last writes), so neither costs a round trip of its own — on a busy server each round
 * trip waits behind everyone else's. When `work` fails, whatever it left open is rolled back
 * before the connection goes back to the pool.
 */
export async function onOneConnection<T>(knex: Knex, work: (send: Send) => Promise<T>): Promise<T> {
  const connection = (await knex.client.acquireConnection()) as Connection;
  const query = (sql: string, bindings: readonly unknown[]) =>
    new Promise<unknown>((resolve, reject) => {
      // The pool's own events, as for any Knex query: the health check counts on them.
      const event = { sql, bindings, __knexQueryUid: randomUUID() };
      knex.emit("query", event);
      connection.query({ sql }, bindings, (error, answer) => {
        if (error) {
          knex.emit("query-error", error, event);
          return reject(error);
        }
        knex.emit("query-response", answer, event);
        resolve(answer);
      });
    });
  const send: Send = async (statements, { together }) => {
    const parts = statements.map((s) => ("native" in s ? s.native : s.toSQL().toNative()));
    if (!together || parts.length < 2) {
      const answers: unknown[] = [];
      for (const p of parts) answers.push(await query(p.sql, p.bindings));
      return answers;
    }
    return (await query(
      parts.map((p) => p.sql).join(";\n"),
      parts.flatMap((p) => p.bindings),
    )) as unknown[];
  };
  try {
    return await work(send);
  } catch (error) {
    await query("ROLLBACK", []).catch(() => {}); // a connection that broke is dropped by the pool
    throw error;
  } finally {
    await knex.client.releaseConnection(connection);
  }
}
