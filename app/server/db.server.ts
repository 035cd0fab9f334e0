import type { Knex } from "knex";
import { connect } from "../../db/connect.ts";
import { env } from "./env.server.ts";

declare global {
  // Survives module reloads in development so the pool is not opened twice.
  var __sternpostDb: Knex | undefined;
}

export function db(): Knex {
  globalThis.__sternpostDb ??= connect(env().DATABASE_URL);
  return globalThis.__sternpostDb;
}
