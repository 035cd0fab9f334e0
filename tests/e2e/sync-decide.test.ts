import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { connect } from "../../db/connect.ts";
import { launch, signIn, tabletContext } from "../support/browser.ts";

/**
 * Issue 13 §3 as a new user meets it: the same entry changed by the lead and by the technician
 * while apart, on an item far into the checklist. The To-decide page says where and who; "Enter a
 * new value" opens the checklist at that item; entering the value there decides the conflict.
 */
let browser: Browser;
const knex = connect(process.env.E2E_DATABASE_URL!);
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

async function goOfflineReady(page: Page) {
  await page.evaluate(() => navigator.serviceWorker.ready.then(() => true));
  await page.getByRole("button", { name: /Make my jobs available offline|Refresh the offline copy/ }).click();
  await page
    .getByTestId("offline-readiness")
    .getByText(/Ready offline/)
    .waitFor();
}

/** The demo's open cooling checklist on "Tern of Helvick" (the same one on both tablets). */
async function coolingId(): Promise<string> {
  const row = await knex("job_checklists as c")
    .join("jobs as j", "j.id", "c.job_id")
    .join("vessels as v", "v.id", "j.vessel_id")
    .join("template_versions as t", "t.id", "c.template_version_id")
    .where({ "v.name": "Tern of Helvick", "t.title": "Cooling" })
    .whereIn("c.state", ["in-progress", "returned"])
    .first("c.id");
  return row.id;
}

async function openCooling(page: Page, id: string) {
  await page.goto(`/checklists/${id}`);
  await page.getByRole("heading", { level: 1, name: "Cooling" }).waitFor();
}

const ITEM = "no-cooling-leaks"; // in the last section of the cooling checklist
const item = (page: Page) => page.locator(`[data-item="${ITEM}"]`);

async function goToItemSection(page: Page) {
  await page.getByRole("navigation", { name: "Sections" }).getByRole("button").last().click();
  await item(page).waitFor();
}

describe("a conflict on an item far into a checklist", () => {
  it("names where and who, opens the checklist at the item, and is decided by a new entry there", async () => {
    const id = await coolingId();
    const techTablet = await tabletContext(browser);
    const leadTablet = await tabletContext(browser);
    const tech = await techTablet.context.newPage();
    const lead = await leadTablet.context.newPage();
    await signIn(tech, "tech@kittiwake-slip.example");
    await signIn(lead, "lead@kittiwake-slip.example");
    await goOfflineReady(tech);
    await goOfflineReady(lead);
    await techTablet.context.setOffline(true);
    await leadTablet.context.setOffline(true);
    for (const [page, button] of [
      [tech, "✓ Pass"],
      [lead, "✕ Fail"],
    ] as const) {
      await openCooling(page, id);
      await goToItemSection(page);
      await item(page).getByRole("button", { name: button }).click();
      await item(page).getByTestId("pending").waitFor();
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
    // This item's conflict (other tests may have left others on the lead's list).
    const conflict = lead.getByTestId("conflict").filter({ has: lead.locator(`a[href$="#item-${ITEM}"]`) });
    await conflict.waitFor();
    expect(await conflict.getByTestId("conflict-place").innerText()).toMatch(
      /Tern of Helvick · job \d+ .*· Cooling/,
    );
    expect(await conflict.getByTestId("server-set-by").innerText()).toMatch(/On the server now, set by \S+/);
    expect(await conflict.innerText()).not.toMatch(/revision/i);

    await conflict.getByRole("link", { name: "Enter a new value" }).click();
    await lead.getByRole("heading", { level: 1, name: "Cooling" }).waitFor();
    // The item is on screen, not section 1.
    await item(lead).waitFor();
    await item(lead).getByRole("button", { name: "✓ Pass" }).click();
    await expect
      .poll(
        async () =>
          (await knex("sync_conflicts").where({ checklist_id: id, item_key: ITEM }).whereNull("resolved_at"))
            .length,
        { timeout: 20_000 },
      )
      .toBe(0);
    // And the tablet no longer lists it.
    await lead.goto("/sync");
    await lead.getByRole("heading", { level: 1, name: "To decide" }).waitFor();
    expect(await conflict.count()).toBe(0);
    await techTablet.context.close();
    await leadTablet.context.close();
  });
});
