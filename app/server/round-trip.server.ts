import { randomUUID } from "node:crypto";
import type { Knex } from "knex";

export type Statement = Knex.QueryBuilder | Knex.Raw;

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
    const parts = statements.map((s) => s.toSQL().toNative());
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
