import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Role } from "~/lib/roles";
import { startChecklists } from "~/server/checklists.server";
import { checklistStateChanged } from "~/server/sync-clock.server";
import { sync } from "~/server/sync.server";
import { seedLibrary } from "../../db/seeds/library.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";
import { check, op } from "../support/sync.ts";

// Who receives what in a pull: the checklists of the jobs a person leads or works on, every
// checklist for a manager, none for a surveyor — in a pull alone and in the pull a push answers.
const knex = testDb();
afterAll(() => knex.destroy());

type Person = { id: number; name: string; role: Role };
const people = {} as Record<"manager" | "leadA" | "leadB" | "techA" | "techB" | "surveyor", Person>;
let checklistA: string, checklistB: string;
let since: string;

beforeAll(async () => {
  await seedLibrary(knex);
  people.manager = await makeUser(knex, "manager");
  people.leadA = await makeUser(knex, "lead");
  people.leadB = await makeUser(knex, "lead");
  people.techA = await makeUser(knex, "technician");
  people.techB = await makeUser(knex, "technician");
  people.surveyor = await makeUser(knex, "surveyor");
  const jobA = await makeJob(knex, people.leadA.id, [people.techA.id]);
  const jobB = await makeJob(knex, people.leadB.id, [people.techB.id]);
  [checklistA] = await startChecklists(jobA.id, ["cooling"], people.leadA.id);
  [checklistB] = await startChecklists(jobB.id, ["cooling"], people.leadB.id);
  since = String((await knex("sync_clock").where({ id: 1 }).first("seq"))!.seq);
  for (const [tech, checklist] of [
    [people.techA, checklistA],
    [people.techB, checklistB],
  ] as const) {
    const answer = await sync(tech, {
      deviceId: `scope-${tech.id}`,
      cursor: null,
      ops: [op(checklist, "seacock", check("pass"), 0)],
    });
    expect(answer.results[0]).toMatchObject({ status: "applied" });
  }
});

const pull = (person: Person, cursor = since) =>
  sync(person, { deviceId: `scope-pull-${person.id}`, cursor, ops: [] });
const checklistsIn = (answer: Awaited<ReturnType<typeof pull>>) =>
  [checklistA, checklistB].filter((id) => answer.changes.some((c) => c.checklistId === id));

describe("what each person pulls", () => {
  it.each([
    ["manager", ["A", "B"]],
    ["leadA", ["A"]],
    ["leadB", ["B"]],
    ["techA", ["A"]],
    ["techB", ["B"]],
    ["surveyor", []],
  ] as const)("%s receives the entries of checklists %j", async (who, expected) => {
    const answer = await pull(people[who]);
    const names = expected.map((x) => (x === "A" ? checklistA : checklistB));
    expect(checklistsIn(answer)).toEqual(names);
  });

  it("gives a technician's push answer only their own jobs' changes", async () => {
    // techB writes again; techA's next push, from the cursor before both, must not carry it.
    await sync(people.techB, {
      deviceId: "scope-b-again",
      cursor: null,
      ops: [op(checklistB, "strainer", check("pass"), 0)],
    });
    const answer = await sync(people.techA, {
      deviceId: "scope-a-again",
      cursor: since,
      ops: [op(checklistA, "strainer", check("fail"), 0)],
    });
    expect(answer.results[0]).toMatchObject({ status: "applied" });
    expect(checklistsIn(answer)).toEqual([checklistA]);
    expect(answer.changes.map((c) => c.itemKey).sort()).toEqual(["seacock", "strainer"]);
  });

  it.each([
    ["manager", true],
    ["leadA", true],
    ["leadB", false],
    ["techA", true],
    ["techB", false],
    ["surveyor", false],
  ] as const)("tells %s of checklist A's new state: %s", async (who, told) => {
    const before = String((await knex("sync_clock").where({ id: 1 }).first("seq"))!.seq);
    await knex.transaction(async (trx) => {
      await trx("job_checklists").where({ id: checklistA }).update({ state: "returned" });
      await checklistStateChanged(trx, checklistA);
    });
    const answer = await pull(people[who], before);
    expect(answer.checklists.some((c) => c.id === checklistA)).toBe(told);
    expect(answer.checklists.some((c) => c.id === checklistB)).toBe(false);
  });
});
