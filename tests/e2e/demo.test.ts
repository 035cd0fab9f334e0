import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { connect } from "../../db/connect.ts";
import { seedDemo } from "../../db/seeds/demo.ts";
import { seedDemoStory } from "../../db/seeds/demo-story.ts";
import { seedLibrary } from "../../db/seeds/library.ts";
import {
  expectNoConsoleErrors,
  goOfflineReady,
  hydrated,
  launch,
  TABLET_TIME_ZONE,
} from "../support/browser.ts";
import { DEMO_PASSWORD } from "../../db/seeds/demo-people.ts";
import { freshDatabase } from "../support/database.ts";
import { startServer, type RunningServer } from "../support/server-process.ts";

/**
 * Issue 15 §4: what `npm start` seeds shows every state to a newcomer. The demo goes into a
 * database and a server of its own (the other browser tests share the plain demo and change it).
 */
let browser: Browser;
let server: RunningServer;
let databaseUrl: string;

beforeAll(async () => {
  databaseUrl = await freshDatabase("sternpost_demo");
  const knex = connect(databaseUrl);
  try {
    await seedLibrary(knex);
    await seedDemo(knex);
    expect(await seedDemoStory(knex)).toMatch(/issued/);
    expect(await seedDemoStory(knex)).toBe("story already told");
  } finally {
    await knex.destroy();
  }
  server = await startServer({
    DATABASE_URL: databaseUrl,
    SESSION_SECRET: "demo-end-to-end-secret-0123456789",
    LOG_LEVEL: "warn",
  });
  browser = await launch();
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

async function tablet(): Promise<{ context: BrowserContext; errors: string[] }> {
  const context = await browser.newContext({
    viewport: { width: 820, height: 1180 },
    baseURL: server.url,
    hasTouch: true,
    timezoneId: TABLET_TIME_ZONE,
  });
  const errors: string[] = [];
  context.on("page", (page) => {
    page.on("console", (m) => {
      if (m.type() === "error" && !/Failed to load resource/.test(m.text())) errors.push(m.text());
    });
    page.on("pageerror", (e) => errors.push(String(e)));
  });
  return { context, errors };
}

/** A checklist of the repower under way ("Tern of Helvick"), by its template. */
async function checklistOnTern(templateKey: string): Promise<string> {
  const knex = connect(databaseUrl);
  try {
    const row = await knex("job_checklists as c")
      .join("jobs as j", "j.id", "c.job_id")
      .join("vessels as v", "v.id", "j.vessel_id")
      .where({ "v.name": "Tern of Helvick", "c.template_key": templateKey })
      .first("c.id");
    return row.id;
  } finally {
    await knex.destroy();
  }
}

async function signedIn(email: string): Promise<{ page: Page; errors: string[] }> {
  const { context, errors } = await tablet();
  const page = await context.newPage();
  await page.goto("/login");
  await hydrated(page);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/login"));
  await hydrated(page);
  return { page, errors };
}

describe("the demo", () => {
  it("shows the surveyor the issued record at first sign-in, genuine on /verify", async () => {
    const { page, errors } = await signedIn("surveyor@harbourmark-survey.example");
    const issued = page.getByTestId("issued-records");
    expect(await issued.innerText()).toContain("Little Auk");
    await issued.getByRole("link", { name: /Little Auk/ }).click();
    await page.getByRole("heading", { level: 1, name: "Little Auk" }).waitFor();
    // Countersigned checklists, in the order the work is done.
    const titles = await page.getByTestId("record-checklist").locator("h2").allInnerTexts();
    expect(titles.map((t) => t.replace(/\s*version \d+$/, ""))).toEqual([
      "Engine alignment",
      "Exhaust",
      "Cooling",
      "Sea trial",
    ]);
    await page.getByRole("link", { name: "Check it is genuine" }).click();
    await page.getByTestId("verdict").waitFor();
    expect(await page.getByTestId("verdict").innerText()).toMatch(/Genuine and unchanged/);
    expect(await page.getByTestId("verify-identity").innerText()).toContain("K4T-0011907");
    expectNoConsoleErrors(errors);
  });

  it("shows the lead a checklist waiting for review and a conflict to decide", async () => {
    const { page, errors } = await signedIn("lead@kittiwake-slip.example");
    const tern = page.locator("li", { has: page.getByRole("link", { name: "Tern of Helvick" }) });
    expect(await tern.getByRole("link", { name: /^Exhaust/ }).innerText()).toMatch(/Waiting for review/);
    await goOfflineReady(page);
    await page.goto("/sync");
    await hydrated(page);
    const conflict = page.getByTestId("conflict");
    // The list is read from the tablet's own store after the page shows: wait for it, then count.
    await conflict.first().waitFor();
    expect(await conflict.count()).toBe(1);
    expect(await conflict.innerText()).toMatch(/Strainer/i);
    expectNoConsoleErrors(errors);
  });

  it("shows the technician the straightening converging and the alignment's mount moves", async () => {
    const { page, errors } = await signedIn("tech@kittiwake-slip.example");
    await goOfflineReady(page);
    const open = async (key: string, item: string) => {
      await page.goto(`/checklists/${await checklistOnTern(key)}#item-${item}`);
      await hydrated(page);
      const located = page.locator(`[data-item="${item}"]`);
      await located.waitFor();
      return located;
    };
    // Three sets of dial readings: as received, after the first press, after the second.
    // Each set reads as its worst-station TIR (issue 15: one figure per attempt), converging.
    const runout = await open("propeller-shaft-and-coupling", "runout-readings");
    const sets = runout.getByTestId("attempts").locator(":scope > tbody > tr");
    await expect.poll(() => sets.count()).toBe(3);
    expect(await sets.nth(0).innerText()).toMatch(/TIR[^\n]*0\.008 in/);
    expect(await sets.nth(2).innerText()).toMatch(/TIR[^\n]*0\.0015 in/);
    expect(await runout.innerText()).toMatch(/Good\. All 20 readings entered \(attempt 3\)/);
    expect(await page.locator('[data-item="runout-result"]').innerText()).toMatch(/0\.0015 in/);
    // The alignment afloat: the moves at each mount, with the adjusting nut's turns.
    const moves = await (await open("engine-alignment", "mount-moves")).innerText();
    expect(moves).toMatch(/Front mounts, height\s+raise 0\.0112 in/);
    expect(moves).toMatch(/0\.15 turns to raise/);
    expectNoConsoleErrors(errors);
  });
});
