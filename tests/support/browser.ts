import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { expect } from "vitest";
import { DEMO_PASSWORD } from "../../db/seeds/demo-people.ts";

/** The tablets' zone in every browser test (the server and the database keep UTC). */
export const TABLET_TIME_ZONE = "America/St_Johns";

export const baseUrl = () => process.env.E2E_BASE_URL ?? "http://localhost:3100";

/**
 * Debian's Chromium, headless, with nothing reaching outside this machine (Playwright gives it a
 * fresh profile). `home` gives it a home folder of its own (whose NSS database may trust a
 * certificate authority); `args` adds flags such as host-resolver rules that keep every name on
 * loopback.
 */
export async function launch(options: { home?: string; args?: string[] } = {}): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    env: options.home ? { ...process.env, HOME: options.home } : undefined,
    args: [
      ...(options.args ?? []),
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
}

/** A tablet-sized context whose pages fail the test on any console error. */
export async function tabletContext(
  browser: Browser,
): Promise<{ context: BrowserContext; errors: string[] }> {
  const context = await browser.newContext({
    viewport: { width: 820, height: 1180 },
    baseURL: baseUrl(),
    hasTouch: true,
    // Not UTC, and half an hour off the hour: a date or time read in the wrong zone shows.
    timezoneId: TABLET_TIME_ZONE,
  });
  const errors: string[] = [];
  context.on("page", (page) => watch(page, errors));
  return { context, errors };
}

function watch(page: Page, errors: string[]) {
  page.on("console", (m) => {
    // A refused page load (403/404) logs a resource error; the tests check those statuses themselves.
    if (m.type() === "error" && !/Failed to load resource/.test(m.text()))
      errors.push(`${page.url()}: ${m.text()}`);
  });
  page.on("pageerror", (e) => errors.push(`${page.url()}: ${String(e)}`));
}

export function expectNoConsoleErrors(errors: string[]) {
  expect(errors, "console errors during the test").toEqual([]);
}

/** Opens a page and waits until React has hydrated it, so clicks reach their handlers. */
export async function open(page: Page, url: string) {
  await page.goto(url);
  await hydrated(page);
}

export async function hydrated(page: Page) {
  await page.waitForSelector("html[data-hydrated]", { state: "attached" });
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await open(page, "/login");
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/login"));
  await hydrated(page);
}

/** Takes the signed-in person's jobs offline (or refreshes the copy) and waits until it is ready. */
export async function goOfflineReady(page: Page) {
  await page.evaluate(() => navigator.serviceWorker.ready.then(() => true));
  await page.getByRole("button", { name: /Make my jobs available offline|Refresh the offline copy/ }).click();
  await page
    .getByTestId("offline-readiness")
    .getByText(/Ready offline/)
    .waitFor();
}
