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

export function db(): Knex {
  if (!globalThis.__sternpostDb) {
    globalThis.__sternpostDb = knexFactory({
      ...knexConfig(env().DATABASE_URL),
      acquireConnectionTimeout: ACQUIRE_TIMEOUT_MS,
    });
    globalThis.__sternpostDb.on("query-response", () => (answeredAt = Date.now()));
  }
  return globalThis.__sternpostDb;
}

/**
 * The sync applier's own pool: its connections accept several statements in one request, so a
 * batch is read in one round trip and written in another (round-trip.server.ts, decision 044).
 * Everything else uses `db()`, whose connections take one statement at a time.
 */
export function applierDb(): Knex {
  if (!globalThis.__sternpostApplierDb) {
    globalThis.__sternpostApplierDb = knexFactory({
      ...knexConfig(env().DATABASE_URL, { severalStatements: true }),
      acquireConnectionTimeout: ACQUIRE_TIMEOUT_MS,
    });
    globalThis.__sternpostApplierDb.on("query-response", () => (answeredAt = Date.now()));
  }
  return globalThis.__sternpostApplierDb;
}

/**
 * When MariaDB last answered a query of this process (ms since the epoch, 0 if never). Under load
 * every pooled connection is busy and a health probe would queue behind them: a recent answer
 * says the database is up without asking again.
 */
export const lastDatabaseAnswerAt = () => answeredAt;
