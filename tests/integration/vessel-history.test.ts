import { randomUUID } from "node:crypto";
import { afterAll, describe, expect, it } from "vitest";
import { vesselFigures, vesselJobsAndRecords } from "~/server/vessel-history.server";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";
import { alignmentChecklist, starterTemplate } from "../support/record-fixture.ts";

const knex = testDb();
afterAll(() => knex.destroy());

/** A checklist of the job with the fixture's responses, in the given state. */
async function handIn(jobId: number, userId: number, state: "in-progress" | "submitted", at: string) {
  const template = starterTemplate("engine-alignment");
  const key = `engine-alignment-${randomUUID().slice(0, 8)}`;
  const [versionId] = await knex("template_versions").insert({
    template_key: key,
    version: 1,
    status: "draft",
    title: template.title,
    body: JSON.stringify(template),
    body_sha256: "0".repeat(64),
  });
  const id = randomUUID();
  await knex("job_checklists").insert({
    id,
    job_id: jobId,
    template_version_id: versionId,
    template_key: key,
  });
  for (const [itemKey, response] of Object.entries(alignmentChecklist().responses))
    await knex("response_history").insert({
      checklist_id: id,
      item_key: itemKey,
      value: JSON.stringify(response.value),
      rev: 1,
      user_id: userId,
      at: new Date(at),
      change_seq: 1,
    });
  await knex("job_checklists").where({ id }).update({ state });
  return id;
}

describe("a vessel's history (issue 16)", () => {
  it("lists its jobs and its alignment figures from checklists handed in, newest first, by phase", async () => {
    const lead = await makeUser(knex, "lead");
    const first = await makeJob(knex, lead.id);
    const second = await makeJob(knex, lead.id, [], first.vesselId);
    await handIn(first.id, lead.id, "submitted", "2025-05-20T10:00:00Z");
    await handIn(second.id, lead.id, "submitted", "2026-06-02T10:00:00Z");
    // Work in progress is not a figure a yard compares.
    const third = await makeJob(knex, lead.id, [], first.vesselId);
    await handIn(third.id, lead.id, "in-progress", "2026-07-01T10:00:00Z");

    const { jobs } = await vesselJobsAndRecords(first.vesselId);
    expect(jobs.map((j) => j.id).sort()).toEqual([first.id, second.id, third.id].sort());

    const figures = await vesselFigures(first.vesselId);
    expect(new Set(figures.map((f) => f.jobId))).toEqual(new Set([second.id, first.id]));
    expect(figures[0]!.jobId).toBe(second.id);
    // The fixture's face gaps and rim readings give the afloat angularity and offset, and the
    // re-check after the sea trial its own angularity.
    const phases = new Set(figures.filter((f) => f.jobId === first.id).map((f) => f.phase));
    expect(phases).toEqual(new Set(["Afloat", "After the sea trial"]));
    for (const f of figures) {
      expect(f.figures).toMatch(/\d/);
      expect(f.state).toBe("submitted");
    }
  });
});
