import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { expectNoConsoleErrors, launch, open, signIn, tabletContext } from "../support/browser.ts";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser?.close());

/**
 * Apparent slip worked by hand (Gerr, Propeller Handbook, apparent slip):
 *   shaft rpm = engine rpm ÷ gear ratio;
 *   theoretical knots = pitch (in) × shaft rpm ÷ 12 in/ft × 60 min/h ÷ 6076.12 ft per nautical mile
 *   (1 nmi = 1852 m = 6076.12 ft, NIST SP 811);
 *   slip % = (theoretical − actual) ÷ theoretical × 100.
 * Pitch 24 in, 2800 rpm, 1.96 : 1, 27 kn → shaft 1428.57 rpm, 28.21 kn, slip ≈ 4.3 %.
 */
function slipByHand(pitchIn: number, engineRpm: number, gearRatio: number, knots: number) {
  const shaftRpm = engineRpm / gearRatio;
  const theoreticalKnots = ((pitchIn * shaftRpm) / 12 / 6076.12) * 60;
  return { shaftRpm, theoreticalKnots, slipPercent: ((theoreticalKnots - knots) / theoreticalKnots) * 100 };
}

describe("the calculators on a tablet", () => {
  it("a technician opens propeller slip, enters a sea-trial run and reads the slip as they type", async () => {
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "tech@kittiwake-slip.example");
    await open(page, "/calculators");
    await page.getByRole("heading", { level: 1, name: "Calculators" }).waitFor();
    await page.getByRole("link", { name: "Propeller slip" }).click();
    await page.getByRole("heading", { level: 1, name: "Propeller slip" }).waitFor();

    await page.getByLabel("Propeller pitch", { exact: true }).fill("24");
    await page.getByLabel("Engine rpm", { exact: true }).fill("2800");
    await page.getByLabel("Gear ratio (e.g. 2.5 for 2.5 : 1)", { exact: true }).fill("1.96");
    // Not yet complete: the screen says what it is waiting for, and shows no number.
    expect(await page.getByRole("region", { name: "Result" }).innerText()).toMatch(
      /Waiting for: Speed through the water/,
    );
    await page.getByLabel("Speed through the water", { exact: true }).fill("27");

    const expected = slipByHand(24, 2800, 1.96, 27);
    const slip = page.locator('[data-result="slip"]');
    await slip.waitFor();
    const reading = (text: string, unit: string) => {
      expect(text.endsWith(unit), `"${text}" ends with its unit ${unit}`).toBe(true);
      return Number(text.slice(0, -unit.length).trim());
    };
    // The screen shows slip to 0.1 %, speed to 0.01 kn and shaft rpm to the nearest rpm.
    expect(Math.abs(reading(await slip.innerText(), "%") - expected.slipPercent)).toBeLessThanOrEqual(0.05);
    expect(
      Math.abs(
        reading(await page.locator('[data-result="theoretical speed"]').innerText(), "kn") -
          expected.theoreticalKnots,
      ),
    ).toBeLessThanOrEqual(0.005);
    expect(
      Math.abs(
        reading(await page.locator('[data-result="shaft rpm"]').innerText(), "rpm") - expected.shaftRpm,
      ),
    ).toBeLessThanOrEqual(0.5);
    // The rule and its source are on the screen; the diagram names the run and its slip.
    expect(await page.getByTestId("calc-result").innerText()).toMatch(
      /Source: Gerr, Propeller Handbook, apparent slip/,
    );
    expect(await page.getByTestId("calc-diagram").getByRole("img").locator("title").textContent()).toContain(
      `2800 rpm, 27 kn, slip ${expected.slipPercent.toFixed(1)}%`,
    );

    // A gear ratio of zero is refused at the field, with no number on the screen.
    await page.getByLabel("Gear ratio (e.g. 2.5 for 2.5 : 1)", { exact: true }).fill("0");
    await page.locator("#calc-gearRatio-error").waitFor();
    expect(await page.locator("#calc-gearRatio-error").innerText()).toMatch(/greater than zero/);
    expect(await page.locator('[data-result="slip"]').count()).toBe(0);
    expect(
      await page
        .getByLabel("Gear ratio (e.g. 2.5 for 2.5 : 1)", { exact: true })
        .getAttribute("aria-invalid"),
    ).toBe("true");

    // Readable on a tablet: nothing wider than the screen, touch targets at least 48 px high.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(820);
    const pitch = await page.getByLabel("Propeller pitch", { exact: true }).boundingBox();
    expect(pitch!.height).toBeGreaterThanOrEqual(48);
    expect(await page.getByLabel("Propeller pitch", { exact: true }).getAttribute("inputmode")).toBe(
      "decimal",
    );
    expectNoConsoleErrors(errors);
    await context.close();
  });

  it("the conductor check fails 40 A on 16 AWG in an engine space, and says which table it used", async () => {
    // 33 CFR 183.425 Table 5: 16 AWG, 105 °C insulation, 25 A; × 0.85 inside an engine space = 21.25 A.
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "tech@kittiwake-slip.example");
    await open(page, "/calculators/conductorCheck");
    await page.getByRole("heading", { level: 1, name: "Conductor check" }).waitFor();
    await page.getByLabel("Current", { exact: true }).fill("40");
    await page.getByLabel("Round-trip conductor length", { exact: true }).fill("2");
    await page.getByLabel("System voltage (12, 24...)", { exact: true }).fill("12");
    await page.getByLabel("Allowed voltage drop (3 or 10 %)", { exact: true }).fill("10");
    await page.getByLabel("Conductor fitted (AWG or mm²)", { exact: true }).fill("16");
    await page.getByLabel("Insulation temperature rating (°C)", { exact: true }).fill("105");
    await page.getByLabel("Runs inside an engine space (yes or no)", { exact: true }).fill("yes");
    const result = page.getByTestId("calc-result");
    await expect.poll(() => result.getAttribute("data-verdict")).toBe("fail");
    const text = await result.innerText();
    expect(text).toMatch(
      /40 A is more than the conductor's allowable 21.25 A \(16 AWG, 105 °C insulation, inside an engine space\)/,
    );
    expect(text).toMatch(/105 °C column for 16 AWG inside an engine space \(× 0.85\)/);
    expect(await page.locator('[data-result="allowable amperage"]').innerText()).toMatch(/^21.3 A/);
    expectNoConsoleErrors(errors);
    await context.close();
  });

  it("converts a length when the unit is switched, and says when a calculator does not exist", async () => {
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "tech@kittiwake-slip.example");
    await open(page, "/calculators/propSlip");
    const pitch = page.getByLabel("Propeller pitch", { exact: true });
    await pitch.fill("24");
    // 24 in × 25.4 mm/in = 609.6 mm (1 in = 25.4 mm exactly, NIST SP 811).
    await page.getByRole("button", { name: "Millimetres" }).click();
    await expect.poll(() => pitch.inputValue()).toBe("609.6");
    expect(await page.getByLabel("Propeller pitch: unit").inputValue()).toBe("mm");

    await open(page, "/calculators/no-such-thing");
    await page.getByRole("heading", { level: 1, name: "No such calculator" }).waitFor();
    await page.getByText(/There is no calculator called “no-such-thing”/).waitFor();
    expectNoConsoleErrors(errors);
    await context.close();
  });

  it("works with the network off: opened from the tablet's copy after a reload", async () => {
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "tech@kittiwake-slip.example");
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => true));
    await page
      .getByRole("button", { name: /Make my jobs available offline|Refresh the offline copy/ })
      .click();
    await page
      .getByTestId("offline-readiness")
      .getByText(/Ready offline/)
      .waitFor();
    await context.setOffline(true);
    const response = await page.goto("/calculators/propSlip");
    expect(response?.fromServiceWorker()).toBe(true);
    await page.waitForSelector("html[data-hydrated]", { state: "attached" });
    await page.getByLabel("Propeller pitch", { exact: true }).fill("24");
    await page.getByLabel("Engine rpm", { exact: true }).fill("2800");
    await page.getByLabel("Gear ratio (e.g. 2.5 for 2.5 : 1)", { exact: true }).fill("1.96");
    await page.getByLabel("Speed through the water", { exact: true }).fill("27");
    const expected = slipByHand(24, 2800, 1.96, 27);
    const slip = await page.locator('[data-result="slip"]').innerText();
    expect(Math.abs(Number(slip.replace("%", "").trim()) - expected.slipPercent)).toBeLessThanOrEqual(0.05);
    // Back to the list and into another calculator, still offline (client-side navigation).
    await page.getByRole("link", { name: "Calculators" }).first().click();
    await page.getByRole("heading", { level: 1, name: "Calculators" }).waitFor();
    expect(await page.getByTestId("connection").innerText()).toMatch(/Offline/);
    expectNoConsoleErrors(errors.filter((e) => !/ERR_INTERNET_DISCONNECTED/.test(e)));
    await context.close();
  });
});
