import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { expectNoConsoleErrors, launch, open, signIn, tabletContext } from "../support/browser.ts";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser?.close());

describe("starting and reading a job's checklists", () => {
  it("a manager starts the default set; the technician opens one and reads it on a tablet", async () => {
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "manager@kittiwake-slip.example");
    await open(page, "/jobs");
    await page.getByRole("link", { name: "Merrow" }).click();
    await page.getByRole("heading", { name: "Checklists" }).waitFor();
    // A realignment's defaults: engine alignment and the sea trial, ticked already.
    expect(await page.getByLabel(/Engine alignment/).isChecked()).toBe(true);
    expect(await page.getByLabel(/Sea trial/).isChecked()).toBe(true);
    expect(await page.getByLabel(/Exhaust/).isChecked()).toBe(false);
    await page.getByRole("button", { name: "Start the ticked checklists" }).click();
    await expect
      .poll(() => page.getByTestId("job-checklists").innerText())
      // Started now: the newest published version of the starter library.
      .toMatch(/Engine alignment[\s\S]*Version 2[\s\S]*Sea trial/);
    expectNoConsoleErrors(errors);
    await context.close();

    const tech = await tabletContext(browser);
    const techPage = await tech.context.newPage();
    await signIn(techPage, "tech2@kittiwake-slip.example");
    await open(techPage, "/jobs");
    await techPage.getByRole("link", { name: "Merrow" }).click();
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
