import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { connect } from "../../db/connect.ts";
import {
  expectNoConsoleErrors,
  goOfflineReady,
  launch,
  open,
  signIn,
  tabletContext,
} from "../support/browser.ts";
import { makeCrewedJob, TEST_PASSWORD } from "../support/fixtures.ts";

/**
 * Issue 15 §1: entering readings fast, gloves on — keyboard-only grid entry (a gauge that types
 * its reading and Enter), start from the last set, the ± toggle, a set struck through with a
 * reason, TIR per straightening attempt, notes whatever the verdict, reopening where left, the
 * connection readable and sticky, the submit panel's compact summary. On a 768×1024 touch tablet.
 */
let browser: Browser;
const knex = connect(process.env.E2E_DATABASE_URL!);
const HULL = "Fulmar of Rathlin";
let crew: Awaited<ReturnType<typeof makeCrewedJob>>;
beforeAll(async () => {
  browser = await launch();
  crew = await makeCrewedJob(knex, HULL, ["propeller-shaft-and-coupling"]);
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

const parse = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v);
async function stored(itemKey: string) {
  const row = await knex("checklist_responses")
    .where({ checklist_id: crew.checklists["propeller-shaft-and-coupling"], item_key: itemKey })
    .first("value");
  return row ? (parse(row.value) as any) : undefined;
}
const item = (page: Page, key: string) => page.locator(`[data-item="${key}"]`);
const sections = (page: Page) => page.getByRole("navigation", { name: "Sections" });
const focusedCell = (page: Page) =>
  page.evaluate(() => (document.activeElement as HTMLElement | null)?.dataset.cell ?? null);

// Dial readings in inches at five stations × four marks (0°, 90°, 180°, 270°), as a gauge types them.
// TIR at a station is the highest reading less the lowest (a dial indicator's total indicated
// runout; common practice, and Machinery's Handbook's definition of TIR). Worst station here:
// 0.004 - (-0.002) = 0.006 in, over the template's 0.003 in limit.
const FIRST_SET = [
  ["0", "0.001", "0.002", "0.001"],
  ["0", "0.002", "0.003", "0.001"],
  ["0", "0.003", "0.004", "-0.002"],
  ["0", "0.002", "0.002", "0.001"],
  ["0", "0.001", "0.001", "0"],
];

describe("fast entry at the shaft", () => {
  it("fills a runout grid from the keyboard alone, starts from the last set, strikes a set through, and reopens where left", async () => {
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await page.setViewportSize({ width: 768, height: 1024 });
    await signIn(page, crew.technician.email, TEST_PASSWORD);
    await open(page, `/checklists/${crew.checklists["propeller-shaft-and-coupling"]}`);
    await page.getByRole("heading", { level: 1 }).waitFor();
    await sections(page)
      .getByRole("button", { name: /Shaft runout/ })
      .tap();
    const grid = item(page, "runout-readings");

    // The keypad says what Enter does, and is numeric.
    const cells = grid.locator("input[data-cell]");
    expect(await cells.count()).toBe(20);
    expect(await cells.first().getAttribute("enterkeyhint")).toBe("next");
    expect(await cells.last().getAttribute("enterkeyhint")).toBe("done");
    expect(await cells.first().getAttribute("inputmode")).toBe("decimal");

    // Keyboard only: reading + Enter lands in the cell and moves on; Enter on the last records the set.
    await cells.first().focus();
    for (const row of FIRST_SET)
      for (const reading of row) {
        await page.keyboard.type(reading);
        await page.keyboard.press("Enter");
      }
    await expect.poll(async () => (await stored("runout-readings"))?.attempts?.length).toBe(1);
    const first = (await stored("runout-readings")).attempts[0];
    expect(first.cells).toEqual(FIRST_SET.map((row) => row.map(Number)));
    // The next set starts empty with the focus in its first cell, ready for the gauge.
    await expect.poll(() => focusedCell(page)).toBe("0");
    expect(await cells.first().inputValue()).toBe("");
    await item(page, "runout-result").locator('[data-verdict="out-of-range"]').waitFor();

    // Start from the last set, then change only what moved: the gauge types over the first cell
    // (its text is selected), and the ± toggle flips the sign of another with a tap.
    // Once the set has been sent (its answer re-renders the item).
    await expect.poll(() => grid.getByTestId("pending").count()).toBe(0);
    await grid.getByRole("button", { name: "Start from the last set" }).tap();
    await expect.poll(() => cells.nth(10).inputValue()).toBe("0.004");
    await expect.poll(() => focusedCell(page)).toBe("0");
    await page.keyboard.type("0.0005");
    await page.keyboard.press("Enter");
    await expect.poll(() => focusedCell(page)).toBe("1");
    // Station 3 straightened: 0.004 → 0.001 at 180°, and -0.002 → 0.002 at 270° by the ± toggle.
    await cells.nth(10).fill("0.001");
    await grid.getByRole("button", { name: /Change the sign of Mid-length, 270°/ }).tap();
    expect(await cells.nth(11).inputValue()).toBe("0.002");
    await grid.getByRole("button", { name: /Change the sign of Mid-length, 270°/ }).tap();
    expect(await cells.nth(11).inputValue()).toBe("-0.002");
    await grid.getByRole("button", { name: /Change the sign of Mid-length, 270°/ }).tap();
    // Typing "-" still works.
    await cells.nth(19).fill("-0.001");
    await grid.getByRole("button", { name: "Record a new set of readings" }).tap();
    await expect.poll(async () => (await stored("runout-readings"))?.attempts?.length).toBe(2);
    const second = (await stored("runout-readings")).attempts[1];
    const expected = FIRST_SET.map((row) => row.map(Number));
    expected[0]![0] = 0.0005;
    expected[2]![2] = 0.001;
    expected[2]![3] = 0.002;
    expected[4]![3] = -0.001;
    expect(second.cells).toEqual(expected);
    // Worst station now 0.003 - 0 = 0.003 in (station 2): at the limit, within it.
    await item(page, "runout-result").locator('[data-verdict="ok"]').waitFor();

    // Straightening attempts read as one TIR per set with its verdict; the raw readings on demand.
    const log = grid.getByTestId("attempts");
    const sets = log.locator(":scope > tbody > tr");
    await expect.poll(() => sets.count()).toBe(2);
    expect(await sets.nth(0).innerText()).toMatch(/TIR[^\n]*0\.006 in[\s\S]*▲ outside/);
    expect(await sets.nth(1).innerText()).toMatch(/TIR[^\n]*0\.003 in[\s\S]*✓ within/);
    const raw = sets.nth(0).locator("details table");
    expect(await raw.isVisible()).toBe(false);
    await sets.nth(0).getByText("The readings").tap();
    expect(await raw.isVisible()).toBe(true);

    // Strike the second set through with a reason: it stays, struck, and no longer counts.
    await grid.getByRole("button", { name: "Strike set 2 through" }).tap();
    await grid.getByLabel("Why is set 2 struck through?").fill("Dial base slipped on station 3");
    await grid.getByRole("button", { name: "Strike it through" }).tap();
    await log.locator(':scope > tbody > tr[data-struck="true"]').waitFor();
    expect(await log.getByTestId("strike").innerText()).toMatch(
      new RegExp(`Struck through by ${HULL} technician, .*: Dial base slipped on station 3`),
    );
    await item(page, "runout-result").locator('[data-verdict="out-of-range"]').waitFor();
    await expect.poll(async () => (await stored("runout-readings"))?.strikes?.length).toBe(1);
    const strike = (await stored("runout-readings")).strikes[0];
    expect(strike).toMatchObject({ attempt: second.id, reason: "Dial base slipped on station 3" });
    expect((await stored("runout-readings")).attempts).toHaveLength(2);

    // A note on a measurement whatever its verdict: a good face runout can carry one.
    await sections(page)
      .getByRole("button", { name: /Coupling face/ })
      .tap();
    const face = item(page, "face-runout");
    await face.getByLabel("Reading").fill("0.0005");
    await face.getByRole("button", { name: "Record reading" }).tap();
    await face.locator('[data-verdict="ok"]').waitFor();
    await face.getByLabel(/^Note/).fill("Read twice, same figure");
    await face.getByRole("button", { name: "Save note" }).tap();
    await expect.poll(async () => (await stored("face-runout"))?.note).toBe("Read twice, same figure");

    // An entry waiting to be sent moves nothing when it goes: the buttons stay under the finger.
    const saveNote = face.getByRole("button", { name: "Save note" });
    const top = () => saveNote.evaluate((e) => e.getBoundingClientRect().top + window.scrollY);
    await context.setOffline(true);
    await face.getByLabel("Reading", { exact: true }).fill("0.0006");
    await face.getByRole("button", { name: /Record (reading|a new attempt)/ }).tap();
    await face.getByTestId("pending").waitFor();
    const waiting = await top();
    await context.setOffline(false);
    await expect.poll(() => face.getByTestId("pending").count()).toBe(0);
    expect(await top()).toBe(waiting);

    // The connection reads at arm's length and stays on screen while scrolling; offline looks different.
    const connection = page.getByTestId("connection");
    await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight));
    expect(await connection.isVisible()).toBe(true);
    const box = await connection.boundingBox();
    expect(box!.y).toBeGreaterThanOrEqual(0);
    expect(box!.y).toBeLessThan(200);
    // Larger than the rest of the bar (18 px and up, against 14 px before), bold.
    expect(await connection.evaluate((e) => parseFloat(getComputedStyle(e).fontSize))).toBeGreaterThanOrEqual(
      18,
    );
    expect(await connection.getAttribute("data-online")).toBe("true");
    await context.setOffline(true);
    await page
      .getByTestId("connection")
      .getByText(/Offline/)
      .waitFor();
    expect(await page.getByTestId("connection").getAttribute("data-online")).toBe("false");
    expect(await page.getByTestId("connection").innerText()).toMatch(/⊘/);
    await context.setOffline(false);
    await page.getByTestId("connection").getByText("Online").waitFor();

    // The submit panel: one tappable line per section with counts, every target at least 48 px.
    const summary = page.getByTestId("missing-summary");
    const lines = summary.getByRole("button");
    expect(await lines.count()).toBeGreaterThan(3);
    expect(await lines.count()).toBeLessThanOrEqual(8);
    for (const height of await lines.evaluateAll((all) => all.map((b) => b.getBoundingClientRect().height)))
      expect(height).toBeGreaterThanOrEqual(48);
    expect(await summary.innerText()).toMatch(/Section 1 · The shaft as received[\s\S]*to answer/);
    await summary.getByRole("button", { name: /Shaft seal and stern bearing/ }).tap();
    expect(await sections(page).locator('[aria-current="step"]').innerText()).toMatch(/Shaft seal/);

    // Back at the coupling face, then a reload: it reopens at that section and item.
    await sections(page)
      .getByRole("button", { name: /Coupling face/ })
      .tap();
    await item(page, "rim-runout").getByLabel("Reading").tap();
    await page.reload();
    await item(page, "rim-runout").waitFor();
    expect(await sections(page).locator('[aria-current="step"]').innerText()).toMatch(/Coupling face/);
    await expect.poll(() => item(page, "rim-runout").isVisible()).toBe(true);
    // The struck set is still there, struck, with its reason.
    await sections(page)
      .getByRole("button", { name: /Shaft runout/ })
      .tap();
    await item(page, "runout-readings").locator('tr[data-struck="true"]').waitFor();

    // Offline too: with the jobs on the tablet and no connection, it reopens where it was left.
    const checklistUrl = page.url();
    await open(page, "/");
    await goOfflineReady(page);
    await open(page, checklistUrl);
    await item(page, "runout-readings").waitFor();
    await context.setOffline(true);
    await page.reload();
    await item(page, "runout-readings").waitFor();
    expect(await sections(page).locator('[aria-current="step"]').innerText()).toMatch(/Shaft runout/);
    expect(await page.getByTestId("connection").getAttribute("data-online")).toBe("false");
    await context.setOffline(false);

    // The calculators' signed fields have the toggle too: an offset made negative with a tap.
    await open(page, "/calculators/mountMoves");
    const offset = page.getByLabel("Engine centre above shaft centre (optional)", { exact: true });
    await offset.fill("0.004");
    await page.getByRole("button", { name: "Change the sign of Engine centre above shaft centre" }).tap();
    expect(await offset.inputValue()).toBe("-0.004");
    expect(
      await page.getByRole("button", { name: /Change the sign of Coupling face to front mounts/ }).count(),
    ).toBe(0);
    expectNoConsoleErrors(errors);
    await context.close();
  });
});
