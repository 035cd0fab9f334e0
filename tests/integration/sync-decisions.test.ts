import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { SUBMIT_KEY, submitValue } from "~/lib/sync/submission";
import { startChecklists } from "~/server/checklists.server";
import { openConflicts } from "~/server/offline.server";
import { countersign, returnChecklist } from "~/server/review.server";
import { changesPage, sync } from "~/server/sync.server";
import { seedLibrary } from "../../db/seeds/library.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser, publishTemplate, TEST_PASSWORD } from "../support/fixtures.ts";
import { op } from "../support/sync.ts";

/** Issue 13 §2 (state changes reach the pull) and §3 (conflicts decided once, and blocking). */
const knex = testDb();
afterAll(() => knex.destroy());

const template = {
  key: "sync-decide-test",
  version: 1,
  title: "Deciding test",
  purpose: "Integration tests of conflict decisions.",
  sections: [
    {
      key: "s",
      title: "S",
      items: [
        { kind: "check", key: "a", label: "A", required: true },
        { kind: "text", key: "b", label: "B", required: true },
      ],
    },
  ],
};

let tech: Awaited<ReturnType<typeof makeUser>>, lead: Awaited<ReturnType<typeof makeUser>>;
beforeAll(async () => {
  await seedLibrary(knex);
  await publishTemplate(knex, template);
  tech = await makeUser(knex, "technician");
  lead = await makeUser(knex, "lead");
});

const push = (
  actor: typeof tech,
  ops: ReturnType<typeof op>[],
  cursor: string | null = null,
  device = "decide-1",
) => sync(actor, { deviceId: device, cursor, ops });
async function fresh() {
  const job = await makeJob(knex, lead.id, [tech.id]);
  return (await startChecklists(job.id, [template.key], lead.id))[0]!;
}
/** The lead sets A online; the technician's offline entry on the old revision becomes a conflict. */
async function withConflict(id: string) {
  await push(lead, [op(id, "a", { result: "pass" }, 0)], null, "lead-desk");
  const answer = await push(tech, [op(id, "a", { result: "fail" }, 0)]);
  expect(answer.results[0]).toMatchObject({ status: "conflict", serverBy: lead.name });
  return answer.results[0]!.conflictId!;
}
const waiting = async (id: string) =>
  knex("sync_conflicts").where({ checklist_id: id }).whereNull("resolved_at");

describe("a conflict is decided once", () => {
  it("by any later entry on its item made on the server's value", async () => {
    const id = await fresh();
    await withConflict(id);
    expect(await waiting(id)).toHaveLength(1);
    const later = op(id, "a", { result: "na" }, 1); // no `resolves`: an ordinary entry
    expect((await push(tech, [later])).results[0]).toMatchObject({ status: "applied", rev: 2 });
    const row = await knex("sync_conflicts").where({ checklist_id: id }).first();
    expect(row).toMatchObject({ resolution_op_id: later.opId, resolved_by: tech.id });
    expect(await openConflicts([id])).toEqual([]);
  });

  it("names who set the server's value, and when, for the To-decide page", async () => {
    const id = await fresh();
    await withConflict(id);
    const [conflict] = await openConflicts([id]);
    expect(conflict).toMatchObject({ serverBy: lead.name, serverAt: expect.stringMatching(/^\d{4}-/) });
  });
});

describe("an undecided conflict blocks", () => {
  it("the submission, with its code", async () => {
    const id = await fresh();
    await withConflict(id);
    const answer = await push(tech, [op(id, "b", { text: "ok" }, 0), op(id, SUBMIT_KEY, submitValue, 0)]);
    expect(answer.results[1]).toMatchObject({ status: "rejected", code: "conflict-undecided" });
    expect((await knex("job_checklists").where({ id }).first())!.state).toBe("in-progress");
  });

  it("the countersignature (a conflict left from before the submission rule)", async () => {
    const id = await fresh();
    await push(tech, [
      op(id, "a", { result: "pass" }, 0),
      op(id, "b", { text: "ok" }, 0),
      op(id, SUBMIT_KEY, submitValue, 0),
    ]);
    await knex("sync_conflicts").insert({
      checklist_id: id,
      item_key: "b",
      op_id: crypto.randomUUID(),
      base_rev: 0,
      server_rev: 1,
      server_value: JSON.stringify({ text: "ok" }),
      client_value: JSON.stringify({ text: "not ok" }),
      user_id: tech.id,
      device_id: "decide-2",
      received_at: new Date(),
    });
    await expect(countersign(lead, id, TEST_PASSWORD)).rejects.toThrow(/conflict/);
    expect((await knex("job_checklists").where({ id }).first())!.state).toBe("submitted");
  });
});

describe("a checklist's state reaches other tablets through the pull", () => {
  it("submitted, then returned", async () => {
    const id = await fresh();
    const { cursor } = await push(tech, [], null, "other-tablet");
    await push(tech, [
      op(id, "a", { result: "pass" }, 0),
      op(id, "b", { text: "ok" }, 0),
      op(id, SUBMIT_KEY, submitValue, 0),
    ]);
    const afterSubmit = await push(tech, [], cursor, "other-tablet");
    expect(afterSubmit.checklists).toEqual([{ id, state: "submitted" }]);
    await returnChecklist(lead, id);
    const afterReturn = await push(tech, [], afterSubmit.cursor, "other-tablet");
    expect(afterReturn.checklists).toEqual([{ id, state: "returned" }]);
  });
});

describe("paged pulls (issue 13 §5)", () => {
  it("answer a bounded page, never split a batch, and say when more waits", async () => {
    const job = await makeJob(knex, lead.id, [tech.id]);
    const [id] = await startChecklists(job.id, ["cooling"], lead.id);
    const { cursor: start } = await push(tech, [], null, "pager");
    // Three batches of two changes each: three change numbers.
    const pass = { result: "pass" };
    await push(tech, [op(id!, "seacock", pass, 0), op(id!, "strainer", pass, 0)]);
    await push(tech, [op(id!, "impeller", pass, 0), op(id!, "heat-exchanger", pass, 0)]);
    await push(tech, [op(id!, "thermostat", pass, 0), op(id!, "cooling-hoses", pass, 0)]);
    const end = Number((await push(tech, [], null, "pager")).cursor);
    const pages: { changes: number; more: boolean }[] = [];
    let cursor = Number(start);
    await knex.transaction(async (trx) => {
      for (let more = true; more;) {
        const page = await changesPage(trx, [id!], cursor, end, 3);
        pages.push({ changes: page.changes.length, more: page.more });
        expect(page.cursor).toBeGreaterThan(cursor);
        ({ cursor, more } = page);
      }
    });
    // A page of 3 ends between change numbers: the second batch comes whole with the first.
    expect(pages).toEqual([
      { changes: 4, more: true },
      { changes: 2, more: false },
    ]);
    expect(cursor).toBe(end);
  });
});

describe("merge by item kind on the server (issue 13 §4)", () => {
  const attempt = (value: number, at: string) => ({
    id: crypto.randomUUID(),
    value,
    unit: "degF",
    at,
    by: "T",
  });
  it("adds attempts from two tablets to one measure item, no conflict; a choice still conflicts", async () => {
    const job = await makeJob(knex, lead.id, [tech.id]);
    const [id] = await startChecklists(job.id, ["cooling"], lead.id);
    const first = attempt(180, "2026-05-01T09:00:00Z");
    await push(tech, [op(id!, "coolant-temperature-cruise", { attempts: [first] }, 0)]);
    // Both tablets start from rev 1 and each adds an attempt while apart.
    const mine = attempt(182, "2026-05-01T10:00:00Z");
    const theirs = attempt(181, "2026-05-01T09:30:00Z");
    const a = await push(
      tech,
      [op(id!, "coolant-temperature-cruise", { attempts: [first, mine] }, 1)],
      null,
      "tab-a",
    );
    const b = await push(
      lead,
      [op(id!, "coolant-temperature-cruise", { attempts: [first, theirs] }, 1)],
      null,
      "tab-b",
    );
    expect(a.results[0]).toMatchObject({ status: "applied", rev: 2 });
    expect(b.results[0]).toMatchObject({ status: "applied", rev: 3 });
    const row = await knex("checklist_responses")
      .where({ checklist_id: id, item_key: "coolant-temperature-cruise" })
      .first();
    const stored = typeof row!.value === "string" ? JSON.parse(row!.value) : row!.value;
    expect(stored.attempts.map((x: any) => x.value)).toEqual([180, 181, 182]);
    expect(await knex("sync_conflicts").where({ checklist_id: id })).toHaveLength(0);
    // The merged value reaches the tablet that sent the other attempt, with the new revision.
    expect(b.changes.find((c) => c.itemKey === "coolant-temperature-cruise")).toMatchObject({
      rev: 3,
      value: stored,
    });

    await push(tech, [op(id!, "coolant-temperature-verdict", { option: "within" }, 0)]);
    const stale = await push(lead, [
      op(id!, "coolant-temperature-verdict", { option: "above", note: "Runs hot at cruise" }, 0),
    ]);
    expect(stale.results[0]).toMatchObject({ status: "conflict" });
  });
});
