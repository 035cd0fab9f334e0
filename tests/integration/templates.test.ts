import { cpSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { findChecklist, listJobChecklists, startChecklists } from "~/server/checklists.server";
import { latestPublished } from "~/server/templates.server";
import { LIBRARY_DIR, seedLibrary, sha256 } from "../../db/seeds/library.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";

const knex = testDb();
afterAll(() => knex.destroy());
beforeAll(() => seedLibrary(knex));

const snapshot = async () =>
  knex("template_versions")
    .orderBy("id")
    .select("id", "template_key", "version", "status", "body_sha256", "published_at");

describe("the template library in MariaDB", () => {
  it("holds the six starter templates, published", async () => {
    // Other test files add templates of their own to the shared database; the six are there, published.
    const keys = (await latestPublished()).map((t) => t.key);
    expect(keys).toEqual(
      expect.arrayContaining([
        "cooling",
        "engine-alignment",
        "exhaust",
        "instruments-and-electrical",
        "propeller-shaft-and-coupling",
        "sea-trial",
      ]),
    );
    const files = await knex("template_versions")
      .whereIn("template_key", [
        "cooling",
        "engine-alignment",
        "exhaust",
        "instruments-and-electrical",
        "propeller-shaft-and-coupling",
        "sea-trial",
      ])
      .where({ version: 1 });
    expect(files.every((f: any) => f.status === "published")).toBe(true);
  });

  it("seeding twice changes nothing", async () => {
    const before = await snapshot();
    expect(await seedLibrary(knex)).toBe("template library up to date");
    expect(await snapshot()).toEqual(before);
  });

  it("refuses a direct UPDATE or DELETE of a published version", async () => {
    const row = (await knex("template_versions").where({ status: "published" }).first())!;
    await expect(knex("template_versions").where({ id: row.id }).update({ body: "{}" })).rejects.toThrow(
      /cannot be changed/,
    );
    await expect(
      knex("template_versions").where({ id: row.id }).update({ title: "Changed" }),
    ).rejects.toThrow(/cannot be changed/);
    await expect(knex("template_versions").where({ id: row.id }).update({ status: "draft" })).rejects.toThrow(
      /cannot be changed/,
    );
    await expect(knex("template_versions").where({ id: row.id }).delete()).rejects.toThrow(
      /cannot be deleted/,
    );
    expect((await knex("template_versions").where({ id: row.id }).first())!.body_sha256).toBe(
      sha256(row.body),
    );
  });

  it("lets a draft change and a published version retire, but never come back", async () => {
    const [id] = await knex("template_versions").insert({
      template_key: "scratch",
      version: 1,
      status: "draft",
      title: "Scratch",
      body: "{}",
      body_sha256: sha256("{}"),
    });
    await knex("template_versions")
      .where({ id })
      .update({ body: '{"a":1}', body_sha256: sha256('{"a":1}') });
    await knex("template_versions").where({ id }).update({ status: "published", published_at: new Date() });
    await knex("template_versions").where({ id }).update({ status: "retired", retired_at: new Date() });
    await expect(knex("template_versions").where({ id }).update({ status: "published" })).rejects.toThrow(
      /cannot be changed/,
    );
  });

  it("stops the seed with the bad file's path and field, loading nothing", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "library-"));
    cpSync(LIBRARY_DIR, dir, { recursive: true });
    const file = path.join(dir, "cooling.v1.json");
    const broken = JSON.parse(readFileSync(file, "utf8"));
    broken.key = "cooling-copy";
    broken.sections[0].items[0].label = 42;
    writeFileSync(path.join(dir, "cooling-copy.v1.json"), JSON.stringify(broken));
    const before = await snapshot();
    await expect(seedLibrary(knex, dir)).rejects.toThrow(
      /cooling-copy\.v1\.json: sections\[0\]\.items\[0\]\.label/,
    );
    expect(await snapshot()).toEqual(before);
  });

  it("refuses a file that changed under an existing published version", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "library-"));
    cpSync(LIBRARY_DIR, dir, { recursive: true });
    const file = path.join(dir, "exhaust.v1.json");
    const changed = JSON.parse(readFileSync(file, "utf8"));
    changed.title = "Exhaust (edited)";
    writeFileSync(file, JSON.stringify(changed));
    await expect(seedLibrary(knex, dir)).rejects.toThrow(/save the change as version 2/);
  });
});

describe("a job's checklists", () => {
  it("are pinned to the version published when they started", async () => {
    const lead = await makeUser(knex, "lead");
    const job = await makeJob(knex, lead.id);
    const [first] = await startChecklists(job.id, ["engine-alignment"], lead.id);
    const pinned = await findChecklist(first!);
    expect(pinned?.version).toBe(1);

    // The manager publishes version 2 of the template (same content, a new title).
    const v1 = (await knex("template_versions")
      .where({ template_key: "engine-alignment", version: 1 })
      .first())!;
    const body = JSON.stringify({ ...JSON.parse(v1.body), version: 2, title: "Engine alignment (rev. 2)" });
    await knex("template_versions").insert({
      template_key: "engine-alignment",
      version: 2,
      status: "published",
      title: "Engine alignment (rev. 2)",
      body,
      body_sha256: sha256(body),
      published_at: new Date(),
    });

    const after = await findChecklist(first!);
    expect(after?.version).toBe(1);
    expect(after?.template.title).toBe("Engine alignment");
    expect(after?.newerVersion).toBe(2);
    expect((await listJobChecklists(job.id))[0]).toMatchObject({ version: 1, newerVersion: 2 });

    // A job started now gets version 2.
    const newer = await makeJob(knex, lead.id);
    const [second] = await startChecklists(newer.id, ["engine-alignment"], lead.id);
    expect((await findChecklist(second!))?.version).toBe(2);
  });

  it("start once per template and write the audit log", async () => {
    const lead = await makeUser(knex, "lead");
    const job = await makeJob(knex, lead.id);
    expect(await startChecklists(job.id, ["exhaust", "cooling"], lead.id)).toHaveLength(2);
    expect(await startChecklists(job.id, ["exhaust", "sea-trial"], lead.id)).toHaveLength(1);
    expect((await listJobChecklists(job.id)).map((c) => c.key)).toEqual(["exhaust", "cooling", "sea-trial"]);
    expect(
      await knex("audit_log").where({ action: "checklist.started", user_id: lead.id }).count({ n: "*" }),
    ).toEqual([{ n: 3 }]);
    await expect(startChecklists(job.id, ["no-such-template"], lead.id)).rejects.toThrow(
      /No published template/,
    );
  });
});
