import { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parseTemplateText, templateFileName, type Template } from "~/lib/templates";
import { Refusal } from "~/lib/refusal";
import { findChecklist, startChecklists } from "~/server/checklists.server";
import {
  createDraftFrom,
  createTemplate,
  discardDraft,
  importTemplate,
  listLibrary,
  publishDraft,
  readableVersion,
  retireVersion,
  saveDraft,
  templateFileText,
} from "~/server/library.server";
import { latestPublished } from "~/server/templates.server";
import { LIBRARY_DIR, seedLibrary, sha256 } from "../../db/seeds/library.ts";
import { appHandler, signInCookie } from "../support/app.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";

/**
 * The library on MariaDB. These tests work on templates of their own keys (copies of the
 * starter engine-alignment template) so the starter library stays as other test files expect;
 * afterAll retires what they published.
 */
const knex = testDb();
const run = Date.now().toString(36);
const ownKeys: string[] = [];
let manager: { id: number; role: "manager" };
let lead: { id: number; role: "lead" };
let technician: { id: number; role: "technician" };

const starterText = (key: string) => readFileSync(path.join(LIBRARY_DIR, `${key}.v1.json`), "utf8");

/** The starter engine-alignment template under a key of this test run. */
function alignmentCopy(name: string, change: (t: any) => void = () => {}): string {
  const key = `lib-${name}-${run}`;
  ownKeys.push(key);
  const template = JSON.parse(starterText("engine-alignment"));
  template.key = key;
  change(template);
  return JSON.stringify(template, null, 2);
}

async function importPublished(name: string, change?: (t: any) => void): Promise<string> {
  const result = await importTemplate(alignmentCopy(name, change), {}, manager.id);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  await publishDraft(result.key, result.version, manager.id);
  return result.key;
}

const rowOf = async (key: string, version: number) =>
  (await knex("template_versions").where({ template_key: key, version }).first())!;
const bolt = {
  kind: "measure",
  key: "coupling-bolt-torque",
  label: "Coupling bolt torque",
  unit: "lbfFt",
  rule: { nominal: 40, tolerance: 2, unit: "lbfFt" },
};

beforeAll(async () => {
  await seedLibrary(knex);
  manager = (await makeUser(knex, "manager")) as typeof manager;
  lead = (await makeUser(knex, "lead")) as typeof lead;
  technician = (await makeUser(knex, "technician")) as typeof technician;
});

afterAll(async () => {
  if (ownKeys.length) {
    await knex("template_versions").whereIn("template_key", ownKeys).where({ status: "draft" }).delete();
    await knex("template_versions")
      .whereIn("template_key", ownKeys)
      .where({ status: "published" })
      .update({ status: "retired", retired_at: new Date() });
  }
  await knex.destroy();
});

describe("publishing", () => {
  it("freezes the version: a direct UPDATE is refused, and saving it again is refused", async () => {
    const key = await importPublished("freeze");
    const draft = await createDraftFrom(key, 1, manager.id);
    expect(draft.version).toBe(2);
    const v2 = (await readableVersion(manager, key, 2))!.template;
    v2.sections[2].items.push(bolt as any);
    expect(await saveDraft(key, 2, v2, manager.id)).toEqual({ ok: true });
    expect(await publishDraft(key, 2, manager.id)).toEqual({ supersedes: 1 });

    const published = await rowOf(key, 2);
    expect(published.status).toBe("published");
    expect(JSON.parse(published.body).sections[2].items.at(-1)).toMatchObject({
      key: "coupling-bolt-torque",
      rule: { nominal: 40, tolerance: 2 },
    });
    await expect(
      knex("template_versions").where({ id: published.id }).update({ body: "{}" }),
    ).rejects.toThrow(/cannot be changed/);
    await expect(
      knex("template_versions").where({ id: published.id }).update({ title: "Changed behind its back" }),
    ).rejects.toThrow(/cannot be changed/);
    await expect(
      saveDraft(key, 2, { ...v2, title: "Edited after publishing" }, manager.id),
    ).rejects.toMatchObject({ reason: "wrong-state", status: 409 });
    await expect(publishDraft(key, 2, manager.id)).rejects.toThrow(/already published/);
    expect((await rowOf(key, 2)).body_sha256).toBe(published.body_sha256);
    expect(sha256(published.body)).toBe(published.body_sha256);

    // The version before stays published, for the jobs on it; new jobs take the newest.
    expect((await rowOf(key, 1)).status).toBe("published");
    expect((await latestPublished()).find((l) => l.key === key)?.version).toBe(2);
    const actions = await knex("audit_log")
      .where({ user_id: manager.id })
      .whereIn("action", ["template.draft-created", "template.draft-saved", "template.published"])
      .pluck("action");
    expect(actions).toEqual(
      expect.arrayContaining(["template.draft-created", "template.draft-saved", "template.published"]),
    );
  });

  it("saves a draft only when the schema passes, and says where it does not", async () => {
    const result = await importTemplate(alignmentCopy("invalid"), {}, manager.id);
    expect(result).toMatchObject({ ok: true, action: "created", version: 1 });
    const key = (result as { key: string }).key;
    const before = await rowOf(key, 1);
    const draft = (await readableVersion(manager, key, 1))!.template as any;
    draft.sections[2].items[0].rule = { min: 48, max: 24, unit: "h" };
    draft.sections[0].items[1].key = draft.sections[0].items[0].key;
    draft.sections[2].items[2].unit = "psi"; // coupling-diameter, which the angularity calc reads as a length
    const saved = await saveDraft(key, 1, draft, manager.id);
    expect(saved.ok).toBe(false);
    expect(!saved.ok && saved.problems.map((p) => p.path)).toEqual(
      expect.arrayContaining([
        "sections[2].items[0].rule.min",
        "sections[0].items[1].key",
        "sections[2].items[4].inputs.diameter.item",
      ]),
    );
    const after = await rowOf(key, 1);
    expect(after.body_sha256).toBe(before.body_sha256);
    expect(after.body).toBe(before.body);
  });

  it("keeps one draft per template at a time, and a discarded draft is gone", async () => {
    const key = await importPublished("one-draft");
    await createDraftFrom(key, 1, manager.id);
    await expect(createDraftFrom(key, 1, manager.id)).rejects.toThrow(/Version 2 is already a draft/);
    await discardDraft(key, 2, manager.id);
    expect(await rowOf(key, 2)).toBeUndefined();
    await expect(discardDraft(key, 1, manager.id)).rejects.toThrow(/only a draft can be discarded/);
    expect((await rowOf(key, 1)).status).toBe("published");
  });

  it("starts a new template as a valid version-1 draft and refuses a key already taken", async () => {
    const key = `lib-new-${run}`;
    ownKeys.push(key);
    await createTemplate(
      { key, title: "Stern gland", purpose: "Packing or dripless seal fitted and adjusted." },
      manager.id,
    );
    const found = await readableVersion(manager, key, 1);
    expect(found?.status).toBe("draft");
    expect(found?.template.sections[0].items).toHaveLength(1);
    await expect(createTemplate({ key, title: "Again", purpose: "Again." }, manager.id)).rejects.toThrow(
      /already a template with the key/,
    );
  });
});

describe("retiring", () => {
  it("stops new jobs from starting on the version; jobs on it keep it", async () => {
    const key = await importPublished("retire");
    await createDraftFrom(key, 1, manager.id);
    await publishDraft(key, 2, manager.id);

    const onTwo = await makeJob(knex, lead.id);
    const [pinned] = await startChecklists(onTwo.id, [key], lead.id);
    expect((await findChecklist(pinned!))?.version).toBe(2);

    await retireVersion(key, 2, manager.id);
    expect((await rowOf(key, 2)).status).toBe("retired");
    const later = await makeJob(knex, lead.id);
    const [fallback] = await startChecklists(later.id, [key], lead.id);
    expect((await findChecklist(fallback!))?.version).toBe(1);
    expect((await findChecklist(pinned!))?.version).toBe(2);

    await retireVersion(key, 1, manager.id);
    const none = await makeJob(knex, lead.id);
    await expect(startChecklists(none.id, [key], lead.id)).rejects.toThrow(Refusal);
    await expect(retireVersion(key, 1, manager.id)).rejects.toThrow(/Only a published version/);
    await expect(
      knex("template_versions").where({ template_key: key, version: 1 }).update({ status: "published" }),
    ).rejects.toThrow(/cannot be changed/);
  });

  it("the library lists each version with its state and the jobs on it, drafts for managers only", async () => {
    const key = await importPublished("listing");
    const job = await makeJob(knex, lead.id, [technician.id]);
    await startChecklists(job.id, [key], lead.id);
    await createDraftFrom(key, 1, manager.id);

    const forManager = (await listLibrary(manager)).find((t) => t.key === key)!;
    expect(forManager.versions.map((v) => [v.version, v.status, v.jobCount])).toEqual([
      [2, "draft", 0],
      [1, "published", 1],
    ]);
    expect(forManager.newestPublished).toBe(1);
    expect(forManager.versions[1].jobs.map((j) => j.jobId)).toEqual([job.id]);

    const forTechnician = (await listLibrary(technician)).find((t) => t.key === key)!;
    expect(forTechnician.versions.map((v) => v.version)).toEqual([1]);
    expect(forTechnician.versions[0].jobs.map((j) => j.jobId)).toEqual([job.id]);
    expect(await readableVersion(technician, key, 2)).toBeUndefined();
    expect(await readableVersion(lead, key, 2)).toBeUndefined();

    const otherLead = await makeUser(knex, "lead");
    const forOtherLead = (await listLibrary({ id: otherLead.id, role: "lead" })).find((t) => t.key === key)!;
    expect(forOtherLead.versions[0]).toMatchObject({ jobCount: 1, jobs: [] });
  });
});

describe("export and import", () => {
  it("exports a version as the file it came from, byte for byte", async () => {
    const text = starterText("engine-alignment");
    const found = await readableVersion(manager, "engine-alignment", 1);
    expect(templateFileText(found!.template)).toBe(text);
  });

  it("exports every starter version to a file that loads as the same template", async () => {
    for (const key of [
      "cooling",
      "engine-alignment",
      "exhaust",
      "instruments-and-electrical",
      "propeller-shaft-and-coupling",
      "sea-trial",
    ]) {
      const stored = (await readableVersion(manager, key, 1))!.template;
      const back = parseTemplateText(templateFileText(stored));
      expect(back.ok && back.template).toEqual(stored);
    }
  });

  it("round-trips a template through export and import in meaning", async () => {
    const key = await importPublished("round-trip", (t) => t.sections[2].items.push(bolt));
    const exported = templateFileText((await readableVersion(manager, key, 1))!.template);
    // The same file again: nothing to do.
    expect(await importTemplate(exported, {}, manager.id)).toEqual({
      ok: true,
      action: "unchanged",
      key,
      version: 1,
    });
    // The same content as the next version: a draft that says exactly what version 1 says.
    const renumbered = await importTemplate(exported, { renumber: true }, manager.id);
    expect(renumbered).toEqual({ ok: true, action: "created", key, version: 2 });
    const v1 = (await readableVersion(manager, key, 1))!.template;
    const v2 = (await readableVersion(manager, key, 2))!.template;
    expect({ ...v2, version: 1 }).toEqual(v1);
    const file = parseTemplateText(exported);
    expect(file.ok && file.template).toEqual(v1);
    expect(templateFileName(v2)).toBe(`${key}.v2.json`);
  });

  it("never overwrites a published version, and replaces a draft only when asked", async () => {
    const key = await importPublished("overwrite");
    const published = await rowOf(key, 1);
    const changed = JSON.parse(templateFileText(JSON.parse(published.body) as Template));
    changed.title = "Engine alignment (shop edit)";
    const text = JSON.stringify(changed);

    const refused = await importTemplate(text, {}, manager.id);
    expect(refused).toEqual({
      ok: false,
      problems: [
        { path: "version", message: expect.stringMatching(/version 1 of .* is published and never changes/) },
      ],
    });
    expect(await rowOf(key, 1)).toEqual(published);

    expect(await importTemplate(text, { renumber: true }, manager.id)).toMatchObject({
      ok: true,
      action: "created",
      version: 2,
    });
    const second = JSON.stringify({ ...changed, version: 2, title: "Engine alignment (second shop edit)" });
    expect(await importTemplate(second, {}, manager.id)).toMatchObject({
      ok: false,
      problems: [{ path: "version", message: expect.stringMatching(/is a draft already/) }],
    });
    expect(await importTemplate(second, { replaceDraft: true }, manager.id)).toMatchObject({
      ok: true,
      action: "replaced",
      version: 2,
    });
    expect((await rowOf(key, 2)).title).toBe("Engine alignment (second shop edit)");
    expect(await rowOf(key, 1)).toEqual(published);
  });

  it("refuses a file that fails the schema with the path of every problem, and saves nothing", async () => {
    const count = async () => (await knex("template_versions").count({ n: "*" }))[0].n;
    const before = await count();
    const broken = JSON.parse(alignmentCopy("broken"));
    broken.sections[2].items[0].rule = { min: 48, max: 24, unit: "h" };
    broken.sections[1].items[1].key = "beds-sound";
    broken.sections[2].items[4].inputs.diameter.item = "no-such-item";
    broken.sections[0].items[0].label = 42;
    const result = await importTemplate(JSON.stringify(broken), {}, manager.id);
    expect(result.ok).toBe(false);
    // The structure is checked first: the label that is not text stops the cross-checks.
    expect(!result.ok && result.problems).toEqual([
      { path: "sections[0].items[0].label", message: "expected a string" },
    ]);
    broken.sections[0].items[0].label = "Beds sound";
    const again = await importTemplate(JSON.stringify(broken), {}, manager.id);
    expect(!again.ok && again.problems.map((p) => p.path)).toEqual(
      expect.arrayContaining([
        "sections[1].items[1].key",
        "sections[2].items[0].rule.min",
        "sections[2].items[4].inputs.diameter.item",
      ]),
    );
    expect(await importTemplate("{ not json", {}, manager.id)).toMatchObject({
      ok: false,
      problems: [{ path: "", message: expect.stringMatching(/not valid JSON/) }],
    });
    expect(await count()).toBe(before);
  });
});

describe("over HTTP, by role", () => {
  let app: Awaited<ReturnType<typeof appHandler>>;
  const cookies: Record<string, string> = {};
  let draftKey: string;

  beforeAll(async () => {
    app = await appHandler();
    for (const role of ["technician", "lead", "manager", "surveyor"] as const)
      cookies[role] = await signInCookie(app, (await makeUser(knex, role)).email);
    draftKey = await importPublished("http");
    await createDraftFrom(draftKey, 1, manager.id);
  });

  const who = ["anonymous", "technician", "lead", "manager", "surveyor"] as const;
  const pages: [string | (() => string), number[]][] = [
    ["/library", [302, 200, 200, 200, 403]],
    ["/library/import", [302, 403, 403, 200, 403]],
    ["/library/engine-alignment/1", [302, 200, 200, 200, 403]],
    [() => `/library/${draftKey}/2`, [302, 404, 404, 200, 403]],
    [() => `/library/${draftKey}/2/edit`, [302, 403, 403, 200, 403]],
    [() => `/library/${draftKey}/compare?from=1&to=2`, [302, 404, 404, 200, 403]],
    ["/library/engine-alignment/99", [302, 404, 404, 404, 403]],
    ["/api/templates/engine-alignment/1/export", [401, 200, 200, 200, 403]],
    [() => `/api/templates/${draftKey}/2/export`, [401, 404, 404, 200, 403]],
  ];
  for (const [url, statuses] of pages) {
    it(`GET ${typeof url === "string" ? url : "a draft's page"} answers each role as it should`, async () => {
      const target = typeof url === "string" ? url : url();
      const got = await Promise.all(who.map(async (w) => (await app(target, { cookie: cookies[w] })).status));
      expect(got).toEqual(statuses);
    });
  }

  it("serves the export as a file named after the key and version", async () => {
    const response = await app("/api/templates/engine-alignment/1/export", { cookie: cookies.technician });
    expect(response.headers.get("Content-Disposition")).toBe(
      'attachment; filename="engine-alignment.v1.json"',
    );
    expect(await response.text()).toBe(starterText("engine-alignment"));
  });

  it("creates a new template from the library page, or says at the field what is wrong", async () => {
    const key = `lib-form-${run}`;
    ownKeys.push(key);
    const post = (fields: Record<string, string>) =>
      app("/library?index", {
        method: "POST",
        body: new URLSearchParams({ intent: "create-template", ...fields }),
        cookie: cookies.manager,
      });
    const bad = await post({ key: "Stern Gland", title: "Stern gland", purpose: "" });
    expect(bad.status).toBe(400);
    expect(await bad.text()).toMatch(/expected a key in lower-case words joined by hyphens/);
    const good = await post({
      key,
      title: "Stern gland",
      purpose: "Packing or a dripless seal fitted and adjusted.",
    });
    expect(good.status).toBe(302);
    expect(good.headers.get("Location")).toBe(`/library/${key}/1/edit`);
    expect((await rowOf(key, 1)).status).toBe("draft");
    const technician = await app("/library?index", {
      method: "POST",
      body: new URLSearchParams({ intent: "create-template", key: `${key}-x`, title: "x", purpose: "x" }),
      cookie: cookies.technician,
    });
    expect(technician.status).toBe(403);
  });

  it("imports a pasted file as a draft, or lists its problems by path", async () => {
    const post = (text: string, who = "manager") => {
      const form = new FormData();
      form.set("text", text);
      return app("/library/import", { method: "POST", body: form, cookie: cookies[who] });
    };
    const broken = JSON.parse(alignmentCopy("http-import"));
    broken.sections[2].items[0].rule = { min: 48, max: 24, unit: "h" };
    const refused = await post(JSON.stringify(broken));
    expect(refused.status).toBe(400);
    expect(await refused.text()).toContain("sections[2].items[0].rule.min");
    expect(await rowOf(broken.key, 1)).toBeUndefined();
    broken.sections[2].items[0].rule = { min: 24, unit: "h" };
    expect((await post(JSON.stringify(broken), "lead")).status).toBe(403);
    const accepted = await post(JSON.stringify(broken));
    expect(accepted.status).toBe(302);
    expect(accepted.headers.get("Location")).toBe(`/library/${broken.key}/1`);
    expect((await rowOf(broken.key, 1)).status).toBe("draft");
  });

  it("lets only a manager publish", async () => {
    const publish = (w: string) =>
      app(`/library/${draftKey}/2`, {
        method: "POST",
        body: new URLSearchParams({ intent: "publish" }),
        cookie: cookies[w],
      });
    for (const w of ["technician", "lead", "surveyor"]) expect((await publish(w)).status).toBe(403);
    expect((await rowOf(draftKey, 2)).status).toBe("draft");
    const response = await publish("manager");
    expect(response.status).toBe(302);
    expect((await rowOf(draftKey, 2)).status).toBe("published");
  });
});
