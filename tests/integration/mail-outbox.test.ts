import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { SUBMIT_KEY, submitValue } from "~/lib/sync/submission";
import { startChecklists } from "~/server/checklists.server";
import { deliver, deliverDue, mailWaiting, queueMail } from "~/server/mail-outbox.server";
import { issueRecord, verifyRecord } from "~/server/records.server";
import { countersign } from "~/server/review.server";
import { sync } from "~/server/sync.server";
import { seedLibrary } from "../../db/seeds/library.ts";
import { appHandler, signInCookie } from "../support/app.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser, publishTemplate, TEST_PASSWORD } from "../support/fixtures.ts";
import { mailTo as mailIn, waitForMail } from "../support/mail.ts";
import { freePort, startServer } from "../support/server-process.ts";
import { op } from "../support/sync.ts";
import { startMailSink } from "../../scripts/mail-sink.ts";

// The mail server, as the app's own code reaches it: the real one (this setup's SMTP sink), or
// away, failing as nodemailer does when nothing listens on its port.
const smtp = vi.hoisted(() => ({ away: false }));
vi.mock("~/server/mail.server", async (importOriginal) => {
  const real = await importOriginal<typeof import("~/server/mail.server")>();
  return {
    sendMail: async (message: Parameters<typeof real.sendMail>[0]) => {
      if (smtp.away)
        throw Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:2525"), { code: "ESOCKET" });
      return real.sendMail(message);
    },
  };
});

const knex = testDb();
afterAll(() => knex.destroy());
const sink = () => process.env.MAIL_SINK_DIR!;
const mailTo = (to: string) => mailIn(to, sink());
const row = async (id: number) => (await knex("mail_outbox").where({ id }).first())!;
/** As if the wait before the next attempt had passed. */
const makeDue = (id: number) =>
  knex("mail_outbox")
    .where({ id })
    .update({ next_attempt_at: new Date(Date.now() - 1000) });
let counter = 0;
const address = (what: string) => `${what}-${Date.now()}-${++counter}@survey.example`;

const template = {
  key: "outbox-test",
  version: 1,
  title: "Outbox test",
  purpose: "Integration tests of the mail outbox.",
  sections: [{ key: "s", title: "S", items: [{ kind: "check", key: "a", label: "A", required: true }] }],
};

let tech: Awaited<ReturnType<typeof makeUser>>,
  lead: Awaited<ReturnType<typeof makeUser>>,
  manager: Awaited<ReturnType<typeof makeUser>>;

beforeAll(async () => {
  await seedLibrary(knex);
  await publishTemplate(knex, template);
  [tech, lead, manager] = [
    await makeUser(knex, "technician"),
    await makeUser(knex, "lead"),
    await makeUser(knex, "manager"),
  ];
});

/** A job whose one checklist is submitted complete and countersigned: ready for its record. */
async function readyJob() {
  const jobId = (await makeJob(knex, lead.id, [tech.id])).id;
  const [id] = await startChecklists(jobId, [template.key], lead.id);
  const ops = [op(id!, "a", { result: "pass" }, 0), op(id!, SUBMIT_KEY, submitValue, 0)];
  await sync(tech, { deviceId: "outbox-device", cursor: null, ops });
  await countersign(lead, id!, TEST_PASSWORD);
  return jobId;
}

describe("the mail outbox", () => {
  it("issues a record while the mail server is away, and sends its e-mail once when the server answers", async () => {
    const jobId = await readyJob();
    const surveyor = address("away");
    smtp.away = true;
    const issued = await issueRecord(manager, jobId, [{ email: surveyor, name: "Sela Away" }]);
    smtp.away = false;
    expect(issued.mailWaiting).toBe(true);
    expect((await verifyRecord(issued.id))!.genuine).toBe(true);
    const [kept] = await knex("mail_outbox").where({ recipient: surveyor });
    expect(kept).toMatchObject({ kind: "record", attempts: 1, sent_at: null, failed_at: null });
    expect(kept.last_error).toMatch(/ECONNREFUSED/);
    expect(kept.body).toContain(`/records/${issued.id}`);
    expect(new Date(kept.next_attempt_at).getTime()).toBeGreaterThan(Date.now());
    expect(mailTo(surveyor)).toHaveLength(0);

    await deliverDue(); // not its turn yet
    expect((await row(kept.id)).attempts).toBe(1);
    await makeDue(kept.id);
    await deliverDue();
    const mail = await waitForMail(surveyor, 10_000, /Commissioning record/, sink());
    expect(mail.text).toContain(`/records/${issued.id}`);
    expect(mail.text).toMatch(/invitation\//); // a new surveyor: the invitation travels with it
    expect(await row(kept.id)).toMatchObject({ attempts: 2, next_attempt_at: null, last_error: null });
    await deliverDue();
    await new Promise((r) => setTimeout(r, 200));
    expect(mailTo(surveyor)).toHaveLength(1);
  });

  it("sends each message once when several instances deliver at the same moment", async () => {
    const to = address("race");
    const ids = await queueMail([
      { kind: "test", to, subject: "Once only", text: "One message, three senders." },
    ]);
    await Promise.all([deliver(ids), deliver(ids), deliverDue()]);
    await waitForMail(to, 10_000, /Once only/, sink());
    await new Promise((r) => setTimeout(r, 300));
    expect(mailTo(to)).toHaveLength(1);
    expect(await row(ids[0]!)).toMatchObject({ attempts: 1, next_attempt_at: null });
  });

  it("waits twice as long after each failure, up to an hour", async () => {
    const [id] = await queueMail([{ kind: "test", to: address("backoff"), subject: "Later", text: "…" }]);
    const away = async () => {
      throw Object.assign(new Error("connect ETIMEDOUT"), { code: "ETIMEDOUT" });
    };
    const waits: number[] = [];
    for (let i = 0; i < 9; i++) {
      await makeDue(id!);
      const before = Date.now();
      await deliver([id!], away);
      waits.push(Math.round((new Date((await row(id!)).next_attempt_at).getTime() - before) / 1000));
    }
    // MAIL_RETRY_S is 30 by default: 30 s, 60 s, 120 s… and never more than 3,600 s.
    expect(waits.slice(0, 4)).toEqual([30, 60, 120, 240]);
    expect(Math.max(...waits)).toBe(3600);
    expect((await row(id!)).attempts).toBe(9);
  });

  it("gives up a message the mail server refuses outright, and says so on the People page", async () => {
    const to = address("refused");
    const [id] = await queueMail([{ kind: "test", to, subject: "Refused", text: "…" }]);
    const refuses = async () => {
      throw Object.assign(new Error("550 5.1.1 no such mailbox"), { responseCode: 550 });
    };
    expect(await deliver([id!], refuses)).toEqual({ sent: 0 });
    const given = await row(id!);
    expect(given.next_attempt_at).toBeNull();
    expect(given.failed_at).not.toBeNull();
    expect(given.last_error).toMatch(/550/);
    await deliverDue();
    expect((await row(id!)).attempts).toBe(1);

    // One more that waits, so both lines show.
    const [waiting] = await queueMail([{ kind: "test", to: address("waits"), subject: "Waits", text: "…" }]);
    await deliver([waiting!], async () => {
      throw Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:2525"), { code: "ESOCKET" });
    });
    const summary = await mailWaiting();
    expect(summary.waiting).toBeGreaterThanOrEqual(1);
    expect(summary.failedThisWeek).toBeGreaterThanOrEqual(1);
    const app = await appHandler();
    const page = await (await app("/people", { cookie: await signInCookie(app, manager.email) })).text();
    expect(page).toContain('data-testid="mail-waiting"');
    expect(page).toMatch(/e-mails? waits? for the mail server/);
    expect(page).toMatch(/could not be sent this week/);
  });

  it("lets the production server keep an invitation while no mail server answers, and send it once one does", async () => {
    const smtpPort = await freePort();
    const server = await startServer({ SMTP_URL: `smtp://127.0.0.1:${smtpPort}`, MAIL_RETRY_S: "1" });
    let sink: Awaited<ReturnType<typeof startMailSink>> | undefined;
    try {
      const signIn = await fetch(`${server.url}/login`, {
        method: "POST",
        headers: { Origin: server.url },
        body: new URLSearchParams({ email: manager.email, password: TEST_PASSWORD }),
        redirect: "manual",
      });
      const cookie = signIn.headers.get("Set-Cookie")!.split(";")[0]!;
      const to = address("invited");
      const invite = await fetch(`${server.url}/people`, {
        method: "POST",
        headers: { Origin: server.url, Cookie: cookie },
        body: new URLSearchParams({ intent: "invite", email: to, name: "Ivo Later", role: "surveyor" }),
      });
      expect(invite.status).toBe(200);
      expect(await invite.text()).toMatch(/Invitation to [^ ]+ kept/);
      expect(await knex("users").where({ email: to }).first()).toBeDefined();

      const directory = mkdtempSync(path.join(tmpdir(), "sternpost-late-smtp-"));
      sink = await startMailSink({ port: smtpPort, directory });
      const mail = await waitForMail(to, 20_000, /invited to Sternpost/, directory);
      expect(mail.text).toMatch(/\/invitation\//);
      await new Promise((r) => setTimeout(r, 2500)); // a second send, if one were made, lands by now
      expect(mailIn(to, directory)).toHaveLength(1);
      const kept = (await knex("mail_outbox").where({ recipient: to }).first())!;
      expect(kept.attempts).toBeGreaterThanOrEqual(2);
      expect(kept.sent_at).not.toBeNull();
    } finally {
      await sink?.close();
      await server.stop();
    }
  });
});
