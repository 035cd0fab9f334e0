import { afterAll, describe, expect, it } from "vitest";
import { connect, createDatabase, dropDatabase } from "../../db/connect.ts";

describe("migrations", () => {
  // Suffixed like every test database, so two checkouts testing on one server do not share it.
  // The name is the URL's path: a socket's path may follow in its query (?socketPath=…).
  const base = new URL(process.env.DATABASE_URL!);
  base.pathname = `/sternpost_migrations${process.env.TEST_DB_SUFFIX ?? ""}`;
  const url = base.toString();
  afterAll(() => dropDatabase(url));

  it("run up, all the way down, and up again on MariaDB", async () => {
    await dropDatabase(url);
    await createDatabase(url);
    const knex = connect(url);
    try {
      const tables = async () =>
        (await knex.raw("SHOW TABLES"))[0].map((r: any) => Object.values(r)[0]).sort();
      await knex.migrate.latest();
      expect(await tables()).toEqual(
        expect.arrayContaining([
          "users",
          "sessions",
          "rate_limits",
          "vessels",
          "jobs",
          "job_technicians",
          "audit_log",
        ]),
      );
      // 009: the shaft's system, a metric shaft's diameter and the DC system voltage on the job.
      const jobColumns = (await knex.raw("SHOW COLUMNS FROM jobs"))[0] as {
        Field: string;
        Default: string | null;
      }[];
      const column = (name: string) => jobColumns.find((c) => c.Field === name);
      expect(column("shaft_system")?.Default).toBe("inch");
      expect(column("system_volts")?.Default).toBe("12");
      expect(column("shaft_diameter_mm")).toBeDefined();
      await knex.migrate.rollback(undefined, true);
      expect((await tables()).filter((t: string) => !t.startsWith("knex_"))).toEqual([]);
      const [, again] = await knex.migrate.latest();
      expect(again.length).toBeGreaterThan(0);
    } finally {
      await knex.destroy();
    }
  });
});
