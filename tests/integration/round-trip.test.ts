// runStatements (decision 044): the same statements give the same answers sent together in one
// request (one MariaDB server) and one at a time (a Galera node), and a failing statement stops
// the ones after it either way.
import { describe, expect, it } from "vitest";
import { applierDb } from "~/server/db.server";
import { runStatements } from "~/server/round-trip.server";

describe("statements sent together or one at a time", () => {
  it("answer alike, row lists and statement outcomes in order", async () => {
    const knex = applierDb();
    const answers = await Promise.all(
      [true, false].map((together) =>
        knex.transaction((trx) =>
          runStatements(
            trx,
            [
              trx.raw("CREATE TEMPORARY TABLE rt (n INT PRIMARY KEY)"),
              trx("rt").insert([{ n: 1 }, { n: 2 }]),
              trx("rt").orderBy("n").select("n"),
              trx.raw("SELECT COUNT(*) AS c FROM rt"),
              trx.raw("DROP TEMPORARY TABLE rt"),
            ],
            { together },
          ),
        ),
      ),
    );
    const [together, oneByOne] = answers as [unknown[], unknown[]];
    expect(together[2]).toEqual([{ n: 1 }, { n: 2 }]);
    expect(oneByOne[2]).toEqual([{ n: 1 }, { n: 2 }]);
    expect(together[3]).toEqual([{ c: 2 }]);
    expect(oneByOne[3]).toEqual([{ c: 2 }]);
    expect(together.length).toBe(oneByOne.length);
  });

  it("stop at the first failing statement", async () => {
    for (const together of [true, false]) {
      const knex = applierDb();
      await knex.raw("CREATE TABLE IF NOT EXISTS rt_stop (n INT PRIMARY KEY)");
      await knex("rt_stop").delete();
      await expect(
        runStatements(
          knex,
          [
            knex("rt_stop").insert({ n: 1 }),
            knex("rt_stop").insert({ n: 1 }),
            knex("rt_stop").insert({ n: 2 }),
          ],
          { together },
        ),
      ).rejects.toThrow(/Duplicate entry/);
      expect(await knex("rt_stop").orderBy("n").pluck("n")).toEqual([1]);
      await knex.raw("DROP TABLE rt_stop");
    }
  });
});
