import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { connect } from "../../db/connect.ts";
import {
  expectNoConsoleErrors,
  goOfflineReady,
  hydrated,
  launch,
  signIn,
  tabletContext,
} from "../support/browser.ts";
import { makeCrewedJob, TEST_PASSWORD } from "../support/fixtures.ts";

let browser: Browser;
const knex = connect(process.env.E2E_DATABASE_URL!);
/** This file's own hull, crew and checklists: nothing here depends on the demo's entries. */
let crew: Awaited<ReturnType<typeof makeCrewedJob>>;
const checklistKeys: Record<string, string> = {
  "Engine alignment": "engine-alignment",
  Cooling: "cooling",
  "Sea trial": "sea-trial",
};
beforeAll(async () => {
  browser = await launch();
  crew = await makeCrewedJob(knex, "Skua of Garron", Object.values(checklistKeys));
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

const parse = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v);

async function openChecklist(page: Page, title: string) {
  await page.getByRole("link", { name: "Today" }).click();
  await page
    .getByRole("link", { name: new RegExp(`^${title}`) })
    .first()
    .click();
  await page.getByRole("heading", { level: 1, name: title }).waitFor();
}

const item = (page: Page, key: string) => page.locator(`[data-item="${key}"]`);

const checklistId = (title: string) => crew.checklists[checklistKeys[title]!]!;

async function response(checklistTitle: string, itemKey: string) {
  const row = await knex("checklist_responses")
    .where({ checklist_id: checklistId(checklistTitle), item_key: itemKey })
    .first("value", "rev");
  return row ? { value: parse(row.value) as any, rev: row.rev as number } : undefined;
}

describe("working with no connection", () => {
  let context: BrowserContext;
  it("fills every kind of item offline, survives a reload, and everything reaches the server once", async () => {
    const tablet = await tabletContext(browser);
    context = tablet.context;
    const page = await context.newPage();
    await signIn(page, crew.technician.email, TEST_PASSWORD);
    await goOfflineReady(page);

    await context.setOffline(true);
    await openChecklist(page, "Engine alignment");
    await page
      .getByRole("navigation", { name: "Sections" })
      .getByRole("button", { name: /Final alignment afloat/ })
      .click();

    // measure: two attempts, both kept
    const afloat = item(page, "time-afloat");
    await afloat.getByLabel("Reading").fill("twenty");
    await afloat.getByRole("button", { name: "Record reading" }).click();
    await afloat
      .getByRole("alert")
      .getByText(/as a number/)
      .waitFor();
    await afloat.getByLabel("Reading").fill("20");
    await afloat.getByRole("button", { name: "Record reading" }).click();
    await afloat.locator('[data-verdict="out-of-range"]').waitFor();
    await afloat.getByLabel("Reading").fill("26");
    await afloat.getByRole("button", { name: "Record a new attempt" }).click();
    await afloat.locator('[data-verdict="ok"]').waitFor();
    expect(await afloat.getByTestId("attempts").locator("tr").count()).toBe(2);

    // check
    await item(page, "usual-trim").getByRole("button", { name: "✓ Pass" }).click();
    await item(page, "usual-trim").locator('[data-verdict="ok"]').waitFor();

    // measure feeding a calc, readings grid, and the calc computed live
    await item(page, "coupling-diameter").getByLabel("Reading").fill("6");
    await item(page, "coupling-diameter").getByRole("button", { name: "Record reading" }).click();
    const gaps = item(page, "face-gaps");
    await gaps.getByLabel(/Top/).fill("0.012");
    await gaps.getByLabel(/Bottom/).fill("0.010");
    await gaps.getByLabel(/Port/).fill("0.011");
    await gaps.getByRole("button", { name: "Record readings" }).click();
    await gaps
      .getByRole("alert")
      .getByText(/Fill every cell/)
      .waitFor();
    await gaps.getByLabel(/Starboard/).fill("0.011");
    await gaps.getByRole("button", { name: "Record readings" }).click();
    await gaps.locator('[data-verdict="ok"]').waitFor();
    // 0.002 in of gap difference over a 6 in face is 0.00033 in/in: inside 0.001 in per inch (common practice).
    await item(page, "face-angularity").locator('[data-verdict="ok"]').waitFor();

    // choice and initials on another checklist
    await openChecklist(page, "Cooling");
    await page
      .getByRole("navigation", { name: "Sections" })
      .getByRole("button", { name: /Raw-water pump flow/ })
      .click();
    await item(page, "flow-against-maker")
      .getByRole("button", { name: "At or above the maker's figure" })
      .click();
    await page
      .getByRole("navigation", { name: "Sections" })
      .getByRole("button", { name: /Temperatures under load/ })
      .click();
    await item(page, "cooling-done").getByLabel("Your initials").fill("ta");
    await item(page, "cooling-done").getByRole("button", { name: "Confirm" }).click();
    await item(page, "cooling-done")
      .getByText(/Confirmed by TA/)
      .first()
      .waitFor();

    // text on a third
    await openChecklist(page, "Sea trial");
    const conditions = item(page, "trial-conditions");
    await conditions.getByRole("textbox").fill("Wind SW 10 kn, slight sea, half tanks, four aboard");
    await conditions.getByRole("button", { name: "Save" }).click();
    await conditions.locator('[data-verdict="ok"]').waitFor();

    expect(await page.getByTestId("connection").innerText()).toMatch(/Offline/);
    await expect.poll(() => page.getByTestId("waiting").innerText()).toMatch(/^\d+ waiting to send/);
    expect(await response("Engine alignment", "time-afloat")).toBeUndefined();

    // Close the tab and open the app again, still with no connection.
    await page.close();
    const again = await context.newPage();
    const reloaded = await again.goto("/");
    expect(reloaded?.fromServiceWorker()).toBe(true);
    await hydrated(again);
    await openChecklist(again, "Engine alignment");
    await again
      .getByRole("navigation", { name: "Sections" })
      .getByRole("button", { name: /Final alignment afloat/ })
      .click();
    expect(await item(again, "time-afloat").getByTestId("attempts").locator("tr").count()).toBe(2);
    await item(again, "face-angularity").locator('[data-verdict="ok"]').waitFor();

    // The connection returns: everything reaches the server, once.
    await context.setOffline(false);
    await expect
      .poll(() => again.getByTestId("waiting").innerText(), { timeout: 20_000 })
      .toBe("All entries sent");
    const afloatOnServer = await response("Engine alignment", "time-afloat");
    expect(afloatOnServer?.value.attempts.map((a: any) => a.value)).toEqual([20, 26]);
    expect(afloatOnServer?.rev).toBe(2);
    expect((await response("Engine alignment", "face-gaps"))?.value.attempts[0].cells).toEqual([
      [0.012, 0.01, 0.011, 0.011],
    ]);
    expect((await response("Engine alignment", "usual-trim"))?.value).toEqual({ result: "pass" });
    expect((await response("Cooling", "flow-against-maker"))?.value.option).toBe("at-or-above");
    expect((await response("Cooling", "cooling-done"))?.value.initials).toBe("TA");
    expect((await response("Sea trial", "trial-conditions"))?.value.text).toMatch(/Wind SW/);
    const history = await knex("response_history").where({
      checklist_id: checklistId("Engine alignment"),
      item_key: "time-afloat",
    });
    expect(history).toHaveLength(2);
    expectNoConsoleErrors(tablet.errors.filter((e) => !/ERR_INTERNET_DISCONNECTED/.test(e)));
    await context.close();
  });

  it("keeps both values when two people change the same entry apart, and lets one decide", async () => {
    const techTablet = await tabletContext(browser);
    const leadTablet = await tabletContext(browser);
    const tech = await techTablet.context.newPage();
    const lead = await leadTablet.context.newPage();
    await signIn(tech, crew.technician.email, TEST_PASSWORD);
    await signIn(lead, crew.lead.email, TEST_PASSWORD);
    await goOfflineReady(tech);
    await goOfflineReady(lead);
    await techTablet.context.setOffline(true);
    await leadTablet.context.setOffline(true);

    for (const [page, button] of [
      [tech, "✓ Pass"],
      [lead, "✕ Fail"],
    ] as const) {
      await openChecklist(page, "Cooling");
      await item(page, "seacock").getByRole("button", { name: button }).click();
      await item(page, "seacock").getByTestId("pending").waitFor();
    }

    await techTablet.context.setOffline(false);
    await expect
      .poll(() => tech.getByTestId("waiting").innerText(), { timeout: 20_000 })
      .toBe("All entries sent");
    await leadTablet.context.setOffline(false);
    await expect
      .poll(() => lead.getByTestId("waiting").innerText(), { timeout: 20_000 })
      .toBe("All entries sent");
    await lead.getByTestId("conflict-badge").click();
    const conflict = lead.getByTestId("conflict").first();
    await conflict.waitFor();
    expect(await conflict.getByTestId("server-value").innerText()).toBe("Pass");
    expect(await conflict.getByTestId("sent-value").innerText()).toBe("Fail");
    // Nothing was overwritten: the server kept the first value.
    expect((await response("Cooling", "seacock"))?.value).toEqual({ result: "pass" });

    await conflict.getByRole("button", { name: "Use the value that was sent" }).click();
    await lead.getByTestId("nothing-to-decide").waitFor();
    await expect
      .poll(async () => (await response("Cooling", "seacock"))?.value, { timeout: 20_000 })
      .toEqual({ result: "fail" });
    const row = (await knex("sync_conflicts")
      .where({ checklist_id: checklistId("Cooling"), item_key: "seacock" })
      .first())!;
    expect(row.resolved_at).not.toBeNull();
    await techTablet.context.close();
    await leadTablet.context.close();
  });
});
