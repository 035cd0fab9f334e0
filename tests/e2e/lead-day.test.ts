import { randomUUID } from "node:crypto";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { connect } from "../../db/connect.ts";
import { expectNoConsoleErrors, launch, open, signIn, tabletContext } from "../support/browser.ts";
import { makeCrewedJob, publishTemplate, TEST_PASSWORD } from "../support/fixtures.ts";
import { waitForMail } from "../support/mail.ts";

let browser: Browser;
const knex = connect(process.env.E2E_DATABASE_URL!);
const HULL = "Petrel Ledge";

// Two short checklists of this test's own, so a day's review fits in one run.
const templates = ["lead-day-shaft", "lead-day-cooling"].map((key, i) => ({
  key,
  version: 1,
  title: i === 0 ? "Lead day: shaft" : "Lead day: cooling",
  purpose: "A short end-to-end checklist.",
  sections: [
    {
      key: "main",
      title: "Main",
      items: [
        { kind: "check", key: "secured", label: "Fasteners secured", required: true },
        { kind: "text", key: "remarks", label: "Remarks", required: true },
      ],
    },
  ],
}));

let crew: Awaited<ReturnType<typeof makeCrewedJob>>;
let shaft: string, cooling: string;

beforeAll(async () => {
  browser = await launch();
  for (const t of templates) await publishTemplate(knex, t);
  crew = await makeCrewedJob(
    knex,
    HULL,
    templates.map((t) => t.key),
  );
  [shaft, cooling] = [crew.checklists["lead-day-shaft"]!, crew.checklists["lead-day-cooling"]!];
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

const stateOf = async (id: string) => (await knex("job_checklists").where({ id }).first())!.state;
const item = (page: Page, key: string) => page.locator(`[data-item="${key}"]`);

/** The technician's tablet sends a checklist's entries and its submission, as the sync loop does. */
async function submitThroughSync(page: Page, checklistId: string) {
  const ops = [
    ["secured", { result: "pass" }],
    ["remarks", { text: "Done to the drawing" }],
    ["@submit", { action: "submit" }],
  ].map(([itemKey, value], i) => ({
    opId: randomUUID(),
    seq: i + 1,
    checklistId,
    itemKey,
    value,
    baseRev: 0,
    at: new Date().toISOString(),
  }));
  const status = await page.evaluate(
    async (body) =>
      (
        await fetch("/api/sync", {
          method: "POST",
          headers: { "Content-Type": "application/json" },
          body: JSON.stringify(body),
        })
      ).status,
    { deviceId: `lead-day-${randomUUID()}`, cursor: null, ops },
  );
  expect(status).toBe(200);
}

describe("the lead's day on a tablet", () => {
  it("queue, mail, findings first, return with a confirm, an answer, then several countersigned with one password", async () => {
    const tech = await tabletContext(browser);
    const techPage = await tech.context.newPage();
    await signIn(techPage, crew.technician.email, TEST_PASSWORD);
    await submitThroughSync(techPage, shaft);
    await submitThroughSync(techPage, cooling);
    expect([await stateOf(shaft), await stateOf(cooling)]).toEqual(["submitted", "submitted"]);
    // The lead is told by e-mail, with the link to the review.
    const mail = await waitForMail(crew.lead.email, 10_000, /Waiting for your review: Lead day: shaft/);
    expect(mail.text).toContain(`/checklists/${shaft}/review`);

    // The lead's queue on Today: both, oldest first, each a link.
    const lead = await tabletContext(browser);
    const leadPage = await lead.context.newPage();
    await signIn(leadPage, crew.lead.email, TEST_PASSWORD);
    const queue = leadPage.getByTestId("review-queue");
    await queue.waitFor();
    const mine = queue.getByRole("link").filter({ hasText: HULL });
    expect(await mine.allInnerTexts()).toEqual([
      expect.stringMatching(/To review[\s\S]*Lead day: shaft/),
      expect.stringMatching(/To review[\s\S]*Lead day: cooling/),
    ]);

    // The review page: nothing to flag yet, and what is within limits folded away.
    await mine.first().click();
    await leadPage.getByRole("heading", { name: /Review: Lead day: shaft/ }).waitFor();
    const outline = leadPage.getByTestId("review-outline");
    await outline.getByText(/No findings/).waitFor();
    const folded = leadPage.getByTestId("within-limits");
    expect(await folded.evaluate((d) => (d as HTMLDetailsElement).open)).toBe(false);
    await folded.getByText("2 items within limits").click();
    // A control that cannot be used looks it.
    const pass = item(leadPage, "secured").getByRole("button", { name: /Pass/ });
    expect(await pass.isDisabled()).toBe(true);
    expect(Number(await pass.evaluate((b) => getComputedStyle(b).opacity))).toBeLessThan(0.7);
    expect(await pass.evaluate((b) => getComputedStyle(b).cursor)).toBe("not-allowed");
    // A comment puts the item among the findings, with a jump link to it.
    await item(leadPage, "remarks").getByLabel("Comment on this item").fill("Which drawing, which revision?");
    await item(leadPage, "remarks").getByRole("button", { name: "Add comment" }).click();
    await outline
      .getByTestId("findings-comment")
      .getByRole("link", { name: /Remarks/ })
      .waitFor();
    expect(await outline.getByTestId("findings-comment").getByRole("link").getAttribute("href")).toBe(
      "#item-remarks",
    );

    // Returning asks first; only "Yes" returns it, and the technician is e-mailed the comment.
    await leadPage.getByText(/Return to the technician with the comments/).click();
    expect(await stateOf(shaft)).toBe("submitted");
    await leadPage.getByRole("button", { name: "Yes, return it" }).click();
    await leadPage.waitForURL(new RegExp(`/jobs/${crew.job.id}$`));
    expect(await stateOf(shaft)).toBe("returned");
    const returned = await waitForMail(crew.technician.email, 10_000, /Returned to you: Lead day: shaft/);
    expect(returned.text).toContain("Remarks: Which drawing, which revision?");

    // The technician sees what came back and why, opens it at the summary and answers at the item.
    await open(techPage, "/");
    const back = techPage.getByTestId("returned-queue");
    await back.getByText("Which drawing, which revision?").waitFor();
    await back.getByRole("link", { name: /Lead day: shaft/ }).click();
    const summary = techPage.getByTestId("comment-summary");
    await summary.getByText("Which drawing, which revision?").waitFor();
    await summary.getByRole("link", { name: /Remarks/ }).click();
    await item(techPage, "remarks").getByLabel("Answer the lead").fill("Drawing 14-B, revision C");
    await item(techPage, "remarks").getByRole("button", { name: "Send answer" }).click();
    await item(techPage, "remarks")
      .getByTestId("comment-reply")
      .getByText(/revision C/)
      .waitFor();
    await techPage.getByRole("button", { name: "Submit for review" }).click();
    await expect.poll(() => stateOf(shaft), { timeout: 20_000 }).toBe("submitted");

    // The lead reads the answer on the review page.
    await open(leadPage, `/checklists/${shaft}/review`);
    await item(leadPage, "remarks")
      .getByTestId("comment-reply")
      .getByText(/Drawing 14-B/)
      .waitFor();

    // Both countersigned from the job page with one password entry (a wrong one signs none).
    await open(leadPage, `/jobs/${crew.job.id}`);
    const several = leadPage.getByRole("form", { name: /Countersign the 2 checklists/ });
    await several.getByLabel("Your password, to countersign").fill("not-my-password");
    await several.getByRole("button", { name: "Countersign the ticked checklists" }).click();
    await several.getByText(/password is not right; none was countersigned/).waitFor();
    expect([await stateOf(shaft), await stateOf(cooling)]).toEqual(["submitted", "submitted"]);
    await leadPage
      .getByRole("form", { name: /Countersign the 2 checklists/ })
      .getByLabel("Your password, to countersign")
      .fill(TEST_PASSWORD);
    await leadPage.getByRole("button", { name: "Countersign the ticked checklists" }).click();
    const outcomes = leadPage.getByTestId("seal-outcomes");
    await outcomes.getByText("✓ Countersigned: Lead day: cooling").waitFor();
    await outcomes.getByText("✓ Countersigned: Lead day: shaft").waitFor();
    const signed = await knex("job_checklists").whereIn("id", [shaft, cooling]).select("state", "digest");
    expect(signed.map((s) => s.state)).toEqual(["countersigned", "countersigned"]);
    expect(signed[0]!.digest).not.toBe(signed[1]!.digest);

    // An amendment asks first, and one opened by mistake is discarded while still empty.
    const count = async () => (await knex("job_checklists").where({ job_id: crew.job.id })).length;
    await leadPage.getByText("Correct it (amendment)…").first().click();
    expect(await count()).toBe(2);
    await leadPage.getByRole("button", { name: "Yes, open an amendment" }).click();
    await expect.poll(count).toBe(3);
    await leadPage.getByText("Discard this amendment…").click();
    await leadPage.getByRole("button", { name: "Yes, discard it" }).click();
    await expect.poll(count).toBe(2);

    // The queue now holds the record to issue.
    await open(leadPage, "/");
    await leadPage
      .getByTestId("review-queue")
      .getByRole("link", { name: new RegExp(`To issue[\\s\\S]*${HULL}`) })
      .waitFor();
    // It opens the job's record card; a second issue asks first.
    await leadPage
      .getByTestId("review-queue")
      .getByRole("link", { name: new RegExp(`To issue[\\s\\S]*${HULL}`) })
      .click();
    await leadPage
      .getByLabel("Surveyors' e-mail addresses")
      .fill(`Petra Ellwood <petrel.${Date.now()}@survey.example>`);
    await leadPage.getByRole("button", { name: "Issue the record" }).click();
    await leadPage
      .getByRole("status")
      .getByText(/Record issued/)
      .waitFor();
    const records = async () => (await knex("records").where({ job_id: crew.job.id })).length;
    await leadPage
      .getByLabel("Surveyors' e-mail addresses")
      .fill(`Petra Ellwood <petrel.again.${Date.now()}@survey.example>`);
    await leadPage.getByTestId("issue-again").getByText("Issue the record again…").click();
    await leadPage.getByText(/earlier record stays valid/).waitFor();
    expect(await records()).toBe(1);
    await leadPage.getByRole("button", { name: "Yes, issue a new record" }).click();
    await expect.poll(records).toBe(2);

    expectNoConsoleErrors(tech.errors);
    expectNoConsoleErrors(lead.errors);
  });

  it("People: a second invitation right after the first, and deactivating only after a yes", async () => {
    const manager = await tabletContext(browser);
    const page = await manager.context.newPage();
    await signIn(page, "manager@kittiwake-slip.example");
    await open(page, "/people");
    const stamp = Date.now();
    const first = `first.${stamp}@kittiwake-slip.example`;
    const second = `second.${stamp}@kittiwake-slip.example`;
    await page.getByLabel("Name", { exact: true }).fill("Orla Fenwick");
    await page.getByLabel("E-mail address", { exact: true }).fill(first);
    await page.getByRole("button", { name: "Send invitation" }).click();
    await page.getByRole("status").getByText(`Invitation sent to ${first}.`).waitFor();
    // Issue 16: the role list went blank here and the next invitation failed under this banner.
    expect(await page.getByLabel("Role", { exact: true }).inputValue()).toBe("technician");
    expect(await page.getByLabel("Name", { exact: true }).inputValue()).toBe("");
    await page.getByLabel("Name", { exact: true }).fill("Tam Rowlinson");
    await expect.poll(() => page.getByRole("status").count()).toBe(0); // the old banner goes
    await page.getByLabel("E-mail address", { exact: true }).fill(second);
    await page.getByLabel("Role", { exact: true }).selectOption("lead");
    await page.getByRole("button", { name: "Send invitation" }).click();
    await page.getByRole("status").getByText(`Invitation sent to ${second}.`).waitFor();
    expect((await knex("users").where({ email: second }).first())!.role).toBe("lead");

    const row = page.getByTestId(`person-${second}`);
    await row.getByText("Deactivate…").click();
    expect((await knex("users").where({ email: second }).first())!.active).toBeTruthy();
    await row.getByRole("button", { name: "Yes, deactivate Tam Rowlinson" }).click();
    await row.getByText("Deactivated").waitFor();
    expect((await knex("users").where({ email: second }).first())!.active).toBeFalsy();
    expectNoConsoleErrors(manager.errors);
  });
});
