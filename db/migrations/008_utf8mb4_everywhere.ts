import type { Knex } from "knex";

// Every table and text column holds utf8mb4, so a 4-byte character (an emoji, a rare CJK
// character) typed anywhere is stored rather than answered with a 500. The rate_limits table
// was created with utf8 (3-byte) keys by rate-limiter-flexible's own DDL.
async function tablesNotUtf8mb4(knex: Knex): Promise<string[]> {
  const [rows] = await knex.raw(
    `SELECT DISTINCT c.TABLE_NAME AS name
       FROM information_schema.COLUMNS c
       JOIN information_schema.TABLES t ON t.TABLE_SCHEMA = c.TABLE_SCHEMA AND t.TABLE_NAME = c.TABLE_NAME
      WHERE c.TABLE_SCHEMA = DATABASE() AND t.TABLE_TYPE = 'BASE TABLE'
        AND c.CHARACTER_SET_NAME IS NOT NULL AND c.CHARACTER_SET_NAME <> 'utf8mb4'
     UNION
     SELECT TABLE_NAME FROM information_schema.TABLES
      WHERE TABLE_SCHEMA = DATABASE() AND TABLE_TYPE = 'BASE TABLE'
        AND TABLE_COLLATION NOT LIKE 'utf8mb4%'`,
  );
  return (rows as { name: string }[]).map((r) => r.name);
}

export async function up(knex: Knex) {
  for (const table of await tablesNotUtf8mb4(knex)) {
    await knex.raw("ALTER TABLE ?? CONVERT TO CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci", [table]);
  }
}

// Narrowing back to 3-byte utf8 could lose data; the down step leaves the tables as they are.
export async function down() {}
