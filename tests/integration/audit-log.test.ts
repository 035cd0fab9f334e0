import { randomUUID } from "node:crypto";
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { auditFiltersSchema } from "~/lib/validation/audit";
import { audit } from "~/server/audit.server";
import { listAuditEntries } from "~/server/audit-log.server";
import { appHandler, signInCookie } from "../support/app.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";

const knex = testDb();
afterAll(() => knex.destroy());

// Other files write to the same log: every check is narrowed to this file's people, things and devices.
const run = randomUUID().slice(0, 8);
const bowTablet = `tablet-bow-${run}`;
const sternTablet = `tablet-stern-${run}`;
const checklistId = randomUUID();
const recordId = `rec-${run}`;
let manager: Awaited<ReturnType<typeof makeUser>>,
  lead: typeof manager,
  tech: typeof manager,
  surveyor: typeof manager;
let job: { id: number; vesselId: number };
const ids: Record<string, number> = {};

const page = (params: Record<string, string | number>, pageSize?: number) =>
  listAuditEntries(
    auditFiltersSchema.parse(Object.fromEntries(Object.entries(params).map(([k, v]) => [k, String(v)]))),
    pageSize,
  );

async function write(name: string, entry: Parameters<typeof audit>[0]) {
  await audit(entry);
  ids[name] = Number(
    (
      await knex("audit_log")
        .max({ id: "id" })
        .where({ action: entry.action, entity_id: String(entry.entityId) })
    )[0]!.id,
  );
}

beforeAll(async () => {
  [manager, lead, tech, surveyor] = [
    await makeUser(knex, "manager"),
    await makeUser(knex, "lead"),
    await makeUser(knex, "technician"),
    await makeUser(knex, "surveyor"),
  ];
  job = await makeJob(knex, lead.id, [tech.id]);
  await write("started", {
    userId: lead.id,
    deviceId: bowTablet,
    action: "checklist.started",
    entity: "checklist",
    entityId: checklistId,
    detail: { jobId: job.id, key: "cooling", version: 1 },
  });
  await write("submitted1", {
    userId: tech.id,
    deviceId: sternTablet,
    action: "checklist.submitted",
    entity: "checklist",
    entityId: checklistId,
  });
  await write("returned", {
    userId: lead.id,
    deviceId: bowTablet,
    action: "checklist.returned",
    entity: "checklist",
    entityId: checklistId,
    detail: { comments: 2 },
  });
  await write("submitted2", {
    userId: tech.id,
    deviceId: sternTablet,
    action: "checklist.submitted",
    entity: "checklist",
    entityId: checklistId,
  });
  await write("countersigned", {
    userId: lead.id,
    deviceId: bowTablet,
    action: "checklist.countersigned",
    entity: "checklist",
    entityId: checklistId,
    detail: { digest: "9f2c" },
  });
  await write("issued", {
    userId: manager.id,
    action: "record.issued",
    entity: "record",
    entityId: recordId,
    detail: { to: ["surveyor@test.example"], sent: true },
  });
  await write("viewed", {
    userId: surveyor.id,
    action: "record.viewed",
    entity: "record",
    entityId: recordId,
  });
  await write("jobUpdated", { userId: manager.id, action: "job.updated", entity: "job", entityId: job.id });
  await write("vesselUpdated", {
    userId: manager.id,
    action: "vessel.updated",
    entity: "vessel",
    entityId: job.vesselId,
  });
});

/** The rendered table alone: the filter's action list names every action too. */
const tableOf = (html: string) =>
  html.slice(html.indexOf('data-testid="audit-table"'), html.indexOf("</table>"));
const shown = (result: { entries: { id: number }[] }) => result.entries.map((e) => e.id);

describe("the audit log query", () => {
  it("gives an entry with its person, device, link, a sentence and what the sentence does not say", async () => {
    const [started] = (
      await page({ action: "checklist.started", entity: "checklist", entityId: checklistId })
    ).entries;
    expect(started).toMatchObject({
      id: ids.started,
      who: { id: lead.id, name: lead.name, role: "lead" },
      deviceId: bowTablet,
      href: `/checklists/${checklistId}`,
      // The sentence says what the checklist is; the job, key and version are not repeated.
      sentence: `${lead.name} started Checklist ${checklistId}`,
      detail: null,
    });
    expect(Date.parse(started!.at)).not.toBeNaN();
    const [jobEntry] = (await page({ entity: "job", entityId: job.id })).entries;
    expect(jobEntry).toMatchObject({ href: `/jobs/${job.id}`, detail: null });
    expect((await page({ entity: "vessel", entityId: job.vesselId })).entries[0]?.href).toBe(
      `/vessels/${job.vesselId}`,
    );
    const [issued] = (await page({ action: "record.issued", entity: "record", entityId: recordId })).entries;
    expect(issued).toMatchObject({
      href: null,
      deviceId: null,
      detail: "to: surveyor@test.example · sent: yes",
    });
  });

  it("filters by one action and by a family of actions, newest first", async () => {
    expect(
      shown(await page({ action: "checklist.submitted", entity: "checklist", entityId: checklistId })),
    ).toEqual([ids.submitted2, ids.submitted1]);
    expect(shown(await page({ action: "checklist.", person: lead.id }))).toEqual([
      ids.countersigned,
      ids.returned,
      ids.started,
    ]);
    // An underscore in the family is a letter, not LIKE's any-character wildcard.
    expect(shown(await page({ action: "checklis_.", person: lead.id }))).toEqual([]);
  });

  it("filters by person, by thing and by device", async () => {
    expect(shown(await page({ person: tech.id }))).toEqual([ids.submitted2, ids.submitted1]);
    expect(shown(await page({ person: manager.id }))).toEqual([
      ids.vesselUpdated,
      ids.jobUpdated,
      ids.issued,
    ]);
    expect(shown(await page({ entity: "record", entityId: recordId }))).toEqual([ids.viewed, ids.issued]);
    expect(shown(await page({ entity: "checklist", entityId: recordId }))).toEqual([]);
    expect(shown(await page({ device: bowTablet }))).toEqual([ids.countersigned, ids.returned, ids.started]);
    expect(shown(await page({ device: sternTablet, person: lead.id }))).toEqual([]);
  });

  it("filters by whole days in the reader's time zone", async () => {
    const at = {
      started: "2026-03-01T12:00:00.000Z",
      returned: "2026-03-02T03:30:00.000Z",
      countersigned: "2026-03-03T12:00:00.000Z",
    };
    for (const [name, when] of Object.entries(at))
      await knex("audit_log")
        .where({ id: ids[name] })
        .update({ at: new Date(when) });
    expect(shown(await page({ device: bowTablet, from: "2026-03-02", to: "2026-03-02", tz: "UTC" }))).toEqual(
      [ids.returned],
    );
    // From memory: US Eastern time is UTC-5 in early March (daylight time starts on the second
    // Sunday, 2026-03-08), so 03:30 UTC on the 2nd is 22:30 on the 1st in New York.
    expect(
      shown(await page({ device: bowTablet, from: "2026-03-01", to: "2026-03-01", tz: "America/New_York" })),
    ).toEqual([ids.returned, ids.started]);
    expect(shown(await page({ device: bowTablet, from: "2026-03-02", tz: "UTC" }))).toEqual([
      ids.countersigned,
      ids.returned,
    ]);
    expect(shown(await page({ device: bowTablet, to: "2026-03-01", tz: "UTC" }))).toEqual([ids.started]);
  });

  it("pages from the newest to the oldest without losing or repeating an entry", async () => {
    const device = `tablet-paging-${run}`;
    const written: number[] = [];
    for (let i = 0; i < 7; i++) {
      await audit({
        userId: tech.id,
        deviceId: device,
        action: "job.updated",
        entity: "job",
        entityId: job.id,
        detail: { step: i },
      });
      written.unshift(
        Number((await knex("audit_log").max({ id: "id" }).where({ device_id: device }))[0]!.id),
      );
    }
    const seen: number[] = [];
    let before: number | null = null;
    const sizes: number[] = [];
    do {
      const result: Awaited<ReturnType<typeof page>> = await page(
        before === null ? { device } : { device, before },
        3,
      );
      seen.push(...shown(result));
      sizes.push(result.entries.length);
      before = result.olderThan;
    } while (before !== null);
    expect(sizes).toEqual([3, 3, 1]);
    expect(seen).toEqual(written);
  });
});

describe("the audit log in names (issue 16)", () => {
  it("names people, vessels, jobs and template versions, and says what happened in a sentence", async () => {
    // Reproduced with: a deactivation read "Person 8" and "intent: deactivate · user id: 8".
    const target = await makeUser(knex, "technician", { name: `Tomás Reyes ${run}` });
    await write("deactivated", {
      userId: manager.id,
      action: "user.deactivate",
      entity: "user",
      entityId: target.id,
      detail: { intent: "deactivate", userId: target.id },
    });
    await write("promoted", {
      userId: manager.id,
      action: "user.role",
      entity: "user",
      entityId: target.id,
      detail: { intent: "role", userId: target.id, role: "lead" },
    });
    const [promoted, deactivated] = (await page({ entity: "user", entityId: target.id })).entries;
    expect(deactivated).toMatchObject({
      what: target.name,
      sentence: `${manager.name} deactivated ${target.name}`,
      detail: null,
    });
    expect(promoted).toMatchObject({ sentence: `${manager.name} made ${target.name} Lead`, detail: null });

    // The yard's settings are one row: named, not numbered ("Yard settings 1").
    await write("yard settings saved", {
      userId: manager.id,
      action: "yard.updated",
      entity: "yard",
      entityId: 1,
      detail: { name: "Kittiwake Slip", timeZone: "Europe/Dublin" },
    });
    expect((await page({ entity: "yard", entityId: 1 })).entries[0]!.what).toBe("Yard settings");

    const vessel = (await knex("vessels").where({ id: job.vesselId }).first())!;
    const [jobEntry] = (await page({ entity: "job", entityId: job.id })).entries;
    expect(jobEntry!.what).toContain(vessel.name);
    expect(jobEntry!.sentence).toBe(`${jobEntry!.who!.name} updated ${jobEntry!.what}`);
    expect((await page({ entity: "vessel", entityId: job.vesselId })).entries[0]!.sentence).toBe(
      `${manager.name} updated the vessel ${vessel.name}`,
    );

    const [versionId] = await knex("template_versions").insert({
      template_key: `stern-gland-${run}`,
      version: 4,
      status: "draft",
      title: "Stern gland",
      body: "{}",
      body_sha256: "0".repeat(64),
    });
    const version = { id: versionId!, template_key: `stern-gland-${run}`, version: 4, title: "Stern gland" };
    await write("published", {
      userId: manager.id,
      action: "template.published",
      entity: "template_version",
      entityId: version.id,
      detail: { key: version.template_key, version: version.version, supersedes: 3 },
    });
    const [published] = (
      await page({ action: "template.published", entity: "template_version", entityId: version.id })
    ).entries;
    expect(published!.sentence).toBe(
      `${manager.name} published ${version.title}, version ${version.version}, replacing version 3`,
    );
    for (const entry of [deactivated, promoted, jobEntry, published])
      expect(`${entry!.sentence} ${entry!.detail ?? ""}`).not.toMatch(
        /Person \d|Job \d|Template version \d|user id|intent/,
      );
  });

  it("folds repeated views of one record by one person into one entry", async () => {
    const viewed = `rec-views-${run}`;
    for (let i = 0; i < 5; i++)
      await audit({ userId: surveyor.id, action: "record.viewed", entity: "record", entityId: viewed });
    await audit({ userId: manager.id, action: "record.viewed", entity: "record", entityId: viewed });
    const { entries } = await page({ action: "record.viewed", entity: "record", entityId: viewed });
    expect(entries.map((e) => [e.who?.id, e.views?.count ?? 1])).toEqual([
      [manager.id, 1],
      [surveyor.id, 5],
    ]);
    expect(Date.parse(entries[1]!.views!.firstAt)).toBeLessThanOrEqual(Date.parse(entries[1]!.at));
  });
});

describe("the audit log page", () => {
  let app: Awaited<ReturnType<typeof appHandler>>;
  const cookies: Record<string, string> = {};
  // React reports bad markup (a list where one value belongs) through console.error.
  const consoleError = vi.spyOn(console, "error");
  afterEach(() => {
    const calls = [...consoleError.mock.calls];
    consoleError.mockClear();
    expect(calls).toEqual([]);
  });
  beforeAll(async () => {
    app = await appHandler();
    for (const person of [manager, lead, tech, surveyor])
      cookies[person.role] = await signInCookie(app, person.email);
  });

  it("answers the manager only", async () => {
    const anonymous = await app("/audit");
    expect(anonymous.status).toBe(302);
    expect(anonymous.headers.get("Location")).toMatch(/^\/login/);
    for (const role of ["lead", "technician", "surveyor"])
      expect((await app("/audit", { cookie: cookies[role] })).status, role).toBe(403);
    const response = await app(`/audit?entity=checklist&entityId=${checklistId}`, {
      cookie: cookies.manager,
    });
    expect(response.status).toBe(200);
    const html = tableOf(await response.text());
    expect(html).toContain("Countersigned a checklist");
    expect(html).toContain("Returned a checklist for fixes");
    expect(html).toContain(`href="/checklists/${checklistId}"`);
    expect(html).toContain(bowTablet);
    expect(html).not.toContain("Issued a commissioning record");
  });

  it("shows a bad filter's message at its field instead of failing", async () => {
    const response = await app("/audit?person=Ana&from=2026-13-01&action=DROP%20TABLE&before=x", {
      cookie: cookies.manager,
    });
    expect(response.status).toBe(200);
    const html = await response.text();
    expect(html).toContain("Choose a person from the list.");
    expect(html).toContain("Enter the first day as a date (YYYY-MM-DD).");
    expect(html).toContain("Choose one action or one family of actions.");
    expect(html).toContain("Correct the marked filter to see the log.");
    expect(html).not.toContain('data-testid="audit-table"');
    const orphanId = await app("/audit?entityId=12", { cookie: cookies.manager });
    expect(orphanId.status).toBe(200);
    expect(await orphanId.text()).toContain("Choose what kind of thing the id belongs to.");
    const repeated = await app(`/audit?person=${lead.id}&person=${tech.id}`, { cookie: cookies.manager });
    expect(repeated.status).toBe(200);
    expect(tableOf(await repeated.text())).toContain(sternTablet);
  });

  it("links to the older entries past the first hundred", async () => {
    const device = `tablet-hundred-${run}`;
    for (let i = 0; i < 101; i++)
      await audit({
        userId: manager.id,
        deviceId: device,
        action: "vessel.updated",
        entity: "vessel",
        entityId: job.vesselId,
      });
    const first = await (await app(`/audit?device=${device}`, { cookie: cookies.manager })).text();
    const older = first.match(/href="\/audit\?device=[^"]*&amp;before=(\d+)"/);
    expect(older, "an Older entries link").not.toBeNull();
    const second = await app(`/audit?device=${device}&before=${older![1]}`, { cookie: cookies.manager });
    const html = await second.text();
    expect(tableOf(html).match(/Updated a vessel/g)).toHaveLength(1);
    expect(html).toContain("Newest entries");
    expect(html).not.toContain("Older entries");
  });
});
