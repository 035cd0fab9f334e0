// onOneConnection (decision 044): the same statements give the same answers sent together in one
// request (one MariaDB server) and one at a time (a Galera node); a failing statement stops the
// ones after it either way, and a transaction it leaves open is rolled back, not handed on.
import { describe, expect, it } from "vitest";
import { applierDb } from "~/server/db.server";
import { onOneConnection } from "~/server/round-trip.server";

describe("statements sent together or one at a time", () => {
  it("answer alike, row lists and statement outcomes in order", async () => {
    const knex = applierDb();
    const answers = await Promise.all(
      [true, false].map((together) =>
        onOneConnection(knex, (send) =>
          send(
            [
              knex.raw("START TRANSACTION"),
              knex.raw("CREATE TEMPORARY TABLE rt (n INT PRIMARY KEY)"),
              knex("rt").insert([{ n: 1 }, { n: 2 }]),
              knex("rt").orderBy("n").select("n"),
              knex.raw("SELECT COUNT(*) AS c FROM rt"),
              knex.raw("DROP TEMPORARY TABLE rt"),
              knex.raw("COMMIT"),
            ],
            { together },
          ),
        ),
      ),
    );
    const [together, oneByOne] = answers as [unknown[], unknown[]];
    expect(together[3]).toEqual([{ n: 1 }, { n: 2 }]);
    expect(oneByOne[3]).toEqual([{ n: 1 }, { n: 2 }]);
    expect(together[4]).toEqual([{ c: 2 }]);
    expect(oneByOne[4]).toEqual([{ c: 2 }]);
    expect(together.length).toBe(oneByOne.length);
  });

  it("stop at the first failing statement and roll back what was open", async () => {
    const knex = applierDb();
    await knex.raw("CREATE TABLE IF NOT EXISTS rt_stop (n INT PRIMARY KEY)");
    for (const together of [true, false]) {
      await knex("rt_stop").delete();
      await knex("rt_stop").insert({ n: 0 });
      await expect(
        onOneConnection(knex, (send) =>
          send(
            [
              knex.raw("START TRANSACTION"),
              knex("rt_stop").insert({ n: 1 }),
              knex("rt_stop").insert({ n: 1 }),
              knex("rt_stop").insert({ n: 2 }),
              knex.raw("COMMIT"),
            ],
            { together },
          ),
        ),
      ).rejects.toThrow(/Duplicate entry/);
      // n = 1 was written inside the transaction, which the failure rolled back; the connection
      // went back to the pool with no transaction open on it.
      expect(await knex("rt_stop").orderBy("n").pluck("n")).toEqual([0]);
      const open = await Promise.all(
        Array.from({ length: 3 }, () =>
          onOneConnection(knex, (send) => send([knex.raw("SELECT @@in_transaction AS t")], { together })),
        ),
      );
      for (const [rows] of open) expect(rows).toEqual([{ t: 0 }]);
    }
    await knex.raw("DROP TABLE rt_stop");
  });
});
