import knexFactory, { type Knex } from "knex";
import { knexConfig } from "../../knexfile.ts";
import { env } from "./env.server.ts";

/**
 * Seconds a query waits for a connection. Knex's default of 60 would hold every request for a
 * minute while MariaDB is down; the HTTP layer answers 503 instead (http/bridge.server.ts).
 */
const ACQUIRE_TIMEOUT_MS = 5_000;

declare global {
  // Survives module reloads in development so the pool is not opened twice.
  var __sternpostDb: Knex | undefined;
  var __sternpostApplierDb: Knex | undefined;
}

let answeredAt = 0;

function pool(options: { severalStatements?: boolean } = {}): Knex {
  const knex = knexFactory({
    ...knexConfig(env().DATABASE_URL, options),
    acquireConnectionTimeout: ACQUIRE_TIMEOUT_MS,
  });
  knex.on("query-response", () => (answeredAt = Date.now()));
  return knex;
}

export function db(): Knex {
  return (globalThis.__sternpostDb ??= pool());
}

/**
 * The sync applier's own pool: its connections accept several statements in one request, so a
 * batch is read in one round trip and written in another (round-trip.server.ts, decision 044).
 * Everything else uses `db()`, whose connections take one statement at a time.
 */
export function applierDb(): Knex {
  return (globalThis.__sternpostApplierDb ??= pool({ severalStatements: true }));
}

/**
 * When MariaDB last answered a query of this process (ms since the epoch, 0 if never). Under load
 * every pooled connection is busy and a health probe would queue behind them: a recent answer
 * says the database is up without asking again.
 */
export const lastDatabaseAnswerAt = () => answeredAt;
