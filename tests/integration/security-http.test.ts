// Issue 14, sections 1 and 3, at the HTTP level: the production server (`node server.js`) on a
// port of its own, probed the way the outside probe did — foreign origins, wrong body types,
// oversized and chunked bodies — and its request log read back.
import { request as httpRequest } from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser, TEST_PASSWORD } from "../support/fixtures.ts";
import { startServer, type RunningServer } from "../support/server-process.ts";
import { startChecklists } from "~/server/checklists.server";
import { seedLibrary } from "../../db/seeds/library.ts";

const knex = testDb();
const PHOTO_MAX_BYTES = 200_000;
let server: RunningServer;
let technician: { id: number; email: string };
let techCookie: string;
let checklistId: string;

async function signIn(email: string, password = TEST_PASSWORD) {
  const response = await fetch(`${server.url}/login`, {
    method: "POST",
    headers: { Origin: server.url },
    body: new URLSearchParams({ email, password }),
    redirect: "manual",
  });
  expect(response.status).toBe(302);
  return response.headers.get("Set-Cookie")!.split(";")[0]!;
}

/**
 * A request whose body goes out in chunks (no Content-Length), as a stream would send it. It
 * settles on the server's answer, which may come before the whole body is sent; the client then
 * stops sending, as browsers and curl do on an early final answer.
 */
function chunked(
  path: string,
  {
    method = "POST",
    headers = {},
    chunk = 64 * 1024,
    total,
  }: { method?: string; headers?: Record<string, string>; chunk?: number; total: number },
): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    const req = httpRequest(`${server.url}${path}`, { method, headers, agent: false }, (res) => {
      let body = "";
      res.on("data", (c: Buffer) => (body += c.toString()));
      res.on("end", () => {
        resolve({ status: res.statusCode!, body });
        req.destroy();
      });
    });
    req.on("error", (error) => {
      if (!req.destroyed) reject(error);
    });
    const piece = Buffer.alloc(chunk, "a");
    let sent = 0;
    const write = () => {
      while (sent < total && !req.destroyed) {
        sent += chunk;
        if (!req.write(piece)) return void req.once("drain", write);
      }
      if (!req.destroyed) req.end();
    };
    write();
  });
}

beforeAll(async () => {
  server = await startServer({ PHOTO_MAX_BYTES: String(PHOTO_MAX_BYTES) });
  technician = await makeUser(knex, "technician");
  const lead = await makeUser(knex, "lead");
  await seedLibrary(knex);
  const job = await makeJob(knex, lead.id, [technician.id]);
  [checklistId] = await startChecklists(job.id, ["cooling"], lead.id);
  techCookie = await signIn(technician.email);
}, 60_000);
afterAll(async () => {
  await server?.stop();
  await knex.destroy();
});

describe("/dev/mail in production (finding 1)", () => {
  it("is off unless DEV_MAIL_PAGE=on, even for a manager, though a mail sink is set", async () => {
    const manager = await makeUser(knex, "manager");
    const cookie = await signIn(manager.email);
    expect(process.env.MAIL_SINK_DIR).toBeTruthy();
    const response = await fetch(`${server.url}/dev/mail`, { headers: { Cookie: cookie } });
    expect(response.status).toBe(404);
  });
});

describe("request bodies (finding 4)", () => {
  it("refuses a declared 50 MB anonymous post with 413 before reading it", async () => {
    const response = await new Promise<number>((resolve, reject) => {
      const req = httpRequest(`${server.url}/login`, {
        method: "POST",
        headers: { "Content-Type": "application/x-www-form-urlencoded", "Content-Length": 50 * 1024 * 1024 },
      });
      req.on("response", (res) => {
        resolve(res.statusCode!);
        req.destroy();
      });
      req.on("error", reject);
      req.write(Buffer.alloc(64 * 1024, "a"));
    });
    expect(response).toBe(413);
  });

  it("refuses a chunked form past the form limit with 413", async () => {
    const answer = await chunked("/login", {
      headers: { "Content-Type": "application/x-www-form-urlencoded" },
      total: 3 * 1024 * 1024,
    });
    expect(answer.status).toBe(413);
  });

  it("answers a chunked photo past the photo limit with the documented 413, not a reset", async () => {
    const answer = await chunked(
      `/api/photos/${crypto.randomUUID()}?checklistId=${checklistId}&itemKey=seacock`,
      {
        method: "PUT",
        headers: { "Content-Type": "image/jpeg", Cookie: techCookie, Origin: server.url },
        total: PHOTO_MAX_BYTES * 3,
      },
    );
    expect(answer.status).toBe(413);
    expect(JSON.parse(answer.body).error).toMatch(/larger than/);
  });

  it("keeps memory flat under four concurrent anonymous 50 MB posts", async () => {
    const before = server.memoryMb().rss;
    const answers = await Promise.all(
      [1, 2, 3, 4].map(() =>
        chunked("/login", {
          headers: { "Content-Type": "application/x-www-form-urlencoded" },
          chunk: 256 * 1024,
          total: 50 * 1024 * 1024,
        }),
      ),
    );
    expect(answers.map((a) => a.status)).toEqual([413, 413, 413, 413]);
    // The probe saw 195 MB grow to 1,289 MB; read-and-discard keeps it to a few MB.
    expect(server.memoryMb().peak - before).toBeLessThan(60);
  }, 60_000);
});

describe("bodies a page cannot read (finding 5)", () => {
  it("answers a non-form body to a page action with 4xx, not 500", async () => {
    const cookie = await signIn(technician.email);
    for (const path of ["/login", "/people", "/jobs/new", "/vessels/new", "/logout", "/library/import"]) {
      for (const [type, body] of [
        ["application/json", '{"email":"x"}'],
        ["text/plain", "hello"],
        ["multipart/form-data; boundary=abc", "--abc\r\nbroken"],
        ["application/x-www-form-urlencoded", "%E0%A4%A=%"],
      ] as const) {
        const response = await fetch(`${server.url}${path}`, {
          method: "POST",
          headers: { "Content-Type": type, Cookie: cookie },
          body,
          redirect: "manual",
        });
        expect(response.status, `${path} ${type}`).toBeLessThan(500);
      }
    }
  });
});

describe("a sync op with a 2,000-deep JSON value (finding 5)", () => {
  it("is refused with 4xx, not 500", async () => {
    const deep = JSON.parse(`${"[".repeat(2000)}${"]".repeat(2000)}`);
    const response = await fetch(`${server.url}/api/sync`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Origin: server.url, Cookie: techCookie },
      body: JSON.stringify({
        deviceId: crypto.randomUUID(),
        cursor: null,
        ops: [
          { opId: crypto.randomUUID(), seq: 1, checklistId, itemKey: "seacock", value: deep, baseRev: 0 },
        ],
      }),
    });
    expect(response.status).toBe(400);
    expect((await response.json()).error).toMatch(/nested more than 64 levels/);
  });
});

describe("what one account can make the server store (finding 10)", () => {
  it("pauses the sync of an account whose refused operations reached the hour's bound", async () => {
    const spammer = await makeUser(knex, "technician");
    const cookie = await signIn(spammer.email);
    const sync = () =>
      fetch(`${server.url}/api/sync`, {
        method: "POST",
        headers: { "Content-Type": "application/json", Origin: server.url, Cookie: cookie },
        body: JSON.stringify({ deviceId: "spam-device", cursor: null, ops: [] }),
      });
    // 5,000 refused operations' bookkeeping rows in the last hour, as 5 full requests would leave.
    const rows = Array.from({ length: 5000 }, (_, i) => ({
      op_id: crypto.randomUUID(),
      device_id: "spam-device",
      seq: i,
      user_id: spammer.id,
      checklist_id: checklistId,
      item_key: "seacock",
      status: "rejected" as const,
      result: JSON.stringify({ status: "rejected", reason: "test" }),
      received_at: new Date(),
    }));
    for (let i = 0; i < rows.length; i += 1000) await knex("sync_ops").insert(rows.slice(i, i + 1000));
    const paused = await sync();
    expect(paused.status).toBe(429);
    expect(paused.headers.get("Retry-After")).toMatch(/^\d+$/);
    expect((await paused.json()).error).toMatch(/refused in the last hour/);
    // Others sync on.
    expect(
      (
        await fetch(`${server.url}/api/sync`, {
          method: "POST",
          headers: { "Content-Type": "application/json", Origin: server.url, Cookie: techCookie },
          body: JSON.stringify({ deviceId: "tech-device-1", cursor: null, ops: [] }),
        })
      ).status,
    ).toBe(200);
  });
});

describe("cross-site requests (finding 6)", () => {
  const syncBody = () => JSON.stringify({ deviceId: crypto.randomUUID(), cursor: 0, ops: [] });

  it("refuse a sync from a foreign origin carrying the technician's cookie", async () => {
    const historyBefore = await knex("audit_log").count({ n: "*" });
    const response = await fetch(`${server.url}/api/sync`, {
      method: "POST",
      headers: { "Content-Type": "text/plain", Origin: "http://evil.example", Cookie: techCookie },
      body: syncBody(),
    });
    expect(response.status).toBe(403);
    expect(await knex("audit_log").count({ n: "*" })).toEqual(historyBefore);
  });

  it("require application/json for the sync API even from this origin", async () => {
    const response = await fetch(`${server.url}/api/sync`, {
      method: "POST",
      headers: { "Content-Type": "text/plain", Origin: server.url, Cookie: techCookie },
      body: syncBody(),
    });
    expect(response.status).toBe(415);
  });

  it("do not sign anyone out from a foreign origin", async () => {
    const cookie = await signIn(technician.email);
    const response = await fetch(`${server.url}/logout`, {
      method: "POST",
      headers: {
        "Content-Type": "application/x-www-form-urlencoded",
        Origin: "http://evil.example",
        Cookie: cookie,
      },
      redirect: "manual",
    });
    expect(response.status).toBe(403);
    expect((await fetch(`${server.url}/api/me`, { headers: { Cookie: cookie } })).status).toBe(200);
  });

  it("refuse a browser's cross-site form post that carries no Origin", async () => {
    const response = await fetch(`${server.url}/logout`, {
      method: "POST",
      headers: { "Sec-Fetch-Site": "cross-site", Cookie: techCookie },
      redirect: "manual",
    });
    expect(response.status).toBe(403);
  });
});

describe("security headers (finding 8)", () => {
  it("send a CSP whose nonce is on every inline script of the page", async () => {
    const response = await fetch(`${server.url}/login`);
    const csp = response.headers.get("Content-Security-Policy")!;
    expect(csp).toMatch(/default-src 'self'/);
    expect(csp).toMatch(/frame-ancestors 'none'/);
    const nonce = csp.match(/'nonce-([^']+)'/)![1];
    const html = await response.text();
    const scripts = [...html.matchAll(/<script(?![^>]*\bsrc=)([^>]*)>/g)];
    expect(scripts.length).toBeGreaterThan(0);
    for (const [, attributes] of scripts) expect(attributes).toContain(`nonce="${nonce}"`);
    // A fresh nonce each time.
    const again = (await fetch(`${server.url}/login`)).headers.get("Content-Security-Policy")!;
    expect(again).not.toBe(csp);
    expect(response.headers.get("Strict-Transport-Security")).toBeNull();
  });

  it("add HSTS when APP_URL is https", async () => {
    const behindTls = await startServer({ APP_URL: "https://sternpost.kittiwake-slip.example" });
    try {
      const response = await fetch(`${behindTls.url}/login`);
      expect(response.headers.get("Strict-Transport-Security")).toMatch(/max-age=31536000/);
    } finally {
      await behindTls.stop();
    }
  });
});

describe("request log (section 3)", () => {
  it("writes one line per request with id, route, status, time and user, and no secret", async () => {
    const marker = `/api/jobs?probe=${Date.now()}`;
    await fetch(`${server.url}${marker}`, { headers: { Cookie: techCookie } });
    await signIn(technician.email);
    await fetch(`${server.url}/invitation/secret-token-value`);
    await new Promise((r) => setTimeout(r, 200));
    const lines = server.logLines();
    const jobs = lines.filter((l) => (l.req as { route?: string })?.route === "/api/jobs");
    expect(jobs.length).toBeGreaterThan(0);
    const line = jobs.at(-1)!;
    expect(line).toMatchObject({ res: { status: 200 }, userId: technician.id });
    expect((line.req as { id: string }).id).toMatch(/^[0-9a-f-]{36}$/);
    expect(typeof line.responseTime).toBe("number");
    const all = server.output();
    expect(all).not.toContain(TEST_PASSWORD);
    expect(all).not.toContain("secret-token-value");
    expect(all).not.toContain("__sternpost=");
    expect(all).not.toContain(`probe=`);
    // No stack traces for the refused and malformed requests above: they are 4xx.
    expect(all).not.toMatch(/"stack"/);
  });
});
