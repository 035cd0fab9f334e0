import { afterAll, describe, expect, it } from "vitest";
import { connect, createDatabase, dropDatabase } from "../../db/connect.ts";
import { seedLibrary } from "../../db/seeds/library.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";

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

  it("016 and 017 keep every current value, its author, time, change number and seal, both ways", async () => {
    await dropDatabase(url);
    await createDatabase(url);
    const knex = connect(url);
    try {
      await knex.migrate.latest();
      // Back past 017 and 016 (and whatever came after), to the separate value table of 015.
      while ((await knex.migrate.currentVersion()) > "015") await knex.migrate.down();
      await seedLibrary(knex);
      const lead = await makeUser(knex, "lead");
      const tech = await makeUser(knex, "technician");
      const job = await makeJob(knex, lead.id, [tech.id]);
      const version = (await knex("template_versions").first("id", "template_key"))!;
      const [open, sealed] = ["00000000-0000-4000-8000-000000000001", "00000000-0000-4000-8000-000000000002"];
      for (const id of [open, sealed])
        await knex("job_checklists").insert({
          id,
          job_id: job.id,
          template_version_id: version.id,
          template_key: version.template_key,
        });
      const at = (s: number) => new Date(Date.UTC(2026, 10, 3, 9, 0, s));
      const value = (text: string) => JSON.stringify({ text });
      // Two revisions of "a" with their history; "b" without a history row; one sealed value.
      const history = [
        { checklist_id: open, item_key: "a", rev: 1, value: value("first"), user_id: tech.id, at: at(1) },
        { checklist_id: open, item_key: "a", rev: 2, value: value("second"), user_id: lead.id, at: at(2) },
        { checklist_id: sealed, item_key: "a", rev: 1, value: value("kept"), user_id: tech.id, at: at(3) },
      ];
      await knex("response_history").insert(history.map((h) => ({ ...h, device_id: "tablet-1" })));
      await knex("checklist_responses").insert([
        { ...current(history[1]!), change_seq: 7 },
        {
          checklist_id: open,
          item_key: "b",
          rev: 1,
          value: value("no history"),
          updated_by: tech.id,
          device_id: null,
          updated_at: at(4),
          change_seq: 8,
        },
        { ...current(history[2]!), change_seq: 9 },
      ]);
      await knex("job_checklists").where({ id: sealed }).update({ state: "countersigned" });
      const columns = ["checklist_id", "item_key", "value", "rev", "updated_by", "device_id"];
      const snapshot = async () =>
        (
          await knex("checklist_responses")
            .orderBy(["checklist_id", "item_key"])
            .select(...columns, "updated_at", "change_seq", "open_ref")
        ).map((r) => ({ ...r, change_seq: Number(r.change_seq), updated_at: new Date(r.updated_at) }));
      const before = await snapshot();
      expect(before.map((r) => r.open_ref)).toEqual([open, open, null]);

      await knex.migrate.up();
      expect(await snapshot()).toEqual(before);
      // The sealed checklist's value still cannot be changed by a later revision.
      await expect(
        knex("response_history").insert({ ...history[2]!, rev: 2, value: value("late") }),
      ).rejects.toThrow(/sealed_when_countersigned/);

      // One current row per item, whoever writes: a second one is refused by the key, before and
      // after 017 reorders it.
      const secondCurrent = () =>
        knex("response_history").insert({ ...history[1]!, rev: 3, value: value("third"), change_seq: 10 });
      await expect(secondCurrent()).rejects.toThrow(/one_current_row/);
      await knex.migrate.up();
      expect(await snapshot()).toEqual(before);
      await expect(secondCurrent()).rejects.toThrow(/one_current_row/);

      await knex.migrate.down();
      await knex.migrate.down();
      expect(await snapshot()).toEqual(before);
    } finally {
      await knex.destroy();
    }
  });
});

/** The value row the applier of migration 015 wrote beside a history row. */
function current(h: {
  checklist_id: string;
  item_key: string;
  rev: number;
  value: string;
  user_id: number;
  at: Date;
}) {
  return {
    checklist_id: h.checklist_id,
    item_key: h.item_key,
    rev: h.rev,
    value: h.value,
    updated_by: h.user_id,
    device_id: "tablet-1",
    updated_at: h.at,
  };
}
