import { cpSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { loadTemplateFile } from "~/lib/templates";
import { findChecklist, listJobChecklists, startChecklists } from "~/server/checklists.server";
import { findJob } from "~/server/jobs.server";
import { prefillFromJob } from "~/server/prefill.server";
import { LIBRARY_DIR, seedLibrary, sha256 } from "../../db/seeds/library.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser, publishTemplate } from "../support/fixtures.ts";

const knex = testDb();
afterAll(() => knex.destroy());
beforeAll(() => seedLibrary(knex));

const snapshot = async () =>
  knex("template_versions")
    .orderBy("id")
    .select("id", "template_key", "version", "status", "body_sha256", "published_at");

const starters = [
  "cooling",
  "engine-alignment",
  "exhaust",
  "instruments-and-electrical",
  "propeller-shaft-and-coupling",
  "sea-trial",
];
const fileText = (key: string, version: number) =>
  readFileSync(path.join(LIBRARY_DIR, `${key}.v${version}.json`), "utf8");

describe("the template library in MariaDB", () => {
  it("holds the six starter templates at versions 1 and 2 side by side, and fuel and ventilation, published", async () => {
    // Other test files add templates of their own to the shared database; the starters are there.
    const rows = await knex("template_versions")
      .whereIn("template_key", [...starters, "fuel-system", "ventilation"])
      .whereIn("version", [1, 2])
      .orderBy(["template_key", "version"])
      .select("template_key", "version", "status", "body");
    const loaded = rows.map((r: any) => `${r.template_key}.v${r.version} ${r.status}`);
    expect(loaded).toEqual(
      expect.arrayContaining([
        ...starters.flatMap((k) => [`${k}.v1 published`, `${k}.v2 published`]),
        "fuel-system.v1 published",
        "ventilation.v1 published",
      ]),
    );
    // Each version as its file says, version 1 unchanged by version 2's arrival.
    for (const r of rows.filter((r: any) => r.status === "published")) {
      const file = loadTemplateFile(
        `${r.template_key}.v${r.version}.json`,
        fileText(r.template_key, r.version),
      );
      expect(JSON.parse(r.body), `${r.template_key}.v${r.version}`).toEqual(file);
    }
  });

  it("a job started on version 1 keeps it; a job started now takes version 2", async () => {
    const lead = await makeUser(knex, "lead");
    const job = await makeJob(knex, lead.id);
    // Started before version 2 was published: pinned to version 1, as the jobs already in a yard are.
    const v1 = await knex("template_versions").where({ template_key: "exhaust", version: 1 }).first();
    const id = randomUUID();
    await knex("job_checklists").insert({
      id,
      job_id: job.id,
      template_version_id: v1!.id,
      template_key: "exhaust",
      started_by: lead.id,
    });
    await seedLibrary(knex);
    const pinned = await findChecklist(id);
    expect(pinned).toMatchObject({ version: 1, newerVersion: 2 });
    expect(pinned?.template).toEqual(loadTemplateFile("exhaust.v1.json", fileText("exhaust", 1)));
    // Version 1's "against the lines" stays in its own checklist; the new one measures under way.
    expect(JSON.stringify(pinned?.template)).toMatch(/against the lines/);

    const newer = await makeJob(knex, lead.id);
    const [started] = await startChecklists(newer.id, ["exhaust", "fuel-system", "ventilation"], lead.id);
    const fresh = await findChecklist(started!);
    expect(fresh).toMatchObject({ version: 2, newerVersion: null });
    expect(JSON.stringify(fresh?.template)).not.toMatch(/against the lines/);
    expect((await listJobChecklists(newer.id)).map((c) => `${c.key}.v${c.version}`)).toEqual(
      expect.arrayContaining(["exhaust.v2", "fuel-system.v1", "ventilation.v1"]),
    );
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
    // A key of its own (a copy of the starter alignment), so the starters stay as other files expect.
    const key = `pinning-${Date.now().toString(36)}`;
    const publish = (version: number, title: string) =>
      publishTemplate(knex, { ...JSON.parse(fileText("engine-alignment", 1)), key, version, title });
    await publish(1, "Engine alignment");
    const lead = await makeUser(knex, "lead");
    const job = await makeJob(knex, lead.id);
    const [first] = await startChecklists(job.id, [key], lead.id);
    const pinned = await findChecklist(first!);
    expect(pinned?.version).toBe(1);

    // The manager publishes version 2 of the template (same content, a new title).
    await publish(2, "Engine alignment (rev. 2)");

    const after = await findChecklist(first!);
    expect(after?.version).toBe(1);
    expect(after?.template.title).toBe("Engine alignment");
    expect(after?.newerVersion).toBe(2);
    expect((await listJobChecklists(job.id))[0]).toMatchObject({ version: 1, newerVersion: 2 });

    // A job started now gets version 2.
    const newer = await makeJob(knex, lead.id);
    const [second] = await startChecklists(newer.id, [key], lead.id);
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

describe("items filled from the job's equipment", () => {
  it("are written when the checklists start, in the shaft's own system, and attributed to the job", async () => {
    const lead = await makeUser(knex, "lead");
    const made = await makeJob(knex, lead.id);
    await knex("jobs")
      .where({ id: made.id })
      .update({ shaft_system: "metric", shaft_diameter_mm: 35, shaft_diameter_in: 1.378, system_volts: 24 });
    const job = (await findJob(made.id))!;
    const ids = await startChecklists(made.id, ["propeller-shaft-and-coupling", "sea-trial"], lead.id);
    // Shaft: system, diameter, propeller diameter and pitch; sea trial: rpm band, pitch, gear ratio.
    expect(await prefillFromJob(lead, job, ids)).toBe(8);

    const stored = async (checklistId: string, itemKey: string) => {
      const row = await knex("checklist_responses")
        .where({ checklist_id: checklistId, item_key: itemKey })
        .first();
      return row && (typeof row.value === "string" ? JSON.parse(row.value) : row.value);
    };
    const [shaft, trial] = ids;
    expect(await stored(shaft!, "shaft-system")).toEqual({ option: "metric" });
    expect(await stored(shaft!, "shaft-diameter")).toMatchObject({
      attempts: [{ value: 35, unit: "mm", by: "job-equipment" }],
    });
    expect(await stored(shaft!, "propeller-pitch")).toMatchObject({ attempts: [{ value: 18, unit: "in" }] });
    expect(await stored(trial!, "rated-rpm-low")).toMatchObject({ attempts: [{ value: 2600, unit: "rpm" }] });
    expect(await stored(trial!, "gear-ratio")).toMatchObject({ attempts: [{ value: 2, unit: "1" }] });
    const history = await knex("response_history")
      .whereIn("checklist_id", ids)
      .select("device_id", "user_id");
    expect(history.every((h: any) => h.device_id === "job-equipment" && h.user_id === lead.id)).toBe(true);
  });
});
