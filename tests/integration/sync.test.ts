import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startChecklists } from "~/server/checklists.server";
import { applierDb } from "~/server/db.server";
import { sync } from "~/server/sync.server";
import { seedLibrary } from "../../db/seeds/library.ts";
import { appHandler, signInCookie } from "../support/app.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";
import { check, op } from "../support/sync.ts";

const knex = testDb();
const parse = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v);
afterAll(() => knex.destroy());

let tech: { id: number; email: string; name: string; role: "technician" },
  otherTech: typeof tech,
  lead: { id: number; email: string; name: string; role: "lead" };
let checklist: string, otherChecklist: string;
beforeAll(async () => {
  await seedLibrary(knex);
  tech = (await makeUser(knex, "technician")) as typeof tech;
  otherTech = (await makeUser(knex, "technician")) as typeof tech;
  lead = (await makeUser(knex, "lead")) as typeof lead;
  const job = await makeJob(knex, lead.id, [tech.id]);
  const other = await makeJob(knex, lead.id, [otherTech.id]);
  [checklist] = await startChecklists(job.id, ["cooling"], lead.id);
  [otherChecklist] = await startChecklists(other.id, ["cooling"], lead.id);
});

const device = "device-under-test-1";
const push = (
  actor: { id: number; name: string; role: any },
  ops: ReturnType<typeof op>[],
  cursor: string | null = null,
) => sync(actor, { deviceId: device, cursor, ops });
const history = (item: string, id = checklist) =>
  knex("response_history").where({ checklist_id: id, item_key: item }).orderBy("rev");

describe("the sync rules on MariaDB", () => {
  it("applies an operation on the current revision and counts the revision up", async () => {
    const first = op(checklist, "seacock", check("pass"), 0);
    const answer = await push(tech, [first]);
    expect(answer.results).toEqual([{ opId: first.opId, status: "applied", rev: 1 }]);
    expect(answer.changes).toEqual([
      expect.objectContaining({ checklistId: checklist, itemKey: "seacock", value: check("pass"), rev: 1 }),
    ]);
    const second = op(checklist, "seacock", check("fail", "Handle seized"), 1);
    expect((await push(tech, [second])).results[0]).toMatchObject({ status: "applied", rev: 2 });
    expect((await history("seacock")).map((h: any) => h.rev)).toEqual([1, 2]);
  });

  it("reads a batch in one request and writes, commits and pulls in a second; a pull is one (decision 044)", async () => {
    // A technician and job of its own, so other tests' pulls do not see them.
    const me = (await makeUser(knex, "technician")) as typeof tech;
    const [own] = await startChecklists((await makeJob(knex, lead.id, [me.id])).id, ["cooling"], lead.id);
    const sent: string[] = [];
    const count = (q: { sql: string }) => sent.push(q.sql);
    applierDb().on("query", count);
    try {
      await push(me, [op(own!, "impeller", check("pass"), 0), op(own!, "thermostat", check("pass"), 0)]);
      expect(sent).toHaveLength(2);
      expect(sent[0]).toMatch(/^START TRANSACTION;/);
      expect(sent[1]).toMatch(/COMMIT;[\s\S]*checklist_responses/);
      sent.length = 0;
      await push(me, []);
      expect(sent).toHaveLength(1);
    } finally {
      applierDb().off("query", count);
    }
  });

  it("keeps one current row per item, the last revision, when a batch changes it twice (decision 046)", async () => {
    // A technician and job of its own, so other tests' pulls do not see them.
    const me = (await makeUser(knex, "technician")) as typeof tech;
    const [own] = await startChecklists((await makeJob(knex, lead.id, [me.id])).id, ["cooling"], lead.id);
    const first = op(own!, "heat-exchanger", check("pass"), 0);
    await push(me, [first]);
    const answer = await push(me, [
      op(own!, "heat-exchanger", check("fail", "Scale"), 1),
      op(own!, "heat-exchanger", check("pass"), 2),
    ]);
    expect(answer.results.map((r) => r.status)).toEqual(["applied", "applied"]);
    const rows = await history("heat-exchanger", own);
    expect(rows.map((h: any) => [h.rev, h.change_seq === null])).toEqual([
      [1, true],
      [2, true],
      [3, false],
    ]);
    const current = await knex("checklist_responses").where({
      checklist_id: own!,
      item_key: "heat-exchanger",
    });
    expect(current.map((r: any) => [r.rev, parse(r.value)])).toEqual([[3, check("pass")]]);
    // A tablet pulling from before the first entry gets the item once, at its last revision.
    const pulled = (await push(me, [], null)).changes.filter((c) => c.itemKey === "heat-exchanger");
    expect(pulled.map((c) => c.rev)).toEqual([3]);
  });

  it("reads a checklist's current values without walking the revisions they replaced (migration 017)", async () => {
    const me = (await makeUser(knex, "technician")) as typeof tech;
    const [own, beside] = await startChecklists(
      (await makeJob(knex, lead.id, [me.id])).id,
      ["cooling", "exhaust"],
      lead.id,
    );
    // A yard's table holds many checklists' revisions: 2,000 past ones of another checklist.
    await knex.batchInsert(
      "response_history",
      Array.from({ length: 2000 }, (_, i) => ({
        checklist_id: beside!,
        item_key: `past-${i}`,
        rev: 1,
        value: JSON.stringify(check("pass")),
        user_id: me.id,
        at: new Date(),
      })),
      500,
    );
    const items = ["seacock", "strainer", "impeller", "thermostat", "heat-exchanger"];
    // 20 revisions of each item: 100 history rows, 5 of them current.
    for (let rev = 0; rev < 20; rev++)
      await push(
        me,
        items.map((item) => op(own!, item, check(rev % 2 ? "pass" : "fail"), rev)),
      );
    // Rows read from tables by the queries of this connection (a session counter).
    const rowsRead = async (trx: typeof knex) =>
      Number((await trx.raw("SHOW SESSION STATUS LIKE 'Rows_read'"))[0][0].Value);
    await knex.transaction(async (trx) => {
      const before = await rowsRead(trx);
      const current = await trx("checklist_responses")
        .where({ checklist_id: own! })
        .select("item_key", "rev");
      const read = (await rowsRead(trx)) - before;
      expect(current.map((r: any) => [r.item_key, r.rev]).sort()).toEqual(items.map((i) => [i, 20]).sort());
      // Before migration 017 the key led with the item, and this read walked all 100 revisions.
      expect(read).toBeLessThanOrEqual(items.length + 1);
    });
  });

  it("answers a repeated operation with its first result and changes nothing", async () => {
    const once = op(checklist, "strainer", check("pass"), 0);
    const first = await push(tech, [once]);
    const again = await push(tech, [once]);
    // The first answer again, marked as a repeat: its revision describes the server back then.
    expect(again.results).toEqual(first.results.map((r) => ({ ...r, repeat: true })));
    expect(await history("strainer")).toHaveLength(1);
    // An applied operation's record is its history row: exactly one.
    expect((await history("strainer")).map((h: any) => h.op_id)).toEqual([once.opId]);
  });

  it("accepts the same value on an old revision without a conflict", async () => {
    await push(tech, [op(checklist, "impeller", check("pass"), 0)]);
    const stale = op(checklist, "impeller", check("pass"), 0);
    expect((await push(lead, [stale])).results[0]).toMatchObject({ status: "applied", rev: 1 });
    expect(await knex("sync_conflicts").where({ op_id: stale.opId })).toHaveLength(0);
  });

  it("keeps a different value on an old revision as a conflict, leaving the server's value", async () => {
    await push(tech, [op(checklist, "intake-hose", check("pass"), 0)]);
    const stale = op(checklist, "intake-hose", check("fail", "Cracked at the clamp"), 0);
    const answer = await push(lead, [stale]);
    expect(answer.results[0]).toMatchObject({ status: "conflict", rev: 1, serverValue: check("pass") });
    const row = (await knex("sync_conflicts").where({ op_id: stale.opId }).first())!;
    expect(parse(row.client_value)).toEqual(check("fail", "Cracked at the clamp"));
    expect(row.user_id).toBe(lead.id);
    const current = (await knex("checklist_responses")
      .where({ checklist_id: checklist, item_key: "intake-hose" })
      .first())!;
    expect(parse(current.value)).toEqual(check("pass"));

    // The resolution is an ordinary operation on the current revision that names the conflict.
    const decide = op(checklist, "intake-hose", check("fail", "Cracked at the clamp"), 1, {
      resolves: [answer.results[0]!.conflictId!],
    });
    expect((await push(lead, [decide])).results[0]).toMatchObject({ status: "applied", rev: 2 });
    expect((await knex("sync_conflicts").where({ op_id: stale.opId }).first())!.resolution_op_id).toBe(
      decide.opId,
    );
  });

  it("refuses entries on other people's checklists, unknown items, bad values and locked checklists, without blocking the rest", async () => {
    const notMine = op(otherChecklist, "seacock", check("pass"), 0);
    const noItem = op(checklist, "no-such-item", check("pass"), 0);
    const badUnit = op(
      checklist,
      "raw-water-flow",
      { attempts: [{ value: 30, unit: "psi", at: new Date().toISOString(), by: "T" }] },
      0,
    );
    const fine = op(checklist, "thermostat", check("pass"), 0);
    const answer = await push(tech, [notMine, noItem, badUnit, fine]);
    expect(answer.results.map((r) => r.status)).toEqual(["rejected", "rejected", "rejected", "applied"]);
    expect(answer.results[0]!.reason).toMatch(/not on one of your jobs/);
    expect(answer.results[1]!.reason).toMatch(/no item/);
    expect(answer.results[2]!.reason).toMatch(/takes L or gal/);
    // Pulls only what this person may see.
    expect(answer.changes.every((c) => c.checklistId === checklist)).toBe(true);

    await knex("job_checklists").where({ id: checklist }).update({ state: "submitted" });
    const late = await push(tech, [op(checklist, "coolant-bled", check("pass"), 0)]);
    expect(late.results[0]).toMatchObject({ status: "rejected", reason: expect.stringMatching(/submitted/) });
    await knex("job_checklists").where({ id: checklist }).update({ state: "in-progress" });
  });

  it("pulls only what changed after the cursor", async () => {
    const { cursor } = await push(tech, []);
    expect((await push(tech, [], cursor)).changes).toEqual([]);
    await push(lead, [op(checklist, "heat-exchanger", check("pass"), 0)]);
    const after = await push(tech, [], cursor);
    expect(after.changes.map((c) => c.itemKey)).toEqual(["heat-exchanger"]);
    expect(Number(after.cursor)).toBeGreaterThan(Number(cursor));
  });

  it("never lets a pull miss a change committed late, while batches on other checklists run at once (decisions 004, 043)", async () => {
    const jobA = await makeJob(knex, lead.id, [tech.id]);
    const jobB = await makeJob(knex, lead.id, [otherTech.id]);
    const [a] = await startChecklists(jobA.id, ["cooling"], lead.id);
    const [b] = await startChecklists(jobB.id, ["cooling"], lead.id);
    const items = ["seacock", "intake-hose", "strainer", "impeller", "heat-exchanger", "thermostat"];
    // The lead's watching device syncs with its cursor, again and again, while two devices push to
    // the two checklists at the same time; it must end up with every value they wrote. It pushes an
    // entry of its own each time (to a third checklist), so its pulls are the ones read after a batch.
    const [c] = await startChecklists((await makeJob(knex, lead.id, [])).id, ["cooling"], lead.id);
    const seen = new Map<string, number>();
    let cursor = (await sync(lead, { deviceId: "watcher", cursor: null, ops: [] })).cursor;
    let pushing = true;
    const watching = (async () => {
      let rev = 0;
      for (let last = false; !last;) {
        last = !pushing; // one more sync after the pushes have all answered
        const entry = op(
          c!,
          "strainer",
          check(rev % 2 ? "pass" : "fail", rev % 2 ? undefined : "Clogged"),
          rev,
        );
        const answer = await sync(lead, { deviceId: "watcher", cursor, ops: [entry] });
        rev = answer.results[0]!.rev!;
        for (const change of answer.changes) seen.set(`${change.checklistId}|${change.itemKey}`, change.rev);
        cursor = answer.cursor;
      }
    })();
    const pushes = (actor: typeof tech, id: string) =>
      (async () => {
        for (const item of items)
          for (const rev of [0, 1])
            await sync(actor, {
              deviceId: `pusher-${id}`,
              cursor: null,
              ops: [op(id, item, check(rev ? "fail" : "pass", rev ? "Replaced" : undefined), rev)],
            });
      })();
    await Promise.all([pushes(tech, a!), pushes(otherTech, b!)]);
    pushing = false;
    await watching;
    const rows = await knex("checklist_responses").whereIn("checklist_id", [a!, b!]);
    expect(rows).toHaveLength(2 * items.length);
    for (const r of rows) expect(seen.get(`${r.checklist_id}|${r.item_key}`), r.item_key).toBe(2);
  });

  it("orders concurrent pushes to one item from two connections: one applies, the other conflicts", async () => {
    const a = op(checklist, "cooling-hoses", check("pass"), 0);
    const b = op(checklist, "cooling-hoses", check("fail", "Soft hose at the pump"), 0);
    const [ra, rb] = await Promise.all([
      push(tech, [a]),
      sync(lead, { deviceId: "another-device", cursor: null, ops: [b] }),
    ]);
    expect([ra.results[0]!.status, rb.results[0]!.status].sort()).toEqual(["applied", "conflict"]);
    expect(await history("cooling-hoses")).toHaveLength(1);
    expect(await knex("sync_conflicts").whereIn("op_id", [a.opId, b.opId])).toHaveLength(1);
  });

  it("leaves nothing half-applied when the database connection dies in the middle of a batch", async () => {
    // A trigger makes the fourth insert slow, so the test can kill the connection while it runs.
    await knex.raw(`CREATE TRIGGER slow_history BEFORE INSERT ON response_history FOR EACH ROW
      BEGIN IF NEW.item_key = 'no-cooling-leaks' THEN DO SLEEP(5); END IF; END`);
    try {
      const ops = [
        op(checklist, "coolant-type", check("pass"), 0),
        op(checklist, "flow-against-maker", { option: "meets" }, 0),
        op(checklist, "no-cooling-leaks", check("pass"), 0),
      ];
      const running = push(tech, ops).then(
        () => "finished",
        (e) => String(e),
      );
      let killed = false;
      for (let i = 0; i < 50 && !killed; i++) {
        await new Promise((r) => setTimeout(r, 100));
        const [rows] = await knex.raw(
          "SELECT id FROM information_schema.processlist WHERE info = 'DO SLEEP(5)'",
        );
        for (const row of rows) {
          await knex.raw(`KILL ${Number(row.id)}`);
          killed = true;
        }
      }
      expect(killed).toBe(true);
      expect(await running).not.toBe("finished");
      for (const o of ops) {
        expect(await knex("sync_ops").where({ op_id: o.opId })).toHaveLength(0);
        expect(await knex("sync_conflicts").where({ op_id: o.opId })).toHaveLength(0);
        expect(await knex("response_history").where({ op_id: o.opId })).toHaveLength(0);
      }
      expect(
        await knex("checklist_responses")
          .where({ checklist_id: checklist })
          .whereIn("item_key", ["coolant-type", "flow-against-maker", "no-cooling-leaks"]),
      ).toHaveLength(0);
    } finally {
      await knex.raw("DROP TRIGGER IF EXISTS slow_history");
    }
  });
});

describe("POST /api/sync", () => {
  let app: Awaited<ReturnType<typeof appHandler>>;
  let cookie: string;
  beforeAll(async () => {
    app = await appHandler();
    cookie = await signInCookie(app, tech.email);
  });
  const post = (body: unknown, withCookie = true) =>
    app("/api/sync", {
      method: "POST",
      body: typeof body === "string" ? body : JSON.stringify(body),
      headers: { "Content-Type": "application/json" },
      cookie: withCookie ? cookie : undefined,
    });

  it("needs a session", async () => {
    expect((await post({ deviceId: device, cursor: null, ops: [] }, false)).status).toBe(401);
  });

  it("answers 400 naming the bad fields, and applies nothing of a malformed batch", async () => {
    const good = op(
      checklist,
      "freeze-protection",
      { attempts: [{ value: -30, unit: "degF", at: new Date().toISOString(), by: "T" }] },
      0,
    );
    const response = await post({
      deviceId: device,
      cursor: null,
      ops: [good, { ...op(checklist, "x", 1, 0), opId: "not-a-uuid", baseRev: -1 }],
    });
    expect(response.status).toBe(400);
    const body = await response.json();
    // The envelope needs a UUID per operation; the rest of an operation is read on its own.
    expect(body.fields.map((f: any) => f.path)).toEqual(["ops[1].opId"]);
    expect(await knex("response_history").where({ op_id: good.opId })).toHaveLength(0);
    expect((await post("{not json")).status).toBe(400);
  });

  it("answers 413 for a batch over the limit", async () => {
    const ops = Array.from({ length: 1001 }, () => op(checklist, "seacock", check("pass"), 0));
    expect((await post({ deviceId: device, cursor: null, ops })).status).toBe(413);
  });

  it("applies a well-formed batch", async () => {
    const entry = op(
      checklist,
      "coolant-temperature-cruise",
      { attempts: [{ value: 180, unit: "degF", at: new Date().toISOString(), by: "T" }] },
      0,
    );
    const response = await post({ deviceId: device, cursor: null, ops: [entry] });
    expect(response.status).toBe(200);
    expect((await response.json()).results[0]).toMatchObject({ opId: entry.opId, status: "applied", rev: 1 });
  });
});
