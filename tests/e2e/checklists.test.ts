import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { connect } from "../../db/connect.ts";
import { expectNoConsoleErrors, launch, open, signIn, tabletContext } from "../support/browser.ts";
import { makeCrewedJob, TEST_PASSWORD } from "../support/fixtures.ts";

let browser: Browser;
const knex = connect(process.env.E2E_DATABASE_URL!);
/** This file's own realignment, with no checklists started yet. */
const HULL = "Shag of Inishbofin";
let crew: Awaited<ReturnType<typeof makeCrewedJob>>;
beforeAll(async () => {
  browser = await launch();
  crew = await makeCrewedJob(knex, HULL, []);
  await knex("jobs").where({ id: crew.job.id }).update({ scope: "realignment" });
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

describe("starting and reading a job's checklists", () => {
  it("a manager starts the default set; the technician opens one and reads it on a tablet", async () => {
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "manager@kittiwake-slip.example");
    await open(page, "/jobs");
    await page.getByRole("link", { name: HULL }).click();
    await page.getByRole("heading", { name: "Checklists" }).waitFor();
    // A realignment's defaults: engine alignment and the sea trial, ticked already.
    expect(await page.getByLabel(/Engine alignment/).isChecked()).toBe(true);
    expect(await page.getByLabel(/Sea trial/).isChecked()).toBe(true);
    expect(await page.getByLabel(/Exhaust/).isChecked()).toBe(false);
    // Offered in the order the work is done: the shaft line first, the sea trial last (templates
    // the shop added come after these).
    const offered = await page
      .locator('input[name="templates"]')
      .evaluateAll((all) => all.map((i) => (i as HTMLInputElement).value));
    expect(offered.slice(0, 8)).toEqual([
      "propeller-shaft-and-coupling",
      "engine-alignment",
      "exhaust",
      "cooling",
      "fuel-system",
      "instruments-and-electrical",
      "ventilation",
      "sea-trial",
    ]);
    await page.getByRole("button", { name: "Start the ticked checklists" }).click();
    await expect
      .poll(() => page.getByTestId("job-checklists").innerText())
      // Started now: the newest published version of the starter library.
      .toMatch(/Engine alignment[\s\S]*Version 2[\s\S]*Sea trial/);
    expectNoConsoleErrors(errors);
    await context.close();

    const tech = await tabletContext(browser);
    const techPage = await tech.context.newPage();
    await signIn(techPage, crew.technician.email, TEST_PASSWORD);
    await open(techPage, "/jobs");
    await techPage.getByRole("link", { name: HULL }).click();
    await techPage.getByRole("link", { name: "Engine alignment" }).click();
    await techPage.getByRole("heading", { level: 1, name: "Engine alignment" }).waitFor();
    await techPage
      .getByRole("navigation", { name: "Sections" })
      .getByRole("button", { name: /Final alignment afloat/ })
      .click();
    const faceGaps = techPage.locator('[data-item="face-gaps"]');
    expect(await faceGaps.getByRole("note", { name: "Caution" }).innerText()).toMatch(/Isolate the engine/);
    expect(await faceGaps.innerText()).toMatch(/Accept:/);
    expect(
      await techPage.getByRole("navigation", { name: "Sections" }).getByRole("button").count(),
    ).toBeGreaterThan(2);
    // Readable on a tablet: nothing wider than the screen.
    expect(await techPage.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(820);
    expectNoConsoleErrors(tech.errors);
    await tech.context.close();
  });
});
