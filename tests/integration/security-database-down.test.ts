// Issue 14, section 2: while MariaDB is down every route answers 503 with Retry-After — a page for
// people, JSON for the API — and /healthz says unhealthy; when it is back, so is the app. The
// database stopped here is a throwaway server of this test's own, never the shared one.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { connect, createDatabase } from "../../db/connect.ts";
import { makeUser, TEST_PASSWORD } from "../support/fixtures.ts";
import { startServer, type RunningServer } from "../support/server-process.ts";
import { startThrowawayMariadb } from "../support/throwaway-mariadb.ts";

let mariadb: Awaited<ReturnType<typeof startThrowawayMariadb>>;
let server: RunningServer;
let cookie: string;

beforeAll(async () => {
  mariadb = await startThrowawayMariadb("db-down");
  const url = mariadb.url("sternpost_down");
  await createDatabase(url);
  const knex = connect(url);
  await knex.migrate.latest();
  const technician = await makeUser(knex, "technician");
  await knex.destroy();
  server = await startServer({ DATABASE_URL: url });
  const login = await fetch(`${server.url}/login`, {
    method: "POST",
    headers: { Origin: server.url },
    body: new URLSearchParams({ email: technician.email, password: TEST_PASSWORD }),
    redirect: "manual",
  });
  cookie = login.headers.get("Set-Cookie")!.split(";")[0]!;
}, 90_000);

afterAll(async () => {
  await server?.stop();
  await mariadb?.remove();
});

const get = (path: string, init: RequestInit = {}) =>
  fetch(`${server.url}${path}`, {
    redirect: "manual",
    ...init,
    headers: { Cookie: cookie, Origin: server.url, ...init.headers },
  });

describe("with MariaDB down", () => {
  it("everything answers 503 with Retry-After, then recovers", { timeout: 60_000 }, async () => {
    expect((await get("/healthz")).status).toBe(200);
    expect((await get("/api/jobs")).status).toBe(200);

    await mariadb.stop();

    const health = await get("/healthz");
    expect(health.status).toBe(503);
    expect(health.headers.get("Retry-After")).toMatch(/^\d+$/);
    expect(await health.json()).toMatchObject({ ok: false });

    const api = await get("/api/jobs");
    expect(api.status).toBe(503);
    expect(api.headers.get("Retry-After")).toMatch(/^\d+$/);
    expect(api.headers.get("Content-Type")).toMatch(/json/);
    expect((await api.json()).error).toMatch(/cannot reach its database/);

    const sync = await get("/api/sync", {
      method: "POST",
      headers: { "Content-Type": "application/json" },
      body: JSON.stringify({ deviceId: crypto.randomUUID(), cursor: 0, ops: [] }),
    });
    expect(sync.status).toBe(503);

    for (const path of ["/", "/jobs", "/login"]) {
      const page = await get(path);
      expect(page.status, path).toBe(503);
      expect(page.headers.get("Content-Type"), path).toMatch(/html/);
      expect(await page.text(), path).toMatch(/unreachable for now/);
    }
    const signIn = await get("/login", {
      method: "POST",
      body: new URLSearchParams({ email: "a@b.example", password: "whatever-it-is" }),
    });
    expect(signIn.status).toBe(503);
    expect(server.output()).not.toMatch(/Unexpected Server Error/);

    await mariadb.start();
    // The pool reconnects; the next probe after a second sees the database again.
    let back = 0;
    for (let i = 0; i < 40 && back !== 200; i++) {
      await new Promise((r) => setTimeout(r, 250));
      back = (await get("/healthz")).status;
    }
    expect(back).toBe(200);
    expect((await get("/api/jobs")).status).toBe(200);
  });
});
