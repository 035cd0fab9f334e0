import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demoPeople } from "../../db/seeds/demo-people.ts";
import { baseUrl, expectNoConsoleErrors, launch, open, signIn, tabletContext } from "../support/browser.ts";
import { waitForMail } from "../support/mail.ts";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser?.close());

const expectedNavigation: Record<string, string[]> = {
  manager: ["Today", "Jobs", "Vessels", "Calculators", "Library", "People", "Audit log", "Yard settings"],
  lead: ["Today", "Jobs", "Vessels", "Calculators", "Library"],
  technician: ["Today", "Jobs", "Calculators", "Library"],
  surveyor: ["Today"],
};

describe("signing in", () => {
  for (const person of demoPeople.filter((p, i, all) => all.findIndex((q) => q.role === p.role) === i)) {
    it(`shows a ${person.role} the navigation of that role`, async () => {
      const { context, errors } = await tabletContext(browser);
      const page = await context.newPage();
      await signIn(page, person.email);
      const nav = page.getByRole("navigation", { name: "Main" });
      // Every place of the role, those in the Shop menu included (closed, so read as text). Read
      // until the page after sign-in has rendered it: reading text does not wait by itself.
      await expect
        .poll(() => nav.locator("a").allTextContents(), { timeout: 10_000 })
        .toEqual(expectedNavigation[person.role]);
      expect(await page.getByTestId("role").innerText()).toBe(
        person.role[0]!.toUpperCase() + person.role.slice(1),
      );
      expectNoConsoleErrors(errors);
      await context.close();
    });
  }

  it("says plainly when the password is wrong", async () => {
    const { context } = await tabletContext(browser);
    const page = await context.newPage();
    await open(page, "/login");
    await page.getByLabel("E-mail address").fill("tech@kittiwake-slip.example");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect.poll(() => page.getByRole("alert").innerText()).toMatch(/do not match/);
    await context.close();
  });
});

describe("the manager's day", () => {
  it("invites a person by e-mail, who sets a password from the link and signs in", async () => {
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "manager@kittiwake-slip.example");
    await page.locator("summary", { hasText: /^Shop/ }).click();
    await page.getByRole("link", { name: "People" }).click();
    const email = `new.hand.${Date.now()}@kittiwake-slip.example`;
    await page.getByLabel("Name").fill("Ossian Trewin");
    await page.getByLabel("E-mail address").fill(email);
    await page.getByLabel("Role", { exact: true }).selectOption("technician");
    await page.getByRole("button", { name: "Send invitation" }).click();
    await expect.poll(() => page.getByRole("status").innerText()).toContain(`Invitation sent to ${email}`);

    const mail = await waitForMail(email);
    expect(mail.subject).toMatch(/invited to Sternpost/);
    const link = mail.text.match(/https?:\/\/\S+\/invitation\/\S+/)?.[0];
    // The link is the app's own address and a 43-character base64url token (32 random bytes).
    expect(link).toMatch(new RegExp(`^${baseUrl()}/invitation/[A-Za-z0-9_-]{43}$`));

    // The development page shows the same message with its link.
    await open(page, "/dev/mail");
    await expect.poll(() => page.getByTestId("mail").first().innerText()).toContain(email);

    const newcomer = await (await tabletContext(browser)).context.newPage();
    await open(newcomer, link!);
    await newcomer.getByRole("heading", { name: "Welcome, Ossian Trewin" }).waitFor();
    expect(await newcomer.getByTestId("invitation-why").innerText()).toContain(
      "Kittiwake Slip has invited you to Sternpost as a technician.",
    );
    await newcomer.getByLabel("New password").fill("first-day-at-the-yard");
    await newcomer.getByLabel("Type it again").fill("first-day-at-the-yard");
    await newcomer.getByRole("button", { name: "Set password" }).click();
    // Signed in straight away (a new session), on Today.
    await newcomer.waitForURL(`${baseUrl()}/`);
    expect(await newcomer.getByTestId("role").innerText()).toBe("Technician");
    expectNoConsoleErrors(errors);
    await context.close();
  });

  it("creates a vessel and a job, and the assigned technician sees the job", async () => {
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "manager@kittiwake-slip.example");
    const vesselName = `Skerry Lass ${Date.now() % 100000}`;
    await open(page, "/vessels/new");
    await page.getByLabel("Vessel name").fill(vesselName);
    // A HIN that breaks 33 CFR 181.25 (the letter O in the serial) is refused at the field first.
    await page.getByLabel("Hull identification number (HIN)").fill("KSBO4017J526");
    await page.getByLabel("Length overall").fill("31");
    await page.getByLabel("Owner", { exact: true }).fill("Morwenna Tresize");
    await page.getByRole("button", { name: "Save vessel" }).click();
    const hinId = await page.getByLabel("Hull identification number (HIN)").getAttribute("id");
    await expect.poll(() => page.locator(`#${hinId}-error`).innerText()).toMatch(/\bO\b/);
    await page.getByLabel("Hull identification number (HIN)").fill("KSB7R118C727");
    await page.getByRole("button", { name: "Save vessel" }).click();
    await page.waitForURL(/\/vessels$/);
    await expect.poll(() => page.getByText(vesselName).count()).toBe(1);

    await open(page, "/jobs/new");
    await page.getByLabel("Vessel").selectOption({ label: vesselName });
    await page.getByLabel("Engine model").fill("K4-150 diesel");
    await page.getByLabel("Engine serial number").fill("K4T-0099001");
    await page.getByLabel("Rated power (hp)").fill("150");
    await page.getByLabel("Rated rpm, lowest (rpm)").fill("3800");
    await page.getByLabel("Rated rpm, highest (rpm)").fill("4000");
    await page.getByLabel("Gear ratio (: 1)").fill("1.5");
    await page.getByLabel("Propeller diameter (in)").fill("15");
    await page.getByLabel("Propeller pitch (in)").fill("17");
    await page.getByLabel("Shaft diameter (in)").fill("1");
    await page.getByLabel("Shaft material").fill("316 stainless");
    await page.getByLabel("Coupling type").fill("Split clamp, keyed");
    await page.getByLabel("Lead", { exact: true }).selectOption({ label: "Idris Penhale" });
    await page.getByLabel("Wren Malloch").check();
    await page.getByRole("button", { name: "Create job" }).click();
    await page.waitForURL(/\/jobs\/\d+$/);
    await expect.poll(() => page.getByRole("heading", { level: 1 }).innerText()).toBe(vesselName);
    expectNoConsoleErrors(errors);
    await context.close();

    const tech = await tabletContext(browser);
    const techPage = await tech.context.newPage();
    await signIn(techPage, "tech2@kittiwake-slip.example");
    await techPage.getByRole("link", { name: "Jobs" }).click();
    await expect.poll(() => techPage.getByTestId("jobs-table").innerText()).toContain(vesselName);
    // The other technician is not assigned and does not see it.
    const other = await tabletContext(browser);
    const otherPage = await other.context.newPage();
    await signIn(otherPage, "tech@kittiwake-slip.example");
    await open(otherPage, "/jobs");
    expect(await otherPage.getByTestId("jobs-table").innerText()).not.toContain(vesselName);
    expectNoConsoleErrors(tech.errors);
    await tech.context.close();
    await other.context.close();
  });
});
