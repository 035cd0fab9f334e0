import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { checklistDigest, sha256Hex } from "~/lib/record/digest.server";
import { checklistCanonical } from "~/lib/record/canonical";
import { SUBMIT_KEY, submitValue } from "~/lib/sync/submission";
import { startChecklists } from "~/server/checklists.server";
import { loadRecordChecklist } from "~/server/record-data.server";
import { issueRecord, verifyRecord } from "~/server/records.server";
import { notificationKinds } from "~/lib/notifications";
import { recordOpened, setNotifications } from "~/server/notifications.server";
import { issuedRecently, returnedTo, waitingFor } from "~/server/queue.server";
import {
  addComment,
  countersign,
  countersignSeveral,
  discardAmendment,
  replyToComment,
  returnChecklist,
  startAmendment,
} from "~/server/review.server";
import { sync } from "~/server/sync.server";
import { seedLibrary } from "../../db/seeds/library.ts";
import { testDb } from "../support/db.ts";
import { appHandler, signInCookie } from "../support/app.ts";
import { makeJob, makeUser, publishTemplate, TEST_PASSWORD } from "../support/fixtures.ts";
import { mailTo as mailIn, waitForMail } from "../support/mail.ts";
import { op } from "../support/sync.ts";

const knex = testDb();
afterAll(() => knex.destroy());

const template = {
  key: "review-test",
  version: 1,
  title: "Review test",
  purpose: "Integration tests of review.",
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

let tech: Awaited<ReturnType<typeof makeUser>>,
  lead: Awaited<ReturnType<typeof makeUser>>,
  otherLead: Awaited<ReturnType<typeof makeUser>>,
  manager: Awaited<ReturnType<typeof makeUser>>;
let jobId: number;

beforeAll(async () => {
  await seedLibrary(knex);
  await publishTemplate(knex, template);
  [tech, lead, otherLead, manager] = [
    await makeUser(knex, "technician"),
    await makeUser(knex, "lead"),
    await makeUser(knex, "lead"),
    await makeUser(knex, "manager"),
  ];
  jobId = (await makeJob(knex, lead.id, [tech.id])).id;
});

const device = "review-device";
const push = (actor: typeof tech, ops: ReturnType<typeof op>[]) =>
  sync(actor, { deviceId: device, cursor: null, ops });
const stateOf = async (id: string) => (await knex("job_checklists").where({ id }).first())!.state;
const actions = async (id: string) =>
  (await knex("audit_log").where({ entity_id: id }).orderBy("id").pluck("action")) as string[];

async function freshJobChecklist() {
  jobId = (await makeJob(knex, lead.id, [tech.id])).id;
  return (await startChecklists(jobId, [template.key], lead.id))[0]!;
}

describe("submitting, returning and countersigning", () => {
  it("refuses an incomplete submission with the reason, and accepts a complete one after its entries", async () => {
    const id = await freshJobChecklist();
    const early = await push(tech, [op(id, SUBMIT_KEY, submitValue, 0)]);
    expect(early.results[0]).toMatchObject({
      status: "rejected",
      reason: expect.stringMatching(/2 required item/),
    });
    // Entries and the submission in one batch, as a tablet sends them after working offline.
    const batch = await push(tech, [
      op(id, "a", { result: "pass" }, 0),
      op(id, "b", { text: "ok" }, 0),
      op(id, SUBMIT_KEY, submitValue, 0),
    ]);
    expect(batch.results.map((r) => r.status)).toEqual(["applied", "applied", "applied"]);
    expect(await stateOf(id)).toBe("submitted");
    const late = await push(tech, [op(id, "b", { text: "changed" }, 1)]);
    expect(late.results[0]).toMatchObject({ status: "rejected", reason: expect.stringMatching(/submitted/) });
  });

  it("lets only the job's lead comment, return and countersign, with the right password", async () => {
    const id = await freshJobChecklist();
    await push(tech, [
      op(id, "a", { result: "pass" }, 0),
      op(id, "b", { text: "ok" }, 0),
      op(id, SUBMIT_KEY, submitValue, 0),
    ]);
    await expect(addComment(otherLead, id, "b", "nope")).rejects.toThrow(/Only the job's lead/);
    await addComment(lead, id, "b", "Say more");
    await returnChecklist(lead, id);
    expect(await stateOf(id)).toBe("returned");
    await push(tech, [op(id, "b", { text: "ok, with more" }, 1), op(id, SUBMIT_KEY, submitValue, 0)]);
    await expect(countersign(lead, id, "wrong password")).rejects.toThrow(/password is not right/);
    await expect(countersign(otherLead, id, TEST_PASSWORD)).rejects.toThrow(/Only the job's lead/);
    expect(await stateOf(id)).toBe("submitted");
    const digest = await countersign(lead, id, TEST_PASSWORD);
    expect(await stateOf(id)).toBe("countersigned");
    // The stored digest is SHA-256 over the canonical content, recomputed here with node:crypto.
    const content = (await loadRecordChecklist(id, knex))!;
    expect(digest).toBe(sha256Hex(checklistCanonical(content)));
    expect(digest).toBe(checklistDigest(content));
    expect(await actions(id)).toEqual([
      "checklist.started",
      "checklist.submitted",
      "checklist.returned",
      "checklist.submitted",
      "checklist.countersigned",
    ]);
    await expect(countersign(lead, id, TEST_PASSWORD)).rejects.toThrow(/waiting for review/);
  });

  it("refuses each step in the wrong state with 409, and a stranger with 403, whatever the step", async () => {
    const id = await freshJobChecklist();
    const wrongState = { reason: "wrong-state", status: 409 };
    // In progress: nothing to comment on, return or countersign yet; nothing to amend.
    await expect(addComment(lead, id, "b", "Too early")).rejects.toMatchObject(wrongState);
    await expect(returnChecklist(lead, id)).rejects.toMatchObject(wrongState);
    await expect(countersign(lead, id, TEST_PASSWORD)).rejects.toMatchObject(wrongState);
    await expect(startAmendment(lead, id)).rejects.toMatchObject(wrongState);
    const forbidden = { reason: "forbidden", status: 403 };
    await expect(returnChecklist(otherLead, id)).rejects.toMatchObject(forbidden);
    await expect(startAmendment(tech, id)).rejects.toMatchObject(forbidden);
    await expect(countersign(lead, id, "wrong password")).rejects.toMatchObject({
      status: 400,
      field: "password",
    });
    expect(await stateOf(id)).toBe("in-progress");
  });
});

describe("the lock", () => {
  it("holds against direct UPDATE and DELETE in the database", async () => {
    const id = await freshJobChecklist();
    await push(tech, [
      op(id, "a", { result: "pass" }, 0),
      op(id, "b", { text: "ok" }, 0),
      op(id, SUBMIT_KEY, submitValue, 0),
    ]);
    await countersign(lead, id, TEST_PASSWORD);
    // Updates, deletes and new rows alike: the look-up triggers say it in words, the seal's key
    // by its name (migration 015).
    const refused = /countersigned checklist cannot be changed|sealed_when_countersigned/;
    await expect(
      knex("response_history")
        .where({ checklist_id: id, item_key: "b" })
        .update({ value: JSON.stringify({ text: "edited" }) }),
    ).rejects.toThrow(refused);
    await expect(knex("response_history").where({ checklist_id: id }).delete()).rejects.toThrow(refused);
    await expect(knex("job_checklists").where({ id }).update({ state: "in-progress" })).rejects.toThrow(
      refused,
    );
    await expect(knex("job_checklists").where({ id }).delete()).rejects.toThrow(refused);
    await expect(
      knex("checklist_comments").insert({
        checklist_id: id,
        item_key: "b",
        user_id: lead.id,
        text: "late",
        at: new Date(),
      }),
    ).rejects.toThrow(refused);
    // A new current value (migration 016): refused like the rest.
    await expect(
      knex("response_history").insert({
        checklist_id: id,
        item_key: "c",
        rev: 1,
        value: JSON.stringify({ text: "late" }),
        user_id: tech.id,
        at: new Date(),
        change_seq: 1,
      }),
    ).rejects.toThrow(refused);
    // The key cannot be talked round: the trigger sets it whatever the writer sends.
    await expect(
      knex("response_history")
        .where({ checklist_id: id, item_key: "b" })
        .update({ value: JSON.stringify({ text: "edited" }), open_ref: null }),
    ).rejects.toThrow(refused);
    // The current values are a view of the history: not written at all.
    await expect(
      knex("checklist_responses").where({ checklist_id: id, item_key: "b" }).update({ rev: 9 }),
    ).rejects.toThrow();
    await expect(knex("checklist_responses").where({ checklist_id: id }).delete()).rejects.toThrow();
    const { value } = (await knex("checklist_responses").where({ checklist_id: id, item_key: "b" }).first())!;
    expect(typeof value === "string" ? JSON.parse(value) : value).toEqual({ text: "ok" });
  });

  it("leaves the original as it was when an amendment corrects it", async () => {
    const id = await freshJobChecklist();
    await push(tech, [
      op(id, "a", { result: "pass" }, 0),
      op(id, "b", { text: "first" }, 0),
      op(id, SUBMIT_KEY, submitValue, 0),
    ]);
    const digest = await countersign(lead, id, TEST_PASSWORD);
    const amendment = await startAmendment(lead, id);
    await push(tech, [op(amendment, "b", { text: "corrected" }, 1)]);
    const original = (await loadRecordChecklist(id, knex))!;
    expect(original.responses.b!.value).toEqual({ text: "first" });
    expect(checklistDigest(original)).toBe(digest);
    expect((await knex("job_checklists").where({ id: amendment }).first())!.amends_id).toBe(id);
    expect(await actions(amendment)).toContain("checklist.amended");
  });
});

describe("issuing and verifying a record", () => {
  it("needs every checklist countersigned, then verifies until a stored row is changed", async () => {
    const id = await freshJobChecklist();
    await expect(
      issueRecord(manager, jobId, [{ email: "s@survey.example", name: "Sela Sounding" }]),
    ).rejects.toThrow(/still open: Review test/);
    await push(tech, [
      op(id, "a", { result: "pass" }, 0),
      op(id, "b", { text: "ok" }, 0),
      op(id, SUBMIT_KEY, submitValue, 0),
    ]);
    await countersign(lead, id, TEST_PASSWORD);
    await expect(issueRecord(manager, jobId, [{ email: tech.email }])).rejects.toThrow(/yard account/);
    await expect(
      issueRecord(otherLead, jobId, [{ email: "s@survey.example", name: "Sela Sounding" }]),
    ).rejects.toThrow(/manager or the job's lead/);
    // (Mail goes to the SMTP stand-in the integration setup starts.)
    const recordId = (
      await issueRecord(manager, jobId, [
        { email: `surveyor-${Date.now()}@survey.example`, name: "Sela Sounding" },
      ])
    ).id;
    expect((await verifyRecord(recordId))!.genuine).toBe(true);
    expect(await knex("audit_log").where({ action: "record.issued", entity_id: recordId })).toHaveLength(1);
    const row = (await knex("records").where({ id: recordId }).first())!;
    await knex("records")
      .where({ id: recordId })
      .update({ content: row.content.replace('"text":"ok"', '"text":"OK"') });
    const changed = (await verifyRecord(recordId))!;
    expect(changed.genuine).toBe(false);
    expect(changed.problems.join(" ")).toMatch(/does not match/);
  });
});

describe("e-mail when something waits for a person", () => {
  const sink = () => process.env.MAIL_SINK_DIR!; // this setup's sink, not the end-to-end server's
  const mailTo = (to: string) => mailIn(to, sink());
  const complete = (id: string) => [op(id, "a", { result: "pass" }, 0), op(id, "b", { text: "ok" }, 0)];

  it("tells the lead of a submission that arrives through /api/sync, once, after it is stored", async () => {
    const app = await appHandler();
    const id = await freshJobChecklist();
    const cookie = await signInCookie(app, tech.email);
    const submit = op(id, SUBMIT_KEY, submitValue, 0);
    const body = JSON.stringify({ deviceId: device, cursor: null, ops: [...complete(id), submit] });
    const send = () =>
      app("/api/sync", { method: "POST", cookie, body, headers: { "Content-Type": "application/json" } });
    expect((await send()).status).toBe(200);
    const mail = await waitForMail(lead.email, 10_000, /Waiting for your review/, sink());
    expect(mail.text).toContain(`/checklists/${id}/review`);
    // The tablet's retry of the same batch is answered again, but the lead is not told twice.
    expect((await send()).status).toBe(200);
    await new Promise((r) => setTimeout(r, 300)); // a background send, if one were made, lands by now
    expect(mailTo(lead.email).filter((m) => m.text.includes(id))).toHaveLength(1);
  });

  it("sends the technician the returned checklist with the lead's comments, unless they turned it off", async () => {
    const id = await freshJobChecklist();
    await push(tech, [...complete(id), op(id, SUBMIT_KEY, submitValue, 0)]);
    await addComment(lead, id, "b", "Note the torque you used");
    await returnChecklist(lead, id);
    const returned = mailTo(tech.email).filter((m) => m.text.includes(`/checklists/${id}`));
    expect(returned).toHaveLength(1);
    expect(returned[0]!.subject).toMatch(/Returned to you: Review test/);
    expect(returned[0]!.text).toContain("Note the torque you used");

    await setNotifications(tech.id, [], notificationKinds); // every kind off
    await push(tech, [op(id, SUBMIT_KEY, submitValue, 0)]);
    await returnChecklist(lead, id);
    expect(await stateOf(id)).toBe("returned");
    expect(mailTo(tech.email).filter((m) => m.text.includes(`/checklists/${id}`))).toHaveLength(1);
    await setNotifications(tech.id, [...notificationKinds], notificationKinds);
  });

  it("keeps the return when the mail cannot be sent", async () => {
    // An address the mail library refuses outright: sendMail rejects, the return stands.
    const unreachable = await makeUser(knex, "technician");
    await knex("users").where({ id: unreachable.id }).update({ email: "" });
    jobId = (await makeJob(knex, lead.id, [unreachable.id])).id;
    const [id] = await startChecklists(jobId, [template.key], lead.id);
    await push({ ...unreachable, email: "" }, [...complete(id!), op(id!, SUBMIT_KEY, submitValue, 0)]);
    await expect(returnChecklist(lead, id!)).resolves.toBeUndefined();
    expect(await stateOf(id!)).toBe("returned");
  });

  it("lets each person choose on the account settings page, and refuses a kind that does not exist", async () => {
    const app = await appHandler();
    const person = await makeUser(knex, "lead");
    const cookie = await signInCookie(app, person.email);
    const page = await (await app("/account", { cookie })).text();
    for (const kind of notificationKinds) expect(page).toContain(`value="${kind}"`);
    const save = (body: URLSearchParams) => app("/account", { method: "POST", cookie, body });
    expect((await save(new URLSearchParams([["notify", "checklist-submitted"]]))).status).toBe(200);
    expect(
      (await knex("notification_optouts").where({ user_id: person.id }).orderBy("kind").pluck("kind")).sort(),
    ).toEqual(["checklist-returned", "record-viewed"]);
    expect((await save(new URLSearchParams([["notify", "everything"]]))).status).toBe(400);
    expect(await knex("notification_optouts").where({ user_id: person.id })).toHaveLength(2);
  });

  it("tells the job's lead the first time a surveyor opens the record, and only then", async () => {
    const id = await freshJobChecklist();
    await push(tech, [...complete(id), op(id, SUBMIT_KEY, submitValue, 0)]);
    await countersign(lead, id, TEST_PASSWORD);
    const surveyorEmail = `first-look-${Date.now()}@survey.example`;
    const recordId = (await issueRecord(manager, jobId, [{ email: surveyorEmail, name: "Fenna Sounding" }]))
      .id;
    const surveyor = (await knex("users").where({ email: surveyorEmail }).first())!;
    const actor = { id: surveyor.id, name: surveyor.name, role: "surveyor" };
    await Promise.all([recordOpened(actor, recordId), recordOpened(actor, recordId)]);
    await recordOpened(actor, recordId);
    await recordOpened({ id: manager.id, name: manager.name, role: "manager" }, recordId);
    const told = mailTo(lead.email).filter((m) => m.text.includes(`/records/${recordId}`));
    expect(told).toHaveLength(1);
    expect(told[0]!.subject).toMatch(/opened the record/);
  });
});

/** A job of its own with two checklists of the test template, both submitted complete. */
async function twoSubmitted() {
  const job = (await makeJob(knex, lead.id, [tech.id])).id;
  const [first] = await startChecklists(job, [template.key], lead.id);
  // A second checklist of the same template on the job, as an amendment chain would allow.
  const second = (
    await startChecklists((await makeJob(knex, lead.id, [tech.id])).id, [template.key], lead.id)
  )[0]!;
  await knex("job_checklists").where({ id: second }).update({ job_id: job });
  for (const id of [first!, second])
    await push(tech, [
      op(id, "a", { result: "pass" }, 0),
      op(id, "b", { text: "ok" }, 0),
      op(id, SUBMIT_KEY, submitValue, 0),
    ]);
  return { job, ids: [first!, second] };
}

describe("countersigning several checklists with one password", () => {
  it("signs each with its own digest and lock, and names the one refused while the others are signed", async () => {
    const { job, ids } = await twoSubmitted();
    const third = await freshJobChecklist(); // on another job: never signed from this one
    // A wrong password signs nothing.
    await expect(countersignSeveral(lead, job, ids, "wrong password")).rejects.toMatchObject({
      field: "password",
      message: expect.stringMatching(/password is not right; none was countersigned/),
    });
    expect(await Promise.all(ids.map(stateOf))).toEqual(["submitted", "submitted"]);
    // One of them has a conflict waiting: it is refused with the reason, the other is signed.
    await knex("sync_conflicts").insert({
      checklist_id: ids[1]!,
      item_key: "b",
      op_id: randomUUID(),
      base_rev: 0,
      server_rev: 1,
      server_value: JSON.stringify({ text: "ok" }),
      client_value: JSON.stringify({ text: "other" }),
      user_id: tech.id,
      device_id: "other-device",
      client_at: new Date().toISOString(),
      received_at: new Date(),
    });
    const outcomes = await countersignSeveral(lead, job, [...ids, third], TEST_PASSWORD);
    expect(outcomes[0]).toMatchObject({
      checklistId: ids[0],
      digest: expect.stringMatching(/^[0-9a-f]{64}$/),
    });
    expect(outcomes[1]).toMatchObject({ checklistId: ids[1], refused: expect.stringMatching(/conflict/) });
    expect(outcomes[2]).toMatchObject({
      checklistId: third,
      refused: expect.stringMatching(/not one of this job/),
    });
    expect(await Promise.all([...ids, third].map(stateOf))).toEqual([
      "countersigned",
      "submitted",
      "in-progress",
    ]);
    // Its digest is the one a single countersignature stores: over its own canonical content.
    const content = (await loadRecordChecklist(ids[0]!, knex))!;
    expect((await knex("job_checklists").where({ id: ids[0] }).first())!.digest).toBe(
      sha256Hex(checklistCanonical(content)),
    );
    // The other lead signs none of them.
    await knex("sync_conflicts").where({ checklist_id: ids[1] }).update({ resolved_at: new Date() });
    const stranger = await countersignSeveral(otherLead, job, [ids[1]!], TEST_PASSWORD);
    expect(stranger[0]).toMatchObject({ refused: expect.stringMatching(/Only the job's lead/) });
    expect(await stateOf(ids[1]!)).toBe("submitted");
  });
});

describe("discarding an amendment opened by mistake", () => {
  it("removes it while nothing is entered, and refuses once something is", async () => {
    const id = await freshJobChecklist();
    await push(tech, [
      op(id, "a", { result: "pass" }, 0),
      op(id, "b", { text: "ok" }, 0),
      op(id, SUBMIT_KEY, submitValue, 0),
    ]);
    await countersign(lead, id, TEST_PASSWORD);
    const mistaken = await startAmendment(lead, id);
    await expect(discardAmendment(tech, mistaken)).rejects.toMatchObject({ status: 403 });
    await expect(discardAmendment(lead, id)).rejects.toMatchObject({ status: 409 }); // the original
    await discardAmendment(lead, mistaken);
    expect(await knex("job_checklists").where({ id: mistaken }).first()).toBeUndefined();
    expect(await stateOf(id)).toBe("countersigned");
    expect(await actions(id)).toContain("checklist.amendment-discarded");
    // A new amendment, then an entry in it: it is kept.
    const meant = await startAmendment(lead, id);
    await push(tech, [op(meant, "b", { text: "corrected" }, 1)]);
    await expect(discardAmendment(lead, meant)).rejects.toThrow(/Entries have been made/);
    expect(await knex("job_checklists").where({ id: meant }).first()).toBeDefined();
  });
});

describe("answers to the lead's comments, and each person's queue", () => {
  it("lets the technician answer while the checklist is back with them, and shows each role what waits", async () => {
    const id = await freshJobChecklist();
    await push(tech, [
      op(id, "a", { result: "pass" }, 0),
      op(id, "b", { text: "ok" }, 0),
      op(id, SUBMIT_KEY, submitValue, 0),
    ]);
    expect((await waitingFor(lead)).map((e) => e.to)).toContain(`/checklists/${id}/review`);
    expect((await waitingFor(otherLead)).map((e) => e.to)).not.toContain(`/checklists/${id}/review`);
    expect((await waitingFor(manager)).map((e) => e.kind)).not.toContain("submitted"); // the lead's to review
    await addComment(lead, id, "b", "Which bolts?");
    const [comment] = await knex("checklist_comments").where({ checklist_id: id }).pluck("id");
    // Not while it waits for review.
    await expect(replyToComment(tech, id, comment, "M12")).rejects.toMatchObject({ status: 409 });
    await returnChecklist(lead, id);
    expect(await returnedTo(tech)).toContainEqual(
      expect.objectContaining({ id, comments: ["Which bolts?"] }),
    );
    await expect(replyToComment(otherLead, id, comment, "M12")).rejects.toMatchObject({ status: 403 });
    const reply = await replyToComment(tech, id, comment, "Four M12, 85 N·m");
    expect(reply).toMatchObject({ replyTo: comment, itemKey: "b", text: "Four M12, 85 N·m" });
    await expect(replyToComment(tech, id, reply.id, "an answer to an answer")).rejects.toMatchObject({
      status: 404,
    });
    await push(tech, [op(id, SUBMIT_KEY, submitValue, 0)]);
    const queue = await waitingFor(lead);
    const mine = queue.find((e) => e.to === `/checklists/${id}/review`)!;
    expect(mine.kind).toBe("submitted");
    // Oldest first.
    expect(queue.map((e) => e.since)).toEqual([...queue.map((e) => e.since)].sort());
    await countersign(lead, id, TEST_PASSWORD);
    expect((await waitingFor(lead)).find((e) => e.to === `/jobs/${jobId}#record-title`)?.kind).toBe(
      "record-ready",
    );
    expect((await waitingFor(manager)).map((e) => e.to)).toContain(`/jobs/${jobId}#record-title`);
    const recordId = (
      await issueRecord(manager, jobId, [
        { email: `queue-${Date.now()}@survey.example`, name: "Quill Marlow" },
      ])
    ).id;
    expect((await waitingFor(lead)).map((e) => e.to)).not.toContain(`/jobs/${jobId}#record-title`);
    expect((await issuedRecently()).map((r) => r.id)).toContain(recordId);
  });
});
