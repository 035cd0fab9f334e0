import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startChecklists } from "~/server/checklists.server";
import { sync } from "~/server/sync.server";
import { seedLibrary } from "../../db/seeds/library.ts";
import { appHandler, signInCookie } from "../support/app.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";
import { check, op } from "../support/sync.ts";

/**
 * Issue 13 §1: operations the schema let through but MariaDB refused made the whole batch a 500,
 * and the tablet retried that batch for ever. Each odd operation must be its own rejection, with a
 * code, and the good operations beside it must be applied.
 */
const knex = testDb();
afterAll(() => knex.destroy());

let tech: { id: number; email: string; name: string; role: "technician" };
let checklist: string;
beforeAll(async () => {
  await seedLibrary(knex);
  tech = (await makeUser(knex, "technician")) as typeof tech;
  const lead = await makeUser(knex, "lead");
  const job = await makeJob(knex, lead.id, [tech.id]);
  [checklist] = await startChecklists(job.id, ["cooling"], lead.id);
});

const device = "device-poison-1";
const current = async (itemKey: string) =>
  (await knex("checklist_responses").where({ checklist_id: checklist, item_key: itemKey }).first())?.rev ?? 0;

/** A value nested `depth` arrays deep, built without recursion. */
function nested(depth: number): unknown {
  let v: unknown = "bottom";
  for (let i = 0; i < depth; i++) v = [v];
  return v;
}

describe("an odd operation is refused on its own, never failing the batch", () => {
  let app: Awaited<ReturnType<typeof appHandler>>;
  let cookie: string;
  beforeAll(async () => {
    app = await appHandler();
    cookie = await signInCookie(app, tech.email);
  });
  const post = (ops: unknown[]) =>
    app("/api/sync", {
      method: "POST",
      body: JSON.stringify({ deviceId: device, cursor: null, ops }),
      headers: { "Content-Type": "application/json" },
      cookie,
    });

  const poisoned: [string, (rev: number) => ReturnType<typeof op>][] = [
    // "…🚤".slice(0, -1) leaves the emoji's high surrogate alone at the end.
    [
      "a note cut in the middle of an emoji",
      (rev) => op(checklist, "seacock", check("pass", "Fine 🚤".slice(0, -1)), rev),
    ],
    ["a seq of 2^32", (rev) => op(checklist, "seacock", check("pass"), rev, { seq: 2 ** 32 })],
    ["a baseRev of 2^32", () => op(checklist, "seacock", check("fail"), 2 ** 32)],
    ["a value nested 2,000 deep", (rev) => op(checklist, "seacock", nested(2000) as any, rev)],
    ["a conflict id of 2^32", (rev) => op(checklist, "seacock", check("pass"), rev, { resolves: [2 ** 32] })],
  ];

  for (const [name, make] of poisoned) {
    it(`refuses ${name} with a code and applies the rest of the batch`, async () => {
      const good = op(checklist, "strainer", check("pass", name), await current("strainer"));
      const bad = make(await current("seacock"));
      const response = await post([bad, good]);
      expect(response.status).toBe(200);
      const { results } = await response.json();
      expect(results[0]).toMatchObject({ opId: bad.opId, status: "rejected", code: "invalid-operation" });
      expect(results[0].reason).toMatch(/\w/);
      expect(results[1]).toMatchObject({ opId: good.opId, status: "applied" });
      expect(await knex("response_history").where({ op_id: bad.opId })).toHaveLength(0);
      // Sent again (a lost answer), the same refusal: nothing wedges.
      expect((await (await post([bad])).json()).results[0]).toMatchObject({ code: "invalid-operation" });
    });
  }

  it("keeps a device clock at year 0000 or 9999 exactly as sent, and decides nothing by it", async () => {
    for (const at of ["0000-01-01T00:30:00+01:00", "9999-12-31T23:30:00-01:00"]) {
      const rev = await current("impeller");
      const applied = op(checklist, "impeller", check(rev % 2 ? "pass" : "fail"), rev, { at });
      const conflicting = op(checklist, "impeller", check("na", at), 0, { at });
      const response = await post([applied, conflicting]);
      expect(response.status).toBe(200);
      const { results } = await response.json();
      expect(results.map((r: any) => r.status)).toEqual(["applied", "conflict"]);
      expect((await knex("response_history").where({ op_id: applied.opId }).first())!.client_at).toBe(at);
      expect((await knex("sync_conflicts").where({ op_id: conflicting.opId }).first())!.client_at).toBe(at);
    }
  });

  it("refuses a submission of a checklist that does not exist, without failing the batch", async () => {
    const submit = op("00000000-0000-4000-8000-000000000000", "@submit", { action: "submit" }, 0);
    const good = op(checklist, "thermostat", check("pass"), await current("thermostat"));
    const response = await post([submit, good]);
    expect(response.status).toBe(200);
    const { results } = await response.json();
    expect(results[0]).toMatchObject({ status: "rejected", code: "not-on-your-job" });
    expect(results[1]).toMatchObject({ status: "applied" });
  });

  it("refuses a batch carrying one opId twice with 400, applying nothing", async () => {
    const first = op(checklist, "heat-exchanger", check("pass"), await current("heat-exchanger"));
    const copy = { ...first, value: check("fail") };
    const response = await post([first, copy]);
    expect(response.status).toBe(400);
    expect((await response.json()).fields.map((f: any) => f.path)).toContain("ops[1].opId");
    expect(await knex("response_history").where({ op_id: first.opId })).toHaveLength(0);
  });
});

describe("whatever the protocol schema accepts, the database stores", () => {
  it("answers every generated operation without throwing (fast-check)", async () => {
    const text = fc.string({ unit: "binary", maxLength: 12 });
    const json = fc.letrec((tie) => ({
      value: fc.oneof(
        { depthSize: "small", withCrossShrink: true },
        text,
        fc.double(),
        fc.integer(),
        fc.boolean(),
        fc.constant(null),
        fc.array(tie("value"), { maxLength: 3 }),
        fc.dictionary(text, tie("value"), { maxKeys: 3 }),
      ),
    })).value;
    const anyOp = fc.record({
      itemKey: fc.oneof(fc.constantFrom("seacock", "coolant-type", "freeze-protection", "@submit"), text),
      value: fc.oneof(
        json,
        fc.record({ result: fc.constantFrom("pass", "fail"), note: text }),
        fc.record({ option: text, note: text }),
      ),
      baseRev: fc.oneof(fc.nat({ max: 5 }), fc.constant(2 ** 32), fc.constant(2 ** 53 - 1)),
      seq: fc.oneof(fc.nat(), fc.constant(2 ** 32)),
      at: fc.oneof(
        fc.date({ noInvalidDate: true }).map((d) => d.toISOString()),
        fc.constantFrom(
          "0000-01-01T00:30:00+01:00",
          "9999-12-31T23:30:00-01:00",
          "2026-01-01T00:00:00.123456789Z",
        ),
      ),
    });
    await fc.assert(
      fc.asyncProperty(fc.array(anyOp, { minLength: 1, maxLength: 6 }), async (raw) => {
        const ops = raw.map((r) =>
          op(checklist, r.itemKey, r.value as any, r.baseRev, { seq: r.seq, at: r.at }),
        );
        const answer = await sync(tech, { deviceId: device, cursor: null, ops });
        expect(answer.results.map((r) => r.opId)).toEqual(ops.map((o) => o.opId));
      }),
      { numRuns: 60 },
    );
  });
});
