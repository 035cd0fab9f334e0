// Time to open a 200-item checklist from IndexedDB in Chromium with the network off, against
// opening an empty page of the app in the same browser (the "To decide" page with nothing on it:
// same worker, shell and hydration, no checklist). Prints both medians and their ratio.
//   npx react-router build && npx tsx bench/open-checklist.ts
import { spawn } from "node:child_process";
import { randomUUID } from "node:crypto";
import { performance } from "node:perf_hooks";
import { chromium } from "playwright-core";
import { connect, createDatabase, dropDatabase } from "../db/connect.ts";
import { DEMO_PASSWORD } from "../db/seeds/demo-people.ts";
import { seedDemo } from "../db/seeds/demo.ts";
import { seedLibrary, sha256 } from "../db/seeds/library.ts";

const PORT = 3400;
const ROUNDS = 7;
const base = new URL(process.env.DATABASE_URL ?? "mysql://root@127.0.0.1:3307/sternpost");
base.pathname = "/sternpost_bench_ui";
const url = base.toString();

await dropDatabase(url);
await createDatabase(url);
const knex = connect(url);
await knex.migrate.latest();
await seedLibrary(knex);
await seedDemo(knex);

// A 200-item template in one section, so the whole checklist renders at once.
const kinds = ["check", "measure", "choice", "text"] as const;
const items = Array.from({ length: 200 }, (_, i) => {
  const kind = kinds[i % kinds.length]!;
  const common = {
    key: `item-${i + 1}`,
    label: `Bench item ${i + 1}`,
    hint: "How to do it.",
    reference: "Benchmark",
  };
  if (kind === "measure")
    return { kind, ...common, unit: "in", accepts: ["in", "mm"], rule: { max: 0.003, unit: "in" } };
  if (kind === "choice")
    return {
      kind,
      ...common,
      options: [
        { key: "a", label: "A" },
        { key: "b", label: "B" },
      ],
    };
  return { kind, ...common };
});
const template = {
  key: "bench-200",
  version: 1,
  title: "Bench 200",
  purpose: "Benchmark of opening a large checklist.",
  sections: [{ key: "all", title: "All", items }],
};
const body = JSON.stringify(template);
const [versionId] = await knex("template_versions").insert({
  template_key: "bench-200",
  version: 1,
  status: "published",
  title: "Bench 200",
  body,
  body_sha256: sha256(body),
  published_at: new Date(),
});
const job = (await knex("jobs").where({ status: "underway" }).first())!;
const checklistId = randomUUID();
await knex("job_checklists").insert({
  id: checklistId,
  job_id: job.id,
  template_version_id: versionId,
  template_key: "bench-200",
  started_by: job.lead_id,
});
await knex.destroy();

const server = spawn("node", ["server.js"], {
  env: {
    ...process.env,
    NODE_ENV: "production",
    PORT: String(PORT),
    DATABASE_URL: url,
    SESSION_SECRET: "benchmark-secret-0123456789abcdef",
    APP_URL: `http://localhost:${PORT}`,
  },
  stdio: "ignore",
});
try {
  for (let i = 0; i < 100; i++) {
    if (
      await fetch(`http://localhost:${PORT}/healthz`).then(
        (r) => r.ok,
        () => false,
      )
    )
      break;
    await new Promise((r) => setTimeout(r, 100));
  }
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    args: [
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
  const context = await browser.newContext({
    baseURL: `http://localhost:${PORT}`,
    viewport: { width: 820, height: 1180 },
  });
  const page = await context.newPage();
  await page.goto("/login");
  await page.getByLabel("E-mail address").fill("tech@kittiwake-slip.example");
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/login"));
  await page.waitForSelector("html[data-hydrated]", { state: "attached" });
  await page.evaluate(() => navigator.serviceWorker.ready.then(() => true));
  await page.getByRole("button", { name: /Make my jobs available offline/ }).click();
  await page
    .getByTestId("offline-readiness")
    .getByText(/Ready offline/)
    .waitFor();
  await context.setOffline(true);

  const time = async (path: string, ready: string) => {
    const t = performance.now();
    await page.goto(path);
    await page.waitForSelector(ready, { state: "visible" });
    return performance.now() - t;
  };
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
  const empty: number[] = [];
  const full: number[] = [];
  for (let i = 0; i < ROUNDS + 1; i++) {
    const e = await time("/sync", '[data-testid="nothing-to-decide"]');
    const f = await time(`/checklists/${checklistId}`, '[data-item="item-200"]');
    if (i > 0) {
      empty.push(e);
      full.push(f);
    }
  }
  const e = median(empty);
  const f = median(full);
  console.log(`open the 200-item checklist offline: ${f.toFixed(0)} ms (median of ${ROUNDS})`);
  console.log(`open an empty page offline:          ${e.toFixed(0)} ms (median of ${ROUNDS})`);
  console.log(`ratio checklist / empty page: ${(f / e).toFixed(2)}× (target ≤ 2×)`);
  await browser.close();
} finally {
  server.kill("SIGTERM");
  await dropDatabase(url);
}
