import type { Knex } from "knex";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { connect } from "../../db/connect.ts";
import { expectNoConsoleErrors, hydrated, launch, open, signIn, tabletContext } from "../support/browser.ts";
import { makeCrewedJob, makeJob, TEST_PASSWORD } from "../support/fixtures.ts";

let browser: Browser;
let knex: Knex;
/** This file's own job on version 1 of engine alignment, which must keep it when version 2 is published. */
const HULL = "Razorbill of Keem";
let crew: Awaited<ReturnType<typeof makeCrewedJob>>;
beforeAll(async () => {
  browser = await launch();
  knex = connect(process.env.E2E_DATABASE_URL!);
  crew = await makeCrewedJob(knex, HULL, ["engine-alignment"]);
});
afterAll(async () => {
  // Other files expect the starter library (versions 1 and 2): whatever this test published is retired again.
  await knex?.("template_versions").where({ template_key: "engine-alignment", status: "draft" }).delete();
  await knex?.("template_versions")
    .where({ template_key: "engine-alignment", status: "published" })
    .where("version", ">", 2)
    .update({ status: "retired", retired_at: new Date() });
  await knex?.destroy();
  await browser?.close();
});

const itemKeys = (page: Page, section: string) =>
  page
    .locator(`[data-section-key="${section}"] [data-item-key]`)
    .evaluateAll((els) => els.map((e) => (e as HTMLElement).dataset.itemKey));

async function jobChecklists(page: Page, jobId: number) {
  await open(page, `/jobs/${jobId}`);
  return page.getByTestId("job-checklists").innerText();
}

describe("keeping the template library current", () => {
  it("a manager makes version 3 of engine alignment with a toleranced measurement, reviews the difference and publishes it", async () => {
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "manager@kittiwake-slip.example");

    await open(page, "/library");
    const alignment = page.locator('[data-template="engine-alignment"]');
    await alignment.getByRole("button", { name: "New draft from version 2" }).click();
    await page.waitForURL(/\/library\/engine-alignment\/3\/edit$/);
    await hydrated(page);

    // A measurement at the end of the final alignment; the cursor lands in its label.
    const final = page.locator('[data-section-key="final-alignment"]');
    await final.getByLabel("Kind of new item").selectOption("measure");
    await final.getByRole("button", { name: "+ Add item" }).click();
    await page.keyboard.type("Mount stud torque");
    const item = final.locator('[data-item-key="mount-stud-torque"]');
    await item.getByLabel("Unit", { exact: true }).selectOption("lbfFt");
    await item
      .getByLabel("How (hint)")
      .fill("Torque the mount stud lock nuts in two stages to the mount maker's figure.");
    await item.getByLabel("Reference").fill("Mount maker's installation instructions");

    // Limits the wrong way round are refused at the field, and nothing is saved.
    await item.getByLabel("Judge the reading against limits").check();
    await item.getByLabel("Minimum").fill("50");
    await item.getByLabel("Maximum").fill("45");
    await expect
      .poll(() => item.locator('[data-path$="rule.min"]').innerText())
      .toMatch(/the minimum \(50\) is above the maximum \(45\)/);
    await page.getByRole("button", { name: "Save draft" }).click();
    expect(await page.getByTestId("save-status").innerText()).toMatch(/1 problem to fix/);
    const stored = (await knex("template_versions")
      .where({ template_key: "engine-alignment", version: 3 })
      .first())!;
    expect(
      JSON.parse(stored.body).sections[2].items.some((i: { key: string }) => i.key === "mount-stud-torque"),
    ).toBe(false);

    // 40 ± 2 lbf·ft instead.
    await item.getByLabel("Minimum").fill("");
    await item.getByLabel("Maximum").fill("");
    await item.getByLabel("Nominal").fill("40");
    await item.getByLabel("Tolerance (±)").fill("2");
    await expect.poll(() => item.innerText()).toMatch(/Technicians will read: Accept: 40 ± 2 lbf·ft/);

    // Reordered by keyboard, then by dragging its handle onto the adjuster's threads per inch.
    await item.getByRole("button", { name: "Move “Mount stud torque” up" }).click();
    expect((await itemKeys(page, "final-alignment")).slice(-2)).toEqual([
      "mount-stud-torque",
      "shaft-free-after",
    ]);
    await item.getByRole("button", { name: /Mount stud torque/, expanded: true }).click();
    const handle = item.getByRole("button", { name: /drag/ });
    const target = final.locator('[data-item-key="adjuster-tpi"]');
    await target.scrollIntoViewIfNeeded();
    const from = (await handle.boundingBox())!;
    const to = (await target.boundingBox())!;
    await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
    await page.mouse.down();
    await page.mouse.move(to.x + to.width / 2, to.y + 6, { steps: 8 });
    await page.mouse.up();
    expect((await itemKeys(page, "final-alignment")).slice(-7)).toEqual([
      "adjuster-thread-kind",
      "mount-stud-torque",
      "adjuster-tpi",
      "adjuster-pitch",
      "mount-moves",
      "flexible-coupling-tolerance",
      "shaft-free-after",
    ]);

    await page.getByRole("button", { name: "Save and review" }).click();
    await page.waitForURL(/\/library\/engine-alignment\/3$/);
    await hydrated(page);

    // The version is shown on the fill screen's own items (issue 16): a reading tried there gets
    // the verdict its new rule gives, and nothing is kept.
    const tried = page.getByTestId("checklist-preview").locator('[data-item="mount-stud-torque"]');
    await tried.getByLabel("Reading").fill("45");
    await tried.getByRole("button", { name: "Record reading" }).click();
    await tried.locator('[data-verdict="out-of-range"]').waitFor();
    await tried.getByLabel("Reading").fill("41");
    await tried.getByRole("button", { name: "Record a new attempt" }).click();
    await tried.locator('[data-verdict="ok"]').waitFor();

    // The difference against version 2, item by item.
    const review = page.getByRole("region", { name: "Before you publish" });
    expect(await review.getByTestId("diff-summary").innerText()).toMatch(
      /Version 2 → version 3: 1 added · 0 removed · 0 moved · 0 changed/,
    );
    const added = review.locator('[data-change="added"][data-item="mount-stud-torque"]');
    expect(await added.innerText()).toMatch(
      /Added[\s\S]*Mount stud torque[\s\S]*In Final alignment afloat, place 16[\s\S]*Accept: 40 ± 2 lbf·ft/,
    );

    await review.getByRole("button", { name: "Publish version 3…" }).click();
    // Jobs on version 2 are named only where there are some (the demo's jobs are on version 1).
    expect(await review.innerText()).toMatch(
      /Version 3 will never change again, and new jobs will start from it\.( The \d+ jobs? on version 2 keeps? version 2\.)?/,
    );
    await review.getByRole("button", { name: "Publish version 3", exact: true }).click();
    await expect
      .poll(() => page.locator('[data-status="published"]').first().innerText())
      .toMatch(/new jobs start here/);
    await expect(
      knex("template_versions")
        .where({ template_key: "engine-alignment", version: 3 })
        .update({ title: "Edited" }),
    ).rejects.toThrow(/cannot be changed/);

    // A new job gets version 3; this file's job started on version 1 keeps it.
    const job = await makeJob(knex, crew.lead.id);
    await open(page, `/jobs/${job.id}`);
    await page.getByRole("button", { name: "Start the ticked checklists" }).click();
    await expect
      .poll(() => page.getByTestId("job-checklists").innerText())
      .toMatch(/Engine alignment\s*Version 3/);
    const checklist = await knex("job_checklists as c")
      .join("template_versions as t", "t.id", "c.template_version_id")
      .where({ "c.job_id": job.id, "c.template_key": "engine-alignment" })
      .first("t.version");
    expect(checklist.version).toBe(3);

    expect(await jobChecklists(page, crew.job.id)).toMatch(
      /Engine alignment\s*Version 1\s*Version 3 published since/,
    );

    await open(page, "/library");
    expect(await alignment.getByTestId("newest-published").innerText()).toBe(
      "New jobs start from version 3.",
    );
    expect(await alignment.locator('tr[data-version="1"]').innerText()).toMatch(
      new RegExp(`Published · superseded[\\s\\S]*\\d+ jobs?[\\s\\S]*${HULL}`),
    );

    // Retiring version 3 sends new jobs back to version 2 (and leaves the demo library as it was).
    await open(page, "/library/engine-alignment/3");
    await page.getByRole("button", { name: "Retire version 3…" }).click();
    expect(await page.getByRole("group", { name: "Retire version 3…" }).innerText()).toMatch(
      /New jobs will start from version 2 again/,
    );
    await page.getByRole("button", { name: "Retire version 3", exact: true }).click();
    await expect.poll(() => page.locator('[data-status="retired"]').count()).toBe(1);
    await open(page, "/library");
    expect(await alignment.getByTestId("newest-published").innerText()).toBe(
      "New jobs start from version 2.",
    );

    expectNoConsoleErrors(errors);
    await context.close();
  });

  it("a technician reads published versions but no drafts and no editing", async () => {
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, crew.technician.email, TEST_PASSWORD);
    await open(page, "/library");
    expect(await page.getByRole("button", { name: /New draft/ }).count()).toBe(0);
    expect(await page.getByRole("link", { name: "Import a template file" }).count()).toBe(0);
    await page.locator('[data-template="engine-alignment"]').getByRole("link", { name: "Version 1" }).click();
    await page.getByRole("heading", { level: 1, name: "Engine alignment" }).waitFor();
    expect(await page.getByRole("button", { name: /Retire|Publish/ }).count()).toBe(0);
    const response = await page.goto("/library/engine-alignment/1/edit");
    expect(response?.status()).toBe(403);
    expectNoConsoleErrors(errors);
    await context.close();
  });
});
