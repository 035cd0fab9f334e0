import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startChecklists } from "~/server/checklists.server";
import { sync } from "~/server/sync.server";
import { seedLibrary } from "../../db/seeds/library.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";
import { op } from "../support/sync.ts";

/**
 * Issue 15 §1 / issue 13 §4: an attempt struck through with a reason, through /api/sync's applier.
 * Strikes are an append-only set keyed by attempt: two tablets never conflict over them.
 */
const knex = testDb();
afterAll(() => knex.destroy());

let tech: Awaited<ReturnType<typeof makeUser>>, lead: Awaited<ReturnType<typeof makeUser>>;
beforeAll(async () => {
  await seedLibrary(knex);
  tech = await makeUser(knex, "technician");
  lead = await makeUser(knex, "lead");
});

const ITEM = "coolant-temperature-cruise";
const attempt = (value: number, at: string) => ({
  id: crypto.randomUUID(),
  value,
  unit: "degF",
  at,
  by: "T",
});
const strike = (id: string, reason: string, at: string) => ({ attempt: id, reason, at, by: "T" });
const push = (actor: typeof tech, ops: ReturnType<typeof op>[], device: string) =>
  sync(actor, { deviceId: device, cursor: null, ops });

async function stored(checklistId: string) {
  const row = await knex("checklist_responses").where({ checklist_id: checklistId, item_key: ITEM }).first();
  return typeof row!.value === "string" ? JSON.parse(row!.value) : row!.value;
}

describe("strikes through the sync applier", () => {
  it("merges strikes from two tablets made apart, keeps them against a later entry, and never conflicts", async () => {
    const job = await makeJob(knex, lead.id, [tech.id]);
    const [id] = await startChecklists(job.id, ["cooling"], lead.id);
    const one = attempt(180, "2026-05-01T09:00:00Z");
    const two = attempt(1800, "2026-05-01T09:05:00Z");
    const three = attempt(18, "2026-05-01T09:10:00Z");
    await push(tech, [op(id!, ITEM, { attempts: [one, two, three] }, 0)], "tab-a");

    // Both tablets hold revision 1; each strikes a different attempt while apart.
    const a = await push(
      tech,
      [
        op(
          id!,
          ITEM,
          {
            attempts: [one, two, three],
            strikes: [strike(two.id, "typed a zero too many", "2026-05-01T10:00:00Z")],
          },
          1,
        ),
      ],
      "tab-a",
    );
    const b = await push(
      lead,
      [
        op(
          id!,
          ITEM,
          {
            attempts: [one, two, three],
            strikes: [strike(three.id, "dropped a digit", "2026-05-01T10:05:00Z")],
          },
          1,
        ),
      ],
      "tab-b",
    );
    expect(a.results[0]).toMatchObject({ status: "applied", rev: 2 });
    expect(b.results[0]).toMatchObject({ status: "applied", rev: 3 });
    expect((await stored(id!)).strikes.map((s: { attempt: string }) => s.attempt)).toEqual([
      two.id,
      three.id,
    ]);

    // A third tablet strikes an attempt already struck: the first strike stays, nothing new is written.
    const again = await push(
      tech,
      [
        op(
          id!,
          ITEM,
          { attempts: [one, two, three], strikes: [strike(two.id, "other reason", "2026-05-01T11:00:00Z")] },
          1,
        ),
      ],
      "tab-c",
    );
    expect(again.results[0]!.status).not.toBe("conflict");
    expect((await stored(id!)).strikes).toHaveLength(2);

    // An entry on the current revision that leaves the strikes out (a tablet that never saw them)
    // adds its attempt and removes no strike.
    const four = attempt(181, "2026-05-01T12:00:00Z");
    await push(tech, [op(id!, ITEM, { attempts: [one, two, three, four] }, 3)], "tab-d");
    const after = await stored(id!);
    expect(after.attempts).toHaveLength(4);
    expect(after.strikes.map((s: { reason: string }) => s.reason)).toEqual([
      "typed a zero too many",
      "dropped a digit",
    ]);
    expect(await knex("sync_conflicts").where({ checklist_id: id })).toHaveLength(0);
  });

  it("refuses a strike of an attempt the item does not hold, as that operation's rejection", async () => {
    const job = await makeJob(knex, lead.id, [tech.id]);
    const [id] = await startChecklists(job.id, ["cooling"], lead.id);
    const one = attempt(180, "2026-05-01T09:00:00Z");
    const answer = await push(
      tech,
      [
        op(
          id!,
          ITEM,
          {
            attempts: [one],
            strikes: [strike(crypto.randomUUID(), "no such attempt", "2026-05-01T10:00:00Z")],
          },
          0,
        ),
      ],
      "tab-e",
    );
    expect(answer.results[0]).toMatchObject({ status: "rejected" });
  });
});
