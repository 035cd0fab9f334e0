import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { expectNoConsoleErrors, launch, open, signIn, tabletContext } from "../support/browser.ts";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(() => browser?.close());

describe("the header on a tablet", () => {
  for (const [width, height] of [
    [768, 1024],
    [1024, 768],
  ] as const) {
    it(`keeps the manager's navigation on one row at ${width} px, with the current place marked`, async () => {
      const { context, errors } = await tabletContext(browser);
      const page = await context.newPage();
      await page.setViewportSize({ width, height });
      await signIn(page, "manager@kittiwake-slip.example");
      const nav = page.getByRole("navigation", { name: "Main" });
      const box = (await nav.boundingBox())!;
      // One row of 48 px targets (plus the row's own padding), not the two or three rows of before.
      expect(box.height).toBeLessThanOrEqual(56);
      const header = (await page.locator("header").first().boundingBox())!;
      expect(header.height).toBeLessThanOrEqual(110);

      await page.locator("summary", { hasText: /^Shop/ }).click();
      await page.getByRole("link", { name: "Audit log" }).click();
      await page.waitForURL(/\/audit/);
      // The menu closed itself and now names where the manager is.
      await expect.poll(() => page.getByText("Shop · Audit log").isVisible()).toBe(true);
      await expect(page.getByRole("link", { name: "Audit log" }).isVisible()).resolves.toBe(false);
      expectNoConsoleErrors(errors);
      await context.close();
    });
  }

  it("stays on screen while a long page scrolls", async () => {
    const { context } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "manager@kittiwake-slip.example");
    await open(page, "/audit");
    // However long the page is today, make it longer than the screen.
    await page.evaluate(() => (document.querySelector("main")!.style.minHeight = "5000px"));
    await page.mouse.wheel(0, 3000);
    await expect.poll(() => page.evaluate(() => window.scrollY)).toBeGreaterThan(0);
    const header = (await page.locator("header").first().boundingBox())!;
    expect(header.y).toBe(0);
    await context.close();
  });

  it("keeps the header when a page fails, so the sync bar and navigation stay", async () => {
    const { context } = await tabletContext(browser);
    const page = await context.newPage();
    await signIn(page, "tech@kittiwake-slip.example");
    await open(page, "/jobs/99999999");
    await expect.poll(() => page.getByTestId("error-page").innerText()).toMatch(/Not found|not yours/i);
    await expect(page.getByRole("navigation", { name: "Main" }).isVisible()).resolves.toBe(true);
    await context.close();
  });
});
