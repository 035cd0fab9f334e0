import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { mkdirSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startHttpsProxy } from "../../scripts/https-proxy.ts";
import { baseUrl, expectNoConsoleErrors, hydrated, launch, tabletContext } from "../support/browser.ts";
import { DEMO_PASSWORD } from "../../db/seeds/demo-people.ts";
import { serverArgs } from "../support/server-process.ts";

// The way a yard's tablets reach the app: Caddy with the yard's own certificate authority in front
// of the production server, and a browser that trusts that authority the way a tablet does after
// its one-time install (an NSS database holding the root) — no certificate error is ignored.
const HTTPS_PORT = Number(process.env.E2E_HTTPS_PORT ?? 3463);
const CA_PORT = Number(process.env.E2E_CA_PORT ?? 3464);
const APP_PORT = Number(process.env.E2E_HTTPS_APP_PORT ?? 3161);
const secureUrl = `https://127.0.0.1:${HTTPS_PORT}`;

const children: ChildProcess[] = [];
let browser: Browser;

async function waitFor(url: string) {
  for (let i = 0; i < 150; i++) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {}
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${url} did not answer`);
}

/** A home folder whose NSS database trusts the yard's authority, as a tablet does once it is installed. */
function homeTrusting(caFile: string) {
  const home = mkdtempSync(path.join(tmpdir(), "sternpost-tablet-"));
  const nss = path.join(home, ".pki", "nssdb");
  mkdirSync(nss, { recursive: true });
  execFileSync("certutil", ["-d", `sql:${nss}`, "-N", "--empty-password"]);
  execFileSync("certutil", ["-d", `sql:${nss}`, "-A", "-t", "C,,", "-n", "yard authority", "-i", caFile]);
  return home;
}

async function signInAt(page: Page, origin: string, email: string) {
  await page.goto(`${origin}/login`);
  await hydrated(page);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/login"));
  await hydrated(page);
}

describe("from a tablet on the yard's network", () => {
  let caFile: string;
  beforeAll(async () => {
    const server = spawn("node", serverArgs(), {
      env: {
        ...process.env,
        NODE_ENV: "production",
        PORT: String(APP_PORT),
        HOST: "127.0.0.1",
        TRUST_PROXY: "loopback",
        APP_URL: secureUrl,
        DATABASE_URL: process.env.E2E_DATABASE_URL,
        SESSION_SECRET: "end-to-end-tests-secret-0123456789",
        MAIL_SINK_DIR: "",
      },
      stdio: ["ignore", "ignore", "inherit"],
    });
    children.push(server);
    await waitFor(`http://127.0.0.1:${APP_PORT}/healthz`);
    const proxy = await startHttpsProxy({
      host: "127.0.0.1",
      httpsPort: HTTPS_PORT,
      caPort: CA_PORT,
      upstreamPort: APP_PORT,
      dir: mkdtempSync(path.join(tmpdir(), "sternpost-caddy-")),
    });
    children.push(proxy.child);
    caFile = proxy.caFile;
  });
  afterAll(async () => {
    await browser?.close();
    for (const child of children) child.kill("SIGTERM");
  });

  it("offers the authority's certificate for download over plain HTTP", async () => {
    const res = await fetch(`http://127.0.0.1:${CA_PORT}/sternpost-yard-ca.crt`);
    expect(res.status).toBe(200);
    expect(await res.text()).toMatch(/^-----BEGIN CERTIFICATE-----/);
  });

  it("serves the app over HTTPS with an active service worker, and a checklist opens offline", async () => {
    browser = await launch({ home: homeTrusting(caFile) });
    const { context, errors } = await tabletContext(browser);
    const page = await context.newPage();
    await signInAt(page, secureUrl, "tech@kittiwake-slip.example");
    expect(await page.evaluate(() => window.isSecureContext)).toBe(true);
    const state = await page.evaluate(async () => {
      const worker = (await navigator.serviceWorker.ready).active!;
      if (worker.state !== "activated")
        await new Promise((done) => worker.addEventListener("statechange", done));
      return worker.state;
    });
    expect(state).toBe("activated");
    await expect(page.getByTestId("offline-unavailable").count()).resolves.toBe(0);

    await page
      .getByRole("button", { name: /Make my jobs available offline|Refresh the offline copy/ })
      .click();
    await page
      .getByTestId("offline-readiness")
      .getByText(/Ready offline/)
      .waitFor();
    const link = page.getByRole("link", { name: /^Engine alignment/ }).first();
    const href = await link.getAttribute("href");
    await context.setOffline(true);
    const again = await context.newPage();
    const reloaded = await again.goto(`${secureUrl}${href}`);
    expect(reloaded?.fromServiceWorker()).toBe(true);
    await hydrated(again);
    await again.getByRole("heading", { level: 1, name: "Engine alignment" }).waitFor();
    await context.setOffline(false);
    expectNoConsoleErrors(errors);
    await context.close();
  });
});

describe("on an address that is not a secure context", () => {
  it("Today says the checklists cannot be kept offline here, instead of offering to", async () => {
    // A yard name resolved to this machine: plain http on a name other than localhost is insecure.
    const port = new URL(baseUrl()).port;
    const insecure = await launch({ args: ["--host-resolver-rules=MAP yard-office.test 127.0.0.1"] });
    try {
      const { context, errors } = await tabletContext(insecure);
      const page = await context.newPage();
      await signInAt(page, `http://yard-office.test:${port}`, "tech@kittiwake-slip.example");
      expect(await page.evaluate(() => window.isSecureContext)).toBe(false);
      const warning = page.getByTestId("offline-unavailable");
      await warning.waitFor();
      await expect(warning.textContent()).resolves.toMatch(/cannot keep checklists offline/);
      await expect(
        page.getByRole("button", { name: /Make my jobs available offline/ }).count(),
      ).resolves.toBe(0);
      // Chromium says it ignores the opener-isolation header on an insecure origin: true, and
      // exactly the situation this page warns about.
      expectNoConsoleErrors(
        errors.filter((e) => !/Cross-Origin-Opener-Policy header has been ignored/.test(e)),
      );
      await context.close();
    } finally {
      await insecure.close();
    }
  });
});
