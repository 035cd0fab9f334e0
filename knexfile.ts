import type { Knex } from "knex";
import { migrationSource } from "./db/migrations/index.ts";

/** One configuration for the app, the scripts and the tests; DATABASE_URL picks the server. */
/**
 * `severalStatements`: the connections accept several statements per request (only the sync
 * applier's pool asks for it, decision 044).
 */
export function knexConfig(
  databaseUrl = process.env.DATABASE_URL ?? "mysql://root@127.0.0.1:3307/sternpost",
  { severalStatements = false } = {},
): Knex.Config {
  return {
    client: "mysql2",
    connection: {
      uri: databaseUrl,
      charset: "utf8mb4",
      // Keep DATETIME values in UTC whatever the server's zone.
      timezone: "Z",
      dateStrings: false,
      supportBigNumbers: true,
      multipleStatements: severalStatements,
    },
    pool: { min: 0, max: 10 },
    migrations: { migrationSource, tableName: "knex_migrations" },
  };
}

export default knexConfig();
