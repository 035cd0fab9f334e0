import { afterAll, describe, expect, it } from "vitest";
import { listVisibleJobs } from "~/server/jobs.server";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";

const knex = testDb();
afterAll(() => knex.destroy());

describe("who sees which jobs", () => {
  it("follows the roles: manager all, lead theirs, technician assigned, surveyor none", async () => {
    const [lead, otherLead, tech, otherTech, manager, surveyor] = await Promise.all([
      makeUser(knex, "lead"),
      makeUser(knex, "lead"),
      makeUser(knex, "technician"),
      makeUser(knex, "technician"),
      makeUser(knex, "manager"),
      makeUser(knex, "surveyor"),
    ]);
    const mine = await makeJob(knex, lead.id, [tech.id]);
    const theirs = await makeJob(knex, otherLead.id, [otherTech.id]);
    const ids = async (actor: { id: number; role: any }) => (await listVisibleJobs(actor)).map((j) => j.id);

    expect(await ids(manager)).toEqual(expect.arrayContaining([mine.id, theirs.id]));
    expect(await ids(lead)).toEqual([mine.id]);
    expect(await ids(tech)).toEqual([mine.id]);
    expect(await ids(otherTech)).toEqual([theirs.id]);
    expect(await ids(surveyor)).toEqual([]);
  });
});
