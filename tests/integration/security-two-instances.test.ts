// Issue 14, section 4: two app processes on different ports against one MariaDB and one S3 store.
// A session made on one works on the other, the sign-in limit counts across both, and two
// tablets syncing through different instances end with the same entries, each operation answered
// once.
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Change, OpResult } from "~/lib/sync/protocol";
import { startChecklists } from "~/server/checklists.server";
import { seedLibrary } from "../../db/seeds/library.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser, TEST_PASSWORD } from "../support/fixtures.ts";
import { startServer, type RunningServer } from "../support/server-process.ts";
import { check } from "../support/sync.ts";

const knex = testDb();
let a: RunningServer;
let b: RunningServer;
let technician: { id: number; email: string };
let checklistId: string;

const signIn = (server: RunningServer, email: string, password = TEST_PASSWORD) =>
  fetch(`${server.url}/login`, {
    method: "POST",
    headers: { Origin: server.url },
    body: new URLSearchParams({ email, password }),
    redirect: "manual",
  });
const cookieOf = (response: Response) => response.headers.get("Set-Cookie")!.split(";")[0]!;

async function sync(server: RunningServer, cookie: string, body: object) {
  const response = await fetch(`${server.url}/api/sync`, {
    method: "POST",
    headers: {
      "Content-Type": "application/json",
      Origin: server.url,
      Cookie: cookie,
    },
    body: JSON.stringify(body),
  });
  expect(response.status).toBe(200);
  return (await response.json()) as {
    results: OpResult[];
    changes: Change[];
    cursor: string;
  };
}

beforeAll(async () => {
  [a, b] = await Promise.all([startServer(), startServer()]);
  await seedLibrary(knex);
  technician = await makeUser(knex, "technician");
  const lead = await makeUser(knex, "lead");
  const job = await makeJob(knex, lead.id, [technician.id]);
  [checklistId] = await startChecklists(job.id, ["cooling"], lead.id);
}, 60_000);
afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  await knex.destroy();
});

describe("two instances on one database", () => {
  it("share sessions: signed in on one, known on the other, signed out on both", async () => {
    const cookie = cookieOf(await signIn(a, technician.email));
    const me = await fetch(`${b.url}/api/me`, { headers: { Cookie: cookie } });
    expect(me.status).toBe(200);
    expect((await me.json()).id).toBe(technician.id);
    await fetch(`${b.url}/logout`, {
      method: "POST",
      headers: { Cookie: cookie, Origin: b.url },
      redirect: "manual",
    });
    expect((await fetch(`${a.url}/api/me`, { headers: { Cookie: cookie } })).status).toBe(401);
  });

  it("count failed sign-ins across both (LOGIN_ATTEMPTS is 5 in the integration setup)", async () => {
    const lead = await makeUser(knex, "lead");
    for (const server of [a, b, a, b, a]) {
      expect((await signIn(server, lead.email, "not-the-password")).status).toBe(400);
    }
    const refused = await signIn(b, lead.email);
    expect(refused.status).toBe(400);
    expect(await refused.text()).toMatch(/Too many failed sign-ins/);
  });

  it("converge when two tablets sync through different instances", async () => {
    const cookie = cookieOf(await signIn(a, technician.email));
    const items = ["seacock", "intake-hose", "strainer", "impeller", "heat-exchanger"];
    const push = (server: RunningServer, device: string, result: "pass" | "fail") =>
      sync(server, cookie, {
        deviceId: device,
        cursor: null,
        ops: items.map((itemKey, i) => ({
          opId: randomUUID(),
          seq: i + 1,
          checklistId,
          itemKey,
          value: check(result),
          baseRev: 0,
          at: new Date().toISOString(),
        })),
      });
    // Both tablets edit the same five items from revision 0, at the same time, one per instance.
    const [first, second] = await Promise.all([push(a, "tablet-one", "pass"), push(b, "tablet-two", "fail")]);
    const statuses = [...first.results, ...second.results].map((r) => r.status);
    // Each item: one edit applied, the other kept as a conflict — never both applied, none lost.
    expect(statuses.filter((s) => s === "applied")).toHaveLength(items.length);
    expect(statuses.filter((s) => s === "conflict")).toHaveLength(items.length);
    // Each tablet pulls through the other instance and sees the same entries.
    const viewOf = (changes: Change[]) =>
      Object.fromEntries(
        changes.filter((c) => c.checklistId === checklistId).map((c) => [c.itemKey, [c.rev, c.value]]),
      );
    const [pullOne, pullTwo] = await Promise.all([
      sync(b, cookie, { deviceId: "tablet-one", cursor: null, ops: [] }),
      sync(a, cookie, { deviceId: "tablet-two", cursor: null, ops: [] }),
    ]);
    expect(viewOf(pullOne.changes)).toEqual(viewOf(pullTwo.changes));
    expect(Object.keys(viewOf(pullOne.changes)).sort()).toEqual([...items].sort());
    const conflicts = await knex("sync_conflicts").where({
      checklist_id: checklistId,
    });
    expect(conflicts).toHaveLength(items.length);
  });
});
