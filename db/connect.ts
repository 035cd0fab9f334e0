import knexFactory, { type Knex } from "knex";
import { knexConfig } from "../knexfile.ts";

/** Creates the database named in the URL when it does not exist yet. */
export async function createDatabase(databaseUrl: string) {
  const url = new URL(databaseUrl);
  const name = decodeURIComponent(url.pathname.replace(/^\//, ""));
  if (!/^[A-Za-z0-9_]+$/.test(name)) throw new Error(`Unusable database name "${name}"`);
  url.pathname = "/";
  const admin = knexFactory(knexConfig(url.toString()));
  try {
    await admin.raw(
      `CREATE DATABASE IF NOT EXISTS \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
    );
  } finally {
    await admin.destroy();
  }
}

export async function dropDatabase(databaseUrl: string) {
  const url = new URL(databaseUrl);
  const name = decodeURIComponent(url.pathname.replace(/^\//, ""));
  url.pathname = "/";
  const admin = knexFactory(knexConfig(url.toString()));
  try {
    await admin.raw(`DROP DATABASE IF EXISTS \`${name}\``);
  } finally {
    await admin.destroy();
  }
}

export function connect(databaseUrl: string, options?: { severalStatements?: boolean }): Knex {
  return knexFactory(knexConfig(databaseUrl, options));
}
