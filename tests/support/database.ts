import { connect, createDatabase, dropDatabase } from "../../db/connect.ts";

/**
 * A fresh, migrated database on the test server, named for its purpose. TEST_DB_SUFFIX lets
 * two checkouts run their suites side by side against one server.
 */
export async function freshDatabase(name: string): Promise<string> {
  const base = new URL(process.env.DATABASE_URL ?? "mysql://root@127.0.0.1:3307/sternpost");
  base.pathname = `/${name}${process.env.TEST_DB_SUFFIX ?? ""}`;
  const url = base.toString();
  await dropDatabase(url);
  await createDatabase(url);
  const knex = connect(url);
  try {
    await knex.migrate.latest();
  } finally {
    await knex.destroy();
  }
  return url;
}
