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
}

export function db(): Knex {
  globalThis.__sternpostDb ??= knexFactory({
    ...knexConfig(env().DATABASE_URL),
    acquireConnectionTimeout: ACQUIRE_TIMEOUT_MS,
  });
  return globalThis.__sternpostDb;
}
